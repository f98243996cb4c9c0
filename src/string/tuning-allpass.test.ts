import { describe, expect, it } from 'vitest';
import { allpassCoefficient, allpassPhaseDelay } from './tuning-allpass.js';

/** Phase delay of (η + z⁻¹)/(1 + η·z⁻¹) at ω by direct complex evaluation, −arg H / ω (independent of the code's closed form). */
function measuredPhaseDelay(eta: number, omega: number): number {
  const numRe = eta + Math.cos(omega);
  const numIm = -Math.sin(omega);
  const denRe = 1 + eta * Math.cos(omega);
  const denIm = -eta * Math.sin(omega);
  const phase = Math.atan2(numIm, numRe) - Math.atan2(denIm, denRe);
  return -phase / omega;
}

describe('tuning allpass (η + z⁻¹)/(1 + η·z⁻¹)', () => {
  it('low-frequency mapping η = (1 − Δ)/(1 + Δ): Δ in [0.2, 1.2] ↔ η in [2/3, −1/11] (Smith, PASP, "First-Order Allpass Interpolation"; docs/physics.md §4.2)', () => {
    expect(allpassCoefficient(0.2, 0)).toBeCloseTo(2 / 3, 12);
    expect(allpassCoefficient(1.2, 0)).toBeCloseTo(-1 / 11, 12);
  });

  it('the low-frequency coefficient gives the published phase delays at 329.6 Hz, fs = 44.1 kHz (docs/physics.md §4.2)', () => {
    const omega = (2 * Math.PI * 329.6) / 44100;
    const published = [0.2, 0.5001, 1.0, 1.1999];
    [0.2, 0.5, 1.0, 1.2].forEach((delay, i) => {
      expect(measuredPhaseDelay(allpassCoefficient(delay, 0), omega)).toBeCloseTo(published[i] ?? 0, 4);
    });
  });

  it('the exact coefficient gives the asked phase delay at the asked frequency, even high up', () => {
    for (const hz of [82.4, 329.6, 1318.5, 4000]) {
      const omega = (2 * Math.PI * hz) / 48000;
      for (const delay of [0.1, 0.37, 0.8, 1.099]) {
        const eta = allpassCoefficient(delay, omega);
        expect(measuredPhaseDelay(eta, omega)).toBeCloseTo(delay, 10);
        expect(allpassPhaseDelay(eta, omega)).toBeCloseTo(delay, 10);
        expect(Math.abs(eta)).toBeLessThan(1); // stable
      }
    }
  });
});
