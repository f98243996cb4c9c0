/**
 * Fitting the coil model (coil-model.ts, docs/physics.md §1.6) to what a
 * pickup maker can measure:
 *
 * - `fitCoilToSweep`: a measured impedance sweep Z(f), by least squares on the
 *   relative complex error (Z_model − Z_measured)/|Z_measured| over every
 *   point (Levenberg–Marquardt with a numerical Jacobian; K. Levenberg 1944,
 *   D. W. Marquardt 1963), parameters in log form so they stay positive;
 * - `fitCoilToPeak`: the unloaded resonant peak (frequency and height above
 *   DC, or Q) of the open-lead voltage response, with the DC resistance and
 *   inductance, solved in closed form for C and a parallel loss resistance.
 */
import { type CoilModel, coilImpedanceAt, createCoilPhasors, evaluateCoil } from './coil-model.js';
import { fitLeastSquares } from '../math/index.js';
import type { ImpedancePoint } from './parse-impedance-sweep.js';

/** Which losses the sweep fit may use. */
export type CoilLossModel = 'eddy' | 'parallel' | 'both';

export interface SweepFitOptions {
  /** Loss elements fitted: the eddy branch (κ, Re), the parallel loss resistance Rp, or both. Default "eddy". */
  readonly losses: CoilLossModel;
  /** Levenberg–Marquardt iterations per start, at most. Default 400. */
  readonly maxIterations: number;
}

export const DEFAULT_SWEEP_FIT_OPTIONS: Readonly<SweepFitOptions> = Object.freeze({ losses: 'eddy', maxIterations: 400 });

export interface FittedCoil extends CoilModel {
  /** Corner frequency of the eddy branch, f_e = Re/(2π·κ·L), Hz (null without an eddy branch). */
  readonly eddyCornerHz: number | null;
  /** Root-mean-square relative error |Z_model − Z|/|Z| over the points. */
  readonly rmsRelativeError: number;
  /** Largest relative error at any point. */
  readonly maxRelativeError: number;
  readonly points: number;
}

const TWO_PI = 2 * Math.PI;
/** Starting guesses for the eddy share κ and the corner as a fraction of the peak frequency (a small grid; the best fit wins). */
const START_SHARES = [0.1, 0.3, 0.5];
const START_CORNER_FRACTIONS = [0.3, 1];
/** Starting parallel loss resistance as a multiple of the highest measured |Z|. */
const START_LOSS_FACTOR = 3;
/** A fitted loss resistance above this multiple of the highest measured |Z| is reported as none (it moves |Z| by under 0.1 %). */
const NEGLIGIBLE_LOSS_FACTOR = 1000;
/** Largest eddy share the fit may reach (as the guitar file accepts). */
const MAX_EDDY_SHARE = 0.95;

interface Layout {
  readonly eddy: boolean;
  readonly parallel: boolean;
}

function unpack(theta: readonly number[], layout: Layout): CoilModel {
  const [lnR, lnL, lnC] = theta as [number, number, number];
  let index = 3;
  let eddyShare = 0;
  let eddyResistanceOhms = 0;
  let lossResistanceOhms: number | null = null;
  if (layout.eddy) {
    // κ = κmax·σ(u): a logistic keeps 0 < κ < κmax
    eddyShare = MAX_EDDY_SHARE / (1 + Math.exp(-(theta[index] as number)));
    eddyResistanceOhms = Math.exp(theta[index + 1] as number);
    index += 2;
  }
  if (layout.parallel) lossResistanceOhms = Math.exp(theta[index] as number);
  return { resistanceOhms: Math.exp(lnR), inductanceH: Math.exp(lnL), capacitanceF: Math.exp(lnC), eddyShare, eddyResistanceOhms, lossResistanceOhms };
}

function residuals(theta: readonly number[], layout: Layout, sweep: readonly ImpedancePoint[], out: Float64Array): number {
  const coil = unpack(theta, layout);
  let sum = 0;
  sweep.forEach((point, i) => {
    const [re, im] = coilImpedanceAt(coil, point.frequencyHz);
    const scale = Math.hypot(point.realOhms, point.imaginaryOhms);
    const a = (re - point.realOhms) / scale;
    const b = (im - point.imaginaryOhms) / scale;
    out[2 * i] = a;
    out[2 * i + 1] = b;
    sum += a * a + b * b;
  });
  return sum;
}

