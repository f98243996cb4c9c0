/**
 * Published measurements of real pickups (test/data/published/*.json,
 * docs/physics.md §1.6 "Checked against published measurements") and the
 * figures the checks compare: the peak of the loaded-over-open response for
 * each known load, measured from the data and predicted by the fitted coil
 * model with the same estimator on the same frequencies.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import {
  type CoilModel,
  type LoadedResponse,
  type LoadFitOptions,
  type LoadFittedCoil,
  coilLoadRatioAt,
  fitCoilToLoadedResponses,
  withInstrument,
} from '../../src/circuit/index.js';
import type { CoilConstruction } from '../../src/guitar/index.js';

export const PUBLISHED_FOLDER = join(import.meta.dirname, '..', 'data', 'published');

export interface PublishedPickup {
  readonly name: string;
  readonly description: string;
  readonly construction: CoilConstruction | null;
  readonly dcResistanceOhms: number;
  readonly instrumentOhms: number;
  /** The 200 kΩ ∥ 470 pF load, then the test capacitor. */
  readonly responses: readonly [LoadedResponse, LoadedResponse];
}

interface PublishedFile {
  readonly description: string;
  readonly construction: CoilConstruction | null;
  readonly dcResistanceOhms: number;
  readonly testCapacitorValidFromHz: number;
  readonly measurement: { readonly loadOhms: number; readonly loadFarads: number; readonly testCapacitorFarads: number; readonly instrumentOhms: number };
  readonly rows: readonly (readonly [number, number, number, number | null, number | null, number | null, number | null])[];
}

const DEGREE = Math.PI / 180;
const DB_PER_NEPER = 20 / Math.LN10;

/** Complex ratio of two measured points given in dB and degrees: 10^((a−b)/20)·e^{j(φa−φb)}. */
function ratioOf(db: number, deg: number, openDb: number, openDeg: number): { ratioRe: number; ratioIm: number } {
  const magnitude = 10 ** ((db - openDb) / 20);
  const angle = (deg - openDeg) * DEGREE;
  return { ratioRe: magnitude * Math.cos(angle), ratioIm: magnitude * Math.sin(angle) };
}

export function readPublishedPickups(): PublishedPickup[] {
  return readdirSync(PUBLISHED_FOLDER)
    .filter((name) => name.endsWith('.json'))
    .sort()
    .map((name) => {
      const file = JSON.parse(readFileSync(join(PUBLISHED_FOLDER, name), 'utf8')) as PublishedFile;
      const m = file.measurement;
      const loaded = file.rows.flatMap(([frequencyHz, openDb, openDeg, db, deg]) => (db === null || deg === null ? [] : [{ frequencyHz, ...ratioOf(db, deg, openDb, openDeg) }]));
      const capacitor = file.rows.flatMap(([frequencyHz, openDb, openDeg, , , db, deg]) =>
        db === null || deg === null || frequencyHz < file.testCapacitorValidFromHz ? [] : [{ frequencyHz, ...ratioOf(db, deg, openDb, openDeg) }],
      );
      return {
        name: name.replace(/\.json$/u, ''),
        description: file.description,
        construction: file.construction,
        dcResistanceOhms: file.dcResistanceOhms,
        instrumentOhms: m.instrumentOhms,
        responses: [
          { conductanceS: 1 / m.loadOhms, capacitanceF: m.loadFarads, points: loaded },
          { conductanceS: 0, capacitanceF: m.testCapacitorFarads, points: capacitor },
        ],
      };
    });
}

export interface PeakFigure {
  readonly frequencyHz: number;
  /** Peak of |V_loaded/V_open| as a ratio. */
  readonly height: number;
}

/** How far below the highest point the points of a peak may lie, dB. */
const PEAK_WINDOW_DB = 1;

