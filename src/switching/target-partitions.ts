/**
 * Every way a series–parallel wiring can sit on the plan's items: which
 * items share a point. A wiring is realised exactly when the points the
 * switch makes, restricted to hot, ground and the leads of the elements it
 * uses, are one of these partitions (and every other element is left open).
 *
 * The partitions come from laying the wiring out (as circuit/layout-wiring.ts
 * does) in every order of the parts of every series group, for the wiring and
 * for its global inverse (canonical form treats the two as one wiring). Two
 * layouts give the same circuit when one is the other with series parts
 * reordered or with every element reversed and hot and ground kept: the
 * series–parallel decomposition of a two-terminal graph is unique up to the
 * order of the parts of its groups (R. J. Duffin, "Topology of series-parallel
 * networks", J. Math. Anal. Appl. 10, 303–318, 1965), so this list is
 * complete.
 */
import { type Network, elementsOf, invertAll } from '../wiring/index.js';
import { FIXED_ITEMS, GROUND_ITEM, HOT_ITEM, minusItem, plusItem } from './element-terminals.js';

/** A target: the elements used, and the allowed partitions (node per item, −1 for items of unused elements). */
export interface TargetPartitions {
  readonly used: readonly number[];
  readonly partitions: readonly Int32Array[];
}

function permutations<T>(items: readonly T[]): T[][] {
  if (items.length <= 1) return [[...items]];
  const result: T[][] = [];
  items.forEach((item, k) => {
    const rest = [...items.slice(0, k), ...items.slice(k + 1)];
    for (const tail of permutations(rest)) result.push([item, ...tail]);
  });
  return result;
}

function product<T>(lists: readonly (readonly T[])[]): T[][] {
  let result: T[][] = [[]];
  for (const list of lists) result = result.flatMap((prefix) => list.map((item) => [...prefix, item]));
  return result;
}

/** Every ordering of a network's series groups (parallel order does not change the points). */
function orderings(network: Network): Network[] {
  if (network.kind === 'element') return [network];
  const variants = product(network.parts.map(orderings));
  if (network.kind === 'parallel') return variants.map((parts) => ({ kind: 'parallel' as const, parts }));
  return variants.flatMap((parts) => permutations(parts).map((order) => ({ kind: 'series' as const, parts: order })));
}

function partitionOf(network: Network, elementCount: number): Int32Array {
  const nodes = new Int32Array(FIXED_ITEMS + 2 * elementCount).fill(-1);
  nodes[GROUND_ITEM] = 0;
  nodes[HOT_ITEM] = 1;
  let next = 2;
  const place = (node: Network, plus: number, minus: number): void => {
    if (node.kind === 'element') {
      nodes[plusItem(node.element)] = node.inverted ? minus : plus;
      nodes[minusItem(node.element)] = node.inverted ? plus : minus;
      return;
    }
    if (node.kind === 'parallel') {
      for (const part of node.parts) place(part, plus, minus);
      return;
    }
    let from = plus;
    node.parts.forEach((part, k) => {
      const to = k === node.parts.length - 1 ? minus : next++;
      place(part, from, to);
      from = to;
    });
  };
  place(network, 1, 0);
  // Relabel junctions in order of first appearance so equal partitions compare equal.
  const relabel = new Map<number, number>([
    [0, 0],
    [1, 1],
  ]);
  for (let item = 0; item < nodes.length; item += 1) {
    const node = nodes[item] as number;
    if (node < 0) continue;
    if (!relabel.has(node)) relabel.set(node, relabel.size);
    nodes[item] = relabel.get(node) as number;
  }
  return nodes;
}

/** The partitions that realise `network` on a guitar of `elementCount` elements. */
export function enumerateTargetPartitions(network: Network, elementCount: number): TargetPartitions {
  const seen = new Map<string, Int32Array>();
  for (const variant of [network, invertAll(network)]) {
    for (const ordered of orderings(variant)) {
      const partition = partitionOf(ordered, elementCount);
      seen.set(partition.join(','), partition);
    }
  }
  return { used: elementsOf(network), partitions: [...seen.values()] };
}
