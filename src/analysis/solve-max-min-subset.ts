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
 * search over the sorted distances asks that question, each time by a
 * depth-first clique search that tries candidates in the order given and
 * prunes with a greedy colouring bound (a clique needs one colour per member:
 * E. Tomita, T. Seki, "An efficient branch-and-bound algorithm for finding a
 * maximum clique", DMTCS 2003, LNCS 2731, 278–289). Trying candidates in
 * order makes the set returned the first in that order among the best ones.
 *
 * Heuristic (beyond the budget): greedy farthest-point insertion (each step
 * adds the candidate farthest from everything chosen; T. F. Gonzalez,
 * "Clustering to minimize the maximum intercluster distance", Theoretical
 * Computer Science 38, 293–306, 1985: within a factor 2 of the optimum when
 * the distances obey the triangle inequality), from several starting
 * points, each followed by swaps that raise the smallest distance until
 * none does. It reports itself as such.
 */

export interface MaxMinSubsetProblem {
  /** Candidate items (any integers, e.g. wiring indices), in the order that breaks ties: earlier first. */
  readonly candidates: readonly number[];
  /** Items that must be in the set (not repeated in candidates). */
  readonly include: readonly number[];
  /** How many items in all, include included; at least include.length. */
  readonly size: number;
  /** Symmetric distance between two items. */
  readonly distance: (a: number, b: number) => number;
  /** Return null at once unless a set strictly better than this can exist (for searching many windows). Default −Infinity. */
  readonly mustExceed?: number;
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
  /** Clique-search nodes allowed before falling back to the heuristic. Default 2 000 000. */
  readonly nodeBudget: number;
  /** Starting points of the heuristic. Default 12. */
  readonly heuristicStarts: number;
}

export const DEFAULT_MAX_MIN_SUBSET_OPTIONS: Readonly<MaxMinSubsetOptions> = Object.freeze({ exactLimit: 700, nodeBudget: 2_000_000, heuristicStarts: 12 });

class BudgetExceeded extends Error {}

/** Solve the problem; null when fewer candidates than needed, or nothing beats `mustExceed`. */
export function solveMaxMinSubset(problem: MaxMinSubsetProblem, options: Partial<MaxMinSubsetOptions> = {}): MaxMinSubsetResult | null {
  const settings = { ...DEFAULT_MAX_MIN_SUBSET_OPTIONS, ...options };
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
      return solveExact(problem, need, cap, mustExceed, settings.nodeBudget);
    } catch (error) {
      if (!(error instanceof BudgetExceeded)) throw error;
    }
  }
  const result = solveHeuristic(problem, need, settings.heuristicStarts);
  return result.minDistance > mustExceed ? result : null;
}

function smallestPairDistance(items: readonly number[], distance: (a: number, b: number) => number): number {
  let smallest = Number.POSITIVE_INFINITY;
  for (let i = 0; i < items.length; i += 1) {
    for (let j = i + 1; j < items.length; j += 1) smallest = Math.min(smallest, distance(items[i] as number, items[j] as number));
  }
  return smallest;
}

