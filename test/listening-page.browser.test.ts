/**
 * The listening page in Debian's chromium, opened from file:// as a user
 * would: one engine, two hosts. The page synthesises every wiring from the
 * coil signals it carries with the very modules the command line runs; here
 * its audio, captured through its own OfflineAudioContext chain, is compared
 * with the Node render of the same wiring and knobs:
 * - direct: residual below −90 dB relative to the signal, every wiring of
 *   the three-coil (47) and four-coil (572) samples;
 * - clean (the same biquads in another Web Audio implementation) and
 *   compressed (our own compressor, the same code in both hosts, then those
 *   biquads): below −40 dB;
 * - drive and compressed: loudness within 0.5 LU and centroid within 2 %
 *   (drive: another implementation of the oversampled WaveShaperNode);
 * - knob changes (volume, tone, tone capacitor, cable) against the Node
 *   render with the same what-ifs: the same bounds;
 * - level matching checked with an outside meter (ebur128-wasm, the Rust
 *   port of libebur128, ITU-R BS.1770): every matched render within 0.5 LU;
 * - switching keeps the position, hostile names stay text, no request leaves
 *   the folder, no console error.
 * The phrase is a strum with a short ring-out at 22.05 kHz so that 572
 * wirings' audio crosses from the browser in a few seconds.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { measureCentroid, measureLoudness } from '../src/analysis/index.js';
import { type Guitar, parseGuitar } from '../src/guitar/index.js';
import { decodeSignal, describePeak, formatDb } from '../src/page/index.js';
import { guitarWithKnobs, overridesOf, type Knobs } from '../src/page/wiring-engine.js';
import { type ChainName, prepareWiringSynthesis, renderEffectsChain } from '../src/render/index.js';
import { renderPageFor } from '../src/render/write-listening-page.js';
import { builtInPhrase } from '../src/string/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { CHROMIUM, INSTALL_HINT, RUN_BROWSER_TESTS, type WatchedPage, launchChromium, openFolderPage } from './support/browser.js';
import { makeExampleReport } from './support/example-report.js';
import { referenceLoudness } from './support/ebur128-reference.js';
import { residualDb } from './support/tone-measures.js';
import { maxOf, minOf } from '../src/math/index.js';

const SAMPLE_RATE_HZ = 22050;
const TAIL_S = 0.6;
const SEED = 1;
const HOSTILE = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';
/** Bounds from the checks above (dB, LU, fraction). */
const DIRECT_RESIDUAL_DB = -90;
const CLEAN_RESIDUAL_DB = -40;
const LOUDNESS_LU = 0.5;
const CENTROID_FRACTION = 0.02;
/** Largest jump of the position at a switch, s. */
const SWITCH_TOLERANCE_S = 0.05;

/** COILBENCH_FULL_PAGE_TESTS=1 checks all 572 four-coil wirings (about a minute more); by default every eighth. */
const FULL = process.env['COILBENCH_FULL_PAGE_TESTS'] === '1';
const FOUR_COIL_STRIDE = 8;

if (!RUN_BROWSER_TESTS) console.warn(`listening page browser tests skipped: ${CHROMIUM} not found (${INSTALL_HINT})`);

interface PageRender {
  samples: string;
  loudnessLufs: number;
  centroidHz: number;
  peak: number;
  matchedGainDb: number;
}


function readSample(name: string, rename?: string): Guitar {
  const raw = JSON.parse(readFileSync(join(import.meta.dirname, '..', 'samples', name), 'utf8')) as Record<string, unknown>;
  return parseGuitar(rename ? { ...raw, name: rename } : raw);
}

