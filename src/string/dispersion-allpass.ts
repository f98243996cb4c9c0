/**
 * Stiffness dispersion of a steel string, as an allpass in the string loop.
 *
 * A stiff string's partials are stretched (Fletcher & Rossing, *The Physics
 * of Musical Instruments*, 2nd ed. 1998, ch. 2):
 *
 *   f_n = n·f0·√(1 + B·n²),   B = π³·E·d⁴ / (64·T·L²)
 *
 * f0 being the flexible string's fundamental. A player tunes the sounded
 * fundamental f1 = f0·√(1 + B), so relative to it
 *
 *   f_n / f1 = n·√((1 + B·n²) / (1 + B))                                  (1)
 *
 * The loop resonates where its whole phase delay τ_loop(ω) satisfies
 * ω·τ_loop(ω) = 2π·n, so partial n needs τ_loop(ω_n) = n·fs/f_n = P·n/(f_n/f1),
 * P = fs/f1: high partials need a shorter loop. The difference from the
 * fundamental's delay is (derived from (1))
 *
 *   ΔD_n = P·(√((1 + B)/(1 + B·n²)) − 1)                                   (2)
 *
 * It is realised, as Van Duyne & Smith (1994, "A simplified approach to
 * modeling dispersion caused by stiffness in strings and plates", ICMC) do,
 * by a cascade of M identical first-order allpasses
 * H(z) = (a + z⁻¹)/(1 + a·z⁻¹) with −1 < a < 0, whose phase delay falls
 * with frequency. Rauhala & Välimäki (2006, "Tunable dispersion filter
 * design for piano synthesis", IEEE Signal Processing Letters 13(5)) give a
 * closed-form rule for a; here, a simpler documented design: for each
 * M = 1 … DISPERSION_SECTIONS, a is chosen by a one-dimensional least-squares
 * fit of M·(τ_H(ω_n) − τ_H(ω_1)) to ΔD_n less the rest of the loop's own
 * dispersion (the damping filter's τ(ω_n) − τ(ω_1)) over the partials
 * n = 2 … that lie below DISPERSION_FIT_MAX_HZ (at most
 * DISPERSION_FIT_MAX_PARTIAL of them). The first M whose worst partial is
 * within DISPERSION_FIT_TOLERANCE_CENTS is kept, else the best fit found. A
 * loop delay error δ at partial n moves it by −(1200/ln 2)·δ/D_n cents,
 * D_n = n·fs/f_n (derived from ω·τ_loop = 2πn). The cascade's phase delay at the
 * fundamental, M·τ_H(ω_1), is taken off the loop's delay line so the
 * fundamental stays in tune (`designStringLoop`).
 */
import { allpassPhaseDelay } from './tuning-allpass.js';

/** Most first-order sections in the dispersion cascade (modelling choice: the fit tries 1 … this many and keeps the best; more cost time per sample). */
export const DISPERSION_SECTIONS = 16;
/** Highest partial frequency the fit looks at, Hz (common practice: a guitar amplifier's speaker passes little above about 5 kHz). */
export const DISPERSION_FIT_MAX_HZ = 5000;
/** Highest partial number in the fit (modelling choice: the partials that carry a plucked note's pitch and beats). */
export const DISPERSION_FIT_MAX_PARTIAL = 10;
/** Partial error at which a fit is good enough to stop adding sections, cents (modelling choice: a tenth of the 1-cent pitch check). */
export const DISPERSION_FIT_TOLERANCE_CENTS = 0.1;
/** Cents per natural-log unit of frequency ratio, 1200/ln 2 (definition of the cent). */
const CENTS_PER_NEPER = 1200 / Math.LN2;
/** Share of the loop period the cascade may take at the fundamental (modelling choice: leaves the delay line and tuning allpass room). */
const MAX_PERIOD_SHARE = 0.5;
/** Grid points of the coarse search over a before the golden-section refinement. */
const GRID_POINTS = 64;
/** Golden-section steps (each shrinks the bracket by 0.618: 60 reach double precision). */
const GOLDEN_STEPS = 60;

export interface DispersionAllpass {
  /** Number of first-order sections M; 0 when the string has no stiffness (B = 0) or no partial to fit. */
  readonly sections: number;
  /** Coefficient a of every section. */
  readonly coefficient: number;
  /** Phase delay of the whole cascade at the fundamental, samples. */
  readonly delayAtFundamental: number;
}

export const NO_DISPERSION: DispersionAllpass = Object.freeze({ sections: 0, coefficient: 0, delayAtFundamental: 0 });

