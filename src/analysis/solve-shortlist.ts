/**
 * A shortlist for a real switch: the `count` wirings most different from
 * each other — the smallest distance between two of them as large as
 * possible (solve-max-min-subset.ts), distances on the just-noticeable scale
 * of measure-wiring-difference.ts — under the player's constraints:
 *
 * - humCancelling: only wirings that cancel hum;
 * - elements: only wirings that use no other elements (coils);
 * - include: these wirings must be in the list (they must meet the other
 *   constraints too);
 * - levelWindowDb: every chosen wiring within this many dB of every other.
 *   Solved by sliding the window over the candidates sorted by level: each
 *   window that is not inside the previous one is solved, and the best set
 *   over all windows kept (the first window wins a tie). Beyond the exact
 *   solver's reach, one heuristic search keeps every set inside the window
 *   as it grows, started from wirings spread over the level range.
 *
 * Impossible constraints throw InputError whose path names the constraint
 * (`count`, `humCancelling`, `elements`, `include[i]`, `levelWindowDb`) and
 * whose text says what to relax.
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import {
  DEFAULT_MAX_MIN_SUBSET_OPTIONS,
  type MaxMinSubsetOptions,
  type MaxMinSubsetResult,
  solveMaxMinSubset,
} from './solve-max-min-subset.js';
import { maxOf, minOf } from '../math/index.js';

export interface ShortlistWiring {
  /** Place in the stable order (breaks ties: earlier first). */
  readonly rank: number;
  readonly levelDb: number;
  readonly humCancelling: boolean;
  /** Element indices the wiring uses. */
  readonly elements: readonly number[];
  /** Its expression, for messages. */
  readonly expression: string;
}

export interface ShortlistRequest {
  /** How many wirings to choose, 1 or more. */
  readonly count: number;
  /** Take `count` as a ceiling: when fewer wirings meet the filters, choose them all instead of refusing (for a default count the user did not type). */
  readonly upTo?: boolean;
  readonly humCancelling: boolean;
  /** Element indices allowed, or null for all. */
  readonly elements: readonly number[] | null;
  /** Element ids, for messages (index → id). */
  readonly elementIds: readonly string[];
  /** Wiring indices that must be chosen. */
  readonly include: readonly number[];
  /** Largest level spread of the chosen set, dB, or null for none. */
  readonly levelWindowDb: number | null;
}

export interface Shortlist {
  /** Chosen wiring indices, in rank order. */
  readonly members: readonly number[];
  /** Smallest distance between two of them (Infinity for a single wiring). */
  readonly minDistance: number;
  readonly method: 'exact' | 'heuristic';
  /** Wirings that met the filters (hum, elements), included ones counted. */
  readonly candidateCount: number;
  /** The level range the set was chosen in, dB, or null without a window. */
  readonly levelRangeDb: readonly [number, number] | null;
}

/** Window starts on a grid of this fraction of the window when the exact solver cannot be used and the seeded search fails (our choice). */
const HEURISTIC_WINDOW_STEPS = 8;
/** Starting points of the windowed heuristic, spread over the level range (our choice). */
const HEURISTIC_SEEDS = 16;

/** "at most 12: only 12 wirings are hum cancelling and use only neck, bridge; relax …, or ask for fewer". */
function tooFewMessage(request: ShortlistRequest, available: number): string {
  const filters: Array<{ which: string; relax: string }> = [];
  if (request.humCancelling) filters.push({ which: 'are hum cancelling', relax: 'the hum-cancelling constraint' });
  if (request.elements !== null) {
    filters.push({ which: `use only ${request.elements.map((index) => request.elementIds[index] ?? '?').join(', ')}`, relax: 'the coils allowed' });
  }
  if (filters.length === 0) return `at most ${available}, the number of wirings`;
  const which = filters.map((filter) => filter.which).join(' and ');
  const relax = filters.map((filter) => filter.relax).join(' or ');
  return `at most ${available}: only ${available} wirings ${which}; relax ${relax}, or ask for fewer`;
}

/**
 * Choose the shortlist among `wirings` (index = position in the array)
 * with `distance(a, b)` between wiring indices.
 */
