/**
 * Energy and level. A render's energy is the sum of its squared samples,
 * E = Σ x[n]² (full scale 1; the discrete-time signal energy of A. V.
 * Oppenheim, R. W. Schafer, *Discrete-Time Signal Processing*, §2.1). Renders
 * of one phrase all have the same length, so energy ratios are power ratios
 * and a level difference is ΔL = 10·log10(E / E_ref) dB.
 *
 * docs/design.md's levelDb is a wiring's energy relative to the mean energy of the
 * single-coil wirings; the pipeline computes that mean and calls
 * measureLevelDb(energy, meanSingleCoilEnergy).
 */
import { InputError } from '../errors/index.js';

/**
 * Lowest level reported, dB: a render this far below the reference (or
 * silent) reads this instead of −Infinity. 150 dB is below the whole range
 * of 24-bit PCM (20·log10(2²³) ≈ 138 dB), so nothing audible is floored.
 */
export const LEVEL_FLOOR_DB = -150;

const DECIBELS_PER_DECADE = 10;

/** Energy Σ x[n]² of `samples`. Throws InputError on a non-finite sample. */
export function measureEnergy(samples: ArrayLike<number>): number {
  let sum = 0;
  for (let n = 0; n < samples.length; n += 1) {
    const x = samples[n] as number;
    sum += x * x;
  }
  if (!Number.isFinite(sum)) throw new InputError([{ path: 'samples', expected: 'finite samples', got: 'NaN or an infinite sample' }]);
  return sum;
}

/** Level of `energy` relative to `referenceEnergy`, 10·log10(E / E_ref) dB, never below LEVEL_FLOOR_DB. */
export function measureLevelDb(energy: number, referenceEnergy: number): number {
  if (!Number.isFinite(energy) || energy < 0) throw InputError.at('energy', 'a finite energy ≥ 0', energy);
  if (!Number.isFinite(referenceEnergy) || referenceEnergy <= 0) {
    throw InputError.at('referenceEnergy', 'a finite reference energy > 0 (the reference renders are silent)', referenceEnergy);
  }
  const level = DECIBELS_PER_DECADE * Math.log10(energy / referenceEnergy);
  return Math.max(level, LEVEL_FLOOR_DB);
}
