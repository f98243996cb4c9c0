/**
 * Choose `size` items, some of them given, so that the smallest distance
 * between two chosen items is as large as possible (the max–min diversity
 * or p-dispersion problem; NP-hard in general: M. J. Kuby, "Programming
 * models for facility dispersion: the p-dispersion and maxisum dispersion
 * problems", Geographical Analysis 19(4), 315–329, 1987).
 *
 * Exact method (used while the candidates are few enough and the search
 * stays within a node budget): the answer is one of the pairwise distances,
 * and "is there a set whose every pair is ≥ t?" is "does the graph joining
 * pairs at distance ≥ t hold a clique of the size still needed?". A binary
 * search over the sorted distances — from the heuristic's value up, since
 * that is known to be reachable — asks that question by branch and bound
 * (E. Tomita, T. Seki, "An efficient branch-and-bound algorithm for finding
 * a maximum clique", DMTCS 2003, LNCS 2731, 278–289: colour the candidates
 * greedily, branch from the highest colour down, stop when a colour number,
 * which bounds the clique through that vertex, is too small). At the best
 * level the set returned is the first in candidate order: each candidate in
 * turn is kept when a clique of the remaining size still fits among the
 * later candidates joined to everything kept.
 *
 * Heuristic (beyond the limit or the budget): greedy farthest-point
 * insertion (each step adds the candidate farthest from everything chosen;
 * T. F. Gonzalez, "Clustering to minimize the maximum intercluster
 * distance", Theoretical Computer Science 38, 293–306, 1985: within a
 * factor 2 of the optimum when the distances obey the triangle inequality,
 * which ours nearly do), from several starting points, each followed by
 * swaps that raise the smallest distance until none does. It reports itself
 * as such.
 */
import { minOf } from '../math/index.js';

export interface MaxMinSubsetProblem {
  /** Candidate items (any integers, e.g. wiring indices), in the order that breaks ties: earlier first. */
  readonly candidates: readonly number[];
  /** Items that must be in the set (not repeated in candidates). */
  readonly include: readonly number[];
  /** How many items in all, include included; at least include.length. */
  readonly size: number;
  /**
   * Symmetric distance between two items. The solver reads each pair in one
   * order only (smaller item first), so a distance whose two orders differ in
   * rounding still gives every part of the search the same number.
   */
  readonly distance: (a: number, b: number) => number;
  /** Return null at once unless a set strictly better than this can exist (for searching many windows). Default −Infinity. */
  readonly mustExceed?: number;
  /**
   * Heuristic only: may `candidate` join `chosen`? (A constraint on the whole
   * set, such as a level window.) Default: always. The exact method ignores
   * it; callers split such constraints into separate problems instead.
   */
  readonly admissible?: (chosen: readonly number[], candidate: number) => boolean;
  /** Heuristic only: items to start from (each with the included items). Default: the farthest-point order's first few. */
  readonly seeds?: readonly number[];
}

export interface MaxMinSubsetResult {
  /** The chosen items: include first, then the others in candidate order. */
  readonly members: readonly number[];
  /** Smallest distance between two members (Infinity for fewer than two). */
  readonly minDistance: number;
  readonly method: 'exact' | 'heuristic';
}

export interface MaxMinSubsetOptions {
  /** Largest candidate count solved exactly. Default 700 (a 700 × 700 distance table). */
  readonly exactLimit: number;
  /** Clique-search nodes allowed before falling back to the heuristic. Default 30 000 (a few seconds at most on this machine). */
  readonly nodeBudget: number;
  /** Starting points of the heuristic. Default 12. */
  readonly heuristicStarts: number;
}

export const DEFAULT_MAX_MIN_SUBSET_OPTIONS: Readonly<MaxMinSubsetOptions> = Object.freeze({ exactLimit: 700, nodeBudget: 30_000, heuristicStarts: 12 });

class BudgetExceeded extends Error {}

