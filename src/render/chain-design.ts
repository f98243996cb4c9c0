/**
 * Each effects chain as plain data: an ordered list of stages (gain, biquad,
 * soft clipper, compressor) with every value decided, and the fixed latency
 * the stages add inside node-web-audio-api. `renderChainDesign` runs a design;
 * `measureChainResponse` computes its small-signal response.
 *
 * The chains (every value a named constant with its origin):
 * - direct: nothing.
 * - clean: input gain → tone stack → speaker cabinet.
 * - drive: input gain × drive gain → low cut → soft clipper (4× oversampled)
 *   → tone stack → speaker cabinet → output trim.
 * - compressed: input gain → compressor → tone stack → speaker cabinet.
 *
 * Timing: the renderer removes the fixed delays (`latencyFrames`: the
 * oversampled clipper's; the compressor has none), so no chain adds a fixed
 * latency. What remains is the filters' phase response,
 * the same for every wiring: a group delay of 4.6 ms at 82 Hz, 3.1 ms at
 * 110 Hz and under 0.5 ms from 220 Hz up (computed from the cookbook
 * coefficients).
 *
 * Headroom: everything runs in 32-bit float, so no stage clips. The only
 * level-dependent stages are the soft clipper and the compressor; both see
 * one common input level for every wiring, so a louder wiring drives them
 * harder, as on a real amplifier — never differently per file.
 * - clean: linear; its output peak is at most 3.8× the input peak (the L1 norm
 *   of the tone stack and cabinet's impulse response, a hard bound; a plucked
 *   low E measured 2.1×). Its response peaks at +4.6 dB near 2.7 kHz.
 * - drive: the clipper swings at most +0.85/−1.15, so the output never
 *   exceeds 1.15 × 3.8 × the −12 dB trim = ±1.09 whatever the input
 *   (measured ≤ 0.82 at 60 dB drive). Its quietest detail: the
 *   WaveShaperNode resolves its input to 2⁻²⁴ of its ±1 range (float32),
 *   a floor near −130 dB re saturation.
 * - compressed: 14.85 dB of makeup gain below the threshold; pick attacks
 *   pass the 5 ms attack partly uncompressed. The compressor is our own code
 *   (render-compressor.ts), the same in every host; the other stages are
 *   Web Audio nodes (run-chain-design.ts).
 * The pipeline applies one common gain after the chain so the loudest
 * wiring does not clip in the file.
 */
import type { BiquadSpec } from './biquad-design.js';
import type { ChainName } from './chain-name.js';
import type { ChainOptions } from './chain-options.js';
import { COMPRESSOR_SETTINGS, type CompressorSettings } from './compressor-settings.js';
import { DRIVE_CURVE_SPAN, designDriveCurve } from './drive-curve.js';
import { decibelsToGain } from './decibels.js';
import { SPEAKER_CABINET } from './speaker-cabinet.js';
import { TONE_STACK } from './tone-stack.js';

/** Oversampling factors a WaveShaperNode offers (W3C Web Audio API 1.0). */
export type Oversample = 'none' | '2x' | '4x';

export type ChainStage =
  | { readonly kind: 'gain'; readonly gain: number; readonly purpose: string }
  | { readonly kind: 'biquad'; readonly filter: BiquadSpec; readonly purpose: string }
  | { readonly kind: 'shaper'; readonly curve: Float32Array<ArrayBuffer>; readonly oversample: Oversample; readonly purpose: string }
  | { readonly kind: 'compressor'; readonly settings: CompressorSettings; readonly purpose: string };

export interface ChainDesign {
  readonly name: ChainName;
  readonly sampleRateHz: number;
  readonly stages: readonly ChainStage[];
  /** Frames by which the stages delay the signal as a whole; the renderer removes them, so output lines up with input. */
  readonly latencyFrames: number;
}

