/**
 * Every distinct wiring of a guitar's elements: any non-empty subset, any
 * two-terminal series–parallel network on it, each element in or out of
 * phase, counted once up to reordering, regrouping and inverting everything.
 *
 * Counting: series–parallel networks on k labelled elements are OEIS A006351
 * (1, 2, 8, 52, 472, 5504); with 2^(k−1) phase patterns each and every
 * non-empty subset, n elements give 1, 6, 47, 572, 9997, 228386 wirings
 * (Riordan & Shannon 1942 for the construction). From five elements on,
 * bridge (non series–parallel) networks also exist; they are not enumerated.
 *
 * Construction: a canonical network on a set is a single element, or a group
 * of one kind whose parts are the blocks of a set partition into two or more
 * blocks, each block a single element or a canonical network rooted in the
 * other kind (series and parallel alternate down the tree).
 *
 * Stable order: fewer elements first; then by the elements used (declaration
 * order, compared as lists); then series before parallel before mixed; then
 * fewer out-of-phase elements first; then the structure in construction order;
 * then the out-of-phase set compared as a list.
 */
import type { WiringElement } from '../guitar/index.js';
import { describePhases, describeShape, describeWiring } from './describe-wiring.js';
import { type Network, type Topology, leaf, topologyOf } from './network.js';
import { printNetwork } from './print-wiring.js';
import type { Wiring } from './wiring.js';

const TOPOLOGY_RANK: Readonly<Record<Topology, number>> = Object.freeze({
  single: 0,
  series: 0,
  parallel: 1,
  'series-parallel': 2,
});

type GroupKind = 'series' | 'parallel';

/** Indices of the set bits of a mask, ascending. */
function bitsOf(mask: number): number[] {
  const out: number[] = [];
  for (let bit = 0; mask >> bit !== 0; bit += 1) if ((mask >> bit) & 1) out.push(bit);
  return out;
}

/** Every set partition of `mask` into blocks, each block as a mask, blocks ordered by their lowest bit. */
function setPartitions(mask: number): number[][] {
  if (mask === 0) return [[]];
  const lowest = mask & -mask;
  const rest = mask & ~lowest;
  const partitions: number[][] = [];
  // Choose which of the other elements join the lowest one's block (every submask of rest).
  const submasks: number[] = [];
  for (let sub = rest; ; sub = (sub - 1) & rest) {
    submasks.push(sub);
    if (sub === 0) break;
  }
  submasks.reverse(); // ascending, so smaller blocks come first: a stable construction order
  for (const sub of submasks) {
    const block = lowest | sub;
    for (const tail of setPartitions(rest & ~sub)) partitions.push([block, ...tail]);
  }
  return partitions;
}

/** Enumerates unsigned canonical structures, memoised by (mask, root kind). */
class StructureCatalogue {
  private readonly memo = new Map<string, readonly Network[]>();

  /** All canonical structures on `mask` (a leaf if one element). */
  any(mask: number): readonly Network[] {
    const bits = bitsOf(mask);
    if (bits.length === 1) return [leaf(bits[0] as number)];
    return [...this.rooted(mask, 'series'), ...this.rooted(mask, 'parallel')];
  }

  /** Canonical structures on `mask` whose root is a group of `kind`. */
  rooted(mask: number, kind: GroupKind): readonly Network[] {
    const key = `${mask}:${kind}`;
    const cached = this.memo.get(key);
    if (cached) return cached;
    const other: GroupKind = kind === 'series' ? 'parallel' : 'series';
    const found: Network[] = [];
    for (const blocks of setPartitions(mask)) {
      if (blocks.length < 2) continue;
      const options = blocks.map((block) =>
        (block & (block - 1)) === 0 ? [leaf(bitsOf(block)[0] as number)] : this.rooted(block, other),
      );
      for (const parts of cartesian(options)) found.push({ kind, parts });
    }
    this.memo.set(key, found);
    return found;
  }
}

function cartesian<T>(lists: readonly (readonly T[])[]): T[][] {
  let result: T[][] = [[]];
  for (const list of lists) {
    const next: T[][] = [];
    for (const prefix of result) for (const item of list) next.push([...prefix, item]);
    result = next;
  }
  return result;
}

