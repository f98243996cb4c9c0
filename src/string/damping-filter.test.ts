import { describe, expect, it } from 'vitest';
import { dampingFilterGain, dampingFilterPhaseDelay, stretchForBrightness } from './damping-filter.js';

describe('damping filter Hd(z) = (1 − S) + S·z⁻¹', () => {
  // Check values: docs/physics.md §4.3 (derived from Smith, PASP, "One-Zero String Damping Filter").
  it.each([
    [0.5, [0.999507, 0.987688, 0.951057]],
    [0.25, [0.99963, 0.990781, 0.963525]],
    [0.1, [0.999822, 0.995585, 0.982661]],
  ])('S = %s has the published gains at f/fs = 0.01, 0.05, 0.1', (stretch, gains) => {
    [0.01, 0.05, 0.1].forEach((ratio, i) => {
      expect(dampingFilterGain(stretch, 2 * Math.PI * ratio)).toBeCloseTo(gains[i] ?? 0, 6);
    });
  });

  it('with S = ½ gives harmonic k of plain Karplus–Strong the gain cos(πk/(N + ½)) per period (docs/physics.md §4.3: E2, N = 534)', () => {
    const period = 534.5;
    expect(dampingFilterGain(0.5, (2 * Math.PI * 1) / period)).toBeCloseTo(0.99998273, 8);
    expect(dampingFilterGain(0.5, (2 * Math.PI * 10) / period)).toBeCloseTo(0.99827317, 8);
  });

  it('delays by S samples at low frequency and by exactly ½ sample at every frequency when S = ½ (linear phase, Karplus & Strong 1983)', () => {
    expect(dampingFilterPhaseDelay(0.25, 1e-6)).toBeCloseTo(0.25, 9);
    for (const omega of [0.01, 0.5, 2]) expect(dampingFilterPhaseDelay(0.5, omega)).toBeCloseTo(0.5, 12);
  });

  it('maps brightness 0 to plain Karplus–Strong and 1 to no filter', () => {
    expect(stretchForBrightness(0)).toBe(0.5);
    expect(stretchForBrightness(1)).toBe(0);
  });
});