function solveExact(problem: MaxMinSubsetProblem, need: number, cap: number, mustExceed: number, nodeBudget: number): MaxMinSubsetResult | null {
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
  // The answer is one of these values (or the cap set by the included items).
  const values = new Set<number>([cap]);
  if (need === 1) for (const value of toInclude) values.add(Math.min(value, cap));
  else {
    for (let i = 0; i < n; i += 1) for (let j = i + 1; j < n; j += 1) values.add(Math.min(table[i * n + j] as number, toInclude[i] as number, toInclude[j] as number, cap));
  }
  const levels = [...values].filter((value) => value > mustExceed).sort((a, b) => a - b);
  let nodes = 0;

  /** The first clique of `need` members (in candidate order) with every distance ≥ t, or null. */
  const findClique = (t: number): number[] | null => {
    const eligible: number[] = [];
    for (let i = 0; i < n; i += 1) if ((toInclude[i] as number) >= t) eligible.push(i);
    const chosen: number[] = [];
    const extend = (pool: readonly number[], remaining: number): boolean => {
      nodes += 1;
      if (nodes > nodeBudget) throw new BudgetExceeded();
      if (remaining === 0) return true;
      if (pool.length < remaining || colourBound(pool, table, n, t) < remaining) return false;
      for (let p = 0; p <= pool.length - remaining; p += 1) {
        const v = pool[p] as number;
        const next: number[] = [];
        for (let q = p + 1; q < pool.length; q += 1) {
          const u = pool[q] as number;
          if ((table[v * n + u] as number) >= t) next.push(u);
        }
        chosen.push(v);
        if (extend(next, remaining - 1)) return true;
        chosen.pop();
      }
      return false;
    };
    return extend(eligible, need) ? [...chosen] : null;
  };

  // Largest feasible level by binary search (feasibility falls as t rises).
  let low = 0;
  let high = levels.length - 1;
  let best: { level: number; clique: number[] } | null = null;
  while (low <= high) {
    const middle = (low + high) >> 1;
    const level = levels[middle] as number;
    const clique = findClique(level);
    if (clique) {
      best = { level, clique };
      low = middle + 1;
    } else high = middle - 1;
  }
  if (best === null) return null;
  const members = [...include, ...best.clique.map((index) => candidates[index] as number)];
  return { members, minDistance: smallestPairDistance(members, problem.distance), method: 'exact' };
}

/** Colours a greedy colouring of the graph (pairs ≥ t joined) needs: an upper bound on its largest clique. */
function colourBound(pool: readonly number[], table: Float64Array, n: number, t: number): number {
  const colours: number[][] = [];
  for (const v of pool) {
    let placed = false;
    for (const colour of colours) {
      if (colour.every((u) => (table[v * n + u] as number) < t)) {
        colour.push(v);
        placed = true;
        break;
      }
    }
    if (!placed) colours.push([v]);
  }
  return colours.length;
}

function solveHeuristic(problem: MaxMinSubsetProblem, need: number, starts: number): MaxMinSubsetResult {
  const { candidates, include, distance } = problem;
  const position = new Map<number, number>(candidates.map((item, index) => [item, index]));
  const greedy = (seed: readonly number[]): number[] => {
    const chosen = [...seed];
    const nearest = candidates.map((item) => (chosen.length === 0 ? Number.POSITIVE_INFINITY : Math.min(...chosen.map((other) => distance(item, other)))));
    const taken = new Set(chosen);
    while (chosen.length < include.length + need) {
      let bestIndex = -1;
      for (let i = 0; i < candidates.length; i += 1) {
        if (taken.has(candidates[i] as number)) continue;
        if (bestIndex < 0 || (nearest[i] as number) > (nearest[bestIndex] as number)) bestIndex = i;
      }
      const item = candidates[bestIndex] as number;
      chosen.push(item);
      taken.add(item);
      for (let i = 0; i < candidates.length; i += 1) nearest[i] = Math.min(nearest[i] as number, distance(candidates[i] as number, item));
    }
    return chosen;
  };
  // Starting points: the included items alone, then each of the first points the plain greedy order picks.
  const first = greedy(include.length > 0 ? include : [candidates[0] as number]);
  const seeds: number[][] = [include.length > 0 ? [...include] : [candidates[0] as number]];
  for (const item of first.slice(include.length, include.length + starts)) if (!include.includes(item)) seeds.push([...include, item]);
  let best: MaxMinSubsetResult | null = null;
  for (const seed of seeds.slice(0, starts)) {
    const members = improveBySwaps(greedy(seed), include.length, candidates, distance);
    const minDistance = smallestPairDistance(members, distance);
    const ordered = [...members.slice(0, include.length), ...members.slice(include.length).sort((a, b) => (position.get(a) ?? 0) - (position.get(b) ?? 0))];
    if (best === null || minDistance > best.minDistance || (minDistance === best.minDistance && comesFirst(ordered, best.members, position))) {
      best = { members: ordered, minDistance, method: 'heuristic' };
    }
  }
  return best as MaxMinSubsetResult;
}

/** Replace a free member of a closest pair by the outside candidate that most raises the smallest distance, while that helps. */
function improveBySwaps(start: number[], fixed: number, candidates: readonly number[], distance: (a: number, b: number) => number): number[] {
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
        if (members.includes(candidate)) continue;
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
