/**
 * A biquad section run in our own code, sample for sample as a Web Audio
 * BiquadFilterNode runs it in node-web-audio-api 1.0.9, so the command line
 * renders the linear stages of a chain without an audio context and gets the
 * very same float32 samples (checked bit for bit against the node by
 * biquad-filter.test.ts).
 *
 * The arithmetic is the W3C Web Audio API 1.0 §BiquadFilterNode's, in the
 * order and precision that library computes it:
 *
 * - The node's parameters are float32 (frequency, Q, gain; lowpass and
 *   highpass take Q in dB, biquad-design.ts `webAudioQ`), and so is the
 *   context's sample rate; each is widened to float64 before use.
 * - Coefficients in float64, in the spec's order, cos, sin and 10^x
 *   correctly rounded as the C library gives them (correctly-rounded.ts):
 *   w0 = 2π·f0/fs,
 *   A = 10^(G/40), α_QdB = sin w0 / (2·10^(Q/20)) (lowpass, highpass),
 *   α_Q = sin w0 / (2Q) (peaking), α_S = sin w0 / 2 · √2 (shelves, slope 1),
 *   the shelves' 2·α_S·√A taken as (2·α_S)·√A; then every coefficient
 *   divided by a0.
 * - The filter in direct form I with a float64 state:
 *     y[n] = b0·x[n] + b1·x[n−1] + b2·x[n−2] − a1·y[n−1] − a2·y[n−2]
 *   summed left to right, x[n] the float32 input widened, the state keeping
 *   y[n] unrounded; the output sample is y[n] rounded to float32.
 *
 * Response curves and design checks use biquad-design.ts (`designBiquad`,
 * the cookbook from the plain values); this file is the running filter.
 */
import type { BiquadCoefficients, BiquadSpec } from './biquad-design.js';
import { cookbookSection, webAudioQ } from './biquad-design.js';
import { roundedCosSin, roundedPow10 } from './correctly-rounded.js';
import { FLOAT32_MIN_NORMAL, flushFloat32, flushFloat64 } from './float32-audio.js';

/** W3C Web Audio API 1.0 §BiquadFilterNode: α_QdB = sin w0 / (2·10^(Q/20)), Q in dB. */
const Q_DB_PER_DECADE = 20;
/** W3C Web Audio API 1.0 §BiquadFilterNode: A = 10^(G/40). */
const GAIN_DB_EXPONENT_DIVISOR = 40;

const designed = new Map<string, BiquadCoefficients>();

/** The coefficients a BiquadFilterNode computes for `spec` in a context running at `sampleRateHz` (see above; kept once made). */
export function designNodeBiquad(spec: BiquadSpec, sampleRateHz: number): BiquadCoefficients {
  const key = `${spec.kind} ${spec.frequencyHz} ${spec.q} ${spec.gainDb} ${sampleRateHz}`;
  let coefficients = designed.get(key);
  if (!coefficients) {
    coefficients = computeNodeBiquad(spec, sampleRateHz);
    designed.set(key, coefficients);
  }
  return coefficients;
}

function computeNodeBiquad(spec: BiquadSpec, sampleRateHz: number): BiquadCoefficients {
  // Parameters as the node holds them: float32, then widened.
  const f0 = Math.fround(spec.frequencyHz);
  const q = Math.fround(webAudioQ(spec));
  const gainDb = Math.fround(spec.gainDb);
  const fs = Math.fround(sampleRateHz);
  const w0 = (2 * Math.PI * f0) / fs;
  const { cos: cosW0, sin: sinW0 } = roundedCosSin(w0);
  // α_QdB for lowpass and highpass (their Q in dB), α_Q for peaking; the shelves make their own.
  const qInDb = spec.kind === 'lowpass' || spec.kind === 'highpass';
  const alpha = sinW0 / (2 * (qInDb ? roundedPow10(q / Q_DB_PER_DECADE) : q));
  return Object.freeze(cookbookSection(spec.kind, cosW0, sinW0, roundedPow10(gainDb / GAIN_DB_EXPONENT_DIVISOR), alpha));
}

/**
 * Run `samples` through one section from rest, as the node does (float32
 * input and output flushed, float64 state; float32-audio.ts). Writes into
 * `out` (a new array by default; may be `samples` itself).
 *
 * Two loops, the same arithmetic, taking turns. The first is the plain step:
 * exact as long as the input sample, the state and y[n] are each zero or at
 * least 2⁻¹²⁶ in size, for then no product (coefficients are at least 2⁻⁶⁰
 * in size: a lowpass at 1 Hz and 192 kHz has b0 ≈ 2⁻³²; a zero gives a zero
 * of the same sign either way) and no partial sum (a multiple of 2⁻²³⁹)
 * comes near the subnormals, and nothing needs flushing. At a sample where
 * that fails (a subnormal input, or an output falling below 2⁻¹²⁶ in the
 * ring-out after the sound stops) the second loop takes over from the same
 * state and flushes every read, product, sum and write, until the state is
 * again zero or at least 2⁻¹²⁶ in size (the ring-out flushed to zero, the
 * sound back), and hands back to the first. Before, the second loop kept on
 * to the end, and an exact zero in the input sent it there: a drive chain's
 * sections, whose input starts with zeros, ran their whole signal flushed,
 * at three times the time.
 */
export function renderBiquad(samples: Float32Array, coefficients: BiquadCoefficients, out: Float32Array = new Float32Array(samples.length)): Float32Array {
  const { b0, b1, b2, a1, a2 } = coefficients;
  const frames = samples.length;
  let x1 = 0;
  let x2 = 0;
  let y1 = 0;
  let y2 = 0;
  let n = 0;
  while (n < frames) {
    for (; n < frames; n += 1) {
      const x = samples[n] as number;
      const y = b0 * x + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
      // The common case is one test of each size; a zero (exact in both loops) is told from a tiny value after.
      if ((Math.abs(y) < FLOAT32_MIN_NORMAL || Math.abs(x) < FLOAT32_MIN_NORMAL) && (isTiny(x) || isTiny(y))) break;
      x2 = x1;
      x1 = x;
      y2 = y1;
      y1 = y;
      out[n] = y; // rounded to float32 on storing
    }
    for (; n < frames; n += 1) {
      const x = flushFloat32(samples[n] as number);
      let y = flushFloat64(flushFloat64(b0 * x) + flushFloat64(b1 * x1));
      y = flushFloat64(y + flushFloat64(b2 * x2));
      y = flushFloat64(y - flushFloat64(a1 * y1));
      y = flushFloat64(y - flushFloat64(a2 * y2));
      x2 = x1;
      x1 = x;
      y2 = y1;
      y1 = y;
      out[n] = flushFloat32(Math.fround(y));
      // The inputs in the state are never tiny (each was flushed here or passed the plain loop's test), so the
      // state is clean once both outputs are.
      if (!isTiny(y1) && !isTiny(y2)) {
        n += 1;
        break;
      }
    }
  }
  return out;
}

/**
 * Is `value` non-zero and below 2⁻¹²⁶ in size (where the plain step stops
 * being exact)? The size first: for sound that one test, whatever the
 * sign, is false (a test on the sign first cost the loop a quarter more).
 */
function isTiny(value: number): boolean {
  return Math.abs(value) < FLOAT32_MIN_NORMAL && value !== 0;
}
