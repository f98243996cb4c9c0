import { describe, expect, it } from 'vitest';
import { designStringLoop, type StringLoop } from './design-string-loop.js';

/**
 * The whole loop's response at ω, evaluated directly as complex numbers:
 * G(e^{jω}) = ρ · e^{−jωN} · Hd(e^{jω}) · A(e^{jω}), independent of the design code.
 */
function loopResponse(loop: StringLoop, omega: number): { gain: number; phase: number } {
  const mul = (a: [number, number], b: [number, number]): [number, number] => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
  const div = (a: [number, number], b: [number, number]): [number, number] => {
    const d = b[0] * b[0] + b[1] * b[1];
    return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
  };
  const zInv: [number, number] = [Math.cos(omega), -Math.sin(omega)];
  const delay: [number, number] = [Math.cos(omega * loop.delaySamples), -Math.sin(omega * loop.delaySamples)];
  const damping: [number, number] = [1 - loop.stretch + loop.stretch * zInv[0], loop.stretch * zInv[1]];
  const eta = loop.allpassEta;
  const allpass = div([eta + zInv[0], zInv[1]], [1 + eta * zInv[0], eta * zInv[1]]);
  const total = mul(mul(delay, damping), allpass);
  return { gain: loop.loopGain * Math.hypot(total[0], total[1]), phase: Math.atan2(total[1], total[0]) };
}

describe('designStringLoop', () => {
  const cases = [
    { frequencyHz: 82.4069, sampleRateHz: 48000, brightness: 0.5, t60S: 7 },
    { frequencyHz: 329.6276, sampleRateHz: 44100, brightness: 0, t60S: 3 },
    { frequencyHz: 1318.51, sampleRateHz: 48000, brightness: 0.8, t60S: 1 },
    { frequencyHz: 110, sampleRateHz: 96000, brightness: 1, t60S: 20 },
  ];

  it.each(cases)('loop at $frequencyHz Hz: total phase 0 (mod 2π) at the fundamental, so it resonates exactly there', (request) => {
    const loop = designStringLoop(request);
    const omega = (2 * Math.PI * request.frequencyHz) / request.sampleRateHz;
    expect(Math.abs(loopResponse(loop, omega).phase)).toBeLessThan(1e-9);
    expect(loop.allpassDelay).toBeGreaterThanOrEqual(0.1);
    expect(loop.allpassDelay).toBeLessThan(1.1);
  });

  it.each(cases)('loop at $frequencyHz Hz: the fundamental loses 60 dB in t60 (ρ·|Hd| = 0.001^(P·T/t60), Smith, PASP)', (request) => {
    const loop = designStringLoop(request);
    const omega = (2 * Math.PI * request.frequencyHz) / request.sampleRateHz;
    const periodsInT60 = request.t60S * request.frequencyHz;
    expect(loopResponse(loop, omega).gain ** periodsInT60).toBeCloseTo(0.001, 9);
    expect(loop.loopGain).toBeLessThanOrEqual(1);
  });

  it('never lets the loop gain exceed 1 when the damping filter already decays the fundamental faster than asked', () => {
    const loop = designStringLoop({ frequencyHz: 2000, sampleRateHz: 48000, brightness: 0, t60S: 60 });
    expect(loop.loopGain).toBe(1);
    expect(loop.decayLimitedByBrightness).toBe(true);
  });
});
