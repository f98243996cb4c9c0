import { describe, expect, it } from 'vitest';
import { erbBandwidthHz, erbNumber, erbNumberToHz } from './erb-scale.js';

describe('ERB-number scale (Glasberg & Moore 1990)', () => {
  it('gives the published bandwidth ERB_N = 24.7·(4.37·F + 1)', () => {
    // Hand-worked from eq. 3 of Glasberg & Moore (1990): 24.7 × 5.37 at 1 kHz, 24.7 at 0 Hz.
    expect(erbBandwidthHz(1000)).toBeCloseTo(132.639, 3);
    expect(erbBandwidthHz(0)).toBeCloseTo(24.7, 12);
    expect(erbBandwidthHz(100)).toBeCloseTo(35.4939, 4);
  });

  it('matches the ERB-number of an outside implementation within its rounding of 21.4', () => {
    // MATLAB Audio Toolbox hz2erb documents erb = A·log10(1 + 0.00437·hz) with
    // A = 1000·ln(10)/(24.7·4.37) = 21.332…; Glasberg & Moore round A to 21.4.
    const matlabA = (1000 * Math.log(10)) / (24.7 * 4.37);
    for (const hz of [20, 100, 440, 1000, 5000, 20_000]) {
      const matlab = matlabA * Math.log10(1 + 0.00437 * hz);
      expect(erbNumber(hz) / matlab).toBeCloseTo(21.4 / matlabA, 12);
    }
    // 1 kHz sits near 15.6 on the scale, 20 kHz near 41.65 (derived from eq. 4).
    expect(erbNumber(1000)).toBeCloseTo(15.62, 2);
    expect(erbNumber(20_000)).toBeCloseTo(41.65, 2);
  });

  it('is the integral of 1/ERB: one ERB of frequency is about one unit', () => {
    for (const hz of [50, 300, 1000, 4000, 12_000]) {
      const width = erbBandwidthHz(hz);
      const span = erbNumber(hz + width / 2) - erbNumber(hz - width / 2);
      // exactly 1 with A = 21.332; 21.4 makes it 0.3 % larger
      expect(span).toBeGreaterThan(0.995);
      expect(span).toBeLessThan(1.01);
    }
  });

  it('inverts', () => {
    for (const hz of [0, 20, 82.4, 1000, 19_999]) expect(erbNumberToHz(erbNumber(hz))).toBeCloseTo(hz, 8);
  });
});