export function solveShortlist(
  wirings: readonly ShortlistWiring[],
  distance: (a: number, b: number) => number,
  request: ShortlistRequest,
  options: Partial<MaxMinSubsetOptions> = {},
): Shortlist {
  const settings = { ...DEFAULT_MAX_MIN_SUBSET_OPTIONS, ...options };
  const problems: InputProblem[] = [];
  if (!(Number.isInteger(request.count) && request.count >= 1)) problems.push(problemAt('count', 'a whole number of wirings, 1 or more', request.count));
  if (request.levelWindowDb !== null && !(Number.isFinite(request.levelWindowDb) && request.levelWindowDb >= 0)) {
    problems.push(problemAt('levelWindowDb', 'a level window of 0 dB or more', request.levelWindowDb));
  }
  if (problems.length > 0) throw new InputError(problems);

  const allowed = request.elements === null ? null : new Set(request.elements);
  const meets = (wiring: ShortlistWiring): string | null => {
    if (request.humCancelling && !wiring.humCancelling) return 'a hum-cancelling wiring (it is not; drop it or the hum-cancelling constraint)';
    if (allowed && !wiring.elements.every((element) => allowed.has(element))) {
      return `a wiring of ${[...allowed].map((index) => request.elementIds[index] ?? '?').join(', ')} only (it uses others; drop it or allow its coils)`;
    }
    return null;
  };
  const include = [...new Set(request.include)];
  include.forEach((index, position) => {
    const wiring = wirings[index];
    if (wiring === undefined) throw new RangeError(`solveShortlist: no wiring ${index}`);
    const problem = meets(wiring);
    if (problem) problems.push(problemAt(`include[${position}]`, problem, wiring.expression));
  });
  if (include.length > request.count) {
    problems.push(problemAt('count', `at least the ${include.length} wirings that must be included`, request.count));
  }
  if (problems.length > 0) throw new InputError(problems);

  const byRank = (a: number, b: number): number => (wirings[a] as ShortlistWiring).rank - (wirings[b] as ShortlistWiring).rank;
  const included = new Set(include);
  const candidates = wirings.flatMap((wiring, index) => (!included.has(index) && meets(wiring) === null ? [index] : [])).sort(byRank);
  const candidateCount = candidates.length + include.length;
  const count = request.upTo === true ? Math.min(request.count, candidateCount) : request.count;
  if (candidateCount < count || count < 1) throw InputError.at('count', tooFewMessage(request, candidateCount), request.count);
  const orderedInclude = [...include].sort(byRank);
  const finish = (result: MaxMinSubsetResult, range: readonly [number, number] | null): Shortlist => ({
    members: [...result.members].sort(byRank),
    minDistance: result.minDistance,
    method: result.method,
    candidateCount,
    levelRangeDb: range,
  });
  if (request.levelWindowDb === null) {
    const result = solveMaxMinSubset({ candidates, include: orderedInclude, size: count, distance }, settings);
    if (result === null) throw new RangeError('solveShortlist: no set found although enough candidates exist');
    return finish(result, null);
  }

  const window = request.levelWindowDb;
  const level = (index: number): number => (wirings[index] as ShortlistWiring).levelDb;
  const includeLevels = orderedInclude.map(level);
  const includeLow = minOf(includeLevels);
  const includeHigh = maxOf(includeLevels);
  if (includeLevels.length > 0 && includeHigh - includeLow > window) {
    throw InputError.at(
      'levelWindowDb',
      `a window of at least ${formatDb(includeHigh - includeLow)} dB: the wirings that must be included span that much; widen the level window or include fewer`,
      window,
    );
  }
  const need = count - orderedInclude.length;
  const byLevel = [...candidates].sort((a, b) => level(a) - level(b) || byRank(a, b));
  const levels = byLevel.map(level);
  const exact = candidates.length <= settings.exactLimit;
  if (!exact) {
    // Too many for the exact method: one heuristic search that keeps every set inside the window, seeded across the level range.
    const allLevels = [...levels, ...includeLevels];
    const spread = (chosen: readonly number[], candidate: number): boolean => {
      let low = level(candidate);
      let high = low;
      for (const item of chosen) {
        low = Math.min(low, level(item));
        high = Math.max(high, level(item));
      }
      return high - low <= window;
    };
    const compatible = byLevel.filter((item) => allLevels.length === 0 || spread(orderedInclude, item));
    const seeds = Array.from({ length: Math.min(HEURISTIC_SEEDS, compatible.length) }, (_, k) =>
      compatible[Math.round((k * (compatible.length - 1)) / Math.max(1, HEURISTIC_SEEDS - 1))] as number,
    );
    const result = solveMaxMinSubset({ candidates, include: orderedInclude, size: count, distance, admissible: spread, seeds: [...new Set(seeds)] }, settings);
    if (result !== null) {
      const chosenLevels = result.members.map(level);
      return finish(result, [minOf(chosenLevels), minOf(chosenLevels) + window]);
    }
  }
  const startsFrom = includeLevels.length > 0 ? includeHigh - window : Number.NEGATIVE_INFINITY;
  const startsTo = includeLevels.length > 0 ? includeLow : Number.POSITIVE_INFINITY;
  const starts = windowStarts(levels, includeLevels, startsFrom, startsTo, exact ? null : window / HEURISTIC_WINDOW_STEPS);

  let best: { result: MaxMinSubsetResult; range: [number, number] } | null = null;
  let previousEnd = -1;
  let previousBegin = -1;
  for (const start of starts) {
    const begin = lowerBound(levels, start);
    const end = upperBound(levels, start + window); // exclusive
    if (end - begin < need) continue;
    if (begin >= previousBegin && end <= previousEnd) continue; // inside the previous window: nothing new to find
    previousBegin = begin;
    previousEnd = end;
    const inWindow = byLevel.slice(begin, end).sort(byRank);
    const result = solveMaxMinSubset(
      { candidates: inWindow, include: orderedInclude, size: count, distance, mustExceed: best ? best.result.minDistance : Number.NEGATIVE_INFINITY },
      settings,
    );
    if (result && (best === null || result.minDistance > best.result.minDistance)) best = { result, range: [start, start + window] };
  }
  if (best === null) {
    const span = smallestSpan(levels, includeLevels, need);
    throw InputError.at(
      'levelWindowDb',
      `a wider window: no ${count} of the ${candidateCount} wirings lie within ${formatDb(window)} dB of each other (the closest ${count} span ${formatDb(span)} dB); widen the level window to at least that, or ask for fewer`,
      window,
    );
  }
  return finish(best.result, best.range);
}

