/**
 * Effects chain speed: time per 3.5 s mono render through each chain, as a
 * real-time factor (seconds of audio per second of wall time), and the wall
 * time for 47 renders in a row (the three single-coil demo's wirings).
 * Goals: at least 100× real time direct, 50× with drive.
 */
import { performance } from 'node:perf_hooks';
import { CHAIN_NAMES, renderEffectsChain } from '../../src/render/index.js';
import { heading, line, medianMsAsync } from './timing.js';

const SECONDS = 3.5;
const WIRINGS = 47;
/** Open E major chord, low to high (E2 B2 E3 G#3 B3 E4, equal temperament, A4 = 440 Hz). */
const CHORD_HZ = [82.41, 123.47, 164.81, 207.65, 246.94, 329.63];
const STRUM_STEP_S = 0.015;
const TOP_HZ = 5000;

/** A strum-like test take: six decaying harmonic tones 15 ms apart, a few hundred mV peak (not a string model; only for timing). */
function makeStrum(sampleRateHz: number): Float32Array {
  const frames = Math.round(SECONDS * sampleRateHz);
  const take = new Float32Array(frames);
  CHORD_HZ.forEach((fundamentalHz, string) => {
    const start = Math.round(string * STRUM_STEP_S * sampleRateHz);
    for (let n = 1; n * fundamentalHz < TOP_HZ; n += 1) {
      const step = (2 * Math.PI * n * fundamentalHz) / sampleRateHz;
      const decay = Math.exp(-(1 + n * 0.5) / (1.5 * sampleRateHz));
      let amplitude = 0.03 / n;
      for (let i = start; i < frames; i += 1) {
        take[i] = (take[i] ?? 0) + amplitude * Math.sin(step * (i - start));
        amplitude *= decay;
      }
    }
  });
  return take;
}

export async function benchChain(): Promise<void> {
  for (const sampleRateHz of [48_000, 44_100]) {
    heading(`Effects chain, ${SECONDS} s mono at ${sampleRateHz} Hz (real-time factor = audio s / wall s)`);
    const take = makeStrum(sampleRateHz);
    // One take per wiring, at levels from half to one and a half times the first (wirings differ in level).
    const takes = Array.from({ length: WIRINGS }, (_, wiring) => take.map((value) => value * (0.5 + wiring / WIRINGS)));
    for (const chain of CHAIN_NAMES) {
      const ms = await medianMsAsync(() => renderEffectsChain(take, sampleRateHz, chain), 9);
      const start = performance.now();
      for (const wiring of takes) await renderEffectsChain(wiring, sampleRateHz, chain);
      const allMs = performance.now() - start;
      line(`${chain}: one render`, `${ms.toFixed(1)} ms  ${((SECONDS * 1000) / ms).toFixed(0)}× real time`);
      line(`${chain}: ${WIRINGS} renders in a row`, `${(allMs / 1000).toFixed(2)} s  ${((WIRINGS * SECONDS * 1000) / allMs).toFixed(0)}× real time`);
    }
  }
}
