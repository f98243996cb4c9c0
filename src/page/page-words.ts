/**
 * Plain words for the listening page, each tied to the number it stands
 * for, so a player who does not know the trade terms can still read the
 * table: "quiet (hum cancelling)", "brighter", "present".
 */
import type { Topology } from '../wiring/index.js';
import { maxOf, minOf } from '../math/index.js';
import { HUM_FLOOR_DB, type HumCategory, humCategory } from '../circuit/index.js';

const TOPOLOGY_WORDS: Readonly<Record<Topology, string>> = Object.freeze({
  single: 'alone',
  series: 'series',
  parallel: 'parallel',
  'series-parallel': 'series and parallel',
});

/** How the coils are joined, in words. */
export function topologyInWords(topology: Topology): string {
  return TOPOLOGY_WORDS[topology];
}

/** The page's hum marks use the command line's thresholds and rounding (docs/design.md, `humCancelling`). */
export { HUM_CANCELLING_DB, HUM_REDUCING_DB as HUM_PARTLY_CANCELLING_DB } from '../circuit/index.js';

export type HumVerdict = 'quiet' | 'partly' | 'noisy';

/** The page's word for each command-line hum category. */
const HUM_CATEGORY_VERDICT: Readonly<Record<HumCategory, HumVerdict>> = Object.freeze({ cancels: 'quiet', reduces: 'partly', noisy: 'noisy' });

/** Hum in words: quiet (hum cancelling), less hum (partly cancelling), noisy. Non-finite hum means none at all. */
export function humVerdict(humDb: number | null, humCancelling: boolean): HumVerdict {
  if (humCancelling || humDb === null || !Number.isFinite(humDb)) return 'quiet';
  return HUM_CATEGORY_VERDICT[humCategory(humDb)];
}

/** The mark shown for each verdict, and the words under it. */
export const HUM_VERDICT_WORDS: Readonly<Record<HumVerdict, readonly [string, string]>> = Object.freeze({
  quiet: ['quiet', '(hum cancelling)'],
  partly: ['less hum', '(partly cancelling)'],
  noisy: ['noisy', ''],
});

/**
 * A resonant peak in plain figures: where it is and how high it stands above
 * the response at 100 Hz ("peak at 4.10 kHz, +6.2 dB"). The page gives the
 * peak no character word of its own: where a wiring sits between dark and
 * bright is said once, by the Brightness column (its spectral centroid), so
 * a row never reads two ways at once.
 */
export function describePeak(resonanceHz: number | null, peakDb: number | null): string {
  if (resonanceHz === null || !Number.isFinite(resonanceHz)) return 'no peak in the audio band';
  return `peak at ${formatHz(resonanceHz)}, ${formatDb(peakDb)}`;
}

/**
 * Brightness words compare a wiring's spectral centroid with the median
 * centroid of all wirings of the same guitar (our own scale: a tenth of an
 * octave or less either side counts as "middle", more than a third of an
 * octave as "much").
 */
const BRIGHTNESS_STEPS: ReadonlyArray<readonly [number, string]> = Object.freeze([
  [-1 / 3, 'much darker'], // octaves below the median and lower
  [-1 / 10, 'darker'],
  [1 / 10, 'middle'],
  [1 / 3, 'brighter'],
]);
const BRIGHTNESS_TOP = 'much brighter';

export interface BrightnessScale {
  readonly medianHz: number;
  readonly minHz: number;
  readonly maxHz: number;
  /** Word for a centroid. */
  readonly word: (centroidHz: number) => string;
  /** Position of a centroid between the darkest (0) and brightest (1) wiring on a log scale. */
  readonly fraction: (centroidHz: number) => number;
  /** The centroid band each word covers, for the legend: [word, lowHz or null, highHz or null]. */
  readonly bands: ReadonlyArray<readonly [string, number | null, number | null]>;
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? (sorted[middle] ?? 0) : ((sorted[middle - 1] ?? 0) + (sorted[middle] ?? 0)) / 2;
}

/** The brightness scale of one guitar's wirings (finite, positive centroids only). */
export function brightnessScale(centroidsHz: readonly number[]): BrightnessScale {
  const usable = centroidsHz.filter((hz) => Number.isFinite(hz) && hz > 0);
  const medianHz = usable.length > 0 ? median(usable) : 1;
  const minHz = usable.length > 0 ? minOf(usable) : 1;
  const maxHz = usable.length > 0 ? maxOf(usable) : 1;
  const word = (centroidHz: number): string => {
    if (!Number.isFinite(centroidHz) || centroidHz <= 0) return 'silent';
    const octaves = Math.log2(centroidHz / medianHz);
    for (const [upper, name] of BRIGHTNESS_STEPS) if (octaves < upper) return name;
    return BRIGHTNESS_TOP;
  };
  const fraction = (centroidHz: number): number => {
    if (!(centroidHz > 0) || maxHz <= minHz) return 1;
    return Math.min(1, Math.max(0, Math.log(centroidHz / minHz) / Math.log(maxHz / minHz)));
  };
  const edges = BRIGHTNESS_STEPS.map(([octaves]) => medianHz * 2 ** octaves);
  const names = [...BRIGHTNESS_STEPS.map(([, name]) => name), BRIGHTNESS_TOP];
  const bands = names.map((name, index) => [name, edges[index - 1] ?? null, edges[index] ?? null] as const);
  return { medianHz, minHz, maxHz, word, fraction, bands };
}

const MINUS = '\u2212';

/** "+1.5 dB", "−3.0 dB", "0.0 dB"; "—" when not finite. */
export function formatDb(db: number | null, digits = 1): string {
  if (db === null || !Number.isFinite(db)) return '—';
  const fixed = Math.abs(db).toFixed(digits);
  if (Number(fixed) === 0) return `${(0).toFixed(digits)} dB`;
  return `${db < 0 ? MINUS : '+'}${fixed} dB`;
}

/** A hum figure in whole decibels (the model claims no finer), the floor as "≤ −40 dB" (it claims no deeper rejection). */
export function formatHumDb(db: number | null): string {
  if (db !== null && db <= HUM_FLOOR_DB) return `\u2264 ${formatDb(HUM_FLOOR_DB, 0)}`;
  return formatDb(db, 0);
}

const HZ_PER_KHZ = 1000;

/** "850 Hz", "2.45 kHz", "12.3 kHz"; "—" when missing. */
export function formatHz(hz: number | null): string {
  if (hz === null || !Number.isFinite(hz)) return '—';
  if (hz < HZ_PER_KHZ) return `${Math.round(hz)} Hz`;
  const khz = hz / HZ_PER_KHZ;
  return `${khz.toFixed(khz < 10 ? 2 : 1)} kHz`;
}
