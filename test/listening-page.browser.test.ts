/**
 * The listening page in a real browser: Debian's chromium driven by
 * playwright-core, pages loaded from file:// as a user opens them.
 *
 * Audio is checked by ear-equivalent: an init script puts an AnalyserNode
 * between the page's graph and the speakers, so the tests read what would
 * be heard. The fixture's tones glide in pitch at a known rate
 * (test/support/listening-fixture.ts), so the pitch heard tells the playing
 * position independently of what the page reports.
 *
 * Without /usr/bin/chromium the suite skips locally with a message; in CI
 * (CI=true) it fails instead.
 */
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { CHROMIUM, INSTALL_HINT, RUN_BROWSER_TESTS, launchChromium } from './support/browser.js';
import { GLIDE_RATE_HZ_PER_S, GLIDE_START_HZ, type ListeningFixture, buildListeningFixture } from './support/listening-fixture.js';

const OUTPUT_DIR = join(import.meta.dirname, '..', 'test-output');
const HOSTILE_NAME = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';

if (!RUN_BROWSER_TESTS) console.warn(`listening page browser tests skipped: ${CHROMIUM} not found (${INSTALL_HINT})`);

/** Inserted before any page script: routes everything the page sends to the speakers through one AnalyserNode. */
const TAP_SCRIPT = `(() => {
  const connect = AudioNode.prototype.connect;
  AudioNode.prototype.connect = function (destination, ...rest) {
    if (destination instanceof AudioDestinationNode) {
      const context = destination.context;
      if (!context.__tap) {
        const tap = context.createAnalyser();
        tap.fftSize = 4096;
        tap.smoothingTimeConstant = 0;
        connect.call(tap, destination);
        context.__tap = tap;
        window.__tap = tap;
      }
      return connect.call(this, context.__tap, ...rest);
    }
    return connect.call(this, destination, ...rest);
  };
})();`;

interface Heard {
  /** Position the page reports, s. */
  position: number;
  /** RMS of the last analyser window. */
  rms: number;
  /** Fundamental heard, Hz (autocorrelation), or 0 in silence. */
  pitchHz: number;
  /** The audio clock (AudioContext.currentTime) at the same moment, s. */
  clockS: number;
  /** Length of the analyser window, s: the pitch found is that of the window's middle, half a window ago. */
  windowS: number;
}

/** Runs in the page: what the speakers get now, and the page's position at the same moment. */
function listen(): Heard {
  const page = window as unknown as {
    __tap: AnalyserNode;
    coilbenchPage: { position(): number };
  };
  const tap = page.__tap;
  const rate = tap.context.sampleRate;
  const data = new Float32Array(tap.fftSize);
  tap.getFloatTimeDomainData(data);
  const position = page.coilbenchPage.position();
  const clockS = tap.context.currentTime;
  let energy = 0;
  for (const value of data) energy += value * value;
  const rms = Math.sqrt(energy / data.length);
  // Autocorrelation r(lag) = Σ x[i]·x[i+lag] / N (biased, so the first period wins);
  // the fundamental is the first local maximum above 90 % of the largest, refined by a parabola.
  const minLag = Math.floor(rate / 600);
  const maxLag = Math.ceil(rate / 120);
  const r: number[] = [];
  for (let lag = minLag - 1; lag <= maxLag + 1; lag += 1) {
    let sum = 0;
    for (let i = 0; i + lag < data.length; i += 1) sum += (data[i] ?? 0) * (data[i + lag] ?? 0);
    r[lag] = sum / data.length;
  }
  let largest = 0;
  for (let lag = minLag; lag <= maxLag; lag += 1) largest = Math.max(largest, r[lag] ?? 0);
  let pitchHz = 0;
  for (let lag = minLag; lag <= maxLag && largest > 0; lag += 1) {
    const here = r[lag] ?? 0;
    if (here >= 0.9 * largest && here >= (r[lag - 1] ?? 0) && here >= (r[lag + 1] ?? 0)) {
      const before = r[lag - 1] ?? 0;
      const after = r[lag + 1] ?? 0;
      const shift = (before - after) / (2 * (before - 2 * here + after));
      pitchHz = rate / (lag + shift);
      break;
    }
  }
  return { position, rms, pitchHz, clockS, windowS: data.length / rate };
}

