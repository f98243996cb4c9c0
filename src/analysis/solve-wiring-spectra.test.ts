import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { renderWiringsExactly, type ExactRenders } from '../../test/support/exact-wiring-renders.js';
import { fitLogRatios } from '../../test/support/log-ratio-fit.js';
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import { type Wiring, enumerateWirings } from '../wiring/index.js';
import { measureCentroid } from './measure-centroid.js';
import { measureSpectralBasis } from './measure-spectral-basis.js';
import { type WiringSpectra, solveWiringSpectra } from './solve-wiring-spectra.js';
import { maxOf } from '../math/index.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');
const sample = (file: string): Guitar => parseGuitarText(readFileSync(join(samples, file), 'utf8'), file);
const decibels = (ratio: number): number => 10 * Math.log10(ratio);

/** Exact levels: each wiring's per-bin energy over the mean of the single-element wirings'. */
function exactLevels(guitar: Guitar, wirings: readonly Wiring[], exact: ExactRenders): number[] {
  const singles = guitar.elements.map((element) => wirings.findIndex((wiring) => wiring.expression === element.id));
  const reference = singles.reduce((sum, index) => sum + (exact.energies[index] as number), 0) / singles.length;
  return exact.energies.map((energy) => decibels(energy / reference));
}

describe('solveWiringSpectra on the demo guitar (47 wirings)', () => {
  const guitar = sample('three-single-coil.json');
  const wirings = enumerateWirings(guitar.elements);
  let spectra: WiringSpectra;
  let exact: ExactRenders;
  beforeAll(() => {
    spectra = solveWiringSpectra(guitar, measureSpectralBasis(guitar), wirings);
    exact = renderWiringsExactly(guitar, wirings.map((wiring) => wiring.network));
  });

  it('gives every level within 0.05 dB of the exact per-bin sum Σ_k |Σ_i T_i·E_i|²', () => {
    const levels = exactLevels(guitar, wirings, exact);
    let worst = 0;
    wirings.forEach((wiring, w) => {
      worst = Math.max(worst, Math.abs((spectra.levelsDb[w] as number) - (levels[w] as number)));
    });
    // Measured: 0.002 dB at worst with 8 segments per ERB band (0.012 dB with 4).
    expect(worst).toBeLessThan(0.05);
  });

  it('puts the mean energy of the single coils at 0 dB', () => {
    const singles = [0, 1, 2].map((index) => 10 ** ((spectra.levelsDb[index] as number) / 10));
    expect(decibels(singles.reduce((a, b) => a + b) / 3)).toBeCloseTo(0, 10);
  });

  it('sums its band energies (and the outer segments) to the wiring energy', () => {
    for (let w = 0; w < spectra.count; w += 1) {
      let inBands = 0;
      for (let b = 0; b < spectra.bandCount; b += 1) inBands += spectra.bandEnergies[w * spectra.bandCount + b] as number;
      expect(inBands).toBeLessThanOrEqual((spectra.energies[w] as number) * (1 + 1e-12));
      expect(inBands / (spectra.energies[w] as number)).toBeGreaterThan(0.99);
    }
  });

  it('moves brightness with the render centroid: log ratios correlate ≥ 0.9, brightness moving about 1.4× as far', () => {
    // docs/design.md's centroidHz of each exact render (magnitude weighted, Hann window) against brightnessHz (power weighted).
    const centroids = exact.renders.map((render) => measureCentroid(render, exact.sampleRateHz));
    const { slope, correlation } = fitLogRatios(centroids, Array.from(spectra.brightnessHz));
    // Measured on this guitar: slope 1.43, correlation 0.95 with stiff strings (1.40 and 0.96 flexible; docs/distinctness.md).
    expect(correlation).toBeGreaterThan(0.9);
    expect(slope).toBeGreaterThan(1.2);
    expect(slope).toBeLessThan(1.7);
    // Power weighting leans to the strong partials. Where the magnitude falls with frequency, as it does for every
    // in-phase wiring, Chebyshev's sum inequality puts Σf·|X|²/Σ|X|² below Σf·|X|/Σ|X|: brightness below the
    // centroid (measured: at most 0.80 of it). Out-of-phase wirings whose lows cancel have a rising spectrum and
    // may sit above it (measured: up to 1.12×, (neck + bridge) // ~mid).
    wirings.forEach((wiring, w) => {
      if (!wiring.expression.includes('~')) expect(spectra.brightnessHz[w], wiring.expression).toBeLessThan(centroids[w] as number);
    });
  });
});

describe('solveWiringSpectra with two-lead pickups and knobs turned down', () => {
  it('matches the exact sum on a two-lead humbucker guitar, volume at 7 and tone at 3', () => {
    const guitar = sample('two-lead-humbucker.json');
    const wirings = enumerateWirings(guitar.elements);
    const overrides = { volumeSetting: 7, toneSetting: 3 };
    const spectra = solveWiringSpectra(guitar, measureSpectralBasis(guitar), wirings, overrides);
    const exact = renderWiringsExactly(guitar, wirings.map((wiring) => wiring.network), overrides, false);
    const levels = exactLevels(guitar, wirings, exact);
    wirings.forEach((wiring, w) => expect(Math.abs((spectra.levelsDb[w] as number) - (levels[w] as number)), wiring.expression).toBeLessThan(0.05));
  });

  it('reads silence at volume 0 as silent, floored levels and no brightness', () => {
    const guitar = sample('three-single-coil.json');
    const wirings = enumerateWirings(guitar.elements).slice(0, 5);
    const spectra = solveWiringSpectra(guitar, measureSpectralBasis(guitar), wirings, { volumeSetting: 0 });
    expect(spectra.silent).toBe(true);
    expect([...spectra.energies]).toEqual([0, 0, 0, 0, 0]);
    expect([...spectra.brightnessHz]).toEqual([0, 0, 0, 0, 0]);
    expect(maxOf(spectra.levelsDb)).toBe(-150);
  });
});
