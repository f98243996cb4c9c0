import meydaModule from 'meyda';
import { describe, expect, it } from 'vitest';
import { sine, strummedChord } from '../../test/support/signals.js';
import { InputError } from '../errors/index.js';
import { SILENCE_CENTROID_HZ, measureCentroid } from './measure-centroid.js';

const RATE_HZ = 48_000;

/** The part of meyda used here. Its default export is the settings object with extract() (its types describe the ESM build; Node loads the CommonJS one). */
interface MeydaSettings {
  bufferSize: number;
  sampleRate: number;
  windowingFunction: string;
  extract(feature: 'spectralCentroid', signal: Float32Array): number | null;
}
const Meyda = meydaModule as unknown as MeydaSettings;

/**
 * meyda (npm, 5.6.3) spectralCentroid in Hz. It returns a bin index over bins
 * 0 … N/2 − 1 of a symmetric-Hann-windowed frame, with the spectrum sized from
 * the global bufferSize: set it first, then Hz = bins · sampleRate / N
 * (docs/physics.md §7.1, read from meyda's source).
 */
function meydaCentroidHz(frame: Float32Array, sampleRateHz: number): number {
  Meyda.bufferSize = frame.length;
  Meyda.sampleRate = sampleRateHz;
  Meyda.windowingFunction = 'hanning';
  const bins = Meyda.extract('spectralCentroid', frame) ?? Number.NaN;
  return (bins * sampleRateHz) / frame.length;
}

function relativeDifference(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('measureCentroid', () => {
  const strum = strummedChord(RATE_HZ, 2, 1.5, 21);

  it('agrees with meyda spectralCentroid on the same frames within 0.5 %', () => {
    // Same bins as meyda (DC up to the bin below Nyquist) and the same symmetric Hann window.
    for (const size of [512, 2048, 8192]) {
      const nyquistBelowHz = RATE_HZ / 2 - RATE_HZ / size;
      for (const start of [0, 4000, 30_000, 70_000]) {
        const frame = strum.slice(start, start + size);
        const ours = measureCentroid(frame, RATE_HZ, { lowHz: 0, highHz: nyquistBelowHz });
        expect(relativeDifference(ours, meydaCentroidHz(frame, RATE_HZ)), `N = ${size}, start ${start}`).toBeLessThan(0.005);
      }
    }
  });

  it('agrees with meyda within 0.5 % with the default 20 Hz–20 kHz band on a band-limited tone', () => {
    const frame = strum.slice(10_000, 10_000 + 16_384);
    expect(relativeDifference(measureCentroid(frame, RATE_HZ), meydaCentroidHz(frame, RATE_HZ))).toBeLessThan(0.005);
  });

  it('gives 3.4142·f1 for 10 harmonics with 1/n amplitudes', () => {
    // Derived (docs/physics.md §7.1): Σ n·f1·(1/n) / Σ 1/n = 10·f1 / H_10, H_10 = 7381/2520.
    const fundamentalHz = 220;
    const count = RATE_HZ;
    const tone = new Float64Array(count);
    for (let harmonic = 1; harmonic <= 10; harmonic += 1) {
      const partial = sine(1 / harmonic, harmonic * fundamentalHz, RATE_HZ, count);
      for (let n = 0; n < count; n += 1) tone[n] = (tone[n] as number) + (partial[n] as number);
    }
    const expectedHz = ((10 * 2520) / 7381) * fundamentalHz;
    expect(expectedHz / fundamentalHz).toBeCloseTo(3.4142, 4);
    expect(relativeDifference(measureCentroid(tone, RATE_HZ), expectedHz)).toBeLessThan(0.001);
  });

  it('puts a sine exactly on bin 37 of 1024 at 37 bins (periodic Hann) and 37.00087 (symmetric)', () => {
    // docs/physics.md §7.1 check values (derived); the symmetric one is also meyda's reading.
    const size = 1024;
    const frame = Float64Array.from({ length: size }, (_, n) => Math.sin((2 * Math.PI * 37 * n) / size));
    const wholeBand = { lowHz: 0, highHz: RATE_HZ / 2 };
    expect((measureCentroid(frame, RATE_HZ, { ...wholeBand, window: 'periodic' }) * size) / RATE_HZ).toBeCloseTo(37, 6);
    expect((measureCentroid(frame, RATE_HZ, wholeBand) * size) / RATE_HZ).toBeCloseTo(37.00087, 4);
  });

  it('does not depend on level, and is 0 Hz (not NaN) for silence', () => {
    const frame = strum.slice(0, 24_000);
    const quiet = Float64Array.from(frame, (x) => x * 1e-6);
    expect(relativeDifference(measureCentroid(quiet, RATE_HZ), measureCentroid(frame, RATE_HZ))).toBeLessThan(1e-9);
    expect(measureCentroid(new Float32Array(4800), RATE_HZ)).toBe(SILENCE_CENTROID_HZ);
    expect(measureCentroid(new Float32Array(0), RATE_HZ)).toBe(SILENCE_CENTROID_HZ);
  });

  it('counts only the band asked for', () => {
    // A 50 Hz + 5 kHz pair: with the band starting at 1 kHz only the 5 kHz sine remains.
    const count = RATE_HZ;
    const low = sine(1, 50, RATE_HZ, count);
    const high = sine(0.1, 5000, RATE_HZ, count);
    const pair = low.map((x, n) => x + (high[n] as number));
    expect(measureCentroid(pair, RATE_HZ, { lowHz: 1000 })).toBeCloseTo(5000, 0);
    expect(measureCentroid(pair, RATE_HZ)).toBeLessThan(1000);
  });

  it('rejects bad options and samples', () => {
    expect(() => measureCentroid(strum, 0)).toThrow(/sampleRateHz: expected/u);
    expect(() => measureCentroid(strum, RATE_HZ, { lowHz: -1 })).toThrow(/lowHz: expected/u);
    expect(() => measureCentroid(strum, RATE_HZ, { lowHz: 500, highHz: 100 })).toThrow(/highHz: expected/u);
    expect(() => measureCentroid(strum, RATE_HZ, { window: 'flat' as never })).toThrow(InputError);
    expect(() => measureCentroid([0, Number.NaN, 0, 0], RATE_HZ)).toThrow(/samples: expected finite samples/u);
  });
});
