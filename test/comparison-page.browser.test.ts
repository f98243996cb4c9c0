/**
 * `coilbench compare --render` end to end: two sets rendered beside a
 * comparison page, opened from file:// in Debian's chromium as a user would.
 * The page must switch between the sets while playing at the same place in
 * the phrase, run a blind test between them, and load nothing from outside
 * its folder (each set's audio comes from that set's folder beside it).
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import type { ComparisonReport } from '../src/report/index.js';
import { CHROMIUM, INSTALL_HINT, RUN_BROWSER_TESTS, launchChromium, openFolderPage } from './support/browser.js';

const OUTPUT_DIR = join(import.meta.dirname, '..', 'test-output');
const samples = join(import.meta.dirname, '..', 'samples');
/** Largest jump of the playing position allowed when switching sets, s (as for the listening page). */
const SWITCH_TOLERANCE_S = 0.05;
const HOSTILE_NAME = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';

if (!RUN_BROWSER_TESTS) console.warn(`comparison page browser tests skipped: ${CHROMIUM} not found (${INSTALL_HINT})`);

interface ComparisonView {
  position(): number;
  isPlaying(): boolean;
  currentId(): string;
  soundingIds(): string[];
}

describe.skipIf(!RUN_BROWSER_TESTS)('the comparison page in chromium (file://)', () => {
  let work = '';
  let folder = '';
  let report: ComparisonReport;
  let browser: Browser;
  let page: Page;
  let problems: string[] = [];
  let outside: string[] = [];
  const view = 'coilbenchComparison';

  beforeAll(async () => {
    work = mkdtempSync(join(tmpdir(), 'coilbench-compare-page-'));
    const guitar = JSON.parse(readFileSync(join(samples, 'two-lead-humbucker.json'), 'utf8')) as Record<string, unknown>;
    writeFileSync(join(work, 'candidate.json'), JSON.stringify({ ...guitar, name: `${HOSTILE_NAME} (invented)`, cable: { capacitance: '1500p' } }));
    folder = join(work, 'compared');
    const io = captureIo(work);
    const status = await main(['compare', join(samples, 'two-lead-humbucker.json'), 'candidate.json', '--render', '-o', folder, '--chain', 'direct'], io);
    expect(status, io.err()).toBe(0);
    report = JSON.parse(readFileSync(join(folder, 'comparison.json'), 'utf8')) as ComparisonReport;
    browser = await launchChromium();
    ({ page, problems, outside } = await openFolderPage(browser, folder));
  });

  afterAll(async () => {
    await browser?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  const call = <T>(name: keyof ComparisonView): Promise<T> =>
    page.evaluate(([viewName, method]) => (window as unknown as Record<string, Record<string, () => unknown>>)[viewName as string]?.[method as string]?.(), [view, name]) as Promise<T>;

  it('has one row per wiring with a button per set, biggest change first', async () => {
    expect(report.rows).toHaveLength(6);
    expect(await page.locator('tr[data-row]').count()).toBe(6);
    expect(await page.locator('tr[data-row] [data-action="play-set"]').count()).toBe(12);
    const shown = await page.$$eval('tr[data-row]', (rows) => rows.map((row) => row.getAttribute('data-row')));
    expect(shown).toEqual(report.rows.map((row) => row.key));
  });

  it('plays a wiring on A: the sound comes from A\'s folder and time advances', async () => {
    const key = report.rows[0]?.key ?? '';
    await page.locator(`tr[data-row="${key}"] [data-action="play-set"][data-set="0"]`).click();
    await page.waitForFunction(([name, id]) => (window as unknown as Record<string, ComparisonView>)[name as string]?.soundingIds().join() === id, [view, `A:${key}`]);
    const first = await call<number>('position');
    await page.waitForTimeout(400);
    expect((await call<number>('position')) - first).toBeGreaterThan(0.25);
  });

  it(`switches to B during playback at the same position (within ${SWITCH_TOLERANCE_S * 1000} ms), and back with the A key`, async () => {
    const key = report.rows[0]?.key ?? '';
    const [before, after] = (await page.evaluate(([name, rowKey]) => {
      const comparison = (window as unknown as Record<string, ComparisonView>)[name as string] as ComparisonView;
      const start = comparison.position();
      (document.querySelector(`tr[data-row="${rowKey}"] [data-action="play-set"][data-set="1"]`) as HTMLButtonElement).click();
      return [start, comparison.position()];
    }, [view, key])) as [number, number];
    expect(Math.abs(after - before)).toBeLessThan(SWITCH_TOLERANCE_S);
    const bId = report.rows[0]?.entries[1] ?? '';
    await page.waitForFunction(([name, id]) => (window as unknown as Record<string, ComparisonView>)[name as string]?.soundingIds().join() === id, [view, bId]);
    expect(await call<boolean>('isPlaying')).toBe(true);
    await page.locator('body').press('a');
    await page.waitForFunction(([name, id]) => (window as unknown as Record<string, ComparisonView>)[name as string]?.soundingIds().join() === id, [view, `A:${key}`]);
    expect(await page.locator('#level-note').textContent()).toContain('Level matched');
  });

  it('runs ten blind trials between the sets of one wiring', async () => {
    const row = report.rows[1];
    await page.locator(`tr[data-row="${row?.key ?? ''}"] [data-action="blind-row"]`).click();
    expect(await page.locator('#abx-a').inputValue()).toBe(row?.entries[0]);
    expect(await page.locator('#abx-b').inputValue()).toBe(row?.entries[1]);
    await page.locator('[data-action="abx-start"]').click();
    for (let trial = 0; trial < 10; trial += 1) {
      await page.locator('[data-action="abx-play-x"]').click();
      await page.locator(`[data-action="abx-answer-${trial % 2 === 0 ? 'a' : 'b'}"]`).click();
    }
    expect(await page.locator('#abx-score').getAttribute('data-trials')).toBe('10');
    await page.locator('[data-action="abx-end"]').click();
    expect(await page.locator('#abx-log li').count()).toBe(10);
  });

  it('escaped the hostile guitar name, made no console errors and no request outside its folder; keeps a screenshot', async () => {
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    expect(await page.locator('.set-list').textContent()).toContain('<script>window.__pwned = 1</script>');
    await page.evaluate(() => window.scrollTo(0, 0));
    mkdirSync(OUTPUT_DIR, { recursive: true });
    await page.screenshot({ path: join(OUTPUT_DIR, 'comparison-page.png'), fullPage: false });
    expect(problems).toEqual([]);
    expect(outside).toEqual([]);
  });
});
