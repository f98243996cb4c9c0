/**
 * Design of one note's string loop (Jaffe & Smith 1983, "Extensions of the
 * Karplus–Strong plucked-string algorithm"; Smith, PASP, "The Extended
 * Karplus–Strong Algorithm"): a delay line of N whole samples, the one-zero
 * damping filter Hd for brightness, a first-order allpass for the fractional
 * delay, a dispersion allpass cascade D for the string's stiffness
 * (`designDispersionAllpass`; absent when B = 0) and a loop gain ρ for the
 * decay. The loop's phase delay at the fundamental is made exactly one period:
 *
 *   N + τ_Hd(ω1) + τ_D(ω1) + τ_A(ω1) = P = fs / f1,   ω1 = 2π·f1/fs
 *
 * so the loop resonates at f1 (the damping filter's phase delay is accounted
 * for at ω1, not only at DC). This is plain data: `runStringLoop` applies it.
 */
import { dampingFilterGain, dampingFilterPhaseDelay, stretchForBrightness } from './damping-filter.js';
import { type DispersionAllpass, designDispersionAllpass } from './dispersion-allpass.js';
import { MIN_ALLPASS_DELAY, allpassCoefficient } from './tuning-allpass.js';

/** Level that defines t60: −60 dB = 0.001 in amplitude. */
export const T60_LEVEL = 0.001;

export interface StringLoopRequest {
  readonly sampleRateHz: number;
  /** The note's fundamental, Hz. */
  readonly frequencyHz: number;
  /** Time for the fundamental to fall by 60 dB, seconds. */
  readonly t60S: number;
  /** 0 (plain Karplus–Strong averaging, darkest) to 1 (no extra loss of highs). */
  readonly brightness: number;
  /** Inharmonicity coefficient B of the vibrating length (Fletcher & Rossing ch. 2); 0 or absent: a flexible string. */
  readonly inharmonicity?: number;
}

export interface StringLoop {
  /** Loop period P = fs/f1, samples (fractional). */
  readonly periodSamples: number;
  /** Whole-sample delay line length N. */
  readonly delaySamples: number;
  /** Damping filter's S. */
  readonly stretch: number;
  /** Tuning allpass coefficient η. */
  readonly allpassEta: number;
  /** Fractional delay Δ the allpass gives at the fundamental, samples. */
  readonly allpassDelay: number;
  /** Stiffness dispersion cascade (0 sections when B = 0). */
  readonly dispersion: DispersionAllpass;
  /** Loop gain ρ applied once per trip round the loop. */
  readonly loopGain: number;
  /** True when the damping filter alone already decays the fundamental faster than t60 asks (ρ capped at 1). */
  readonly decayLimitedByBrightness: boolean;
}

export function designStringLoop(request: StringLoopRequest): StringLoop {
  const { sampleRateHz, frequencyHz, t60S, brightness } = request;
  const periodSamples = sampleRateHz / frequencyHz;
  const omega = (2 * Math.PI * frequencyHz) / sampleRateHz;
  const stretch = stretchForBrightness(brightness);
  const dampingDelay = dampingFilterPhaseDelay(stretch, omega);
  // The delay line keeps at least one sample: the rest of the period is the dispersion cascade's budget.
  const budget = periodSamples - dampingDelay - MIN_ALLPASS_DELAY - 1;
  const dispersion = designDispersionAllpass(sampleRateHz, frequencyHz, request.inharmonicity ?? 0, budget, (w) =>
    dampingFilterPhaseDelay(stretch, w),
  );
  const fixedDelay = dampingDelay + dispersion.delayAtFundamental;
  // N + τ_Hd + τ_D + Δ = P with Δ in [MIN_ALLPASS_DELAY, MIN_ALLPASS_DELAY + 1).
  const delaySamples = Math.floor(periodSamples - fixedDelay - MIN_ALLPASS_DELAY);
  if (delaySamples < 1) throw new RangeError(`a string loop needs a period of at least 2 samples, got ${periodSamples}`);
  const allpassDelay = periodSamples - fixedDelay - delaySamples;
  const allpassEta = allpassCoefficient(allpassDelay, omega);
  // Smith, PASP, "One-Zero String Damping Filter": ρ = 0.001^(P·T/t60) per
  // period reaches −60 dB after t60. Divided by |Hd(ω1)| so the fundamental's
  // whole loop gain ρ·|Hd(ω1)| is that target exactly (derived).
  const targetGain = T60_LEVEL ** (periodSamples / (sampleRateHz * t60S));
  const wanted = targetGain / dampingFilterGain(stretch, omega);
  // ρ > 1 would make the loop grow at DC, where Hd's gain is 1.
  const loopGain = Math.min(wanted, 1);
  return {
    periodSamples,
    delaySamples,
    stretch,
    allpassEta,
    allpassDelay,
    dispersion,
    loopGain,
    decayLimitedByBrightness: wanted > 1,
  };
}
