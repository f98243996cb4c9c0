/**
 * Groups of wirings that sound alike: the connected components of the
 * "alike" graph, whose edges join every pair with distance < 1
 * (measure-wiring-difference.ts). This is single-linkage clustering cut at
 * the thresholds; a component is defined by the graph alone, so the groups
 * do not depend on the order the wirings come in, and they are numbered by
 * their first member in the guitar's stable wiring order.
 *
 * What single linkage implies — chaining: if A is alike to B and B to C, all
 * three share a group even when A and C differ audibly. Each group therefore
 * reports its largest internal distance; a value above 1 says the group is
 * a chain whose ends can be told apart.
 *
 * Speed: the level term alone bounds the distance (|ΔL|/T_level ≤ distance),
 * so wirings sorted by level are compared only with neighbours less than one
 * level threshold away, and the brightness term prunes again before the
 * spectral distance is computed. Each wiring's nearest neighbour is found
 * the same way, widening the search only as far as the best distance found.
 */
import { type Steps, runSteps } from '../math/index.js';
import type { AlikeThresholds } from './alike-thresholds.js';
import type { SpectralProfiles } from './measure-spectral-profiles.js';
import { distanceLowerBound, measureWiringDistance } from './measure-wiring-difference.js';

/** Largest group whose internal distances are all computed (m²/2 pairs); bigger groups report null. */
export const MAX_SPREAD_MEMBERS = 1500;

export interface WiringGroup {
  /** 1, 2, … in the order of each group's first member. */
  readonly number: number;
  /** Wiring indices, in rank order. */
  readonly members: readonly number[];
  /** Largest distance between two members (0 for one member); null when the group is too large to check every pair. */
  readonly largestDistance: number | null;
}

export interface WiringGroups {
  readonly thresholds: AlikeThresholds;
  /** Group number of each wiring (1-based). */
  readonly groupOf: Int32Array;
  readonly groups: readonly WiringGroup[];
  /** Index of each wiring's nearest other wiring (−1 when there is none). */
  readonly nearest: Int32Array;
  /** Distance to it (Infinity when there is none). */
  readonly nearestDistance: Float64Array;
}

/**
 * Group the wirings of `profiles`. `rank` gives each wiring's place in the
 * stable order (default its index); it only numbers the groups and orders
 * their members.
 */
export function groupAlikeWirings(profiles: SpectralProfiles, thresholds: AlikeThresholds, rank?: readonly number[]): WiringGroups {
  return runSteps(groupAlikeWiringsSteps(profiles, thresholds, rank));
}

/** groupAlikeWirings as steps (math/run-steps.ts): yields after each wiring's comparisons. */
export function* groupAlikeWiringsSteps(profiles: SpectralProfiles, thresholds: AlikeThresholds, rank?: readonly number[]): Steps<WiringGroups> {
  const count = profiles.count;
  const rankOf = (index: number): number => rank?.[index] ?? index;
  const levels = profiles.levelsDb;
  const order = Array.from({ length: count }, (_, index) => index).sort(
    (a, b) => (levels[a] as number) - (levels[b] as number) || rankOf(a) - rankOf(b),
  );

  const parent = Int32Array.from({ length: count }, (_, index) => index);
  const find = (index: number): number => {
    let root = index;
    while (parent[root] !== root) root = parent[root] as number;
    while (parent[index] !== root) {
      const next = parent[index] as number;
      parent[index] = root;
      index = next;
    }
    return root;
  };
  for (let p = 0; p < count; p += 1) {
    const a = order[p] as number;
    for (let q = p + 1; q < count; q += 1) {
      const b = order[q] as number;
      if (((levels[b] as number) - (levels[a] as number)) / thresholds.levelDb >= 1) break;
      if (distanceLowerBound(profiles, a, profiles, b, thresholds) >= 1) continue;
      if (measureWiringDistance(profiles, a, profiles, b, thresholds) < 1) parent[find(a)] = find(b);
    }
    yield;
  }

  const nearest = new Int32Array(count).fill(-1);
  const nearestDistance = new Float64Array(count).fill(Number.POSITIVE_INFINITY);
  for (let p = 0; p < count; p += 1) {
    const a = order[p] as number;
    for (const step of [-1, 1]) {
      for (let q = p + step; q >= 0 && q < count; q += step) {
        const b = order[q] as number;
        const best = nearestDistance[a] as number;
        if (Math.abs((levels[b] as number) - (levels[a] as number)) / thresholds.levelDb >= best) break;
        if (distanceLowerBound(profiles, a, profiles, b, thresholds) >= best) continue;
        const distance = measureWiringDistance(profiles, a, profiles, b, thresholds);
        if (distance < best || (distance === best && rankOf(b) < rankOf(nearest[a] as number))) {
          nearestDistance[a] = distance;
          nearest[a] = b;
        }
      }
    }
    yield;
  }

  const components = new Map<number, number[]>();
  for (let index = 0; index < count; index += 1) {
    const root = find(index);
    const members = components.get(root);
    if (members) members.push(index);
    else components.set(root, [index]);
  }
  const sorted = [...components.values()]
    .map((members) => members.sort((a, b) => rankOf(a) - rankOf(b)))
    .sort((a, b) => rankOf(a[0] as number) - rankOf(b[0] as number));
  const groupOf = new Int32Array(count);
  const groups = sorted.map((members, position): WiringGroup => {
    for (const member of members) groupOf[member] = position + 1;
    return { number: position + 1, members, largestDistance: largestDistance(profiles, members, thresholds) };
  });
  return { thresholds, groupOf, groups, nearest, nearestDistance };
}

function largestDistance(profiles: SpectralProfiles, members: readonly number[], thresholds: AlikeThresholds): number | null {
  if (members.length > MAX_SPREAD_MEMBERS) return null;
  let largest = 0;
  for (let i = 0; i < members.length; i += 1) {
    for (let j = i + 1; j < members.length; j += 1) {
      largest = Math.max(largest, measureWiringDistance(profiles, members[i] as number, profiles, members[j] as number, thresholds));
    }
  }
  return largest;
}
