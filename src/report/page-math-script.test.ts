/** The page's pure helpers, run from the exact script text the page inlines. */
import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { PAGE_MATH_FUNCTIONS, PAGE_MATH_SCRIPT } from './page-math-script.js';

interface Loop {
  start: number;
  end: number;
}
interface PageMath {
  binomialTailProbability(correct: number, trials: number): number;
  playbackGainsDb(
    wirings: { id: string; loudnessLufs: number | null }[],
    render: { level: 'true' | 'matched'; commonGainDb: number },
  ): { matched: Record<string, number>; trueLevel: Record<string, number>; unknown: string[] };
  limitGainDb(gainDb: number, peak: number): number;
  decibelsToGain(db: number): number;
  wrapPosition(position: number, loop: Loop | null): number;
  isInsideFolder(path: unknown): boolean;
  pageAudioPath(wav: string): string;
  responseAt(frequenciesHz: number[], responseDb: number[], hz: number): number;
  formatDb(db: number | null, digits?: number): string;
  formatHz(hz: number | null): string;
  formatProbability(probability: number): string;
}

const math = runInNewContext(`${PAGE_MATH_SCRIPT}\n({ ${PAGE_MATH_FUNCTIONS.join(', ')} })`) as PageMath;

/** Exact P(K ≥ k | n, 1/2) with BigInt binomial coefficients: an independent computation. */
function exactTail(correct: number, trials: number): number {
  let coefficient = 1n;
  let sum = 0n;
  for (let i = 0; i <= trials; i += 1) {
    if (i >= correct) sum += coefficient;
    coefficient = (coefficient * BigInt(trials - i)) / BigInt(i + 1);
  }
  // Scale to keep 15 significant digits before converting.
  const scale = 10n ** 18n;
  return Number((sum * scale) / 2n ** BigInt(trials)) / Number(scale);
}

describe('binomialTailProbability (ABX guessing probability)', () => {
  it('matches hand-worked values: 9 of 10 is 11/1024, 8 of 10 is 56/1024', () => {
    // C(10,9)+C(10,10) = 11; C(10,8)+C(10,9)+C(10,10) = 45+10+1 = 56.
    expect(math.binomialTailProbability(9, 10)).toBeCloseTo(11 / 1024, 14);
    expect(math.binomialTailProbability(8, 10)).toBeCloseTo(56 / 1024, 14);
    expect(math.binomialTailProbability(10, 10)).toBeCloseTo(1 / 1024, 14);
  });

  it('is 1 for zero correct and 0 above the number of trials', () => {
    expect(math.binomialTailProbability(0, 10)).toBe(1);
    expect(math.binomialTailProbability(11, 10)).toBe(0);
    expect(math.binomialTailProbability(0, 0)).toBe(1);
  });

  it('agrees with exact BigInt sums for every k up to n = 60 and at n = 400', () => {
    for (const trials of [1, 2, 5, 16, 37, 60]) {
      for (let correct = 0; correct <= trials; correct += 1) {
        const expected = exactTail(correct, trials);
        expect(math.binomialTailProbability(correct, trials)).toBeCloseTo(expected, 12);
      }
    }
    expect(math.binomialTailProbability(230, 400) / exactTail(230, 400)).toBeCloseTo(1, 9);
  });

  it('shows probabilities as people read them', () => {
    expect(math.formatProbability(56 / 1024)).toBe('5.5 %');
    expect(math.formatProbability(0.5)).toBe('50 %');
    expect(math.formatProbability(0.0004)).toBe('less than 0.1 %');
  });
});

describe('playbackGainsDb', () => {
  const wirings = [
    { id: 'w1', loudnessLufs: -20 },
    { id: 'w2', loudnessLufs: -26 },
    { id: 'w3', loudnessLufs: -17 },
    { id: 'w4', loudnessLufs: null },
  ];

  it('true-level files: matched mode lifts or lowers each to the median loudness; true mode plays them as written', () => {
    const gains = math.playbackGainsDb(wirings, { level: 'true', commonGainDb: -3 });
    // File loudness = L + common gain: −23, −29, −20; median −23.
    expect(gains.matched).toEqual({ w1: 0, w2: 6, w3: -3, w4: 0 });
    expect(gains.trueLevel).toEqual({ w1: 0, w2: 0, w3: 0, w4: 0 });
    expect(gains.unknown).toEqual(['w4']);
    // After the matched gains every playback has the same loudness.
    const played = wirings.slice(0, 3).map((wiring) => (wiring.loudnessLufs as number) - 3 + (gains.matched[wiring.id] ?? NaN));
    expect(new Set(played).size).toBe(1);
  });

  it('matched files: true mode restores the measured differences with the loudest at 0 dB', () => {
    const gains = math.playbackGainsDb(wirings, { level: 'matched', commonGainDb: 0 });
    expect(gains.matched).toEqual({ w1: 0, w2: 0, w3: 0, w4: 0 });
    expect(gains.trueLevel).toEqual({ w1: -3, w2: -9, w3: 0, w4: 0 });
  });

  it('never lifts a peak above full scale', () => {
    expect(math.limitGainDb(15, 0.25)).toBeCloseTo(20 * Math.log10(4), 12);
    expect(math.limitGainDb(3, 0.25)).toBe(3);
    expect(math.decibelsToGain(-6)).toBeCloseTo(0.501187, 6);
  });
});

describe('wrapPosition', () => {
  it('runs on inside the loop and wraps past its end', () => {
    const loop = { start: 1, end: 2 };
    expect(math.wrapPosition(0.5, loop)).toBe(0.5);
    expect(math.wrapPosition(1.5, loop)).toBe(1.5);
    expect(math.wrapPosition(2.25, loop)).toBeCloseTo(1.25, 12);
    expect(math.wrapPosition(4.75, loop)).toBeCloseTo(1.75, 12);
    expect(math.wrapPosition(4.75, null)).toBe(4.75);
  });
});

describe('isInsideFolder', () => {
  it('accepts relative paths inside the folder only', () => {
    expect(math.isInsideFolder('wav/w1-neck.wav.js')).toBe(true);
    for (const path of ['../x.js', 'wav/../../x.js', '/etc/passwd', '\\\\host\\share', 'http://example.org/a.js', 'file:///a.js', 'data:text/javascript,1', 'javascript:alert(1)', '', 7]) {
      expect(math.isInsideFolder(path), String(path)).toBe(false);
    }
    expect(math.pageAudioPath('wav/w1.wav')).toBe('wav/w1.wav.js');
  });
});

describe('responseAt and formatting', () => {
  it('interpolates on log frequency', () => {
    expect(math.responseAt([100, 1000, 10000], [0, 10, -10], 1000)).toBe(10);
    expect(math.responseAt([100, 1000, 10000], [0, 10, -10], Math.sqrt(100 * 1000))).toBeCloseTo(5, 12);
    expect(math.responseAt([100, 1000], [0, 10], 20)).toBe(0);
  });

  it('formats decibels and frequencies', () => {
    expect(math.formatDb(-3.04)).toBe('\u22123.0 dB');
    expect(math.formatDb(1.25, 2)).toBe('+1.25 dB');
    expect(math.formatDb(-0.01)).toBe('0.0 dB');
    expect(math.formatDb(null)).toBe('\u2014');
    expect(math.formatHz(850.4)).toBe('850 Hz');
    expect(math.formatHz(2450)).toBe('2.45 kHz');
    expect(math.formatHz(12340)).toBe('12.3 kHz');
  });
});