/** Solve the problem; null when fewer candidates than needed, or nothing beats `mustExceed`. */
export function solveMaxMinSubset(given: MaxMinSubsetProblem, options: Partial<MaxMinSubsetOptions> = {}): MaxMinSubsetResult | null {
  const settings = { ...DEFAULT_MAX_MIN_SUBSET_OPTIONS, ...options };
  // One order per pair: the exact search compares the heuristic's smallest distance with its table of
  // pair distances for equality, so both must come from the same evaluation of each pair.
  const problem: MaxMinSubsetProblem = { ...given, distance: (a, b) => (a <= b ? given.distance(a, b) : given.distance(b, a)) };
  const { candidates, include, size } = problem;
  const need = size - include.length;
  if (need < 0) throw new RangeError(`solveMaxMinSubset: size ${size} is smaller than the ${include.length} included items`);
  if (candidates.length < need) return null;
  const mustExceed = problem.mustExceed ?? Number.NEGATIVE_INFINITY;
  const cap = smallestPairDistance(include, problem.distance);
  if (cap <= mustExceed) return null;
  if (need === 0) return { members: [...include], minDistance: cap, method: 'exact' };
  if (candidates.length <= settings.exactLimit) {
    try {
      return solveExact(problem, need, cap, mustExceed, settings.nodeBudget, settings.heuristicStarts);
    } catch (error) {
      if (!(error instanceof BudgetExceeded)) throw error;
    }
  }
  const result = solveHeuristic(problem, need, settings.heuristicStarts);
  return result !== null && result.minDistance > mustExceed ? result : null;
}

function smallestPairDistance(items: readonly number[], distance: (a: number, b: number) => number): number {
  let smallest = Number.POSITIVE_INFINITY;
  for (let i = 0; i < items.length; i += 1) {
    for (let j = i + 1; j < items.length; j += 1) smallest = Math.min(smallest, distance(items[i] as number, items[j] as number));
  }
  return smallest;
}

