import { YIN } from 'pitchfinder';
import { describe, expect, it } from 'vitest';
import { createRandom, maxOf } from '../math/index.js';
import { centsBetween } from '../units/index.js';
import { toneAmplitude } from '../../test/support/harmonics.js';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import type { StringLoop } from './design-string-loop.js';
import { NO_DISPERSION } from './dispersion-allpass.js';
import { type StringVoice, runStringLoop } from './run-string-loop.js';

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

/**
 * The loop's difference equations applied sample by sample, as written in
 * run-string-loop.ts's file comment: the form the blocked loop must equal
 * to the last bit.
 */
function sampleBySample(loop: StringLoop, excitation: Float64Array, out: Float64Array, voice: StringVoice): void {
  const { delaySamples, stretch, allpassEta: eta, loopGain } = loop;
  const { sections, coefficient: alpha } = loop.dispersion;
  const inputs = new Float64Array(sections);
  const outputs = new Float64Array(sections);
  const line = new Float64Array(delaySamples);
  const stop = Math.min(voice.stop, out.length, voice.dampStart + voice.dampLength);
  let index = 0;
  let delayedBefore = 0;
  let dampedBefore = 0;
  let tunedBefore = 0;
  for (let n = voice.start; n < stop; n += 1) {
    const d = line[index] as number;
    const h = (1 - stretch) * d + stretch * delayedBefore;
    const a = eta * h + dampedBefore - eta * tunedBefore;
    [delayedBefore, dampedBefore, tunedBefore] = [d, h, a];
    let b = a;
    for (let k = 0; k < sections; k += 1) {
      const next = alpha * b + (inputs[k] as number) - alpha * (outputs[k] as number);
      inputs[k] = b;
      outputs[k] = next;
      b = next;
    }
    const i = n - voice.start;
    const y = (i < excitation.length ? (excitation[i] as number) : 0) + loopGain * b;
    line[index] = y;
    index = (index + 1) % delaySamples;
    const gain = n < voice.dampStart ? 1 : Math.cos((Math.PI / 2) * ((n - voice.dampStart) / voice.dampLength));
    out[n] = (out[n] as number) + (n < voice.dampStart ? y : y * gain * gain);
  }
}

describe('runStringLoop in blocks', () => {
  // Random loops: delay lines from 1 sample (blocks of one sample) to 500, 0 to 16 dispersion sections (whole
  // passes of four and leftovers), excitations shorter and longer than the line, damped and undamped notes,
  // added onto a wave that already holds other notes.
  it('gives the same numbers, to the last bit, as the equations applied sample by sample', () => {
    const random = createRandom(2026);
    for (let trial = 0; trial < 120; trial += 1) {
      const delaySamples = 1 + Math.floor(random() * (trial % 4 === 0 ? 6 : 500));
      const loop: StringLoop = {
        ...plainKarplusStrong(delaySamples + 1),
        stretch: random(),
        allpassEta: 2 * random() - 1,
        loopGain: 0.9 + 0.1 * random(),
        dispersion: { sections: trial % 17, coefficient: 1.8 * random() - 0.9, delayAtFundamental: 0 },
      };
      const excitation = Float64Array.from({ length: 1 + Math.floor(random() * 1500) }, () => 2 * random() - 1);
      const length = 600 + Math.floor(random() * 6000);
      const start = Math.floor(random() * 300);
      const voice: StringVoice = {
        start,
        stop: length - Math.floor(random() * 100),
        dampStart: random() < 0.5 ? Infinity : start + Math.floor(random() * length),
        dampLength: 1 + Math.floor(random() * 2000),
      };
      const before = Float64Array.from({ length }, () => (random() < 0.3 ? random() : 0));
      const blocked = before.slice();
      const reference = before.slice();
      runStringLoop(loop, excitation, blocked, voice);
      sampleBySample(loop, excitation, reference, voice);
      const first = firstBitDifference(reference, blocked);
      expect(first, `trial ${trial}: N = ${delaySamples}, ${loop.dispersion.sections} sections`).toBe(-1);
    }
  });
});