/** The playing position the pitch tells, s: f0 = start + rate·t (fixture glide). */
const positionFromPitch = (pitchHz: number): number => (pitchHz - GLIDE_START_HZ) / GLIDE_RATE_HZ_PER_S;

/** Exact P(K ≥ k | n, 1/2) from BigInt binomial coefficients: an independent computation for the ABX score. */
function exactTail(correct: number, trials: number): number {
  let coefficient = 1n;
  let sum = 0n;
  for (let i = 0; i <= trials; i += 1) {
    if (i >= correct) sum += coefficient;
    coefficient = (coefficient * BigInt(trials - i)) / BigInt(i + 1);
  }
  return Number(sum) / 2 ** trials;
}

const rowIds = (page: Page): Promise<string[]> =>
  page.$$eval('#wiring-table tbody tr[data-wiring]', (rows) =>
    rows.filter((row) => !(row as HTMLElement).hidden).map((row) => row.getAttribute('data-wiring') ?? ''),
  );

describe.skipIf(!RUN_BROWSER_TESTS)('listening page in chromium (file://)', () => {
  let browser: Browser;
  let context: BrowserContext | null = null;
  let fixture: ListeningFixture;
  let problems: string[] = [];
  let outside: string[] = [];

  beforeAll(async () => {
    browser = await launchChromium();
    fixture = buildListeningFixture();
    mkdirSync(OUTPUT_DIR, { recursive: true });
  });

  afterAll(async () => {
    await browser?.close();
    fixture?.remove();
  });

  afterEach(async () => {
    await context?.close();
    context = null;
    expect(problems, 'console errors and page errors').toEqual([]);
    problems = [];
    expect(outside, 'requests outside the page folder').toEqual([]);
  });

  async function open(target: ListeningFixture = fixture): Promise<Page> {
    problems = [];
    outside = [];
    context = await browser.newContext({ viewport: { width: 1360, height: 900 } });
    await context.addInitScript(TAP_SCRIPT);
    const page = await context.newPage();
    page.on('console', (message) => {
      if (message.type() === 'error' || message.type() === 'warning') problems.push(`${message.type()}: ${message.text()}`);
    });
    page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
    page.on('request', (request) => {
      if (!request.url().startsWith(target.folderUrl)) outside.push(request.url());
    });
    await page.goto(target.pageUrl);
    return page;
  }

  async function waitForSound(page: Page, id: string): Promise<void> {
    await page.waitForFunction((wanted) => {
      const view = (window as unknown as { coilbenchPage: { soundingIds(): string[]; isPlaying(): boolean } }).coilbenchPage;
      return view.isPlaying() && view.soundingIds().length === 1 && view.soundingIds()[0] === wanted;
    }, id);
  }

  /** Several listens a little apart, averaged: offset between heard and reported position, and RMS in dB. */
  async function heard(page: Page, count = 5): Promise<{ offsetS: number; clockOffsetS: number; rmsDb: number; position: number }> {
    const samples: Heard[] = [];
    for (let i = 0; i < count; i += 1) {
      samples.push(await page.evaluate(listen));
      await page.waitForTimeout(40);
    }
    const offsets = samples.map((sample) => positionFromPitch(sample.pitchHz) - (sample.position - sample.windowS / 2));
    const clockOffsets = samples.map((sample) => positionFromPitch(sample.pitchHz) - sample.clockS);
    const rmsDb = samples.map((sample) => 20 * Math.log10(sample.rms));
    const mean = (values: number[]): number => values.reduce((sum, value) => sum + value, 0) / values.length;
    return { offsetS: mean(offsets), clockOffsetS: mean(clockOffsets), rmsDb: mean(rmsDb), position: samples.at(-1)?.position ?? NaN };
  }

  it('lists every wiring, plays one and keeps a screenshot', async () => {
    const page = await open();
    expect(await page.locator('tr[data-wiring]').count()).toBe(fixture.report.wirings.length);
    expect(fixture.report.wirings.length).toBe(47);
    await page.locator('tr[data-wiring="w3"] [data-action="play"]').click();
    await waitForSound(page, 'w3');
    const timeBefore = await page.locator('#time').textContent();
    const started = Date.now();
    const first = await page.evaluate(() => (window as unknown as { coilbenchPage: { position(): number } }).coilbenchPage.position());
    await page.waitForTimeout(400);
    const second = await page.evaluate(() => (window as unknown as { coilbenchPage: { position(): number } }).coilbenchPage.position());
    const elapsedS = (Date.now() - started) / 1000;
    expect(second - first).toBeGreaterThan(0.3);
    expect(second - first).toBeLessThan(elapsedS + 0.05);
    expect(await page.locator('#time').textContent()).not.toBe(timeBefore);
    // Something is heard, at the pitch the fixture plays at that position (within 30 ms of the reported position).
    const now = await heard(page);
    expect(Math.abs(now.offsetS)).toBeLessThan(0.03);
    await expect.poll(() => page.locator('tr[data-wiring="w3"]').getAttribute('aria-current')).toBe('true');
    await page.locator('tr[data-wiring="w10"] [data-action="compare"]').check();
    await page.mouse.move(0, 0);
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: join(OUTPUT_DIR, 'listening-page.png') });
    await page.screenshot({ path: join(OUTPUT_DIR, 'listening-page-full.png'), fullPage: true });
  });

  it('switches wiring during playback at the same position (within 50 ms), heard in the audio', async () => {
    const page = await open();
    await page.locator('tr[data-wiring="w2"] [data-action="play"]').click();
    await waitForSound(page, 'w2');
    await page.waitForTimeout(300);
    const before = await heard(page);
    await page.locator('tr[data-wiring="w9"] [data-action="play"]').click();
    await waitForSound(page, 'w9');
    await page.waitForTimeout(150);
    const after = await heard(page);
    // Heard position minus the audio clock is the same before and after the switch: the phrase
    // went on without a jump or a gap. And the page reports the position that is heard.
    console.log(`switch: heard position moved ${((after.clockOffsetS - before.clockOffsetS) * 1000).toFixed(1)} ms against the audio clock; page position vs heard ${(after.offsetS * 1000).toFixed(1)} ms`);
    expect(after.position).toBeGreaterThan(before.position);
    expect(Math.abs(after.clockOffsetS - before.clockOffsetS)).toBeLessThan(0.05);
    expect(Math.abs(after.offsetS)).toBeLessThan(0.03);
    expect(Math.abs(before.offsetS)).toBeLessThan(0.03);
  });

  it('plays level matched by default and at true level on request', async () => {
    const page = await open();
    const [quiet, loud] = [...fixture.report.wirings].sort((a, b) => a.levelDb - b.levelDb).filter((w) => w.wav !== null);
    if (!quiet || !loud) throw new Error('fixture has no wirings');
    const last = fixture.report.wirings.reduce((a, b) => (b.levelDb > a.levelDb ? b : a));
    await page.locator(`tr[data-wiring="${quiet.id}"] [data-action="play"]`).click();
    await waitForSound(page, quiet.id);
    await page.waitForTimeout(150);
    const quietMatched = await heard(page);
    await page.locator(`tr[data-wiring="${last.id}"] [data-action="play"]`).click();
    await waitForSound(page, last.id);
    await page.waitForTimeout(150);
    const loudMatched = await heard(page);
    expect(last.levelDb - quiet.levelDb).toBeGreaterThan(6);
    expect(Math.abs(loudMatched.rmsDb - quietMatched.rmsDb)).toBeLessThan(0.5);
    await page.locator('#match-level').uncheck();
    await page.waitForTimeout(150);
    const loudTrue = await heard(page);
    await page.locator(`tr[data-wiring="${quiet.id}"] [data-action="play"]`).click();
    await waitForSound(page, quiet.id);
    await page.waitForTimeout(150);
    const quietTrue = await heard(page);
    expect(loudTrue.rmsDb - quietTrue.rmsDb).toBeCloseTo(last.levelDb - quiet.levelDb, 0);
    expect(Math.abs(loudTrue.rmsDb - quietTrue.rmsDb - (last.levelDb - quiet.levelDb))).toBeLessThan(0.5);
    // The true difference is always shown in dB.
    await expect.poll(() => page.locator('#level-note').textContent()).toContain(`${(last.levelDb - quiet.levelDb).toFixed(1)} dB quieter than ${last.id}`);
  });

  it('lets a newcomer find the quiet wirings, hear two back to back at matched level and see which is brighter', async () => {
    const page = await open();
    await page.getByRole('button', { name: 'Show only quiet wirings' }).click();
    const quiet = await rowIds(page);
    expect(quiet.length).toBeGreaterThan(1);
    const [first, second] = quiet.map((id) => fixture.report.wirings.find((w) => w.id === id));
    if (!first || !second) throw new Error('no quiet wirings');
    expect(first.humCancelling && second.humCancelling).toBe(true);
    await expect.poll(() => page.locator(`tr[data-wiring="${first.id}"] td.hum`).textContent()).toContain('quiet');
    await page.locator(`tr[data-wiring="${first.id}"] [data-action="play"]`).click();
    await waitForSound(page, first.id);
    await page.waitForTimeout(150);
    const one = await heard(page);
    await page.locator(`tr[data-wiring="${second.id}"] [data-action="play"]`).click();
    await waitForSound(page, second.id);
    await page.waitForTimeout(150);
    const two = await heard(page);
    expect(Math.abs(two.rmsDb - one.rmsDb)).toBeLessThan(0.5);
    expect(Math.abs(two.clockOffsetS - one.clockOffsetS)).toBeLessThan(0.05);
    // The brighter one (higher centroid in report.json) has the longer brightness bar.
    const bar = (id: string) => page.locator(`tr[data-wiring="${id}"] .bar-fill`).getAttribute('width').then(Number);
    const [barOne, barTwo] = [await bar(first.id), await bar(second.id)];
    if (first.centroidHz !== second.centroidHz) expect(Math.sign(barTwo - barOne)).toBe(Math.sign(second.centroidHz - first.centroidHz));
  });

  it('sorts by brightness in the order of report.json, both ways', async () => {
    const page = await open();
    const byCentroid = [...fixture.report.wirings].sort((a, b) => a.centroidHz - b.centroidHz || a.number - b.number).map((w) => w.id);
    await page.locator('[data-sort="brightness"]').click();
    expect(await rowIds(page)).toEqual(byCentroid);
    expect(await page.locator('th.col-brightness').getAttribute('aria-sort')).toBe('ascending');
    await page.locator('[data-sort="brightness"]').click();
    const descending = [...fixture.report.wirings].sort((a, b) => b.centroidHz - a.centroidHz || a.number - b.number).map((w) => w.id);
    expect(await rowIds(page)).toEqual(descending);
    expect(await page.locator('th.col-brightness').getAttribute('aria-sort')).toBe('descending');
  });

  it('filters: quiet only, coils used, topology and phase', async () => {
    const page = await open();
    const wirings = fixture.report.wirings;
    await page.locator('[data-action="quiet-only"]').click();
    expect(await rowIds(page)).toEqual(wirings.filter((w) => w.humCancelling).map((w) => w.id));
    await page.locator('[data-action="reset-filters"]').click();
    await page.locator('[data-filter-coil="mid"]').selectOption('unused');
    await page.locator('#filter-topology').selectOption('parallel');
    await page.locator('#filter-phase').selectOption('out');
    expect(await rowIds(page)).toEqual(
      wirings.filter((w) => !w.coils.includes('mid') && w.topology === 'parallel' && w.outOfPhase.length > 0).map((w) => w.id),
    );
    expect(await page.locator('#shown-count').textContent()).toMatch(/^Showing \d+ of 47$/u);
  });

  it('runs ten blind trials by clicking, with the score and the guessing probability', async () => {
    const page = await open();
    await page.locator('#abx-a').selectOption('w1');
    await page.locator('#abx-b').selectOption('w3');
    await page.locator('[data-action="abx-start"]').click();
    await page.locator('[data-action="abx-play-x"]').click();
    await waitForSound(page, (await page.evaluate(() => (window as unknown as { coilbenchPage: { currentId(): string } }).coilbenchPage.currentId())));
    // Labels are hidden while the test runs.
    expect(await page.locator('#now-label').textContent()).toBe('Blind test · playing X');
    expect(await page.locator('tr[aria-current]').count()).toBe(0);
    for (let trial = 0; trial < 10; trial += 1) {
      await page.locator(`[data-action="abx-play-${trial % 2 === 0 ? 'a' : 'x'}"]`).click();
      await page.locator(`[data-action="abx-answer-${trial % 3 === 0 ? 'b' : 'a'}"]`).click();
    }
    const score = page.locator('#abx-score');
    expect(await score.getAttribute('data-trials')).toBe('10');
    const correct = Number(await score.getAttribute('data-correct'));
    expect(Number(await score.getAttribute('data-probability'))).toBeCloseTo(exactTail(correct, 10), 12);
    expect(await score.textContent()).toContain(`${correct} of 10 right`);
    await page.locator('[data-action="abx-end"]').click();
    expect(await page.locator('#abx-log li').count()).toBe(10);
    expect(await page.locator('#abx-log li.right').count()).toBe(correct);
  });

  it('works from the keyboard: Space plays and pauses, arrows move between wirings', async () => {
    const page = await open();
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press(' ');
    await waitForSound(page, 'w1');
    await page.keyboard.press('ArrowDown');
    await waitForSound(page, 'w2');
    await page.keyboard.press('ArrowDown');
    await waitForSound(page, 'w3');
    await page.keyboard.press('ArrowUp');
    await waitForSound(page, 'w2');
    expect(await page.evaluate(() => document.activeElement?.closest('tr')?.getAttribute('data-wiring'))).toBe('w2');
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press(' ');
    await expect.poll(() => page.evaluate(() => (window as unknown as { coilbenchPage: { isPlaying(): boolean } }).coilbenchPage.isPlaying())).toBe(false);
    // Every control has a name.
    const unnamed = await page.$$eval('button, input, select', (controls) =>
      controls.filter((control) => {
        const element = control as HTMLElement;
        const label = element.getAttribute('aria-label') ?? (element as HTMLInputElement).labels?.[0]?.textContent ?? element.textContent ?? '';
        return label.trim() === '';
      }).map((control) => control.outerHTML.slice(0, 80)),
    );
    expect(unnamed).toEqual([]);
  });

  it('loops a region', async () => {
    const page = await open();
    await page.locator('#loop-start').fill('0.5');
    await page.locator('#loop-start').dispatchEvent('change');
    await page.locator('#loop-end').fill('1.2');
    await page.locator('#loop-end').dispatchEvent('change');
    await page.locator('#loop-on').check();
    await page.locator('tr[data-wiring="w5"] [data-action="play"]').click();
    await waitForSound(page, 'w5');
    await page.waitForTimeout(1600);
    const now = await heard(page, 3);
    expect(now.position).toBeGreaterThanOrEqual(0.5);
    expect(now.position).toBeLessThan(1.2);
    const heardPosition = now.position - 0.5 * (4096 / 48000) + now.offsetS;
    expect(heardPosition).toBeGreaterThan(0.35);
    expect(heardPosition).toBeLessThan(1.25);
  });

  it('seeks with the position slider, follows the volume control and stops at the end', async () => {
    const page = await open();
    await page.locator('tr[data-wiring="w4"] [data-action="play"]').click();
    await waitForSound(page, 'w4');
    const seekStarted = Date.now();
    await page.locator('#scrub').fill('1.5');
    await page.waitForTimeout(200);
    const sought = await heard(page);
    const elapsedS = (Date.now() - seekStarted) / 1000;
    expect(sought.position).toBeGreaterThan(1.5);
    expect(sought.position).toBeLessThan(1.5 + elapsedS);
    expect(Math.abs(sought.offsetS)).toBeLessThan(0.03);
    // Volume 0.3 → 0.15 halves the signal: −6.02 dB (20·log10 ½).
    await page.locator('#volume').fill('0.15');
    await page.waitForTimeout(150);
    const quieter = await heard(page);
    expect(quieter.rmsDb - sought.rmsDb).toBeCloseTo(20 * Math.log10(0.5), 0);
    await page.locator('#scrub').fill('2.8');
    await expect.poll(() => page.evaluate(() => (window as unknown as { coilbenchPage: { isPlaying(): boolean } }).coilbenchPage.isPlaying())).toBe(false);
    expect(await page.evaluate(() => (window as unknown as { coilbenchPage: { position(): number } }).coilbenchPage.position())).toBe(0);
    expect(await page.locator('#transport-play').getAttribute('aria-label')).toBe('Play');
  });

  it('overlays frequency responses with peaks and shows values on hover', async () => {
    const page = await open();
    await page.locator('tr[data-wiring="w12"] [data-action="compare"]').check();
    const plotted = fixture.report.wirings.filter((w) => w.topology === 'single').length + 1;
    expect(await page.locator('#response-plot polyline.curve').count()).toBe(plotted);
    expect(await page.locator('#response-plot .peak-marker').count()).toBe(
      fixture.report.wirings.filter((w) => (w.topology === 'single' || w.id === 'w12') && w.resonanceHz !== null).length,
    );
    const box = await page.locator('#response-plot').boundingBox();
    if (!box) throw new Error('no plot');
    await page.mouse.move(box.x + box.width * 0.6, box.y + box.height / 2);
    expect(await page.locator('#plot-readout').textContent()).toMatch(/^At [\d.]+ k?Hz: w1 [+−]?[\d.]+ dB/u);
    await page.locator('#response-plot .peak-marker').first().focus();
    expect(await page.locator('#plot-readout').textContent()).toContain('resonant peak');
  });

  it('says so when the audio file of a wiring is missing, and keeps working', async () => {
    const missing = buildListeningFixture({ elementIds: ['neck', 'bridge'] });
    try {
      rmSync(join(missing.dir, 'wav', 'w2.wav.js'));
      const page = await open(missing);
      await page.locator('tr[data-wiring="w2"] [data-action="play"]').click();
      await expect.poll(() => page.locator('#now-detail').textContent()).toContain('wav/w2.wav.js is missing beside this page');
      await page.locator('tr[data-wiring="w1"] [data-action="play"]').click();
      await waitForSound(page, 'w1');
      // The browser itself reports the missing file, once; nothing else may go wrong.
      expect(problems).toEqual(['error: Failed to load resource: net::ERR_FILE_NOT_FOUND']);
      problems = [];
    } finally {
      missing.remove();
    }
  });

  it('shows a hostile guitar name as text and runs none of it', async () => {
    const hostile = buildListeningFixture({ name: HOSTILE_NAME, notes: HOSTILE_NAME, elementIds: ['neck', 'mid"><img src=x onerror="window.__pwned = 3">'], withAudio: false });
    try {
      const page = await open(hostile);
      expect(await page.locator('#guitar-name').textContent()).toBe(HOSTILE_NAME);
      expect(await page.title()).toContain(HOSTILE_NAME);
      expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
      expect(await page.locator('img').count()).toBe(0);
      expect(await page.locator('tr[data-wiring]').count()).toBe(6);
    } finally {
      hostile.remove();
    }
  });

  it('stays usable with 572 wirings', async () => {
    const large = buildListeningFixture({ elementIds: ['neck', 'neck-inner', 'bridge-inner', 'bridge'], withAudio: false });
    try {
      const started = Date.now();
      const page = await open(large);
      expect(await page.locator('tr[data-wiring]').count()).toBe(572);
      const loaded = Date.now() - started;
      const sortStarted = Date.now();
      await page.locator('[data-sort="brightness"]').click();
      const ids = await rowIds(page);
      const sorted = Date.now() - sortStarted;
      expect(ids).toEqual([...large.report.wirings].sort((a, b) => a.centroidHz - b.centroidHz || a.number - b.number).map((w) => w.id));
      await page.locator('[data-action="quiet-only"]').click();
      expect((await rowIds(page)).length).toBe(large.report.wirings.filter((w) => w.humCancelling).length);
      expect(await page.locator('#abx-a option').count()).toBe(572);
      console.log(`572 wirings: page open ${loaded} ms, sort by brightness ${sorted} ms`);
    } finally {
      large.remove();
    }
  });
});