function solveExact(problem: MaxMinSubsetProblem, need: number, cap: number, mustExceed: number, nodeBudget: number, starts: number): MaxMinSubsetResult | null {
  const { candidates, include } = problem;
  const n = candidates.length;
  const table = new Float64Array(n * n);
  const toInclude = new Float64Array(n).fill(Number.POSITIVE_INFINITY);
  for (let i = 0; i < n; i += 1) {
    const a = candidates[i] as number;
    for (const item of include) toInclude[i] = Math.min(toInclude[i] as number, problem.distance(a, item));
    for (let j = i + 1; j < n; j += 1) {
      const d = problem.distance(a, candidates[j] as number);
      table[i * n + j] = d;
      table[j * n + i] = d;
    }
  }
  const positionOf = new Map(candidates.map((item, index) => [item, index]));
  const tabled = (a: number, b: number): number => {
    const i = positionOf.get(a);
    const j = positionOf.get(b);
    if (i !== undefined && j !== undefined) return i === j ? 0 : (table[i * n + j] as number);
    return problem.distance(a, b);
  };
  // A feasible set from the heuristic bounds the search from below (and is the answer if the budget runs out).
  const heuristic = solveHeuristic({ ...problem, distance: tabled, admissible: undefined, seeds: undefined }, need, starts);
  const floor = Math.max(mustExceed, Math.min(heuristic?.minDistance ?? Number.NEGATIVE_INFINITY, cap));
  // The answer is one of these values (or the cap set by the included items).
  const values = new Set<number>([cap]);
  const consider = (value: number): void => {
    if (value >= floor) values.add(value);
  };
  if (need === 1) for (const value of toInclude) consider(Math.min(value, cap));
  else {
    for (let i = 0; i < n; i += 1) for (let j = i + 1; j < n; j += 1) consider(Math.min(table[i * n + j] as number, toInclude[i] as number, toInclude[j] as number, cap));
  }
  const levels = [...values].filter((value) => value > mustExceed && value <= cap).sort((a, b) => a - b);
  // adjacency[v·n + u] = 1 when candidates v and u are at least the current level apart.
  const adjacency = new Uint8Array(n * n);
  const linked = (v: number, u: number): boolean => adjacency[v * n + u] === 1;
  let nodes = 0;
  let eligible: number[] = [];

  /** Join the pairs at distance ≥ t; the eligible candidates are those ≥ t from every included item. */
  const setLevel = (t: number): void => {
    adjacency.fill(0);
    for (let i = 0; i < n; i += 1) {
      for (let j = i + 1; j < n; j += 1) {
        if ((table[i * n + j] as number) >= t) {
          adjacency[i * n + j] = 1;
          adjacency[j * n + i] = 1;
        }
      }
    }
    eligible = [];
    for (let i = 0; i < n; i += 1) if ((toInclude[i] as number) >= t) eligible.push(i);
  };

  /**
   * Is there a clique of `remaining` vertices inside `pool`? Tomita & Seki's
   * branch and bound: colour the pool greedily, branch on vertices from the
   * highest colour down, and stop as soon as a vertex's colour number (a
   * bound on the clique through it and the vertices before it) is too small.
   */
  const hasClique = (pool: readonly number[], remaining: number): boolean => {
    nodes += 1;
    if (nodes > nodeBudget) throw new BudgetExceeded();
    if (remaining <= 0) return true;
    if (pool.length < remaining) return false;
    if (remaining === 1) return true;
    const { order, colour } = colourPool(pool, linked);
    const active = [...pool];
    for (let k = order.length - 1; k >= 0; k -= 1) {
      if ((colour[k] as number) < remaining) return false;
      const v = order[k] as number;
      const next = active.filter((u) => u !== v && linked(v, u));
      if (next.length >= remaining - 1 && hasClique(next, remaining - 1)) return true;
      active.splice(active.indexOf(v), 1);
    }
    return false;
  };

  /** The first clique in candidate order at level t (t feasible): each vertex kept when a clique still fits after it. */
  const firstClique = (): number[] | null => {
    let pool = [...eligible];
    const chosen: number[] = [];
    let remaining = need;
    for (const v of [...pool]) {
      if (remaining === 0) break;
      if (!pool.includes(v)) continue;
      const next = pool.filter((u) => u > v && linked(v, u));
      if (hasClique(next, remaining - 1)) {
        chosen.push(v);
        pool = next;
        remaining -= 1;
      }
    }
    return remaining === 0 ? chosen : null;
  };

  const findClique = (t: number): number[] | null => {
    setLevel(t);
    return hasClique(eligible, need) ? firstClique() : null;
  };

  // Largest feasible level by binary search (feasibility falls as t rises), then its first clique.
  let best: { level: number; clique: number[] } | null = null;
  try {
    let low = 0;
    let high = levels.length - 1;
    let found = -1;
    while (low <= high) {
      const middle = (low + high) >> 1;
      setLevel(levels[middle] as number);
      if (hasClique(eligible, need)) {
        found = middle;
        low = middle + 1;
      } else high = middle - 1;
    }
    if (found >= 0) {
      const level = levels[found] as number;
      const clique = findClique(level);
      if (clique) best = { level, clique };
    }
  } catch (error) {
    if (!(error instanceof BudgetExceeded)) throw error;
    return heuristic !== null && heuristic.minDistance > mustExceed ? heuristic : null;
  }
  if (best === null) return null;
  const members = [...include, ...best.clique.map((index) => candidates[index] as number)];
  return { members, minDistance: smallestPairDistance(members, problem.distance), method: 'exact' };
}

/**
 * Greedy sequential colouring of `pool` (each vertex takes the first colour
 * class holding none of its neighbours), returned sorted by colour: order[k]
 * has colour[k], non-decreasing. The colour of a vertex bounds the largest
 * clique among it and the vertices before it (Tomita & Seki 2003).
 */
function colourPool(pool: readonly number[], linked: (v: number, u: number) => boolean): { order: number[]; colour: number[] } {
  const classes: number[][] = [];
  for (const v of pool) {
    let placed = false;
    for (const members of classes) {
      if (!members.some((u) => linked(v, u))) {
        members.push(v);
        placed = true;
        break;
      }
    }
    if (!placed) classes.push([v]);
  }
  const order: number[] = [];
  const colour: number[] = [];
  classes.forEach((members, index) => {
    for (const v of members) {
      order.push(v);
      colour.push(index + 1);
    }
  });
  return { order, colour };
}