async function openPage(browser: Browser, work: string, guitar: Guitar): Promise<WatchedPage> {
  const folder = mkdtempSync(join(work, 'page-'));
  const report = makeExampleReport(guitar.elements.map((element) => element.id), guitar.name);
  const html = renderPageFor(report, { guitar, phrase: builtInPhrase('strum', guitar.strings.length), sampleRateHz: SAMPLE_RATE_HZ, seed: SEED, overrides: {}, hum: null, tailS: TAIL_S });
  writeFileSync(join(folder, 'index.html'), html);
  const watched = await openFolderPage(browser, folder);
  await watched.page.waitForFunction(() => 'coilbenchPage' in window);
  return watched;
}

async function renderInPage(watched: WatchedPage, expressions: readonly string[], changes: Partial<Knobs> = {}): Promise<PageRender[]> {
  return watched.page.evaluate(
    async ({ list, knobs }) => {
      const view = (window as unknown as { coilbenchPage: { render(expression: string, changes: object): Promise<PageRender> } }).coilbenchPage;
      const results: PageRender[] = [];
      for (const expression of list) results.push(await view.render(expression, knobs));
      return results;
    },
    { list: [...expressions], knobs: changes },
  );
}

function nodeDirect(guitar: Guitar, knobs: Partial<Knobs> = {}): (expression: string) => Float32Array {
  const base: Knobs = {
    volumeSetting: guitar.controls.volume.setting,
    toneSetting: guitar.controls.tone?.setting ?? null,
    toneCapacitorF: guitar.controls.tone?.capacitorF ?? null,
    cableCapacitanceF: guitar.cable.capacitanceF,
    chain: 'direct',
    ...knobs,
  };
  const synthesis = prepareWiringSynthesis(guitarWithKnobs(guitar, base), builtInPhrase('strum', guitar.strings.length), {
    sampleRateHz: SAMPLE_RATE_HZ,
    seed: SEED,
    overrides: overridesOf(base, {}),
    strings: { tailS: TAIL_S },
  });
  const byExpression = new Map(enumerateWirings(guitar.elements).map((wiring) => [wiring.expression, wiring]));
  return (expression) => synthesis.synthesize((byExpression.get(expression) ?? (() => { throw new Error(expression); })()).network);
}

