/**
 * Pure helpers of the listening page (no DOM): the blind test's statistic,
 * playback gains, loop positions, number formats. Tested in Node beside
 * this file; the page bundles this very module.
 */

/**
 * ABX: probability of `correct` or more right answers out of `trials` by
 * guessing, each trial right with probability 1/2 (one-sided binomial test):
 * P(K ≥ k) = Σ_{i=k..n} C(n,i) / 2^n. Terms in logs so large n neither
 * overflows nor underflows: ln C(n,i+1) = ln C(n,i) + ln((n−i)/(i+1)).
 */
export function binomialTailProbability(correct: number, trials: number): number {
  if (!(trials >= 0) || correct <= 0) return 1;
  if (correct > trials) return 0;
  let logTerm = trials * Math.log(0.5);
  let total = 0;
  for (let i = 0; i <= trials; i += 1) {
    if (i >= correct) total += Math.exp(logTerm);
    logTerm += Math.log((trials - i) / (i + 1));
  }
  return Math.min(1, total);
}

/**
 * Loudness every level-matched wiring is played at, LUFS: the EBU R 128
 * programme loudness target (EBU Recommendation R 128, −23 LUFS), which
 * leaves the peaks of plucked-string renders well below full scale.
 */
export const MATCHED_LOUDNESS_LUFS = -23;

/**
 * Playback gain of one render, dB. Level matched: every render at
 * MATCHED_LOUDNESS_LUFS from its own measured loudness,
 *   gain = target − L_render.
 * True level: one common gain for every render (`trueGainDb`), so the
 * measured differences remain. A render of unknown loudness gets the
 * common gain. Either way a gain never lifts the render's peak above full
 * scale: at most −20·log10(peak) dB.
 */
export function playbackGainDb(render: { readonly loudnessLufs: number; readonly peak: number }, matched: boolean, trueGainDb: number): number {
  const wanted = matched && Number.isFinite(render.loudnessLufs) ? MATCHED_LOUDNESS_LUFS - render.loudnessLufs : trueGainDb;
  return limitGainDb(wanted, render.peak);
}

/** A gain never lifts a peak above full scale: at most −20·log10(peak) dB. */
export function limitGainDb(gainDb: number, peak: number): number {
  if (!(peak > 0)) return gainDb;
  return Math.min(gainDb, -20 * Math.log10(peak));
}

export function decibelsToGain(db: number): number {
  return 10 ** (db / 20);
}

/** A loop region of the phrase, seconds. */
export interface LoopRegion {
  readonly start: number;
  readonly end: number;
}

/**
 * Playback position with a loop region [start, end): before the end it runs
 * on; past the end it wraps back to the start, as a looping
 * AudioBufferSourceNode does (W3C Web Audio API, loopStart/loopEnd).
 */
export function wrapPosition(position: number, loop: LoopRegion | null): number {
  if (!loop) return position;
  const length = loop.end - loop.start;
  if (!(length > 0) || position < loop.end) return position;
  return loop.start + ((position - loop.start) % length);
}

/** Phrases this long or shorter loop from the start (our choice: a phrase that ends before a second click is no use for comparing). */
export const LOOP_BY_DEFAULT_MAX_S = 12;

/** Does the page loop a phrase of `durationS` seconds unless told otherwise? */
export function loopsByDefault(durationS: number): boolean {
  return durationS <= LOOP_BY_DEFAULT_MAX_S;
}

export { formatDb, formatHz } from './page-words.js';

export function formatSeconds(seconds: number): string {
  return `${(Number.isFinite(seconds) ? Math.max(0, seconds) : 0).toFixed(2)} s`;
}

export function formatProbability(probability: number): string {
  if (probability < 0.001) return 'less than 0.1 %';
  return `${(probability * 100).toFixed(probability < 0.1 ? 1 : 0)} %`;
}

/** Does every word of `query` appear in `text` (case-insensitive)? An empty query matches everything. */
export function matchesSearch(text: string, query: string): boolean {
  const haystack = text.toLowerCase();
  return query
    .toLowerCase()
    .split(/\s+/u)
    .filter((word) => word !== '')
    .every((word) => haystack.includes(word));
}
