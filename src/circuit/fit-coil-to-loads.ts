/**
 * Fitting the coil model (coil-model.ts, docs/physics.md §1.6) to what an
 * exciter-coil bench measures: the pickup's voltage with the leads open
 * (only the instrument across them) and again with a known load added, at
 * the same frequencies. Their ratio no longer holds the exciter, the
 * coupling or the instrument's gain — only the coil's output impedance:
 *
 *   V_loaded/V_open = 1/(1 + Z_out·Y_L)        (voltage divider of the coil's
 *                                               Thevenin source, derived)
 *
 * where Z_out is the coil with the instrument's input resistance across its
 * leads and Y_L = 1/R_L + jωC_L the added load. The fit is least squares on
 * the relative complex error of that ratio over every point of every load
 * (Levenberg–Marquardt, src/math/fit-least-squares.ts), parameters in log
 * form; the DC resistance is held at its measured value when given.
 *
 * The instrument's own capacitance cannot be told apart from the winding's
 * (both sit across the leads), so the fitted C holds both.
 */
import { fitLeastSquares } from '../math/index.js';
import { type CoilModel, createCoilPhasors, evaluateCoil } from './coil-model.js';

/** One frequency of a loaded response: V_loaded/V_open as a complex ratio. */
export interface LoadRatioPoint {
  readonly frequencyHz: number;
  readonly ratioRe: number;
  readonly ratioIm: number;
}

/** A load added across the coil's leads (parallel R and C; a missing part is 0 S or 0 F) and the ratios measured with it. */
export interface LoadedResponse {
  readonly conductanceS: number;
  readonly capacitanceF: number;
  readonly points: readonly LoadRatioPoint[];
}

export interface LoadFitOptions {
  /** Measured DC resistance held fixed, ohms; null fits it too. Default null. */
  readonly resistanceOhms: number | null;
  /** Input resistance of the instrument across the leads in both measurements, ohms. Default 1 MΩ. */
  readonly instrumentOhms: number;
  /** Eddy branch fixed instead of fitted (share κ and corner f_e in Hz); null fits both. Default null. */
  readonly eddy: { readonly share: number; readonly cornerHz: number } | null;
  /** Levenberg–Marquardt iterations per start, at most. Default 400. */
  readonly maxIterations: number;
}

/** A usual oscilloscope or sound-card input, 1 MΩ — common practice. */
export const DEFAULT_INSTRUMENT_OHMS = 1e6;

export const DEFAULT_LOAD_FIT_OPTIONS: Readonly<LoadFitOptions> = Object.freeze({
  resistanceOhms: null,
  instrumentOhms: DEFAULT_INSTRUMENT_OHMS,
  eddy: null,
  maxIterations: 400,
});

export interface LoadFittedCoil extends CoilModel {
  /** Corner frequency of the eddy branch f_e = Re/(2π·κ·L), Hz. */
  readonly eddyCornerHz: number;
  /** Root-mean-square relative error |ratio_model − ratio|/|ratio| over every point. */
  readonly rmsRelativeError: number;
  readonly points: number;
}

const TWO_PI = 2 * Math.PI;
/** Largest eddy share the fit may reach (as the guitar file accepts). */
const MAX_EDDY_SHARE = 0.95;
/** Starting guesses (a small grid; the best fit wins): inductance in henries, eddy share, corner in hertz; C from the highest ratio peak. */
const START_INDUCTANCES_H = [1, 4];
const START_SHARES = [0.1, 0.3, 0.6];
const START_CORNERS_HZ = [2000, 8000];
const START_RESISTANCE_OHMS = 6000;
/** Smallest starting capacitance, farads (10 pF, below any winding). */
const MIN_START_CAPACITANCE_F = 10e-12;

/** V_loaded/V_open = 1/(1 + Z_out·Y_L) for a coil (instrument already in its loss resistance) and a load, at f. */
export function coilLoadRatioAt(coilWithInstrument: CoilModel, conductanceS: number, capacitanceF: number, frequencyHz: number): [number, number] {
  const omega = TWO_PI * frequencyHz;
  const phasors = evaluateCoil(coilWithInstrument, omega, createCoilPhasors());
  // 1 + Z·Y with Y = G + jωC
  const dr = 1 + phasors.impedanceRe * conductanceS - phasors.impedanceIm * omega * capacitanceF;
  const di = phasors.impedanceRe * omega * capacitanceF + phasors.impedanceIm * conductanceS;
  const norm = dr * dr + di * di;
  return [dr / norm, -di / norm];
}

/** The coil with the instrument's input resistance across its leads (parallel with any loss resistance it has). */
export function withInstrument(coil: CoilModel, instrumentOhms: number): CoilModel {
  const own = coil.lossResistanceOhms;
  return { ...coil, lossResistanceOhms: own === null ? instrumentOhms : (own * instrumentOhms) / (own + instrumentOhms) };
}

interface Layout {
  readonly fixedResistanceOhms: number | null;
  readonly eddy: { readonly share: number; readonly cornerHz: number } | null;
}

