/**
 * How far apart two wirings sound, on one scale: each difference divided by
 * its just-noticeable threshold (alike-thresholds.ts), the largest of them
 * taken, so 1.0 is just noticeable and two wirings are alike below 1:
 *
 *   distance = max( |L_B − L_A| / T_level,  D(A, B) / T_spectrum,
 *                   |ln(b_B / b_A)| / ln(1 + T_brightness/100) )
 *
 * L = level (dB), D = loudness-weighted RMS distance of the level-matched
 * excitation patterns (measure-spectral-profiles.ts), b = brightness (Hz).
 * The brightness term is symmetric on a log scale: +3 % and −2.9 % both read 1.0
 * at a 3 % threshold; every term, and so the distance, is exactly symmetric
 * (d(A, B) and d(B, A) are the same double). The largest term, not a sum, because each threshold
 * is a limen measured on its own: a wiring pair is noticed as different as
 * soon as any one difference is.
 */
import type { AlikeThresholds } from './alike-thresholds.js';
import { DYNAMIC_RANGE_DB, type SpectralProfiles } from './measure-spectral-profiles.js';

const PERCENT = 100;

export interface WiringDifference {
  /** Level of B minus level of A, dB. */
  readonly levelDb: number;
  /** Level-matched spectral distance, dB (≥ 0). */
  readonly spectrumDb: number;
  /** Brightness of B relative to A, percent (+10 = 10 % brighter); null when only one of them is silent. */
  readonly brightnessPercent: number | null;
  /** The largest difference over its threshold: 1 = just noticeable. */
  readonly distance: number;
  /** distance < 1: every difference under its threshold. */
  readonly alike: boolean;
}

/** Loudness-weighted RMS distance of the level-matched excitation of wiring i of `a` and wiring j of `b`, dB. */
export function measureSpectrumDistance(a: SpectralProfiles, i: number, b: SpectralProfiles, j: number): number {
  const silentA = a.silent[i] === 1;
  const silentB = b.silent[j] === 1;
  if (silentA || silentB) return silentA && silentB ? 0 : DYNAMIC_RANGE_DB;
  const bands = a.bandCount;
  const baseA = i * bands;
  const baseB = j * bands;
  let weighted = 0;
  let weights = 0;
  for (let k = 0; k < bands; k += 1) {
    const weight = ((a.loudness[baseA + k] as number) + (b.loudness[baseB + k] as number)) / 2;
    const difference = (a.shapeDb[baseA + k] as number) - (b.shapeDb[baseB + k] as number);
    weighted += weight * difference * difference;
    weights += weight;
  }
  return weights > 0 ? Math.sqrt(weighted / weights) : 0;
}

/**
 * |ln(b_B/b_A)|, or null when only one is silent (0 Hz). Taken as ln(larger/smaller), so it is the same
 * double whichever wiring comes first: Math.abs(Math.log(b / a)) and Math.abs(Math.log(a / b)) can differ
 * in the last bit (700 Hz and 2804 Hz do), and the shortlist's exact search needs d(A, B) = d(B, A) exactly.
 */
function brightnessLogRatio(a: number, b: number): number | null {
  if (a > 0 && b > 0) return Math.log(Math.max(a, b) / Math.min(a, b));
  return a > 0 || b > 0 ? null : 0;
}

/** The scalar distance only (no allocation; for grouping and shortlists). */
export function measureWiringDistance(a: SpectralProfiles, i: number, b: SpectralProfiles, j: number, thresholds: AlikeThresholds): number {
  return Math.max(distanceLowerBound(a, i, b, j, thresholds), measureSpectrumDistance(a, i, b, j) / thresholds.spectrumDb);
}

/** Every difference between wiring i of `a` and wiring j of `b` (B relative to A). */
export function measureWiringDifference(a: SpectralProfiles, i: number, b: SpectralProfiles, j: number, thresholds: AlikeThresholds): WiringDifference {
  const levelDb = (b.levelsDb[j] as number) - (a.levelsDb[i] as number);
  const spectrumDb = measureSpectrumDistance(a, i, b, j);
  const brightA = a.brightnessHz[i] as number;
  const brightB = b.brightnessHz[j] as number;
  const ratio = brightnessLogRatio(brightA, brightB);
  const brightnessPercent = ratio === null ? null : brightA > 0 ? PERCENT * (brightB / brightA - 1) : 0;
  const distance = Math.max(
    Math.abs(levelDb) / thresholds.levelDb,
    spectrumDb / thresholds.spectrumDb,
    ratio === null ? 0 : ratio / Math.log1p(thresholds.brightnessPercent / PERCENT),
  );
  return { levelDb, spectrumDb, brightnessPercent, distance, alike: distance < 1 };
}

/** Lower bound of the distance from the level and brightness terms alone (cheap; for pruning searches). */
export function distanceLowerBound(a: SpectralProfiles, i: number, b: SpectralProfiles, j: number, thresholds: AlikeThresholds): number {
  const level = Math.abs((b.levelsDb[j] as number) - (a.levelsDb[i] as number)) / thresholds.levelDb;
  const ratio = brightnessLogRatio(a.brightnessHz[i] as number, b.brightnessHz[j] as number);
  return Math.max(level, ratio === null ? 0 : ratio / Math.log1p(thresholds.brightnessPercent / PERCENT));
}
