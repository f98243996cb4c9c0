/**
 * What a pluck puts into the string loop: the travelling velocity wave
 * that a plucked string sends towards the bridge (Jaffe & Smith 1983; Smith,
 * PASP, "Generalized Pickup/Pick-Position Modeling"). The steps:
 *
 * 1. Source. An ideal pluck (string pulled to height h at distance p from
 *    the bridge, released at rest) gives, over one period, velocity waves
 *    (c/2)·y0'(x): a rectangular pulse of height c·h/(2p) lasting 2p/c, and
 *    −c·h/(2(L − p)) for the rest (d'Alembert, derived; its harmonic n has
 *    amplitude ∝ sin(nπp/L)/n as for the ideal pluck in Fletcher & Rossing,
 *    ch. 2). It is built as a one-period ramp (spectrum ∝ 1/n) through the
 *    pluck-position comb of step 2. A 'natural' pluck adds seeded noise to
 *    the ramp, the original Karplus–Strong excitation (Karplus & Strong 1983).
 * 2. Pluck-position comb 1 − z^(−M), M = 2p·fs/c samples (Jaffe & Smith:
 *    1 − z^(−βN), β = p/L; with N = 2L·fs/c that is 2p·fs/c). Its notches
 *    k·c/(2p) depend on p and c only, so they do not move with the fret.
 *    The fractional part of M is taken by linear interpolation.
 * 3. Pick direction (natural only): (1 − p)/(1 − p·z⁻¹), p = 0 one way, 0 < p < 1
 *    the other (Jaffe & Smith 1983).
 * 4. Dynamic level (natural only): (1 − R)/(1 − R·z⁻¹), R = e^(−π·B·T), B the
 *    bandwidth in Hz (Jaffe & Smith 1983): softer plucks are darker.
 */
import type { Random } from '../math/index.js';

export type PluckShape = 'natural' | 'ideal';
export type PickDirection = 'down' | 'up';

/** Amplitude of the natural pluck's noise relative to the ramp's scale (modelling choice; the ramp's own peak is ½). */
export const PICK_NOISE = 0.15;
/** Pick-direction pole for an upstroke; a downstroke uses 0 (Jaffe & Smith's p; value a modelling choice). */
export const UPSTROKE_POLE = 0.3;
/** Dynamic-level bandwidth at the softest and hardest pluck, Hz (modelling choice, from memory: soft plucks sound dull, hard ones bright). */
export const SOFT_PLUCK_BANDWIDTH_HZ = 1500;
export const HARD_PLUCK_BANDWIDTH_HZ = 15000;
/** The excitation's filter tails are kept until they fall below this fraction (−180 dB). */
const FILTER_TAIL_LEVEL = 1e-9;

export interface ExcitationRequest {
  readonly sampleRateHz: number;
  /** Loop period of the note, samples. */
  readonly periodSamples: number;
  /** Transverse wave speed of the string, m/s. */
  readonly waveSpeedMps: number;
  /** Vibrating length for this note (shortened by the fret), metres. */
  readonly vibratingM: number;
  /** Pluck distance from the bridge, metres (0 < p < vibratingM). */
  readonly pluckM: number;
  /** Height the string is pulled to, metres. */
  readonly displacementM: number;
  /** 0 … 1; sets the dynamic-level bandwidth of a natural pluck. */
  readonly velocity: number;
  readonly direction: PickDirection;
  readonly shape: PluckShape;
  /** Noise source for a natural pluck. */
  readonly random: Random;
}

/** The excitation signal x[n] added into the loop from the pluck on, in m/s. */
export function renderExcitation(request: ExcitationRequest): Float64Array {
  const { sampleRateHz, periodSamples, waveSpeedMps: c, vibratingM: L, pluckM: p, displacementM: h, shape } = request;
  const natural = shape === 'natural';
  // 1. One-period ramp: through the comb it becomes the ideal pluck's pulse of
  //    height c·h/(2p) (derived: the comb turns a ramp of scale A/(1 − p/L) into
  //    +A over M samples and −A·p/(L − p) elsewhere).
  const rampLength = Math.max(2, Math.round(periodSamples));
  const scale = (c * h * L) / (2 * p * (L - p));
  const source = new Float64Array(rampLength);
  for (let n = 0; n < rampLength; n += 1) {
    const noise = natural ? PICK_NOISE * (2 * request.random() - 1) : 0;
    source[n] = scale * (1 / 2 - n / rampLength + noise);
  }
  // 2. Pluck-position comb e[n] = q[n] − q[n − M], M fractional.
  const combDelay = (2 * p * sampleRateHz) / c;
  const whole = Math.floor(combDelay);
  const fraction = combDelay - whole;
  const pickPole = natural && request.direction === 'up' ? UPSTROKE_POLE : 0;
  const bandwidthHz = SOFT_PLUCK_BANDWIDTH_HZ * (HARD_PLUCK_BANDWIDTH_HZ / SOFT_PLUCK_BANDWIDTH_HZ) ** request.velocity;
  const dynamicPole = natural ? Math.exp((-Math.PI * bandwidthHz) / sampleRateHz) : 0;
  const slowestPole = Math.max(pickPole, dynamicPole);
  const tail = slowestPole > 0 ? Math.ceil(Math.log(FILTER_TAIL_LEVEL) / Math.log(slowestPole)) : 0;
  const out = new Float64Array(rampLength + whole + 2 + tail);
  const at = (n: number): number => (n >= 0 && n < rampLength ? (source[n] as number) : 0);
  let pickState = 0;
  let dynamicState = 0;
  for (let n = 0; n < out.length; n += 1) {
    const delayed = (1 - fraction) * at(n - whole) + fraction * at(n - whole - 1);
    const combed = at(n) - delayed;
    // 3. and 4. one-pole low-passes y[n] = (1 − a)·x[n] + a·y[n − 1].
    pickState = (1 - pickPole) * combed + pickPole * pickState;
    dynamicState = (1 - dynamicPole) * pickState + dynamicPole * dynamicState;
    out[n] = dynamicState;
  }
  return out;
}