/** Low cut before the clipper, Hz (common practice: amplifiers trim lows before their gain stages so low strings do not blur the distortion). */
export const DRIVE_LOW_CUT_HZ = 100;
/** Its quality factor: 0.5, critically damped, no bump (our choice). */
export const DRIVE_LOW_CUT_Q = 0.5;
/** Oversampling of the clipper (4×: harmonics up to 4× the Nyquist frequency are made before folding). */
export const DRIVE_OVERSAMPLE: Oversample = '4x';
/** Output trim after the cabinet, dB (our choice: the clipper's ±1 saturated swing comes out near a clean render's level for a 0.2 V pluck). */
export const DRIVE_OUTPUT_DB = -12;

/** Web Audio render quantum, frames (W3C Web Audio API 1.0: 128). */
export const RENDER_QUANTUM_FRAMES = 128;
/**
 * Delay of an oversampling WaveShaperNode, frames: node-web-audio-api 1.0.9's
 * 2×/4× resampler delays its output by exactly one render quantum (measured;
 * checked by effects-chain.test.ts).
 */
export const OVERSAMPLED_SHAPER_LATENCY_FRAMES = RENDER_QUANTUM_FRAMES;
function biquads(filters: readonly BiquadSpec[]): ChainStage[] {
  return filters.map((filter) => ({ kind: 'biquad', filter, purpose: filter.purpose }));
}

/** The stages of `name` with `options` (already resolved) at `sampleRateHz`. */
export function designEffectsChain(name: ChainName, options: ChainOptions, sampleRateHz: number): ChainDesign {
  const inputStage: ChainStage = { kind: 'gain', gain: options.inputGain, purpose: 'input to volts' };
  let stages: ChainStage[];
  switch (name) {
    case 'direct':
      stages = [];
      break;
    case 'clean':
      stages = [inputStage, ...biquads(TONE_STACK), ...biquads(SPEAKER_CABINET)];
      break;
    case 'drive': {
      // The clipper node reads inputs −1…+1 as u = span·x, so scale by drive gain / span (linear stages commute, so
      // input gain, drive gain and scale are one multiplication ahead of the low cut).
      const driveGain = (options.inputGain * decibelsToGain(options.driveDb)) / DRIVE_CURVE_SPAN;
      stages = [
        { kind: 'gain', gain: driveGain, purpose: 'input to volts, drive gain, clipper input scale' },
        { kind: 'biquad', filter: { kind: 'highpass', frequencyHz: DRIVE_LOW_CUT_HZ, q: DRIVE_LOW_CUT_Q, gainDb: 0, purpose: 'low cut before the clipper' }, purpose: 'low cut before the clipper' },
        { kind: 'shaper', curve: designDriveCurve(), oversample: DRIVE_OVERSAMPLE, purpose: 'soft clipper' },
        ...biquads(TONE_STACK),
        ...biquads(SPEAKER_CABINET),
        { kind: 'gain', gain: decibelsToGain(DRIVE_OUTPUT_DB), purpose: 'output trim' },
      ];
      break;
    }
    case 'compressed':
      stages = [inputStage, { kind: 'compressor', settings: COMPRESSOR_SETTINGS, purpose: 'compressor' }, ...biquads(TONE_STACK), ...biquads(SPEAKER_CABINET)];
      break;
  }
  return Object.freeze({ name, sampleRateHz, stages: Object.freeze(stages), latencyFrames: measureDesignLatencyFrames(stages) });
}

/**
 * Total fixed delay of `stages`, frames (biquads and gains have none: their phase response is not a fixed delay; nor
 * has the compressor, which looks at no sample ahead, render-compressor.ts).
 */
export function measureDesignLatencyFrames(stages: readonly ChainStage[]): number {
  let frames = 0;
  for (const stage of stages) {
    if (stage.kind === 'shaper' && stage.oversample !== 'none') frames += OVERSAMPLED_SHAPER_LATENCY_FRAMES;
  }
  return frames;
}
