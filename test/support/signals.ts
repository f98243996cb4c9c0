/**
 * Test signals made in the test, so checks against outside references need
 * no data files. Pure functions; randomness from the project's seeded
 * generator, so every run sees the same samples.
 */
import { createRandom } from '../../src/math/index.js';

/** Amplitude of a level in dBFS (peak): 10^(dB/20). */
export function amplitudeOfDb(levelDb: number): number {
  return 10 ** (levelDb / 20);
}

/** A sine of `amplitude` at `frequencyHz`, `count` samples, starting at phase 0. */
export function sine(amplitude: number, frequencyHz: number, sampleRateHz: number, count: number): Float32Array {
  const out = new Float32Array(count);
  for (let n = 0; n < count; n += 1) out[n] = amplitude * Math.sin((2 * Math.PI * frequencyHz * n) / sampleRateHz);
  return out;
}

/** Join segments end to end. */
export function concatenate(segments: readonly Float32Array[]): Float32Array {
  const out = new Float32Array(segments.reduce((sum, segment) => sum + segment.length, 0));
  let offset = 0;
  for (const segment of segments) {
    out.set(segment, offset);
    offset += segment.length;
  }
  return out;
}

export interface PluckedToneOptions {
  readonly sampleRateHz: number;
  readonly durationS: number;
  /** Fundamental of each note, Hz, one note per entry, plucked at `noteTimesS`. */
  readonly fundamentalsHz: readonly number[];
  readonly noteTimesS: readonly number[];
  /** Harmonics per note (amplitude 1/n each, as a plucked string's velocity roughly falls). */
  readonly harmonics: number;
  /** Decay time constant of the fundamental, s; harmonic n decays n² times faster (a Karplus–Strong-like loss). */
  readonly decayS: number;
  /** Peak amplitude scale. */
  readonly amplitude: number;
  readonly seed: number;
}

/**
 * A plucked-string-like tone: decaying harmonic series per note with random
 * phases and a short noise burst at each pluck. Not the project's string
 * model, only a realistic test signal (decays, many partials, silence gaps).
 */
export function pluckedTone(options: PluckedToneOptions): Float32Array {
  const { sampleRateHz, durationS, fundamentalsHz, noteTimesS, harmonics, decayS, amplitude, seed } = options;
  const random = createRandom(seed);
  const out = new Float32Array(Math.round(durationS * sampleRateHz));
  const burstSamples = Math.round(0.005 * sampleRateHz);
  fundamentalsHz.forEach((fundamentalHz, note) => {
    const start = Math.round((noteTimesS[note] ?? 0) * sampleRateHz);
    for (let harmonic = 1; harmonic <= harmonics; harmonic += 1) {
      const frequencyHz = harmonic * fundamentalHz;
      if (frequencyHz >= sampleRateHz / 2) break;
      const phase = 2 * Math.PI * random();
      const decayPerSample = Math.exp(-(harmonic * harmonic) / (decayS * sampleRateHz));
      const step = (2 * Math.PI * frequencyHz) / sampleRateHz;
      let envelope = amplitude / harmonic;
      for (let n = start; n < out.length && envelope > 1e-9; n += 1) {
        out[n] = (out[n] as number) + envelope * Math.sin(phase + step * (n - start));
        envelope *= decayPerSample;
      }
    }
    for (let n = start; n < Math.min(out.length, start + burstSamples); n += 1) out[n] = (out[n] as number) + amplitude * 0.1 * (2 * random() - 1);
  });
  return out;
}

/** Fundamentals of an open E major chord, low to high (E2 B2 E3 G#3 B3 E4; ISO 16 equal temperament), Hz. */
export const OPEN_E_MAJOR_HZ: readonly number[] = [82.41, 123.47, 164.81, 207.65, 246.94, 329.63];

/** An open E major chord strummed low to high (30 ms apart), 40 harmonics per string, then left to ring. */
export function strummedChord(sampleRateHz: number, durationS: number, decayS: number, seed: number): Float32Array {
  return pluckedTone({
    sampleRateHz,
    durationS,
    fundamentalsHz: OPEN_E_MAJOR_HZ,
    noteTimesS: OPEN_E_MAJOR_HZ.map((_, index) => 0.03 * index),
    harmonics: 40,
    decayS,
    amplitude: 0.2,
    seed,
  });
}
