import { describe, expect, it } from 'vitest';
import { createRandom } from '../math/index.js';
import { solveMaxMinSubset } from './solve-max-min-subset.js';

/** Points in the plane: Euclidean distances (a metric, as the heuristic's factor-2 bound assumes). */
function randomPoints(count: number, seed: number): Array<[number, number]> {
  const random = createRandom(seed);
  return Array.from({ length: count }, () => [random() * 10, random() * 10]);
}

function combinations(items: readonly number[], size: number): number[][] {
  if (size === 0) return [[]];
  const out: number[][] = [];
  items.forEach((item, index) => {
    for (const rest of combinations(items.slice(index + 1), size - 1)) out.push([item, ...rest]);
  });
  return out;
}

function smallest(members: readonly number[], distance: (a: number, b: number) => number): number {
  let value = Number.POSITIVE_INFINITY;
  for (let i = 0; i < members.length; i += 1) for (let j = i + 1; j < members.length; j += 1) value = Math.min(value, distance(members[i]!, members[j]!));
  return value;
}

describe('solveMaxMinSubset', () => {
  it('finds the same optimum as trying every subset, with and without forced members', () => {
    for (let seed = 1; seed <= 12; seed += 1) {
      const points = randomPoints(13, seed);
      const distance = (a: number, b: number): number => Math.hypot(points[a]![0] - points[b]![0], points[a]![1] - points[b]![1]);
      const size = 2 + (seed % 4);
      const include = seed % 3 === 0 ? [seed % 13] : [];
      const candidates = points.map((_, index) => index).filter((index) => !include.includes(index));
      let best = Number.NEGATIVE_INFINITY;
      let firstBest: number[] = [];
      for (const subset of combinations(candidates, size - include.length)) {
        const value = smallest([...include, ...subset], distance);
        if (value > best) {
          best = value;
          firstBest = subset;
        }
      }
      const result = solveMaxMinSubset({ candidates, include, size, distance });
      expect(result?.method).toBe('exact');
      expect(result?.minDistance, `seed ${seed}`).toBeCloseTo(best, 12);
      // Ties go to the first subset in candidate order, as the brute force (lexicographic) finds it.
      expect(result?.members, `seed ${seed}`).toEqual([...include, ...firstBest]);
    }
  });

  it('falls back to a stated heuristic that stays valid and near the optimum', () => {
    for (let seed = 20; seed < 26; seed += 1) {
      const points = randomPoints(14, seed);
      const distance = (a: number, b: number): number => Math.hypot(points[a]![0] - points[b]![0], points[a]![1] - points[b]![1]);
      const candidates = points.map((_, index) => index);
      const exact = solveMaxMinSubset({ candidates, include: [], size: 4, distance });
      const heuristic = solveMaxMinSubset({ candidates, include: [3], size: 4, distance }, { exactLimit: 0 });
      const heuristicFree = solveMaxMinSubset({ candidates, include: [], size: 4, distance }, { exactLimit: 0 });
      expect(heuristic?.method).toBe('heuristic');
      expect(heuristic?.members).toContain(3);
      expect(new Set(heuristic?.members).size).toBe(4);
      expect(heuristicFree!.minDistance).toBeLessThanOrEqual(exact!.minDistance + 1e-12);
      // Gonzalez's greedy is within a factor 2 of the optimum for a metric; swaps only improve it.
      expect(heuristicFree!.minDistance).toBeGreaterThanOrEqual(exact!.minDistance / 2 - 1e-12);
    }
  });

  it('says when nothing can beat a bound, and when too few candidates exist', () => {
    const distance = (a: number, b: number): number => Math.abs(a - b);
    expect(solveMaxMinSubset({ candidates: [0, 1, 5], include: [], size: 2, distance })?.minDistance).toBe(5);
    expect(solveMaxMinSubset({ candidates: [0, 1, 5], include: [], size: 2, distance, mustExceed: 5 })).toBeNull();
    expect(solveMaxMinSubset({ candidates: [0, 1], include: [], size: 3, distance })).toBeNull();
    expect(solveMaxMinSubset({ candidates: [0, 1, 5], include: [], size: 1, distance })).toMatchObject({ members: [0], minDistance: Number.POSITIVE_INFINITY });
    expect(solveMaxMinSubset({ candidates: [1, 5], include: [0, 9], size: 2, distance })).toMatchObject({ members: [0, 9], minDistance: 9 });
  });
  it('reads each pair in one order, so a distance that differs in its last bit with the argument order cannot lose the answer', () => {
    // Regression: the shortlist's distance once gave |ln(b/a)| and |ln(a/b)| one ulp apart. The heuristic's
    // set then scored d(0, 1) = 10 + ulp while the exact search tabled d(1, 0) = 10, so no level reached the
    // heuristic's floor and a three-coil shortlist failed with "no set found although enough candidates exist".
    const ulp = 2 ** -49; // spacing of doubles between 8 and 16
    const base = (a: number, b: number): number => (a === 3 || b === 3 ? 1 : 10);
    const lopsided = (a: number, b: number): number => base(a, b) + (a < b ? ulp : 0);
    const result = solveMaxMinSubset({ candidates: [1, 2, 3], include: [0], size: 3, distance: lopsided });
    expect(result).toMatchObject({ members: [0, 1, 2], minDistance: 10 + ulp, method: 'exact' });
  });
});