/** Partial n's frequency over the fundamental's for inharmonicity B: equation (1). */
export function partialRatio(n: number, inharmonicity: number): number {
  return n * Math.sqrt((1 + inharmonicity * n * n) / (1 + inharmonicity));
}

/**
 * Design the cascade for a note at `frequencyHz` with inharmonicity B, taking at most `budgetSamples` of
 * delay at the fundamental (times MAX_PERIOD_SHARE); `loopDelay(ω)` is the phase delay, in samples, of the
 * rest of the loop's filters, whose own dispersion the cascade makes up for.
 */
export function designDispersionAllpass(
  sampleRateHz: number,
  frequencyHz: number,
  inharmonicity: number,
  budgetSamples: number,
  loopDelay: (omega: number) => number = () => 0,
): DispersionAllpass {
  if (inharmonicity === 0) return NO_DISPERSION;
  const periodSamples = sampleRateHz / frequencyHz;
  const maxHz = Math.min(DISPERSION_FIT_MAX_HZ, sampleRateHz / 4);
  const omega1 = (2 * Math.PI * frequencyHz) / sampleRateHz;
  const loopDelayAtFundamental = loopDelay(omega1);
  const partials: { omega: number; target: number; loopDelay: number }[] = [];
  for (let n = 2; n <= DISPERSION_FIT_MAX_PARTIAL; n += 1) {
    const hz = frequencyHz * partialRatio(n, inharmonicity);
    if (hz > maxHz) break;
    // Equation (2).
    const omega = (2 * Math.PI * hz) / sampleRateHz;
    const needed = (periodSamples * n) / partialRatio(n, inharmonicity);
    partials.push({ omega, target: needed - periodSamples - (loopDelay(omega) - loopDelayAtFundamental), loopDelay: needed });
  }
  if (partials.length === 0) return NO_DISPERSION;
  let best: DispersionAllpass = NO_DISPERSION;
  let bestError = Infinity;
  for (let m = 1; m <= DISPERSION_SECTIONS; m += 1) {
    const fit = fitSections(m, omega1, partials, budgetSamples);
    if (fit && fit.error < bestError) {
      best = fit.filter;
      bestError = fit.error;
      if (fit.worstCents <= DISPERSION_FIT_TOLERANCE_CENTS) break;
    }
  }
  return best;
}

/** Least-squares coefficient for M sections (coarse grid, then golden section); undefined when M sections cannot fit the budget. */
function fitSections(
  m: number,
  omega1: number,
  partials: readonly { omega: number; target: number; loopDelay: number }[],
  budgetSamples: number,
): { filter: DispersionAllpass; error: number; worstCents: number } | undefined {
  // Bound a so that M·τ_H(0) = M·(1 − a)/(1 + a) stays within the allowed share of the budget.
  const maxSectionDelay = (MAX_PERIOD_SHARE * budgetSamples) / m;
  if (maxSectionDelay <= 1) return undefined;
  const lowest = (1 - maxSectionDelay) / (1 + maxSectionDelay);
  const error = (a: number): number => {
    const base = allpassPhaseDelay(a, omega1);
    let sum = 0;
    for (const { omega, target } of partials) {
      const miss = m * (allpassPhaseDelay(a, omega) - base) - target;
      sum += miss * miss;
    }
    return sum;
  };
  // Coarse grid over [lowest, 0], then golden-section search in the best cell's neighbourhood.
  let best = 0;
  let bestError = error(0);
  // (a = 0 is a pure delay: no dispersion.)
  const step = -lowest / GRID_POINTS;
  for (let i = 0; i <= GRID_POINTS; i += 1) {
    const a = lowest + i * step;
    const e = error(a);
    if (e < bestError) {
      best = a;
      bestError = e;
    }
  }
  let low = Math.max(lowest, best - step);
  let high = Math.min(0, best + step);
  const ratio = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < GOLDEN_STEPS; i += 1) {
    const left = high - ratio * (high - low);
    const right = low + ratio * (high - low);
    if (error(left) < error(right)) high = right;
    else low = left;
  }
  const coefficient = (low + high) / 2;
  const base = allpassPhaseDelay(coefficient, omega1);
  let worstCents = 0;
  for (const { omega, target, loopDelay } of partials) {
    const miss = m * (allpassPhaseDelay(coefficient, omega) - base) - target;
    worstCents = Math.max(worstCents, (CENTS_PER_NEPER * Math.abs(miss)) / loopDelay);
  }
  return { filter: { sections: m, coefficient, delayAtFundamental: m * base }, error: error(coefficient), worstCents };
}