describe.skipIf(!RUN_BROWSER_TESTS)('the listening page in chromium: one engine, two hosts', () => {
  let work = '';
  let browser: Browser;
  let three: WatchedPage;
  const guitar = readSample('three-single-coil.json', HOSTILE);
  const expressions = enumerateWirings(guitar.elements).map((wiring) => wiring.expression);

  beforeAll(async () => {
    work = mkdtempSync(join(tmpdir(), 'coilbench-page-'));
    browser = await launchChromium();
    three = await openPage(browser, work, guitar);
  });

  afterAll(async () => {
    await browser?.close();
    rmSync(work, { recursive: true, force: true });
  });

  it('direct: every one of 47 wirings matches the Node render below −90 dB', async () => {
    const rendered = await renderInPage(three, expressions);
    const node = nodeDirect(guitar);
    const residuals = expressions.map((expression, index) => residualDb(node(expression), decodeSignal((rendered[index] as PageRender).samples)));
    console.info(`direct, 47 wirings: worst residual ${maxOf(residuals).toFixed(1)} dB`);
    expect(maxOf(residuals)).toBeLessThan(DIRECT_RESIDUAL_DB);
  });

  it('clean and compressed below −40 dB; drive and compressed within 0.5 LU and 2 % centroid, every wiring', async () => {
    const node = nodeDirect(guitar);
    const worst: Record<string, number> = {};
    for (const chain of ['clean', 'drive', 'compressed'] as ChainName[]) {
      const rendered = await renderInPage(three, expressions, { chain });
      let worstResidual = -Infinity;
      let worstLoudness = 0;
      let worstCentroid = 0;
      for (const [index, expression] of expressions.entries()) {
        const page = decodeSignal((rendered[index] as PageRender).samples);
        const reference = await renderEffectsChain(node(expression), SAMPLE_RATE_HZ, chain);
        if (chain !== 'drive') worstResidual = Math.max(worstResidual, residualDb(reference, page));
        worstLoudness = Math.max(worstLoudness, Math.abs(measureLoudness([reference], SAMPLE_RATE_HZ) - measureLoudness([page], SAMPLE_RATE_HZ)));
        const centroid = measureCentroid(reference, SAMPLE_RATE_HZ);
        worstCentroid = Math.max(worstCentroid, Math.abs(measureCentroid(page, SAMPLE_RATE_HZ) - centroid) / centroid);
      }
      worst[chain] = worstResidual;
      console.info(`${chain}: ${chain === 'drive' ? '' : `worst residual ${worstResidual.toFixed(1)} dB, `}loudness ${worstLoudness.toFixed(4)} LU, centroid ${(worstCentroid * 100).toFixed(3)} %`);
      if (chain !== 'drive') expect(worstResidual).toBeLessThan(CLEAN_RESIDUAL_DB);
      expect(worstLoudness).toBeLessThan(LOUDNESS_LU);
      expect(worstCentroid).toBeLessThan(CENTROID_FRACTION);
    }
  });

  it('the drive chain rendered in parts at once gives the single render\'s samples, bit for bit', async () => {
    // Every eighth wiring, and through the compressed chain too (no graph part: the parts must not change it either).
    const picks = expressions.filter((_, index) => index % 8 === 0);
    for (const chain of ['drive', 'compressed'] as ChainName[]) {
      const [whole, halves, thirds] = await three.page.evaluate(
        async ({ list, chain }) => {
          const view = (window as unknown as { coilbenchPage: { chainInParts(expression: string, chain: string, parts: number): Promise<string> } }).coilbenchPage;
          const all = async (parts: number): Promise<string[]> => {
            const out: string[] = [];
            for (const expression of list) out.push(await view.chainInParts(expression, chain, parts));
            return out;
          };
          return [await all(1), await all(2), await all(3)];
        },
        { list: picks, chain },
      );
      expect(halves).toEqual(whole);
      expect(thirds).toEqual(whole);
    }
  });

  it('knobs (volume, tone, tone capacitor, cable) match the Node render with the same what-ifs', async () => {
    const changes: Partial<Knobs> = { volumeSetting: 6, toneSetting: 3, toneCapacitorF: 47e-9, cableCapacitanceF: 1.2e-9 };
    const rendered = await renderInPage(three, expressions, changes);
    const node = nodeDirect(guitar, changes);
    const residuals = expressions.map((expression, index) => residualDb(node(expression), decodeSignal((rendered[index] as PageRender).samples)));
    console.info(`knobs changed, direct: worst residual ${maxOf(residuals).toFixed(1)} dB`);
    expect(maxOf(residuals)).toBeLessThan(DIRECT_RESIDUAL_DB);
    // The knobs really change the sound (the test could fail): tone at 3 with 47 nF is darker than the render's settings.
    const plain = await renderInPage(three, [expressions[0] as string]);
    expect((rendered[0] as PageRender).centroidHz).toBeLessThan((plain[0] as PageRender).centroidHz);
  });

  it('level matching holds within 0.5 LU on clean, drive and compressed, by an outside meter (ebur128-wasm)', async () => {
    const some = expressions.filter((_, index) => index % 4 === 0);
    const cases = [];
    for (const chain of ['clean', 'drive', 'compressed'] as ChainName[]) {
      const rendered = await renderInPage(three, some, { chain });
      for (const render of rendered) {
        const gain = 10 ** (render.matchedGainDb / 20);
        cases.push({ sampleRateHz: SAMPLE_RATE_HZ, channels: [decodeSignal(render.samples).map((sample) => sample * gain)] });
      }
    }
    const loudness = referenceLoudness(cases);
    const spread = maxOf(loudness) - minOf(loudness);
    console.info(`level matched, ${loudness.length} renders over three chains: spread ${spread.toFixed(3)} LU (ebur128-wasm)`);
    expect(spread).toBeLessThan(LOUDNESS_LU);
  });

  it('switching while playing keeps the position; names stay text; nothing leaves the folder; no console error', async () => {
    const { page, problems, outside } = three;
    await page.click('[data-wiring="w1"] [data-action="play"]');
    await page.waitForFunction(() => (window as unknown as { coilbenchPage: { isPlaying(): boolean } }).coilbenchPage.isPlaying());
    await page.waitForTimeout(300);
    const jump = await page.evaluate(async () => {
      const view = (window as unknown as { coilbenchPage: { position(): number; audioClock(): number; currentExpression(): string | null; soundingKeys(): string[] } }).coilbenchPage;
      const before = view.position();
      const started = view.audioClock();
      (document.querySelector('[data-wiring="w2"] [data-action="play"]') as HTMLButtonElement).click();
      while (!view.soundingKeys().some((key) => key.startsWith(`${view.currentExpression()}@`)) || view.soundingKeys().length !== 1) await new Promise((resolve) => setTimeout(resolve, 5));
      const after = view.position();
      const elapsed = view.audioClock() - started;
      return { before, after, elapsed };
    });
    // The position runs on through the switch as the audio clock does (loop is on; the phrase is longer than the wait).
    // The audio clock, not the wall clock: on a loaded machine the audio thread can stall for part of a second
    // (seen once in a full test run: 0.70 s), and the position rightly stalls with it.
    expect(Math.abs(jump.after - jump.before - jump.elapsed)).toBeLessThan(SWITCH_TOLERANCE_S + 0.02);
    // The rows show the figures the page carries as columns (wiring-figures.ts): level and resonant peak of the report.
    const example = makeExampleReport(guitar.elements.map((element) => element.id), guitar.name);
    for (const id of ['w1', 'w5']) {
      const figures = example.wirings.find((wiring) => wiring.id === id);
      const text = (await page.locator(`.wiring-row[data-wiring="${id}"]`).textContent()) ?? '';
      expect(text).toContain(formatDb(figures?.levelDb ?? Number.NaN));
      expect(text).toContain(describePeak(figures?.resonanceHz ?? null, figures?.peakDb ?? null));
    }
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    expect(await page.locator('#guitar-name').textContent()).toBe(HOSTILE);
    expect(outside).toEqual([]);
    // The page compiles its WebAssembly FFT kernels under its own policy ('wasm-unsafe-eval'), with no refusal logged.
    expect(await page.evaluate(() => (window as unknown as { coilbenchPage: { fftKernels(): string } }).coilbenchPage.fftKernels())).toBe('webassembly');
    expect(problems).toEqual([]);
  });

  it(`${FULL ? 'every' : 'every eighth'} wiring of a four-coil guitar (572): direct below −90 dB`, { timeout: 180_000 }, async () => {
    const four = readSample('two-humbucker.json');
    const every = enumerateWirings(four.elements).map((wiring) => wiring.expression);
    expect(every.length).toBe(572);
    const all = FULL ? every : every.filter((_, index) => index % FOUR_COIL_STRIDE === 0);
    const watched = await openPage(browser, work, four);
    const node = nodeDirect(four);
    let worst = -Infinity;
    const BATCH = 64;
    for (let start = 0; start < all.length; start += BATCH) {
      const batch = all.slice(start, start + BATCH);
      const rendered = await watched.page.evaluate(
        (list) => list.map((expression) => (window as unknown as { coilbenchPage: { direct(expression: string): string } }).coilbenchPage.direct(expression)),
        batch,
      );
      batch.forEach((expression, index) => {
        worst = Math.max(worst, residualDb(node(expression), decodeSignal(rendered[index] as string)));
      });
    }
    console.info(`direct, ${all.length} of 572 wirings: worst residual ${worst.toFixed(1)} dB`);
    expect(worst).toBeLessThan(DIRECT_RESIDUAL_DB);
    expect(watched.problems).toEqual([]);
    expect(watched.outside).toEqual([]);
  });
});
