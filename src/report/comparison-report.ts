/**
 * The data a comparison page is drawn from: the same wirings on a baseline
 * guitar and on candidate pickup sets, each set rendered into its own
 * folder beside the page, with the differences measured by the
 * distinctness analysis. Plain JSON, numbers in the units their names say,
 * text exactly as it came from the guitar files (the page escapes it).
 */
import type { ReportRender } from './listening-report.js';

export interface ComparisonSetReport {
  /** "A" for the baseline, then "B", "C", … */
  readonly label: string;
  /** The guitar's name, from its file. */
  readonly name: string;
  /** This set's render folder relative to the page ("a"): its own listening page is `<folder>/index.html`. */
  readonly folder: string;
  /** How the set's files were rendered (the same phrase, chain and rate for every set; true level). */
  readonly render: ReportRender;
}

/** One wiring on one set: a sound the page can play. */
export interface ComparisonEntry {
  /** Unique on the page: "<label>:<wiring id>" ("B:w9"). */
  readonly id: string;
  /** Index into `sets`. */
  readonly set: number;
  /** The wiring's id in its own set ("w9"). */
  readonly wiringId: string;
  /** The wiring as its own set spells it. */
  readonly expression: string;
  /** WAV path relative to the page ("b/wav/w9-….wav"), for players outside the page; the page synthesises the sound from the set's coil signals. */
  readonly wav: string | null;
  /** Level against the baseline's mean single coil, dB. */
  readonly levelDb: number;
  /** ITU-R BS.1770 loudness of the set's reference render of this wiring (before the set's common gain), LUFS. */
  readonly loudnessLufs: number;
  /** Power-weighted spectral centroid of the reference strum, Hz (the distinctness analysis). */
  readonly brightnessHz: number;
  readonly resonanceHz: number | null;
  /** Hum against the baseline's mean single-coil hum, dB. */
  readonly humDb: number | null;
  readonly humCancelling: boolean;
}

/** How a candidate set changes a wiring, against the baseline. */
export interface ComparisonDifference {
  /** Index into `sets` of the candidate. */
  readonly set: number;
  /** The largest difference over its threshold (1 = just noticeable). */
  readonly distance: number;
  readonly audible: boolean;
  readonly levelDb: number | null;
  readonly spectrumDb: number;
  readonly brightnessPercent: number | null;
  readonly resonancePercent: number | null;
  readonly humDb: number | null;
}

export interface ComparisonRow {
  /** The baseline's wiring id ("w9"). */
  readonly key: string;
  readonly number: number;
  /** The baseline's spelling and words. */
  readonly expression: string;
  readonly description: string;
  /** Entry id per set, in `sets` order. */
  readonly entries: readonly string[];
  /** One per candidate set. */
  readonly differences: readonly ComparisonDifference[];
}

export interface ComparisonReport {
  readonly generator: string;
  /** Name of the baseline guitar. */
  readonly baseline: string;
  readonly thresholds: { readonly levelDb: number; readonly spectrumDb: number; readonly brightnessPercent: number };
  readonly sets: readonly ComparisonSetReport[];
  readonly entries: readonly ComparisonEntry[];
  /** Biggest change first. */
  readonly rows: readonly ComparisonRow[];
}
