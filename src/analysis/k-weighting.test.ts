import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import type { Biquad } from './biquad.js';
import { BS1770_PRE_FILTER_48K, BS1770_RLB_FILTER_48K, designKWeighting, resampleBiquad } from './k-weighting.js';

/** |H(e^{jω})| of a cascade in dB, evaluated directly from the transfer function (independent of applyBiquad). */
function gainDb(sections: readonly Biquad[], frequencyHz: number, sampleRateHz: number): number {
  const w = (2 * Math.PI * frequencyHz) / sampleRateHz;
  let magnitude = 1;
  for (const { b0, b1, b2, a1, a2 } of sections) {
    const numerator = Math.hypot(b0 + b1 * Math.cos(w) + b2 * Math.cos(2 * w), b1 * Math.sin(w) + b2 * Math.sin(2 * w));
    const denominator = Math.hypot(1 + a1 * Math.cos(w) + a2 * Math.cos(2 * w), a1 * Math.sin(w) + a2 * Math.sin(2 * w));
    magnitude *= numerator / denominator;
  }
  return 20 * Math.log10(magnitude);
}

function expectSectionClose(actual: Biquad, expected: Biquad, tolerance: number): void {
  for (const key of ['b0', 'b1', 'b2', 'a1', 'a2'] as const) expect(Math.abs(actual[key] - expected[key]), key).toBeLessThan(tolerance);
}

describe('designKWeighting', () => {
  it('recovers the standard 48 kHz tables through its analog prototype', () => {
    // ITU-R BS.1770-4, Annex 1, Tables 1 and 2: a round trip 48 kHz → prototype → 48 kHz must give them back.
    expectSectionClose(resampleBiquad(BS1770_PRE_FILTER_48K, 48_000, 48_000), BS1770_PRE_FILTER_48K, 1e-12);
    expectSectionClose(resampleBiquad(BS1770_RLB_FILTER_48K, 48_000, 48_000), BS1770_RLB_FILTER_48K, 1e-12);
  });

  it('gives the pre-filter libebur128 designs at 44.1 kHz', () => {
    // libebur128 (J. Kraft, MIT; also the Rust ebur128 crate behind ebur128-wasm) designs the
    // pre-filter from analog parameters fitted to the 48 kHz table: f0 = 1681.974450955533 Hz,
    // G = 3.999843853973347 dB, Q = 0.7071752369554196, Vb = Vh^0.4996667741545416, prewarped
    // bilinear transform (constants as quoted in Audacity's tests/octave/loudness_test.m).
    const sampleRateHz = 44_100;
    const k = Math.tan((Math.PI * 1681.974450955533) / sampleRateHz);
    const q = 0.7071752369554196;
    const vh = 10 ** (3.999843853973347 / 20);
    const vb = vh ** 0.4996667741545416;
    const a0 = 1 + k / q + k * k;
    const reference: Biquad = {
      b0: (vh + (vb * k) / q + k * k) / a0,
      b1: (2 * (k * k - vh)) / a0,
      b2: (vh - (vb * k) / q + k * k) / a0,
      a1: (2 * (k * k - 1)) / a0,
      a2: (1 - k / q + k * k) / a0,
    };
    const [preFilter, rlbFilter] = designKWeighting(sampleRateHz);
    expectSectionClose(preFilter, reference, 1e-9);
    // The RLB poles likewise (f0 = 38.13547087602444 Hz, Q = 0.5003270373238773 in libebur128).
    const kr = Math.tan((Math.PI * 38.13547087602444) / sampleRateHz);
    const qr = 0.5003270373238773;
    const ar = 1 + kr / qr + kr * kr;
    expect(rlbFilter.a1).toBeCloseTo((2 * (kr * kr - 1)) / ar, 9);
    expect(rlbFilter.a2).toBeCloseTo((1 - kr / qr + kr * kr) / ar, 9);
  });

  it('keeps the 48 kHz frequency response at other rates', () => {
    const reference = designKWeighting(48_000);
    for (const sampleRateHz of [32_000, 44_100, 88_200, 96_000, 192_000]) {
      const sections = designKWeighting(sampleRateHz);
      for (const frequencyHz of [20, 38, 100, 500, 1000, 1682, 3000, 10_000, 15_000]) {
        expect(Math.abs(gainDb(sections, frequencyHz, sampleRateHz) - gainDb(reference, frequencyHz, 48_000)), `${sampleRateHz} Hz at ${frequencyHz} Hz`).toBeLessThan(0.01);
      }
    }
  });

  it('is the K curve: about +0.69 dB at 1 kHz, +4 dB shelf, high-pass below 100 Hz', () => {
    const sections = designKWeighting(48_000);
    // ITU-R BS.1770-4, Annex 1, eq. 2: the −0.691 dB constant cancels the K-weighting gain at 1 kHz.
    expect(gainDb(sections, 1000, 48_000)).toBeCloseTo(0.691, 1);
    // Annex 1, Fig. 1/2: shelf of about +4 dB at high frequencies; the RLB curve falls below 100 Hz.
    expect(gainDb(sections, 10_000, 48_000)).toBeGreaterThan(3.5);
    expect(gainDb(sections, 10_000, 48_000)).toBeLessThan(4.5);
    expect(gainDb(sections, 20, 48_000)).toBeLessThan(-10);
  });

  it('refuses rates too low for the pre-filter', () => {
    expect(() => designKWeighting(3000)).toThrow(InputError);
    expect(() => designKWeighting(Number.NaN)).toThrow(InputError);
    expect(() => designKWeighting(-48_000)).toThrow(InputError);
  });
});
