import { describe, expect, it } from 'vitest';
import { designBands } from './design-bands.js';
import { erbBandwidthHz, erbNumber } from './erb-scale.js';

describe('designBands', () => {
  const layout = designBands(48_000);

  it('cuts 20 Hz–20 kHz into 41 bands about one ERB wide', () => {
    // erbNumber(20 kHz) − erbNumber(20 Hz) = 40.8 ERB, rounded to 41 bands.
    expect(layout.bands).toHaveLength(41);
    expect(layout.bands[0]?.lowHz).toBe(20);
    expect(layout.bands[40]?.highHz).toBe(20_000);
    for (const band of layout.bands) {
      const widthErb = erbNumber(band.highHz) - erbNumber(band.lowHz);
      expect(widthErb).toBeCloseTo(40.8 / 41, 2);
      // and about the bandwidth of the auditory filter at the centre (within the 21.4 rounding and the log scale)
      expect((band.highHz - band.lowHz) / erbBandwidthHz(band.centreHz)).toBeGreaterThan(0.97);
      expect((band.highHz - band.lowHz) / erbBandwidthHz(band.centreHz)).toBeLessThan(1.03);
    }
  });

  it('covers 0 Hz to Nyquist with contiguous segments, eight per band, outer ones level-only', () => {
    const segments = layout.segments;
    expect(segments[0]).toMatchObject({ lowHz: 0, highHz: 20, band: -1 });
    expect(segments[segments.length - 1]).toMatchObject({ lowHz: 20_000, highHz: 24_000, band: -1 });
    expect(segments).toHaveLength(41 * 8 + 2);
    for (let s = 1; s < segments.length; s += 1) expect(segments[s]?.lowHz).toBeCloseTo(segments[s - 1]?.highHz ?? Number.NaN, 9);
    for (const segment of segments) {
      expect(segment.frequencyHz).toBeGreaterThanOrEqual(segment.lowHz);
      expect(segment.frequencyHz).toBeLessThanOrEqual(segment.highHz);
    }
    expect(layout.frequenciesHz).toHaveLength(segments.length);
  });

  it('stops at Nyquist for low sample rates', () => {
    const low = designBands(16_000);
    expect(low.segments[low.segments.length - 1]?.highHz).toBe(8000);
    expect(low.segments.filter((segment) => segment.band < 0)).toHaveLength(1);
  });

  it('rejects bad options, naming each', () => {
    expect(() => designBands(48_000, { bandwidthErb: 0 })).toThrow(/bands\.bandwidthErb: expected a width from 0\.25 to 4 ERB, got 0/u);
    expect(() => designBands(48_000, { segmentsPerBand: 2.5 })).toThrow(/bands\.segmentsPerBand/u);
    expect(() => designBands(48_000, { lowHz: 500, highHz: 100 })).toThrow(/bands\.highHz/u);
    expect(() => designBands(0)).toThrow(/sampleRateHz/u);
  });
});
