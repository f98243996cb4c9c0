/**
 * The audio figures from the coils' cross-spectra (src/analysis/
 * measure-audio-figures.ts) against each wiring's own render of the
 * reference phrase, measured sample by sample (measureEnergy,
 * measureLoudness, measureCentroid: docs/design.md's definitions applied to
 * the render), and the loudness against an outside reference, ebur128-wasm
 * (npm, the Rust ebur128 crate: an ITU-R BS.1770 implementation), on the
 * same renders. The centroid's outside check is measureCentroid's own
 * against meyda (src/analysis/measure-centroid.test.ts): meyda cannot take a
 * whole render as one frame (it builds its 2^17-point buffers with
 * Array.apply, which overflows the stack).
 *
 * Bounds (measured on the samples: level 9e-5 dB, loudness 1.2e-3 LU,
 * centroid 0.033 % at worst): level 0.001 dB, loudness 0.01 LU, centroid
 * 0.1 %. What separates the two routes is the circuit's impulse response at
 * the edges of the gating blocks and of the Hann window, and the linear
 * interpolation of the transfers between grid points.
 */
import { describe, expect, it } from 'vitest';
import { measureCentroid, measureEnergy, measureLoudness, measureSpectralBasis } from '../src/analysis/index.js';
import { phaseClassKey } from '../src/circuit/index.js';
import { parseGuitarText } from '../src/guitar/index.js';
import { measureReferenceFigures, prepareReferenceFigures, prepareReferenceSynthesis, renderReferenceCoils } from '../src/render/measure-wiring-audio.js';
import { measureFiguresOnThread } from '../src/render/measure-figures-on-thread.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { referenceLoudness } from './support/ebur128-reference.js';

const LEVEL_DB = 0.001;
const LOUDNESS_LU = 0.01;
const CENTROID_FRACTION = 0.001;
/** The render test's bound for our BS.1770 against ebur128-wasm (test/render.test.ts). */
const REFERENCE_LOUDNESS_LU = 0.1;
const RATE_HZ = 48_000;

function loadSample(name: string) {
  const path = join(import.meta.dirname, '..', 'samples', name);
  return parseGuitarText(readFileSync(path, 'utf8'), path);
}

/** Every wiring's figures both ways; `every` picks every n-th wiring of the enumeration. */
function compare(sample: string, every: number) {
  const guitar = loadSample(sample);
  const coils = renderReferenceCoils(guitar);
  const meter = prepareReferenceFigures(guitar, {}, coils);
  const synthesis = prepareReferenceSynthesis(guitar, {}, coils);
  const wirings = enumerateWirings(guitar.elements).filter((_, index) => index % every === 0);
  const worst = { levelDb: 0, loudnessLu: 0, centroid: 0 };
  const renders: { samples: Float32Array; loudnessLufs: number; centroidHz: number }[] = [];
  // Phase classes together (the meter's cache), as every caller takes them.
  const ordered = [...wirings].sort((a, b) => (phaseClassKey(guitar, a.network) < phaseClassKey(guitar, b.network) ? -1 : 1));
  for (const wiring of ordered) {
    const figures = meter.measure(wiring.network);
    const samples = synthesis.synthesize(wiring.network);
    worst.levelDb = Math.max(worst.levelDb, Math.abs(10 * Math.log10(figures.energy / measureEnergy(samples))));
    worst.loudnessLu = Math.max(worst.loudnessLu, Math.abs(figures.loudnessLufs - measureLoudness([samples], RATE_HZ)));
    const centroidHz = measureCentroid(samples, RATE_HZ);
    worst.centroid = Math.max(worst.centroid, Math.abs(figures.centroidHz / centroidHz - 1));
    renders.push({ samples, loudnessLufs: figures.loudnessLufs, centroidHz: figures.centroidHz });
  }
  return { worst, renders, count: wirings.length };
}

describe('audio figures from cross-spectra', () => {
  it('match the three-coil renders, every wiring: level, BS.1770 loudness, centroid', () => {
    const { worst, count } = compare('three-single-coil.json', 1);
    console.info(`${count} wirings: level ${worst.levelDb.toExponential(1)} dB, loudness ${worst.loudnessLu.toExponential(1)} LU, centroid ${(worst.centroid * 100).toExponential(1)} %`);
    expect(count).toBe(47);
    expect(worst.levelDb).toBeLessThan(LEVEL_DB);
    expect(worst.loudnessLu).toBeLessThan(LOUDNESS_LU);
    expect(worst.centroid).toBeLessThan(CENTROID_FRACTION);
  });

  it('match the renders of a guitar with a coupled humbucker (every ninth of 572 wirings), and ebur128-wasm on them', () => {
    const { worst, renders, count } = compare('humbucker-two-single-coil.json', 9);
    console.info(`${count} wirings: level ${worst.levelDb.toExponential(1)} dB, loudness ${worst.loudnessLu.toExponential(1)} LU, centroid ${(worst.centroid * 100).toExponential(1)} %`);
    expect(worst.levelDb).toBeLessThan(LEVEL_DB);
    expect(worst.loudnessLu).toBeLessThan(LOUDNESS_LU);
    expect(worst.centroid).toBeLessThan(CENTROID_FRACTION);

    // Outside references on a few of the same renders.
    const picked = renders.filter((_, index) => index % 8 === 0);
    const reference = referenceLoudness(picked.map((render) => ({ sampleRateHz: RATE_HZ, channels: [render.samples] })));
    picked.forEach((render, index) => expect(Math.abs(render.loudnessLufs - (reference[index] as number))).toBeLessThan(REFERENCE_LOUDNESS_LU));
  });

  it('are the same numbers, to the last bit, on a worker thread, one by one and phase class by phase class', async () => {
    const guitar = loadSample('humbucker-two-single-coil.json');
    const wirings = enumerateWirings(guitar.elements).filter((_, index) => index % 11 === 0);
    const here = measureReferenceFigures(guitar, wirings, {});
    const meter = prepareReferenceFigures(guitar, {});
    const oneByOne = new Map(wirings.map((wiring) => [wiring.id, meter.measure(wiring.network)]));
    let steps = 0;
    const pending = measureFiguresOnThread(guitar, wirings, {}, () => (steps += 1));
    // The thread measures from this thread's basis (its coil spectra), not from strings rendered there.
    pending.start(measureSpectralBasis(guitar));
    const there = await pending.result();
    expect(steps).toBeGreaterThan(0);
    expect([...there.entries()]).toEqual([...here.entries()].sort((a, b) => wirings.findIndex((w) => w.id === a[0]) - wirings.findIndex((w) => w.id === b[0])));
    for (const [id, figures] of here) expect(oneByOne.get(id)).toEqual(figures);

    // The caller helping: it takes the classes the thread has not reached (here nearly all, the thread still
    // preparing), and the merged figures are the same numbers, each wiring where it belongs.
    let helped = 0;
    const shared = measureFiguresOnThread(guitar, wirings, {}, (done) => (helped = done));
    const basis = measureSpectralBasis(guitar);
    shared.start(basis);
    await shared.help(basis, async () => undefined, 0);
    const merged = await shared.result();
    expect(helped).toBe(wirings.length);
    expect([...merged.entries()]).toEqual([...there.entries()]);
  });
});