function solveHeuristic(problem: MaxMinSubsetProblem, need: number, starts: number): MaxMinSubsetResult | null {
  const { candidates, include, distance } = problem;
  const admissible = problem.admissible ?? (() => true);
  const position = new Map<number, number>(candidates.map((item, index) => [item, index]));
  /** Farthest-point insertion from `seed`; null when the constraint leaves no candidate to add. */
  const greedy = (seed: readonly number[]): number[] | null => {
    const chosen = [...seed];
    const nearest = candidates.map((item) => (chosen.length === 0 ? Number.POSITIVE_INFINITY : minOf(chosen.map((other) => distance(item, other)))));
    const taken = new Set(chosen);
    while (chosen.length < include.length + need) {
      let bestIndex = -1;
      for (let i = 0; i < candidates.length; i += 1) {
        const item = candidates[i] as number;
        if (taken.has(item) || !admissible(chosen, item)) continue;
        if (bestIndex < 0 || (nearest[i] as number) > (nearest[bestIndex] as number)) bestIndex = i;
      }
      if (bestIndex < 0) return null;
      const item = candidates[bestIndex] as number;
      chosen.push(item);
      taken.add(item);
      for (let i = 0; i < candidates.length; i += 1) nearest[i] = Math.min(nearest[i] as number, distance(candidates[i] as number, item));
    }
    return chosen;
  };
  // Starting points: the given seeds, or the included items alone and each of the first points the plain greedy order picks.
  const seeds: number[][] = [];
  if (problem.seeds) for (const item of problem.seeds) seeds.push([...include, item]);
  else {
    const base = include.length > 0 ? [...include] : [candidates[0] as number];
    seeds.push(base);
    const first = greedy(base) ?? [];
    for (const item of first.slice(base.length, base.length + starts)) seeds.push([...include, item]);
  }
  let best: MaxMinSubsetResult | null = null;
  for (const seed of problem.seeds ? seeds : seeds.slice(0, starts)) {
    const start = greedy(seed);
    if (start === null) continue;
    const members = improveBySwaps(start, include.length, candidates, distance, admissible);
    const minDistance = smallestPairDistance(members, distance);
    const ordered = [...members.slice(0, include.length), ...members.slice(include.length).sort((a, b) => (position.get(a) ?? 0) - (position.get(b) ?? 0))];
    if (best === null || minDistance > best.minDistance || (minDistance === best.minDistance && comesFirst(ordered, best.members, position))) {
      best = { members: ordered, minDistance, method: 'heuristic' };
    }
  }
  return best;
}

/** Replace a free member of a closest pair by the outside candidate that most raises the smallest distance, while that helps. */
function improveBySwaps(
  start: number[],
  fixed: number,
  candidates: readonly number[],
  distance: (a: number, b: number) => number,
  admissible: (chosen: readonly number[], candidate: number) => boolean,
): number[] {
  const members = [...start];
  const smallestWith = (set: readonly number[]): number => smallestPairDistance(set, distance);
  let current = smallestWith(members);
  for (let round = 0; round < candidates.length; round += 1) {
    let improved = false;
    for (let slot = fixed; slot < members.length && !improved; slot += 1) {
      const others = members.filter((_, index) => index !== slot);
      const othersMin = smallestWith(others);
      if (othersMin <= current) continue; // this slot is not in every closest pair: swapping it cannot raise the minimum
      for (const candidate of candidates) {
        if (members.includes(candidate) || !admissible(others, candidate)) continue;
        let value = othersMin;
        for (const other of others) value = Math.min(value, distance(candidate, other));
        if (value > current) {
          members[slot] = candidate;
          current = value;
          improved = true;
          break;
        }
      }
    }
    if (!improved) break;
  }
  return members;
}

function comesFirst(a: readonly number[], b: readonly number[], position: ReadonlyMap<number, number>): boolean {
  for (let i = 0; i < Math.min(a.length, b.length); i += 1) {
    const pa = position.get(a[i] as number) ?? -1;
    const pb = position.get(b[i] as number) ?? -1;
    if (pa !== pb) return pa < pb;
  }
  return false;
}
