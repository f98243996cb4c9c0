/**
 * The wirings' figures as the listening page carries them
 * (`<script type="application/json" id="page-wirings">`): one column per
 * figure the page shows or uses, in the report's wiring order, rounded to the
 * digits the model supports (still more than the page prints). Everything
 * else a report row holds (expression, words, coils, phases, topology) the
 * page gets from its own enumeration of the guitar's wirings, and response
 * curves from its own circuit, so they are not carried. For 9,997 wirings
 * this is about 0.5 MB instead of 6.5 MB of report rows.
 */
import type { ReportWiring } from '../report/index.js';

/**
 * Decimals kept for figures in dB and LU: 0.01 (the page prints 0.1 dB and
 * hum in whole dB; the audio figures are checked against their renders to
 * 0.001–0.01 dB and LU, docs/design.md, so the model claims no finer).
 */
export const DB_DECIMALS = 2;
/**
 * Decimals kept for frequencies: 0.1 Hz (the page prints whole Hz below
 * 1 kHz and 10 Hz above; the centroid is checked to 0.1 % and the resonance
 * to the peak refinement's tolerance, both coarser than 0.1 Hz).
 */
export const HZ_DECIMALS = 1;

/** One column per figure, index k is the report's k-th wiring; null where the report has no finite value. */
export interface PageWiringFigures {
  /** Wiring numbers; each wiring's id is `w<number>` unless `ids` says otherwise. */
  readonly numbers: readonly number[];
  /** Ids, only when some id is not `w<number>`. */
  readonly ids?: readonly string[];
  /** Coils each wiring uses (single coils set the true-level gain). */
  readonly coilCounts: readonly number[];
  readonly levelDb: readonly (number | null)[];
  readonly loudnessLufs: readonly (number | null)[];
  readonly centroidHz: readonly (number | null)[];
  readonly resonanceHz: readonly (number | null)[];
  readonly peakDb: readonly (number | null)[];
  readonly humDb: readonly (number | null)[];
  /** 1 when the wiring cancels hum. */
  readonly humCancelling: readonly (0 | 1)[];
}

/** A wiring's figures as the page reads them back (NaN where the report had none). */
export interface WiringFigures {
  readonly id: string;
  readonly coilCount: number;
  readonly levelDb: number;
  readonly loudnessLufs: number;
  readonly centroidHz: number;
  readonly resonanceHz: number | null;
  readonly peakDb: number | null;
  readonly humDb: number | null;
  readonly humCancelling: boolean;
}

function rounded(value: number | null, decimals: number): number | null {
  if (value === null || !Number.isFinite(value)) return null;
  const scale = 10 ** decimals;
  const result = Math.round(value * scale) / scale;
  return Object.is(result, -0) ? 0 : result;
}

const idOf = (number: number): string => `w${number}`;

/** The report's wirings as the page's columns. */
export function encodeWiringFigures(wirings: readonly ReportWiring[]): PageWiringFigures {
  const numbers = wirings.map((wiring) => wiring.number);
  const plainIds = wirings.every((wiring) => wiring.id === idOf(wiring.number));
  return {
    numbers,
    ...(plainIds ? {} : { ids: wirings.map((wiring) => wiring.id) }),
    coilCounts: wirings.map((wiring) => wiring.coils.length),
    levelDb: wirings.map((wiring) => rounded(wiring.levelDb, DB_DECIMALS)),
    loudnessLufs: wirings.map((wiring) => rounded(wiring.loudnessLufs, DB_DECIMALS)),
    centroidHz: wirings.map((wiring) => rounded(wiring.centroidHz, HZ_DECIMALS)),
    resonanceHz: wirings.map((wiring) => rounded(wiring.resonanceHz, HZ_DECIMALS)),
    peakDb: wirings.map((wiring) => rounded(wiring.peakDb, DB_DECIMALS)),
    humDb: wirings.map((wiring) => rounded(wiring.humDb, DB_DECIMALS)),
    humCancelling: wirings.map((wiring) => (wiring.humCancelling ? 1 : 0)),
  };
}

/** The columns back as one record per wiring, in the report's order. */
export function decodeWiringFigures(figures: PageWiringFigures): WiringFigures[] {
  const missing = (value: number | null | undefined): number => (value === null || value === undefined ? Number.NaN : value);
  return figures.numbers.map((number, k) => ({
    id: figures.ids?.[k] ?? idOf(number),
    coilCount: figures.coilCounts[k] ?? 0,
    levelDb: missing(figures.levelDb[k]),
    loudnessLufs: missing(figures.loudnessLufs[k]),
    centroidHz: missing(figures.centroidHz[k]),
    resonanceHz: figures.resonanceHz[k] ?? null,
    peakDb: figures.peakDb[k] ?? null,
    humDb: figures.humDb[k] ?? null,
    humCancelling: figures.humCancelling[k] === 1,
  }));
}
