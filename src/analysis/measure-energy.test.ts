import { describe, expect, it } from 'vitest';
import { sine } from '../../test/support/signals.js';
import { LEVEL_FLOOR_DB, measureEnergy, measureLevelDb } from './measure-energy.js';

describe('measureEnergy and measureLevelDb', () => {
  it('gives N·A²/2 for a sine over whole periods (mean of sin² is 1/2)', () => {
    const count = 48_000;
    expect(measureEnergy(sine(0.5, 1000, 48_000, count))).toBeCloseTo((count * 0.25) / 2, 3);
    expect(measureEnergy([3, -4])).toBe(25);
    expect(measureEnergy([])).toBe(0);
  });

  it('reads twice the amplitude as +6.02 dB and equal energies as 0 dB', () => {
    const quiet = measureEnergy(sine(0.1, 440, 48_000, 4800));
    const loud = measureEnergy(sine(0.2, 440, 48_000, 4800));
    expect(measureLevelDb(loud, quiet)).toBeCloseTo(20 * Math.log10(2), 5);
    expect(measureLevelDb(quiet, quiet)).toBe(0);
    expect(measureLevelDb(quiet, loud)).toBeCloseTo(-20 * Math.log10(2), 5);
  });

  it('floors silence instead of returning -Infinity', () => {
    expect(measureLevelDb(0, 1)).toBe(LEVEL_FLOOR_DB);
    expect(measureLevelDb(1e-20, 1)).toBe(LEVEL_FLOOR_DB);
    expect(measureLevelDb(1e-14, 1)).toBeCloseTo(-140, 9);
  });

  it('rejects what has no level', () => {
    expect(() => measureEnergy([1, Number.NaN])).toThrow(/samples: expected finite samples/u);
    expect(() => measureLevelDb(1, 0)).toThrow(/referenceEnergy: expected/u);
    expect(() => measureLevelDb(-1, 1)).toThrow(/energy: expected/u);
    expect(() => measureLevelDb(Number.POSITIVE_INFINITY, 1)).toThrow(/energy: expected/u);
  });
});
