/**
 * The most distinct set of wirings a kit can give, one per position:
 *
 * 1. Which wirings each position can give on its own (every other position
 *    free): one plan search per wiring and per kind of position (positions
 *    whose poles close the same number of contacts are alike before any lug
 *    is wired, so one search answers for all of them).
 * 2. Among the wirings some position can give, the shortlist's max–min
 *    choice (analysis/solve-shortlist.ts, with its constraints: hum
 *    cancelling, level window, wirings to include) of as many as the kit has
 *    positions (at most the shortlist's limit).
 * 3. An order of that set over the positions that one plan gives, tried
 *    order by order (each wiring only where it can be had alone); failing
 *    that, the next smaller set. A set found this way is the most distinct
 *    among what each position gives alone, reachable together; it is not
 *    proven the most distinct reachable set (that would need every set
 *    searched), and the result says so.
 */
import { type ShortlistRequest, type ShortlistWiring, solveShortlist } from '../analysis/index.js';
import { InputError } from '../errors/index.js';
import type { Network } from '../wiring/index.js';
import { type SwitchKit, countKitPositions, enumerateKitPoles, enumerateKitPositions } from './switch-kit.js';
import { type PositionWish, type SwitchPlanOptions, type SwitchPlanResult, solveSwitchPlan } from './solve-switch-plan.js';

export interface ChoiceWiring extends ShortlistWiring {
  readonly network: Network;
}

export interface SwitchChoiceRequest extends Omit<ShortlistRequest, 'count'> {
  /** Most wirings to choose (the shortlist's limit). */
  readonly maxCount: number;
  /** Orders of the chosen set to try before taking a smaller set (our choice: enough for a five-position lever). */
  readonly orderLimit: number;
}

export interface SwitchChoice {
  /** Wiring indices that some position gives on its own. */
  readonly reachable: readonly number[];
  /** Wiring index per kit position (−1 for a position left free), or null when no set was found. */
  readonly assignment: readonly number[] | null;
  readonly result: SwitchPlanResult | null;
  /** Smallest distance between the chosen wirings (Infinity for one). */
  readonly minDistance: number;
  /** The exact max–min method was used for the set (else the shortlist's heuristic). */
  readonly exactSet: boolean;
  /** Every plan search finished (no "unknown"). */
  readonly complete: boolean;
}

function positionKind(kit: SwitchKit, switchPositions: readonly number[]): string {
  return enumerateKitPoles(kit)
    .map((pole) => kit.switches[pole.switchIndex]?.positions[switchPositions[pole.switchIndex] ?? 0]?.length ?? 0)
    .join(',');
}

export function solveSwitchChoice(
  kit: SwitchKit,
  elementCount: number,
  wirings: readonly ChoiceWiring[],
  distance: (a: number, b: number) => number,
  request: SwitchChoiceRequest,
  options: Partial<SwitchPlanOptions> = {},
): SwitchChoice {
  const positions = enumerateKitPositions(kit);
  let complete = true;
  // 1. What each kind of position gives alone.
  const kinds = new Map<string, number>();
  positions.forEach((position) => {
    const kind = positionKind(kit, position.switchPositions);
    if (!kinds.has(kind)) kinds.set(kind, position.index);
  });
  const reachableAt = new Map<string, Set<number>>();
  for (const [kind, index] of kinds) {
    const set = new Set<number>();
    wirings.forEach((wiring, w) => {
      const wishes = positions.map((_, k): PositionWish => (k === index ? { kind: 'wiring', network: wiring.network, expression: wiring.expression } : { kind: 'free' }));
      const found = solveSwitchPlan(kit, elementCount, wishes, options);
      if (found.status === 'found') set.add(w);
      if (found.status === 'unknown') complete = false;
    });
    reachableAt.set(kind, set);
  }
  const canAt = positions.map((position) => reachableAt.get(positionKind(kit, position.switchPositions)) ?? new Set<number>());
  const reachable = wirings.flatMap((_, w) => (canAt.some((set) => set.has(w)) ? [w] : []));
  for (const [k, index] of request.include.entries()) {
    if (!reachable.includes(index)) throw InputError.at(`include[${k}]`, 'a wiring some position of this kit can give (it cannot; drop it or change the switch)', wirings[index]?.expression);
  }
  // 2 and 3: the most distinct set, then an order over the positions that one plan gives.
  const local = reachable.map((w) => wirings[w] as ChoiceWiring);
  const localInclude = request.include.map((w) => reachable.indexOf(w));
  let count = Math.min(countKitPositions(kit), request.maxCount, reachable.length);
  for (; count >= Math.max(1, localInclude.length); count -= 1) {
    let set;
    try {
      set = solveShortlist(local, (a, b) => distance(reachable[a] as number, reachable[b] as number), { ...request, count, include: localInclude });
    } catch (error) {
      if (error instanceof InputError && count > 1) continue;
      throw error;
    }
    const members = set.members.map((m) => reachable[m] as number);
    let tries = 0;
    const assignment = new Array<number>(positions.length).fill(-1);
    const taken = new Array<boolean>(positions.length).fill(false);
    let answer: SwitchPlanResult | null = null;
    const place = (k: number): boolean => {
      if (k === members.length) {
        tries += 1;
        const wishes = assignment.map((w): PositionWish => (w < 0 ? { kind: 'free' } : { kind: 'wiring', network: (wirings[w] as ChoiceWiring).network, expression: (wirings[w] as ChoiceWiring).expression }));
        const result = solveSwitchPlan(kit, elementCount, wishes, options);
        if (result.status === 'unknown') complete = false;
        if (result.status === 'found') {
          answer = result;
          return true;
        }
        return false;
      }
      const w = members[k] as number;
      for (let p = 0; p < positions.length && tries < request.orderLimit; p += 1) {
        if (taken[p] || !(canAt[p] as Set<number>).has(w)) continue;
        taken[p] = true;
        assignment[p] = w;
        if (place(k + 1)) return true;
        taken[p] = false;
        assignment[p] = -1;
      }
      return false;
    };
    if (place(0) && answer !== null) {
      return { reachable, assignment, result: answer, minDistance: set.minDistance, exactSet: set.method === 'exact', complete };
    }
    if (tries >= request.orderLimit) complete = false;
  }
  return { reachable, assignment: null, result: null, minDistance: Number.NaN, exactSet: false, complete };
}