function unpack(theta: readonly number[], layout: Layout): CoilModel {
  const inductanceH = Math.exp(theta[0] as number);
  const capacitanceF = Math.exp(theta[1] as number);
  let index = 2;
  let eddyShare: number;
  let eddyResistanceOhms: number;
  if (layout.eddy === null) {
    // κ = κmax·σ(u): a logistic keeps 0 < κ < κmax
    eddyShare = MAX_EDDY_SHARE / (1 + Math.exp(-(theta[index] as number)));
    eddyResistanceOhms = Math.exp(theta[index + 1] as number);
    index += 2;
  } else {
    eddyShare = layout.eddy.share;
    // Re = 2π·f_e·κ·L (the branch κL ∥ Re turns over at f_e)
    eddyResistanceOhms = TWO_PI * layout.eddy.cornerHz * eddyShare * inductanceH;
  }
  const resistanceOhms = layout.fixedResistanceOhms ?? Math.exp(theta[index] as number);
  return { resistanceOhms, inductanceH, capacitanceF, lossResistanceOhms: null, eddyShare, eddyResistanceOhms };
}

function residuals(theta: readonly number[], layout: Layout, responses: readonly LoadedResponse[], instrumentOhms: number, out: Float64Array): number {
  const coil = withInstrument(unpack(theta, layout), instrumentOhms);
  let k = 0;
  let sum = 0;
  for (const response of responses) {
    for (const point of response.points) {
      const [re, im] = coilLoadRatioAt(coil, response.conductanceS, response.capacitanceF, point.frequencyHz);
      const scale = Math.hypot(point.ratioRe, point.ratioIm);
      const a = (re - point.ratioRe) / scale;
      const b = (im - point.ratioIm) / scale;
      out[k] = a;
      out[k + 1] = b;
      k += 2;
      sum += a * a + b * b;
    }
  }
  return sum;
}

/** Fit the coil model to the loaded-over-open ratios of one or more known loads. */
export function fitCoilToLoadedResponses(responses: readonly LoadedResponse[], options: Partial<LoadFitOptions> = {}): LoadFittedCoil {
  const settings = { ...DEFAULT_LOAD_FIT_OPTIONS, ...options };
  const points = responses.reduce((total, response) => total + response.points.length, 0);
  if (points < 2) throw new RangeError('fitCoilToLoadedResponses: need at least two points');
  if (!(settings.instrumentOhms > 0)) throw new RangeError(`fitCoilToLoadedResponses: expected a positive instrument resistance, got ${settings.instrumentOhms}`);
  const layout: Layout = { fixedResistanceOhms: settings.resistanceOhms, eddy: settings.eddy };
  // Starting C from the highest ratio peak of the most capacitive load: ω_p² ≈ 1/(L·(C + C_L)).
  let peak: { frequencyHz: number; magnitude: number; loadF: number } = { frequencyHz: 1000, magnitude: 0, loadF: 0 };
  for (const response of responses) {
    for (const point of response.points) {
      const magnitude = Math.hypot(point.ratioRe, point.ratioIm);
      if (magnitude > peak.magnitude) peak = { frequencyHz: point.frequencyHz, magnitude, loadF: response.capacitanceF };
    }
  }
  const starts: number[][] = [];
  for (const inductanceH of START_INDUCTANCES_H) {
    const omega = TWO_PI * peak.frequencyHz;
    const capacitanceF = Math.max(1 / (omega * omega * inductanceH) - peak.loadF, MIN_START_CAPACITANCE_F);
    const shares = layout.eddy === null ? START_SHARES : [0];
    const corners = layout.eddy === null ? START_CORNERS_HZ : [0];
    for (const share of shares) {
      for (const cornerHz of corners) {
        const theta = [Math.log(inductanceH), Math.log(capacitanceF)];
        if (layout.eddy === null) theta.push(Math.log(share / (MAX_EDDY_SHARE - share)), Math.log(TWO_PI * cornerHz * share * inductanceH));
        if (layout.fixedResistanceOhms === null) theta.push(Math.log(START_RESISTANCE_OHMS));
        starts.push(theta);
      }
    }
  }
  let best: { theta: number[]; cost: number } | null = null;
  for (const start of starts) {
    const result = fitLeastSquares((theta, out) => residuals(theta, layout, responses, settings.instrumentOhms, out), start, 2 * points, {
      maxIterations: settings.maxIterations,
    });
    if (best === null || result.cost < best.cost) best = result;
  }
  const theta = (best as { theta: number[]; cost: number }).theta;
  const coil = unpack(theta, layout);
  return {
    ...coil,
    eddyCornerHz: coil.eddyShare > 0 ? coil.eddyResistanceOhms / (TWO_PI * coil.eddyShare * coil.inductanceH) : Number.POSITIVE_INFINITY,
    rmsRelativeError: Math.sqrt((best as { cost: number }).cost / points),
    points,
  };
}
