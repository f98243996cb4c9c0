/** The page's pure helpers (the very module the page bundles). */
import { describe, expect, it } from 'vitest';
import { MATCHED_LOUDNESS_LUFS, binomialTailProbability, decibelsToGain, formatProbability, limitGainDb, playbackGainDb, wrapPosition } from './page-math.js';

/** Exact P(K ≥ k | n, 1/2) with BigInt binomial coefficients: an independent computation. */
function exactTail(correct: number, trials: number): number {
  let coefficient = 1n;
  let sum = 0n;
  for (let i = 0; i <= trials; i += 1) {
    if (i >= correct) sum += coefficient;
    coefficient = (coefficient * BigInt(trials - i)) / BigInt(i + 1);
  }
  const scale = 10n ** 18n; // keeps 15 significant digits before converting
  return Number((sum * scale) / 2n ** BigInt(trials)) / Number(scale);
}

describe('binomialTailProbability (the blind test\'s guessing probability)', () => {
  it('matches hand-worked values: 9 of 10 is 11/1024, 8 of 10 is 56/1024', () => {
    // C(10,9)+C(10,10) = 11; C(10,8)+C(10,9)+C(10,10) = 45+10+1 = 56.
    expect(binomialTailProbability(9, 10)).toBeCloseTo(11 / 1024, 14);
    expect(binomialTailProbability(8, 10)).toBeCloseTo(56 / 1024, 14);
    expect(binomialTailProbability(10, 10)).toBeCloseTo(1 / 1024, 14);
  });

  it('is 1 for zero correct and 0 above the number of trials', () => {
    expect(binomialTailProbability(0, 10)).toBe(1);
    expect(binomialTailProbability(11, 10)).toBe(0);
    expect(binomialTailProbability(0, 0)).toBe(1);
  });

  it('agrees with exact BigInt sums for every k up to n = 60 and at n = 400', () => {
    for (const trials of [1, 2, 5, 16, 37, 60]) {
      for (let correct = 0; correct <= trials; correct += 1) expect(binomialTailProbability(correct, trials)).toBeCloseTo(exactTail(correct, trials), 12);
    }
    expect(binomialTailProbability(230, 400) / exactTail(230, 400)).toBeCloseTo(1, 9);
  });

  it('shows probabilities as people read them', () => {
    expect(formatProbability(56 / 1024)).toBe('5.5 %');
    expect(formatProbability(0.5)).toBe('50 %');
    expect(formatProbability(0.0004)).toBe('less than 0.1 %');
  });
});

describe('playbackGainDb', () => {
  it('matched: every render to the matched loudness from its own; true: the common gain', () => {
    expect(playbackGainDb({ loudnessLufs: -30, peak: 0.01 }, true, 4)).toBeCloseTo(MATCHED_LOUDNESS_LUFS + 30, 12);
    expect(playbackGainDb({ loudnessLufs: -30, peak: 0.01 }, false, 4)).toBe(4);
    expect(playbackGainDb({ loudnessLufs: Number.NEGATIVE_INFINITY, peak: 0.01 }, true, 4)).toBe(4);
  });

  it('never lifts a peak above full scale', () => {
    expect(limitGainDb(15, 0.25)).toBeCloseTo(20 * Math.log10(4), 12);
    expect(limitGainDb(3, 0.25)).toBe(3);
    expect(playbackGainDb({ loudnessLufs: -60, peak: 0.5 }, true, 0)).toBeCloseTo(20 * Math.log10(2), 12);
    expect(decibelsToGain(-6)).toBeCloseTo(0.501187, 6);
  });
});

describe('wrapPosition', () => {
  it('runs on inside the loop and wraps past its end', () => {
    const loop = { start: 1, end: 2 };
    expect(wrapPosition(0.5, loop)).toBe(0.5);
    expect(wrapPosition(1.5, loop)).toBe(1.5);
    expect(wrapPosition(2.25, loop)).toBeCloseTo(1.25, 12);
    expect(wrapPosition(4.75, loop)).toBeCloseTo(1.75, 12);
    expect(wrapPosition(4.75, null)).toBe(4.75);
  });
});