/** Levenberg–Marquardt (src/math/fit-least-squares.ts) from `start` on the sweep's residuals. */
function minimise(start: number[], layout: Layout, sweep: readonly ImpedancePoint[], maxIterations: number): { theta: number[]; cost: number } {
  return fitLeastSquares((theta, out) => residuals(theta, layout, sweep, out), start, 2 * sweep.length, { maxIterations });
}

/** Fit the coil model to a measured impedance sweep (sorted by frequency, at least a dozen points). */
export function fitCoilToSweep(sweep: readonly ImpedancePoint[], options: Partial<SweepFitOptions> = {}): FittedCoil {
  const settings = { ...DEFAULT_SWEEP_FIT_OPTIONS, ...options };
  if (sweep.length < 2) throw new RangeError('fitCoilToSweep: need at least two points');
  const layout: Layout = { eddy: settings.losses !== 'parallel', parallel: settings.losses !== 'eddy' };
  // Starting values: at the lowest frequency Z ≈ R + jωL; C from the |Z| peak, ω_p² ≈ 1/(L·C).
  const low = sweep[0] as ImpedancePoint;
  const r0 = Math.max(low.realOhms, 1);
  const l0 = Math.max(low.imaginaryOhms / (TWO_PI * low.frequencyHz), 1e-3);
  let peak = low;
  for (const point of sweep) if (Math.hypot(point.realOhms, point.imaginaryOhms) > Math.hypot(peak.realOhms, peak.imaginaryOhms)) peak = point;
  const peakOmega = TWO_PI * peak.frequencyHz;
  const c0 = 1 / (peakOmega * peakOmega * l0);
  const starts: number[][] = [];
  const shares = layout.eddy ? START_SHARES : [0];
  const corners = layout.eddy ? START_CORNER_FRACTIONS : [1];
  for (const share of shares) {
    for (const corner of corners) {
      const theta = [Math.log(r0), Math.log(l0), Math.log(c0 * (1 - share))];
      if (layout.eddy) theta.push(Math.log(share / (MAX_EDDY_SHARE - share)), Math.log(TWO_PI * corner * peak.frequencyHz * share * l0));
      if (layout.parallel) theta.push(Math.log(START_LOSS_FACTOR * Math.hypot(peak.realOhms, peak.imaginaryOhms)));
      starts.push(theta);
    }
  }
  let best: { theta: number[]; cost: number } | null = null;
  for (const start of starts) {
    const result = minimise(start, layout, sweep, settings.maxIterations);
    if (best === null || result.cost < best.cost) best = result;
  }
  const raw = unpack((best as { theta: number[] }).theta, layout);
  // A loss resistance far above every measured |Z| changes nothing the sweep can see: report none.
  const negligible = raw.lossResistanceOhms !== null && raw.lossResistanceOhms > NEGLIGIBLE_LOSS_FACTOR * Math.hypot(peak.realOhms, peak.imaginaryOhms);
  const fitted = negligible ? { ...raw, lossResistanceOhms: null } : raw;
  let sumSquares = 0;
  let maxError = 0;
  for (const point of sweep) {
    const [re, im] = coilImpedanceAt(fitted, point.frequencyHz);
    const error = Math.hypot(re - point.realOhms, im - point.imaginaryOhms) / Math.hypot(point.realOhms, point.imaginaryOhms);
    sumSquares += error * error;
    maxError = Math.max(maxError, error);
  }
  return {
    ...fitted,
    eddyCornerHz: fitted.eddyShare > 0 ? fitted.eddyResistanceOhms / (TWO_PI * fitted.eddyShare * fitted.inductanceH) : null,
    rmsRelativeError: Math.sqrt(sumSquares / sweep.length),
    maxRelativeError: maxError,
    points: sweep.length,
  };
}

/** What a maker measures of the unloaded peak: its frequency and its height above DC (ratio) or its Q. */
export interface PeakMeasurement {
  readonly resistanceOhms: number;
  readonly inductanceH: number;
  readonly peakHz: number;
  /** Peak of the open-lead response over its DC value, as a ratio (> 1). */
  readonly height?: number;
  /** Pole Q of the unloaded coil (> 1/√2); used when no height is given. */
  readonly q?: number;
}

