import { YIN } from 'pitchfinder';
import { describe, expect, it } from 'vitest';
import { createRandom, maxOf } from '../math/index.js';
import { centsBetween } from '../units/index.js';
import { toneAmplitude } from '../../test/support/harmonics.js';
import type { StringLoop } from './design-string-loop.js';
import { NO_DISPERSION } from './dispersion-allpass.js';
import { runStringLoop } from './run-string-loop.js';

const FS = 44100;

/**
 * Plain Karplus–Strong (Karplus & Strong 1983): y[n] = x[n] + (y[n − N] + y[n − N − 1])/2.
 * In the extended loop that is S = ½ and an allpass with η = 0 (a pure
 * one-sample delay z⁻¹), so the delay line holds N − 1 samples; ρ = 1.
 */
function plainKarplusStrong(n: number): StringLoop {
  return {
    periodSamples: n + 0.5,
    delaySamples: n - 1,
    stretch: 0.5,
    allpassEta: 0,
    allpassDelay: 1,
    dispersion: NO_DISPERSION,
    loopGain: 1,
    decayLimitedByBrightness: false,
  };
}

/** One period of seeded white noise, the classic excitation (Karplus & Strong 1983). */
function burst(length: number): Float64Array {
  const random = createRandom(1983);
  return Float64Array.from({ length }, () => 2 * random() - 1);
}

function render(loop: StringLoop, seconds: number): Float64Array {
  const out = new Float64Array(Math.round(seconds * FS));
  runStringLoop(loop, burst(Math.round(loop.periodSamples)), out, { start: 0, stop: out.length, dampStart: Infinity, dampLength: 1 });
  return out;
}

describe('runStringLoop', () => {
  // Check values: docs/physics.md §4.3 (pitch fs/(N + ½), Karplus & Strong 1983), measured by the
  // pitchfinder package's YIN estimator (npm pitchfinder 2.3.4, de Cheveigné & Kawahara's YIN with aubio's refinement).
  it.each([
    [534, 82.4069, 82.507, 2.1],
    [535, 82.4069, 82.353, -1.13],
    [133, 329.6276, 330.337, 3.72],
    [134, 329.6276, 327.881, -9.2],
  ])('plain Karplus–Strong with N = %i sounds fs/(N + ½): %s Hz target, %s Hz published, %s cents', (n, targetHz, publishedHz, publishedCents) => {
    const out = render(plainKarplusStrong(n), 0.6);
    const frame = Float32Array.from(out.subarray(Math.round(0.2 * FS), Math.round(0.2 * FS) + 8192));
    const measured = YIN({ sampleRate: FS })(frame);
    expect(measured).not.toBeNull();
    expect(measured ?? 0).toBeCloseTo(publishedHz, 2);
    expect(centsBetween(measured ?? 0, targetHz)).toBeCloseTo(publishedCents, 1);
  });

  it('plain Karplus–Strong, E2 with N = 534: harmonic 10 decays with τ ≈ 7.0 s (docs/physics.md §4.3: gain 0.99827317 per period)', () => {
    const out = render(plainKarplusStrong(534), 4);
    const f10 = (10 * FS) / 534.5;
    const early = toneAmplitude(out, FS, f10, 0.2, 1);
    const late = toneAmplitude(out, FS, f10, 2.7, 1);
    const tau = 2.5 / Math.log(early / late);
    expect(tau).toBeGreaterThan(7.0 * 0.98);
    expect(tau).toBeLessThan(7.0 * 1.02);
  });

  it('a note damped by a later pluck fades to exactly zero over the damping time and stops there', () => {
    const loop = plainKarplusStrong(200);
    const out = new Float64Array(20000);
    runStringLoop(loop, burst(200), out, { start: 100, stop: out.length, dampStart: 5000, dampLength: 1000 });
    expect(out.subarray(0, 100).every((v) => v === 0)).toBe(true);
    expect(maxOf(out.subarray(4000, 5000).map(Math.abs))).toBeGreaterThan(0.1);
    expect(maxOf(out.subarray(5900, 6000).map(Math.abs))).toBeLessThan(0.01);
    expect(out.subarray(6000).every((v) => v === 0)).toBe(true);
  });
});