/**
 * The peak of |ratio| over a sampled curve: a least-squares parabola in
 * (ln f, dB) through the contiguous points within 1 dB of the highest (at
 * least its two neighbours), read at its vertex — parabolic peak
 * interpolation (J. O. Smith III, Spectral Audio Signal Processing,
 * "Quadratic Interpolation of Spectral Peaks"), widened to more points so
 * the ±0.1 dB scatter of the data averages out (our choice).
 */
export function measureRatioPeak(frequenciesHz: readonly number[], magnitudes: readonly number[]): PeakFigure {
  const db = magnitudes.map((value) => DB_PER_NEPER * Math.log(value));
  let top = 0;
  db.forEach((value, i) => {
    if (value > (db[top] as number)) top = i;
  });
  if (top === 0 || top === db.length - 1) throw new RangeError('measureRatioPeak: the highest point is at an end of the curve');
  let low = top - 1;
  let high = top + 1;
  while (low > 0 && (db[low - 1] as number) >= (db[top] as number) - PEAK_WINDOW_DB) low -= 1;
  while (high < db.length - 1 && (db[high + 1] as number) >= (db[top] as number) - PEAK_WINDOW_DB) high += 1;
  // Least squares y = a + b·x + c·x², x = ln(f/f_top): normal equations of the three sums.
  const x0 = Math.log(frequenciesHz[top] as number);
  const s = [0, 0, 0, 0, 0];
  const t = [0, 0, 0];
  for (let i = low; i <= high; i += 1) {
    const x = Math.log(frequenciesHz[i] as number) - x0;
    const y = db[i] as number;
    for (let k = 0; k < 5; k += 1) s[k] = (s[k] as number) + x ** k;
    for (let k = 0; k < 3; k += 1) t[k] = (t[k] as number) + y * x ** k;
  }
  const [s0, s1, s2, s3, s4] = s as [number, number, number, number, number];
  const [t0, t1, t2] = t as [number, number, number];
  // Cramer's rule on [[s0 s1 s2][s1 s2 s3][s2 s3 s4]]·[a b c] = [t0 t1 t2]
  const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
  const a = (t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2)) / det;
  const b = (s0 * (t1 * s4 - s3 * t2) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2)) / det;
  const c = (s0 * (s2 * t2 - t1 * s3) - s1 * (s1 * t2 - t1 * s2) + t0 * (s1 * s3 - s2 * s2)) / det;
  const vertex = c < 0 ? -b / (2 * c) : 0;
  return { frequencyHz: Math.exp(x0 + vertex), height: 10 ** ((a + b * vertex + c * vertex * vertex) / 20) };
}

/** The measured peak of one load's ratio. */
export function measuredPeak(response: LoadedResponse): PeakFigure {
  return measureRatioPeak(
    response.points.map((point) => point.frequencyHz),
    response.points.map((point) => Math.hypot(point.ratioRe, point.ratioIm)),
  );
}

/** The model's peak for the same load, read with the same estimator at the same frequencies. */
export function modelPeak(coil: CoilModel, instrumentOhms: number, response: LoadedResponse): PeakFigure {
  const withLeads = withInstrument(coil, instrumentOhms);
  const frequencies = response.points.map((point) => point.frequencyHz);
  const magnitudes = frequencies.map((f) => {
    const [re, im] = coilLoadRatioAt(withLeads, response.conductanceS, response.capacitanceF, f);
    return Math.hypot(re, im);
  });
  return measureRatioPeak(frequencies, magnitudes);
}

/** Fit the model to the chosen loads of a pickup, its DC resistance held at the measured value. */
export function fitPublishedPickup(pickup: PublishedPickup, loads: readonly LoadedResponse[] = pickup.responses, options: Partial<LoadFitOptions> = {}): LoadFittedCoil {
  return fitCoilToLoadedResponses(loads, { resistanceOhms: pickup.dcResistanceOhms, instrumentOhms: pickup.instrumentOhms, ...options });
}

/** Relative difference a/b − 1. */
export function relativeError(model: number, measured: number): number {
  return model / measured - 1;
}
