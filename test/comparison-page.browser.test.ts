/**
 * `coilbench compare --render` end to end: two sets rendered beside a
 * comparison page, opened from file:// in Debian's chromium as a user would.
 * The page sounds both sets live from their coil signals (the bundled
 * engine, src/page/comparison-main.ts). It must switch between the sets while
 * playing at the same place in the phrase, play every set at matched level
 * (checked with an outside meter: ebur128-wasm, the Rust port of libebur128,
 * ITU-R BS.1770), run the blind test between them, turn the knobs (the
 * listening page's: volume, tone, tone capacitor, cable, chain) on every set
 * while playing, with each set's sound at the new knobs equal to the Node
 * synthesis from the same coil signals with the same what-ifs (residual
 * below −90 dB, as for the listening page), keep hostile names inert, and
 * make no request outside its folder and no console error.
 */
import { maxOf, minOf } from '../src/math/index.js';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { type ComparisonPageData, decodeSignal } from '../src/page/index.js';
import { guitarWithKnobs, overridesOf, type Knobs } from '../src/page/wiring-engine.js';
import { coilSpectraOfSignals, createWiringSynthesis } from '../src/render/portable/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import type { ComparisonReport } from '../src/report/index.js';
import { CHROMIUM, INSTALL_HINT, RUN_BROWSER_TESTS, launchChromium, openFolderPage } from './support/browser.js';
import { referenceLoudness } from './support/ebur128-reference.js';
import { residualDb } from './support/tone-measures.js';

const OUTPUT_DIR = join(import.meta.dirname, '..', 'test-output');
const samples = join(import.meta.dirname, '..', 'samples');
/** Largest jump of the playing position allowed when switching sets, s (as for the listening page). */
const SWITCH_TOLERANCE_S = 0.05;
/** Largest spread of matched loudness, LU (as for the listening page). */
const LOUDNESS_LU = 0.5;
/** Largest residual of a page render against the Node synthesis, dB relative to the signal (as for the listening page). */
const DIRECT_RESIDUAL_DB = -90;
const HOSTILE_NAME = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';


if (!RUN_BROWSER_TESTS) console.warn(`comparison page browser tests skipped: ${CHROMIUM} not found (${INSTALL_HINT})`);

interface ComparisonView {
  position(): number;
  isPlaying(): boolean;
  currentId(): string | null;
  soundingIds(): string[];
  soundingKeys(): string[];
  knobs(): Knobs;
  render(id: string): Promise<{ samples: string; sampleRateHz: number; loudnessLufs: number; matchedGainDb: number; trueGainDb: number }>;
}
type Rendered = Awaited<ReturnType<ComparisonView['render']>>;

