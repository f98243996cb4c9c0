/**
 * The real thing: `coilbench demo` renders the bundled demo guitar, and its
 * listening page is opened from file:// in Debian's chromium, as a user
 * would. (test/listening-page.browser.test.ts checks the page in depth with a
 * synthetic fixture whose audio tells its own position; this suite checks
 * that the render and the page fit together.)
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import type { ListeningReport } from '../src/report/index.js';
import { CHROMIUM, INSTALL_HINT, RUN_BROWSER_TESTS, launchChromium, openFolderPage } from './support/browser.js';

const OUTPUT_DIR = join(import.meta.dirname, '..', 'test-output');
/** Largest jump of the playing position allowed when switching wirings, s. */
const SWITCH_TOLERANCE_S = 0.05;

if (!RUN_BROWSER_TESTS) console.warn(`demo page browser tests skipped: ${CHROMIUM} not found (${INSTALL_HINT})`);

interface PageView {
  position(): number;
  isPlaying(): boolean;
  currentId(): string;
  soundingIds(): string[];
}

describe.skipIf(!RUN_BROWSER_TESTS)('the demo render in chromium (file://)', () => {
  let work = '';
  let folder = '';
  let report: ListeningReport;
  let browser: Browser;
  let page: Page;
  let problems: string[] = [];
  let outside: string[] = [];

  beforeAll(async () => {
    work = mkdtempSync(join(tmpdir(), 'coilbench-demo-'));
    const io = captureIo(work);
    expect(await main(['demo'], io)).toBe(0);
    folder = join(work, 'renders', 'demo');
    report = JSON.parse(readFileSync(join(folder, 'report.json'), 'utf8')) as ListeningReport;
    browser = await launchChromium();
    ({ page, problems, outside } = await openFolderPage(browser, folder));
  });

  afterAll(async () => {
    await browser?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  const position = (): Promise<number> => page.evaluate(() => (window as unknown as { coilbenchPage: PageView }).coilbenchPage.position());
  const isPlaying = (): Promise<boolean> => page.evaluate(() => (window as unknown as { coilbenchPage: PageView }).coilbenchPage.isPlaying());

  it('lists one row per rendered wiring', async () => {
    expect(report.wirings).toHaveLength(47);
    expect(await page.locator('tr[data-wiring]').count()).toBe(47);
  });

  it('plays a wiring: the playback time advances', async () => {
    await page.locator('tr[data-wiring="w1"] [data-action="play"]').click();
    await page.waitForFunction(() => (window as unknown as { coilbenchPage: PageView }).coilbenchPage.soundingIds().join() === 'w1');
    const first = await position();
    await page.waitForTimeout(400);
    const second = await position();
    expect(second - first).toBeGreaterThan(0.25);
  });

  it(`switches wiring during playback at the same position (within ${SWITCH_TOLERANCE_S * 1000} ms)`, async () => {
    // Read the position, switch, and read it again in one task, so no time passes in between.
    const [before, after] = await page.evaluate(() => {
      const pageView = (window as unknown as { coilbenchPage: PageView }).coilbenchPage;
      const start = pageView.position();
      (document.querySelector('tr[data-wiring="w9"] [data-action="play"]') as HTMLButtonElement).click();
      return [start, pageView.position()];
    });
    expect(Math.abs((after as number) - (before as number))).toBeLessThan(SWITCH_TOLERANCE_S);
    await page.waitForFunction(() => (window as unknown as { coilbenchPage: PageView }).coilbenchPage.soundingIds().join() === 'w9');
    expect(await isPlaying()).toBe(true);
    expect(await position()).toBeGreaterThanOrEqual(before as number);
  });

  it('sorts by brightness in the order of report.json', async () => {
    await page.locator('[data-sort="brightness"]').click();
    const shown = await page.$$eval('tr[data-wiring]', (rows) => rows.map((row) => row.getAttribute('data-wiring')));
    const expected = [...report.wirings].sort((a, b) => a.centroidHz - b.centroidHz || a.number - b.number).map((wiring) => wiring.id);
    expect(shown).toEqual(expected);
  });

  it('runs ten blind trials by clicking', async () => {
    await page.locator('#abx-a').selectOption('w6');
    await page.locator('#abx-b').selectOption('w14');
    await page.locator('[data-action="abx-start"]').click();
    for (let trial = 0; trial < 10; trial += 1) {
      await page.locator('[data-action="abx-play-x"]').click();
      await page.locator(`[data-action="abx-answer-${trial % 2 === 0 ? 'a' : 'b'}"]`).click();
    }
    expect(await page.locator('#abx-score').getAttribute('data-trials')).toBe('10');
  });

  it('made no console errors and no request outside its folder; keeps a screenshot', async () => {
    await page.evaluate(() => window.scrollTo(0, 0));
    mkdirSync(OUTPUT_DIR, { recursive: true });
    await page.screenshot({ path: join(OUTPUT_DIR, 'demo-page.png') });
    expect(problems).toEqual([]);
    expect(outside).toEqual([]);
  });
});