/**
 * C and the parallel loss resistance Rp from the unloaded peak, for a coil
 * without an eddy branch. The open-lead response is the second-order
 * low-pass of docs/physics.md §1.1 with RL = Rp: height = Q/√(1 − 1/(4Q²))
 * ⇒ Q² = (h² + √(h⁴ − h²))/2; ω0 = ω_p/√(1 − 1/(2Q²)); then with g = 1/Rp,
 * ω0² = (1 + R·g)/(L·C) and ω0/Q = g/C + R/L give a = ω0/Q − R/L,
 * g = a/(L·ω0² − a·R), C = (1 + R·g)/(L·ω0²) (derived).
 * Returns null when the peak is higher than the winding resistance alone allows.
 */
export function fitCoilToPeak(measurement: PeakMeasurement): CoilModel | null {
  const { resistanceOhms: r, inductanceH: l, peakHz } = measurement;
  let q: number;
  if (measurement.height !== undefined) {
    const h = measurement.height;
    if (!(h > 1)) return null;
    q = Math.sqrt((h * h + Math.sqrt(h ** 4 - h * h)) / 2);
  } else if (measurement.q !== undefined && measurement.q > Math.SQRT1_2) {
    q = measurement.q;
  } else {
    return null;
  }
  const omega0 = (TWO_PI * peakHz) / Math.sqrt(1 - 1 / (2 * q * q));
  const a = omega0 / q - r / l;
  const denominator = l * omega0 * omega0 - a * r;
  if (!(a > 0) || !(denominator > 0)) return null;
  const g = a / denominator;
  return {
    resistanceOhms: r,
    inductanceH: l,
    capacitanceF: (1 + r * g) / (l * omega0 * omega0),
    lossResistanceOhms: 1 / g,
    eddyShare: 0,
    eddyResistanceOhms: 0,
  };
}

/** Search range and grid for the unloaded peak, Hz (the coil alone peaks between a few and a few tens of kHz). */
const UNLOADED_LOW_HZ = 100;
const UNLOADED_HIGH_HZ = 200e3;
const UNLOADED_GRID_POINTS = 600;
const GOLDEN = (Math.sqrt(5) - 1) / 2;
const REFINE_STEPS = 80;

/** |k(f)| = |1/(1 + Z_s·Y_p)|: the open-lead voltage over the EMF (coil-model.ts). */
function openLeadGain(coil: CoilModel, frequencyHz: number): number {
  const phasors = evaluateCoil(coil, TWO_PI * frequencyHz, createCoilPhasors());
  return Math.hypot(phasors.sourceRe, phasors.sourceIm);
}

/**
 * The unloaded resonant peak of a coil: frequency and height above DC of its
 * open-lead voltage response (what a maker measures with an exciter coil and
 * a high-impedance probe); null when the response has no peak in range.
 */
export function measureUnloadedPeak(coil: CoilModel): { readonly frequencyHz: number; readonly heightDb: number } | null {
  const ratio = Math.log(UNLOADED_HIGH_HZ / UNLOADED_LOW_HZ) / (UNLOADED_GRID_POINTS - 1);
  let bestIndex = 0;
  let bestGain = -Infinity;
  for (let k = 0; k < UNLOADED_GRID_POINTS; k += 1) {
    const gain = openLeadGain(coil, UNLOADED_LOW_HZ * Math.exp(ratio * k));
    if (gain > bestGain) {
      bestGain = gain;
      bestIndex = k;
    }
  }
  if (bestIndex === 0 || bestIndex === UNLOADED_GRID_POINTS - 1) return null;
  // Golden-section refinement in log frequency between the neighbours of the best grid point.
  let a = Math.log(UNLOADED_LOW_HZ) + ratio * (bestIndex - 1);
  let b = Math.log(UNLOADED_LOW_HZ) + ratio * (bestIndex + 1);
  for (let step = 0; step < REFINE_STEPS; step += 1) {
    const c = b - GOLDEN * (b - a);
    const d = a + GOLDEN * (b - a);
    if (openLeadGain(coil, Math.exp(c)) > openLeadGain(coil, Math.exp(d))) b = d;
    else a = c;
  }
  const frequencyHz = Math.exp((a + b) / 2);
  const dc = coil.lossResistanceOhms === null ? 1 : coil.lossResistanceOhms / (coil.lossResistanceOhms + coil.resistanceOhms);
  return { frequencyHz, heightDb: 20 * Math.log10(openLeadGain(coil, frequencyHz) / dc) };
}