describe.skipIf(!RUN_BROWSER_TESTS)('the comparison page in chromium (file://)', () => {
  let work = '';
  let folder = '';
  let report: ComparisonReport;
  let browser: Browser;
  let page: Page;
  let problems: string[] = [];
  let outside: string[] = [];

  beforeAll(async () => {
    work = mkdtempSync(join(tmpdir(), 'coilbench-compare-page-'));
    const guitar = JSON.parse(readFileSync(join(samples, 'two-lead-humbucker.json'), 'utf8')) as Record<string, unknown>;
    // A longer cable darkens and changes the level of every wiring on B (the level check could fail without matching).
    writeFileSync(join(work, 'candidate.json'), JSON.stringify({ ...guitar, name: `${HOSTILE_NAME} (invented)`, cable: { capacitance: '1500p' } }));
    folder = join(work, 'compared');
    const io = captureIo(work);
    const status = await main(['compare', join(samples, 'two-lead-humbucker.json'), 'candidate.json', '--render', '-o', folder, '--chain', 'direct'], io);
    expect(status, io.err()).toBe(0);
    report = JSON.parse(readFileSync(join(folder, 'comparison.json'), 'utf8')) as ComparisonReport;
    browser = await launchChromium();
    ({ page, problems, outside } = await openFolderPage(browser, folder));
    await page.waitForFunction(() => !(document.getElementById('transport-play') as HTMLButtonElement).disabled);
  });

  afterAll(async () => {
    await browser?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  /** Set a knob field as a listener does: its value, then an input event (range inputs cannot be typed into). */
  const setField = (id: string, value: string): Promise<void> =>
    page.evaluate(([field, text]) => {
      const input = document.getElementById(field) as HTMLInputElement;
      input.value = text;
      input.dispatchEvent(new Event('input', { bubbles: true }));
    }, [id, value] as const);

  const soundingIs = (id: string): Promise<unknown> =>
    page.waitForFunction((wanted) => (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison.soundingIds().join() === wanted, id);

  it('has one row per wiring with a button per set, biggest change first; no .wav.js copies', async () => {
    expect(report.rows).toHaveLength(6);
    expect(await page.locator('tr[data-row]').count()).toBe(6);
    expect(await page.locator('tr[data-row] [data-action="play-set"]').count()).toBe(12);
    const shown = await page.$$eval('tr[data-row]', (rows) => rows.map((row) => row.getAttribute('data-row')));
    expect(shown).toEqual(report.rows.map((row) => row.key));
    const { readdirSync } = await import('node:fs');
    expect(readdirSync(join(folder, 'a', 'wav')).filter((name) => name.endsWith('.js'))).toEqual([]);
  });

  it(`plays a wiring on A, switches to B at the same position (within ${SWITCH_TOLERANCE_S * 1000} ms), and back with the A key`, async () => {
    const row = report.rows[0];
    const [idA, idB] = [row?.entries[0] ?? '', row?.entries[1] ?? ''];
    await page.locator(`tr[data-row="${row?.key ?? ''}"] [data-action="play-set"][data-set="0"]`).click();
    await soundingIs(idA);
    await page.waitForTimeout(300);
    const jump = await page.evaluate(async ([key, wanted]) => {
      const view = (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison;
      const before = view.position();
      const started = performance.now();
      (document.querySelector(`tr[data-row="${key}"] [data-action="play-set"][data-set="1"]`) as HTMLButtonElement).click();
      while (view.soundingIds().join() !== wanted) await new Promise((resolve) => setTimeout(resolve, 5));
      return { before, after: view.position(), elapsed: (performance.now() - started) / 1000 };
    }, [row?.key ?? '', idB] as const);
    // The position runs on through the switch as the clock does (the phrase loops; it is longer than the wait).
    expect(Math.abs(jump.after - jump.before - jump.elapsed)).toBeLessThan(SWITCH_TOLERANCE_S);
    expect(await page.evaluate(() => (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison.isPlaying())).toBe(true);
    await page.locator('body').press('a');
    await soundingIs(idA);
    expect(await page.locator('#level-note').textContent()).toContain('Level matched');
  });

  it(`plays both sets at matched level within ${LOUDNESS_LU} LU, by an outside meter (ebur128-wasm); true level keeps B's difference`, async () => {
    const ids = report.rows.slice(0, 3).flatMap((row) => row.entries);
    const rendered = (await page.evaluate(
      (list) => Promise.all(list.map((id) => (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison.render(id))),
      ids,
    )) as Rendered[];
    const atGain = (render: Rendered, db: number) => ({ sampleRateHz: render.sampleRateHz, channels: [decodeSignal(render.samples).map((sample) => sample * 10 ** (db / 20))] });
    const matched = referenceLoudness(rendered.map((render) => atGain(render, render.matchedGainDb)));
    const spread = maxOf(matched) - minOf(matched);
    const trueLevel = referenceLoudness(rendered.map((render) => atGain(render, render.trueGainDb)));
    const trueSpread = maxOf(trueLevel) - minOf(trueLevel);
    console.info(`comparison page, ${rendered.length} renders on two sets: matched spread ${spread.toFixed(3)} LU, true-level spread ${trueSpread.toFixed(2)} LU (ebur128-wasm)`);
    expect(spread).toBeLessThan(LOUDNESS_LU);
    expect(trueSpread).toBeGreaterThan(LOUDNESS_LU); // the matching did something
  });

  it('turns the knobs on every set while playing: each set then sounds as the Node synthesis with the same what-ifs', async () => {
    const row = report.rows[2];
    const ids = row?.entries ?? [];
    await page.locator(`tr[data-row="${row?.key ?? ''}"] [data-action="play-set"][data-set="1"]`).click();
    await soundingIs(ids[1] ?? '');
    const before = await page.evaluate(() => (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison.soundingKeys().join());
    // Volume 6, tone 3, 47 nF, 1200 pF, as a listener sets them (input events on the fields).
    for (const [id, value] of [['knob-volume', '6'], ['knob-tone', '3'], ['knob-tone-capacitor', '47'], ['knob-cable', '1200']] as const) await setField(id, value);
    const knobs = await page.evaluate(() => (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison.knobs());
    expect(knobs).toMatchObject({ volumeSetting: 6, toneSetting: 3, cableCapacitanceF: 1.2e-9 });
    expect(knobs.toneCapacitorF).toBeCloseTo(47e-9, 20);
    // The sound at the new knobs replaces the old one on the same set while it plays (the crossfade keeps the place,
    // as the switching test above checks).
    await page.waitForFunction(
      ([wanted, old]) => {
        const view = (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison;
        const keys = view.soundingKeys();
        return keys.length === 1 && keys[0] !== old && view.soundingIds().join() === wanted && view.isPlaying();
      },
      [ids[1] ?? '', before] as const,
    );
    const rendered = (await page.evaluate(
      (list) => Promise.all(list.map((id) => (window as unknown as { coilbenchComparison: ComparisonView }).coilbenchComparison.render(id))),
      ids,
    )) as Rendered[];
    const html = readFileSync(join(folder, 'index.html'), 'utf8');
    const json = /<script type="application\/json" id="comparison-data">([\s\S]*?)<\/script>/.exec(html)?.[1] ?? '';
    const data = JSON.parse(json) as ComparisonPageData;
    const residuals = ids.map((id, index) => {
      const entry = report.entries.find((candidate) => candidate.id === id);
      const sound = data.sets[entry?.set ?? -1];
      if (!entry || !sound) throw new Error(`no entry ${id}`);
      const coils = { ...sound.coils, signals: sound.coils.signals.map(decodeSignal) };
      const spectra = { ...coils, spectra: coilSpectraOfSignals(coils) };
      const at: Knobs = { ...knobs, chain: 'direct' };
      const wiring = enumerateWirings(sound.guitar.elements).find((candidate) => candidate.id === entry.wiringId);
      if (!wiring) throw new Error(`no wiring ${entry.wiringId}`);
      const expected = createWiringSynthesis(guitarWithKnobs(sound.guitar, at), spectra, overridesOf(at, sound.overrides)).synthesize(wiring.network);
      const got = decodeSignal((rendered[index] as Rendered).samples);
      // The knobs really change the sound: the set's own settings give another signal (the check could fail).
      const own = createWiringSynthesis(sound.guitar, spectra, sound.overrides).synthesize(wiring.network);
      expect(residualDb(expected, own)).toBeGreaterThan(-20);
      return residualDb(expected, got);
    });
    console.info(`comparison page knobs (volume 6, tone 3, 47 nF, 1200 pF) on both sets: worst residual ${maxOf(residuals).toFixed(1)} dB`);
    expect(maxOf(residuals)).toBeLessThan(DIRECT_RESIDUAL_DB);
    // Back to the render's settings for the tests after this one.
    for (const [id, value] of [['knob-volume', '10'], ['knob-tone', '10'], ['knob-tone-capacitor', '22'], ['knob-cable', '500']] as const) await setField(id, value);
  });

  it('runs ten blind rounds between the sets of one wiring', async () => {
    const row = report.rows[1];
    await page.locator(`tr[data-row="${row?.key ?? ''}"] [data-action="blind-row"]`).click();
    expect(await page.locator('#blind-first').inputValue()).toBe(row?.entries[0]);
    expect(await page.locator('#blind-second').inputValue()).toBe(row?.entries[1]);
    await page.locator('[data-action="blind-start"]').click();
    for (let round = 0; round < 10; round += 1) {
      await page.locator('[data-action="blind-hear-mystery"]').click();
      await page.locator(`[data-action="blind-is-${round % 2 === 0 ? 'first' : 'second'}"]`).click();
    }
    expect(await page.locator('#blind-tally').getAttribute('data-rounds')).toBe('10');
    await page.locator('[data-action="blind-finish"]').click();
    expect(await page.locator('#blind-answers li').count()).toBe(10);
  });

  it('kept the hostile guitar name inert, made no console error and no request outside its folder; keeps a screenshot', async () => {
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    expect(await page.locator('.set-list').textContent()).toContain('<script>window.__pwned = 1</script>');
    await page.evaluate(() => window.scrollTo(0, 0));
    mkdirSync(OUTPUT_DIR, { recursive: true });
    await page.screenshot({ path: join(OUTPUT_DIR, 'comparison-page.png'), fullPage: false });
    expect(problems).toEqual([]);
    expect(outside).toEqual([]);
  });
});