/** The network with the elements in `invertedSet` marked out of phase; parts with none of them are shared, not copied. */
function withPhases(network: Network, invertedSet: ReadonlySet<number>): Network {
  if (invertedSet.size === 0) return network;
  if (network.kind === 'element') return invertedSet.has(network.element) ? leaf(network.element, true) : network;
  const parts = network.parts.map((part) => withPhases(part, invertedSet));
  return parts.every((part, index) => part === network.parts[index]) ? network : { kind: network.kind, parts };
}

function compareLists(a: readonly number[], b: readonly number[]): number {
  for (let i = 0; i < Math.min(a.length, b.length); i += 1) {
    const difference = (a[i] as number) - (b[i] as number);
    if (difference !== 0) return difference;
  }
  return a.length - b.length;
}

/** Number of non-empty subsets times networks times phases for `n` elements, by construction (for progress and checks). */
export function countWirings(elementCount: number): number {
  const catalogue = new StructureCatalogue();
  let total = 0;
  for (let mask = 1; mask < 1 << elementCount; mask += 1) {
    total += catalogue.any(mask).length * 2 ** (bitsOf(mask).length - 1);
  }
  return total;
}

/** Every subset of `items` with exactly `size` members, each ascending, in list order (lexicographic). */
function combinations(items: readonly number[], size: number): number[][] {
  const out: number[][] = [];
  const chosen: number[] = [];
  const visit = (from: number): void => {
    if (chosen.length === size) {
      out.push(chosen.slice());
      return;
    }
    for (let i = from; i <= items.length - (size - chosen.length); i += 1) {
      chosen.push(items[i] as number);
      visit(i + 1);
      chosen.pop();
    }
  };
  visit(0);
  return out;
}

/** One canonical structure of a subset (every element in phase), with what its wirings share. */
export interface PlannedStructure {
  readonly structure: Network;
  readonly topology: Topology;
  /** The structure in words, before the phases are added. */
  readonly words: string;
}

/**
 * The wirings of one subset of elements, in the stable order, as plain
 * numbers: wiring k of the subset is structure `structureOf[k]` with the
 * elements of bit mask `invertedOf[k]` out of phase (bit i = element index
 * i). Lets a caller work structure by structure (every phase pattern of a
 * structure shares its circuit solution) and still report in the stable
 * order, without holding the subset's wiring records.
 */
export interface WiringSubsetPlan {
  /** Element indices used, ascending. */
  readonly used: readonly number[];
  /** Their ids, in declaration order. */
  readonly usedIds: readonly string[];
  readonly structures: readonly PlannedStructure[];
  readonly structureOf: Int32Array;
  readonly invertedOf: Int32Array;
  /** Number of the subset's first wiring (w1 is 1). */
  readonly firstNumber: number;
}

/**
 * The subsets of `elementCount` elements in the stable order, each with its
 * wirings planned (see WiringSubsetPlan). The order is produced directly
 * (no sort over all wirings): subsets by size then as lists; inside a
 * subset, structures by topology rank, then phase patterns by how many
 * elements are out of phase, then structure order, then the out-of-phase
 * set as a list. Memory: one subset's plan at a time (176,128 wirings for
 * the full set of six elements, 8 bytes each).
 */