function formatDb(value: number): string {
  return value.toFixed(1);
}

/** Window lower edges to try: each candidate or included level in [from, to] (or a grid of `step` when given), plus `from` itself. */
function windowStarts(levels: readonly number[], includeLevels: readonly number[], from: number, to: number, step: number | null): number[] {
  const all = [...levels, ...includeLevels].filter((value) => value >= from && value <= to);
  if (Number.isFinite(from)) all.push(from);
  all.sort((a, b) => a - b);
  if (step === null || all.length === 0) return [...new Set(all)];
  const low = all[0] as number;
  const high = all[all.length - 1] as number;
  const grid: number[] = [];
  for (let value = low; value <= high; value += step) grid.push(value);
  if (grid[grid.length - 1] !== high) grid.push(high);
  return grid;
}

/** First index with levels[i] ≥ value. */
function lowerBound(levels: readonly number[], value: number): number {
  let low = 0;
  let high = levels.length;
  while (low < high) {
    const middle = (low + high) >> 1;
    if ((levels[middle] as number) < value) low = middle + 1;
    else high = middle;
  }
  return low;
}

/** First index with levels[i] > value. */
function upperBound(levels: readonly number[], value: number): number {
  let low = 0;
  let high = levels.length;
  while (low < high) {
    const middle = (low + high) >> 1;
    if ((levels[middle] as number) <= value) low = middle + 1;
    else high = middle;
  }
  return low;
}

/** Smallest level span of a set holding every included level and `need` candidates (levels sorted). */
function smallestSpan(levels: readonly number[], includeLevels: readonly number[], need: number): number {
  const low = includeLevels.length > 0 ? minOf(includeLevels) : Number.POSITIVE_INFINITY;
  const high = includeLevels.length > 0 ? maxOf(includeLevels) : Number.NEGATIVE_INFINITY;
  if (need === 0) return high - low;
  let best = Number.POSITIVE_INFINITY;
  for (let i = 0; i + need <= levels.length; i += 1) {
    const spanLow = Math.min(levels[i] as number, low);
    const spanHigh = Math.max(levels[i + need - 1] as number, high);
    best = Math.min(best, spanHigh - spanLow);
  }
  return best;
}
