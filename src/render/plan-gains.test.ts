import { describe, expect, it } from 'vitest';
import { PEAK_CEILING_DB, planMatchedGains, planTrueLevelGain } from './plan-gains.js';

describe('planTrueLevelGain', () => {
  it('puts the loudest peak at the ceiling and keeps ratios', () => {
    const peaks = [0.2, 0.5, 0.1];
    const gain = planTrueLevelGain(peaks);
    expect(0.5 * gain).toBeCloseTo(10 ** (PEAK_CEILING_DB / 20), 12);
    expect((0.2 * gain) / (0.1 * gain)).toBeCloseTo(2, 12);
  });
  it('leaves silence alone', () => {
    expect(planTrueLevelGain([0, 0])).toBe(1);
  });
});

describe('planMatchedGains', () => {
  it('brings every file to one loudness with no peak above the ceiling', () => {
    const loudness = [-20, -26, -23];
    const peaks = [0.5, 0.3, 0.9];
    const { targetLufs, gains } = planMatchedGains(loudness, peaks);
    gains.forEach((gain, index) => {
      expect(loudness[index]! + 20 * Math.log10(gain)).toBeCloseTo(targetLufs, 9);
      expect(peaks[index]! * gain).toBeLessThanOrEqual(10 ** (PEAK_CEILING_DB / 20) + 1e-12);
    });
    // The file with the least headroom (peak 0.9 at −23 LUFS) ends exactly at the ceiling.
    expect(peaks[2]! * gains[2]!).toBeCloseTo(10 ** (PEAK_CEILING_DB / 20), 12);
  });
});
