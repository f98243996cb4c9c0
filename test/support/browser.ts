/**
 * Debian's chromium driven by playwright-core, as DEVELOPERS.md describes: the
 * executable, the flags a bare container needs, and whether the browser tests
 * run here (locally they skip without chromium, with a message; in CI they
 * must run, so they fail instead).
 */
import { existsSync } from 'node:fs';
import type { Browser } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';
/** Flags a bare container needs (DEVELOPERS.md): no sandbox as root, no GPU, no background network traffic, autoplay allowed. */
export const CHROMIUM_ARGS: readonly string[] = Object.freeze([
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--autoplay-policy=no-user-gesture-required',
]);
export const IN_CI = process.env['CI'] === 'true';
export const HAVE_CHROMIUM = existsSync(CHROMIUM);
/** Run the browser suites here? (In CI always: a missing browser then fails them.) */
export const RUN_BROWSER_TESTS = HAVE_CHROMIUM || IN_CI;
export const INSTALL_HINT = 'install it with: apt-get update && apt-get install -y chromium';

/** Launch chromium (playwright-core is imported lazily: it takes most of a second to load). */
export async function launchChromium(): Promise<Browser> {
  if (!HAVE_CHROMIUM) throw new Error(`${CHROMIUM} is missing: .ci/run must install chromium (${INSTALL_HINT})`);
  const { chromium } = await import('playwright-core');
  return chromium.launch({ executablePath: CHROMIUM, args: [...CHROMIUM_ARGS] });
}

/** A page opened from a folder on disk, with what went wrong while it ran. */
export interface WatchedPage {
  readonly page: import('playwright-core').Page;
  /** Console errors and warnings, and uncaught page errors. */
  readonly problems: string[];
  /** Requests for anything outside the page's own folder. */
  readonly outside: string[];
}

/** Open `<folder>/index.html` from file:// in a new context, recording console problems and requests that leave the folder. */
export async function openFolderPage(browser: Browser, folder: string): Promise<WatchedPage> {
  const { pathToFileURL } = await import('node:url');
  const context = await browser.newContext({ viewport: { width: 1360, height: 900 } });
  const page = await context.newPage();
  const folderUrl = pathToFileURL(folder).href;
  const problems: string[] = [];
  const outside: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error' || message.type() === 'warning') problems.push(`${message.type()}: ${message.text()}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('request', (request) => {
    if (!request.url().startsWith(`${folderUrl}/`)) outside.push(request.url());
  });
  await page.goto(`${folderUrl}/index.html`);
  return { page, problems, outside };
}