export function* planWiringSubsets(ids: readonly string[]): Generator<WiringSubsetPlan> {
  const catalogue = new StructureCatalogue();
  const masks: Array<{ mask: number; used: number[] }> = [];
  for (let mask = 1; mask < 1 << ids.length; mask += 1) masks.push({ mask, used: bitsOf(mask) });
  masks.sort((a, b) => a.used.length - b.used.length || compareLists(a.used, b.used));
  let firstNumber = 1;
  for (const { mask, used } of masks) {
    const flippable = used.slice(1); // the earliest-declared element stays in phase
    const ranked = catalogue
      .any(mask)
      .map((structure, order) => {
        const topology = topologyOf(structure);
        return { structure, order, topology, rank: TOPOLOGY_RANK[topology], words: describeShape(structure, ids) };
      })
      .sort((a, b) => a.rank - b.rank || a.order - b.order);
    const patternCount = 2 ** flippable.length;
    const total = ranked.length * patternCount;
    const structureOf = new Int32Array(total);
    const invertedOf = new Int32Array(total);
    let slot = 0;
    const ranks = [...new Set(ranked.map((entry) => entry.rank))];
    let start = 0;
    for (const rank of ranks) {
      let stop = start;
      while (stop < ranked.length && ranked[stop]?.rank === rank) stop += 1;
      for (let count = 0; count <= flippable.length; count += 1) {
        const patterns = combinations(flippable, count).map((inverted) => inverted.reduce((bits, element) => bits | (1 << element), 0));
        for (let s = start; s < stop; s += 1) {
          for (const bits of patterns) {
            structureOf[slot] = s;
            invertedOf[slot] = bits;
            slot += 1;
          }
        }
      }
      start = stop;
    }
    yield { used, usedIds: used.map((index) => ids[index] ?? '?'), structures: ranked.map(({ structure, topology, words }) => ({ structure, topology, words })), structureOf, invertedOf, firstNumber };
    firstNumber += total;
  }
}

/** The network of slot `slot` of a subset plan (without the words of its record). */
export function networkOfPlan(plan: WiringSubsetPlan, slot: number): Network {
  const planned = plan.structures[plan.structureOf[slot] as number] as PlannedStructure;
  const bits = plan.invertedOf[slot] as number;
  return bits === 0 ? planned.structure : withPhases(planned.structure, new Set(plan.used.filter((element) => (bits >> element) & 1)));
}

/** The wiring record of slot `slot` of a subset plan (numbered from the plan's first number). */
export function wiringOfPlan(plan: WiringSubsetPlan, slot: number, ids: readonly string[]): Wiring {
  const planned = plan.structures[plan.structureOf[slot] as number] as PlannedStructure;
  const bits = plan.invertedOf[slot] as number;
  const inverted = plan.used.filter((element) => (bits >> element) & 1);
  const network = withPhases(planned.structure, new Set(inverted));
  const number = plan.firstNumber + slot;
  return Object.freeze({
    id: `w${number}`,
    number,
    network,
    expression: printNetwork(network, ids),
    elements: plan.used,
    elementIds: plan.usedIds,
    topology: planned.topology,
    outOfPhase: inverted.map((index) => ids[index] ?? '?'),
    description: describePhases(planned.words, plan.used, inverted, ids),
  });
}

/**
 * Every distinct wiring of these elements, one at a time in the stable
 * order (w1, w2, …), holding one subset's plan at a time: six elements'
 * 228,386 wirings stream in bounded memory.
 */
export function* iterateWirings(elements: readonly Pick<WiringElement, 'id'>[]): Generator<Wiring> {
  const ids = elements.map((element) => element.id);
  for (const plan of planWiringSubsets(ids)) {
    for (let slot = 0; slot < plan.structureOf.length; slot += 1) yield wiringOfPlan(plan, slot, ids);
  }
}

/** Every distinct wiring of these elements, in the stable order, numbered w1, w2, … (iterateWirings, gathered). */
export function enumerateWirings(elements: readonly Pick<WiringElement, 'id'>[]): Wiring[] {
  return Array.from(iterateWirings(elements));
}

/** Build the reported record for a canonical network. */
export function makeWiring(network: Network, ids: readonly string[], number: number): Wiring {
  const used: number[] = [];
  const inverted: number[] = [];
  const walk = (node: Network): void => {
    if (node.kind === 'element') {
      used.push(node.element);
      if (node.inverted) inverted.push(node.element);
    } else node.parts.forEach(walk);
  };
  walk(network);
  used.sort((a, b) => a - b);
  inverted.sort((a, b) => a - b);
  return Object.freeze({
    id: `w${number}`,
    number,
    network,
    expression: printNetwork(network, ids),
    elements: used,
    elementIds: used.map((index) => ids[index] ?? '?'),
    topology: topologyOf(network),
    outOfPhase: inverted.map((index) => ids[index] ?? '?'),
    description: describeWiring(network, ids),
  });
}
