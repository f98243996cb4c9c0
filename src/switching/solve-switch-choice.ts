/**
 * The most distinct set of wirings a kit gives together, one per position:
 * the smallest difference between two of them as large as possible (the
 * shortlist's max–min objective, analysis/solve-shortlist.ts), under the
 * shortlist's constraints (hum cancelling only, a level window, wirings that
 * must be included).
 *
 * Any single wiring can be had in any position by wiring it fixed, so what
 * a switch limits is which wirings it gives together. The choice is a
 * search over thresholds t (the pairwise distances, by bisection: a set
 * whose pairs are all ≥ t is also one for every smaller t): for a given t,
 * positions are filled in order, each with a wiring at least t from those
 * already placed, and a plan search (solve-switch-plan.ts) for the
 * positions filled so far, the rest free, cuts every branch that no lug
 * wiring can give (if the first positions cannot be had together, no
 * completion can). Each threshold's search has a limit on plan searches;
 * where a limit is reached the answer is the best found and says it is not
 * proven.
 */
import type { ShortlistWiring } from '../analysis/index.js';
import type { Guitar } from '../guitar/index.js';
import { type Network, printNetwork } from '../wiring/index.js';
import { componentsAt } from './plan-positions.js';
import { readPositionWiring } from './read-position-wiring.js';
import { type SwitchKit, countKitPositions, enumerateKitPositions } from './switch-kit.js';
import { type PositionWish, type SwitchPlanOptions, type SwitchPlanResult, solveSwitchPlan } from './solve-switch-plan.js';

export interface ChoiceWiring extends ShortlistWiring {
  readonly network: Network;
}

export interface SwitchChoiceRequest {
  readonly humCancelling: boolean;
  /** Wiring indices that must be among the positions. */
  readonly include: readonly number[];
  /** Largest level spread of the set, dB, or null. */
  readonly levelWindowDb: number | null;
  /** Plan searches allowed per threshold tried (our choice in the CLI: a few hundred). */
  readonly planSearchLimit: number;
}

export interface SwitchChoice {
  /** Wiring index per kit position, or null when no set was found. */
  readonly assignment: readonly number[] | null;
  readonly result: SwitchPlanResult | null;
  /** Smallest distance between the chosen wirings (Infinity for one position). */
  readonly minDistance: number;
  /** Every search finished within its limits: the set is proven the most distinct. */
  readonly proven: boolean;
  /** Plan searches run. */
  readonly planSearches: number;
}

export function solveSwitchChoice(
  kit: SwitchKit,
  guitar: Guitar,
  wirings: readonly ChoiceWiring[],
  distance: (a: number, b: number) => number,
  request: SwitchChoiceRequest,
  options: Partial<SwitchPlanOptions> = {},
): SwitchChoice {
  const positions = countKitPositions(kit);
  const elementCount = guitar.elements.length;
  const ids = guitar.elements.map((element) => element.id);
  const kitPositions = enumerateKitPositions(kit);
  const byExpression = new Map(wirings.map((wiring, w) => [wiring.expression, w]));
  /** The wiring a found plan already gives at position p (its other positions free), tried first there: it needs no new lug wiring. */
  const givenAt = (result: SwitchPlanResult | null, p: number): number | null => {
    const position = kitPositions[p];
    if (result?.plan == null || position === undefined) return null;
    const reading = readPositionWiring(guitar, componentsAt(result.plan, position));
    return reading.kind === 'wiring' ? (byExpression.get(printNetwork(reading.network, ids)) ?? null) : null;
  };
  const candidates = wirings.flatMap((wiring, w) => (request.humCancelling && !wiring.humCancelling && !request.include.includes(w) ? [] : [w]));
  const include = [...new Set(request.include)];
  let proven = true;
  let planSearches = 0;
  const wishOf = (w: number): PositionWish => ({ kind: 'wiring', network: (wirings[w] as ChoiceWiring).network, expression: (wirings[w] as ChoiceWiring).expression });
  const levelOf = (w: number): number => (wirings[w] as ChoiceWiring).levelDb;

  /** A full assignment with every pair ≥ t, or null. */
  const fill = (threshold: number): { assignment: number[]; result: SwitchPlanResult } | null => {
    const chosen: number[] = [];
    let searches = 0;
    let last: SwitchPlanResult | null = null;
    const place = (p: number, low: number, high: number): boolean => {
      if (p === positions) return include.every((w) => chosen.includes(w));
      const missing = include.filter((w) => !chosen.includes(w));
      if (missing.length > positions - p) return false;
      const given = givenAt(last, p);
      const rest = candidates.filter((w) => !missing.includes(w));
      const order = [...missing, ...(given !== null && rest.includes(given) ? [given, ...rest.filter((w) => w !== given)] : rest)];
      for (const w of order) {
        if (chosen.includes(w)) continue;
        if (chosen.some((other) => distance(w, other) < threshold)) continue;
        const level = levelOf(w);
        const nextLow = Math.min(low, level);
        const nextHigh = Math.max(high, level);
        if (request.levelWindowDb !== null && nextHigh - nextLow > request.levelWindowDb) continue;
        if (searches >= request.planSearchLimit) {
          proven = false;
          return false;
        }
        chosen.push(w);
        planSearches += 1;
        const wishes = Array.from({ length: positions }, (_, k): PositionWish => (k < chosen.length ? wishOf(chosen[k] as number) : { kind: 'free' }));
        const result = solveSwitchPlan(kit, elementCount, wishes, options);
        // A search refused before its first step (the layouts cannot be kept together) costs next to nothing: not counted.
        if (result.steps > 0) searches += 1;
        if (result.status === 'unknown') proven = false;
        if (result.status === 'found') {
          last = result;
          if (place(p + 1, nextLow, nextHigh)) return true;
        }
        chosen.pop();
      }
      return false;
    };
    if (!place(0, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY) || last === null) return null;
    return { assignment: [...chosen], result: last };
  };

  // Thresholds to try: every distance between two candidates, ascending; bisect for the largest that works.
  const distances = new Set<number>();
  for (let i = 0; i < candidates.length; i += 1) {
    for (let j = i + 1; j < candidates.length; j += 1) distances.add(distance(candidates[i] as number, candidates[j] as number));
  }
  const thresholds = [...distances].sort((a, b) => a - b);
  let best = fill(Number.NEGATIVE_INFINITY);
  if (best === null || positions === 1) {
    return { assignment: best?.assignment ?? null, result: best?.result ?? null, minDistance: Number.POSITIVE_INFINITY, proven, planSearches };
  }
  let low = 0;
  let high = thresholds.length - 1;
  while (low <= high) {
    const middle = (low + high) >> 1;
    const attempt = fill(thresholds[middle] as number);
    if (attempt) {
      best = attempt;
      low = middle + 1;
    } else high = middle - 1;
  }
  const members = best.assignment;
  let minDistance = Number.POSITIVE_INFINITY;
  for (let i = 0; i < members.length; i += 1) {
    for (let j = i + 1; j < members.length; j += 1) minDistance = Math.min(minDistance, distance(members[i] as number, members[j] as number));
  }
  return { assignment: members, result: best.result, minDistance, proven, planSearches };
}
