/**
 * What a position connects, read off the points it makes (`componentOf[item]`):
 *
 * 1. An element with a lead alone on its point (no other lead, hot or
 *    ground there) is open, one with both leads on one point is shorted: no
 *    current from it reaches the output (its own EMF only drives a loop
 *    through itself), it contributes nothing, and it is dropped.
 * 2. Hot and ground on one point with anything left: the output is shorted
 *    (silent, but not a clean wiring). Nothing left: off.
 * 3. Otherwise the remaining elements are edges between points, reduced
 *    as a two-terminal series–parallel network: two edges between the same
 *    two points merge in parallel, a point other than hot or ground with
 *    exactly two edges merges them in series (R. J. Duffin, 1965). One edge
 *    from hot to ground is the wiring; an edge from a point to itself is a
 *    shorted element, a point with one edge a hanging element, and a graph
 *    that does not reduce is a bridge network: each is reported as such.
 *
 * This is independent of the search (which matches layout partitions), so
 * tests compare the two.
 */
import { type Network, canonicalize, invertAll, parallel, series } from '../wiring/index.js';
import type { Guitar } from '../guitar/index.js';
import { GROUND_ITEM, HOT_ITEM, itemCount, minusItem, plusItem } from './element-terminals.js';

export type PositionReading =
  | { readonly kind: 'wiring'; readonly network: Network }
  | { readonly kind: 'off' }
  | { readonly kind: 'unclean'; readonly reason: string };

interface Edge {
  plus: number;
  minus: number;
  network: Network;
}

/** Read a position's wiring from the point of every item. */
export function readPositionWiring(guitar: Pick<Guitar, 'elements'>, componentOf: ArrayLike<number>): PositionReading {
  const items = itemCount(guitar);
  const count = new Map<number, number>();
  for (let item = 0; item < items; item += 1) count.set(componentOf[item] as number, (count.get(componentOf[item] as number) ?? 0) + 1);
  const alone = (item: number): boolean => count.get(componentOf[item] as number) === 1;
  let edges: Edge[] = [];
  guitar.elements.forEach((element, e) => {
    if (alone(plusItem(e)) || alone(minusItem(e)) || componentOf[plusItem(e)] === componentOf[minusItem(e)]) return;
    edges.push({ plus: componentOf[plusItem(e)] as number, minus: componentOf[minusItem(e)] as number, network: { kind: 'element', element: e, inverted: false } });
  });
  const hot = componentOf[HOT_ITEM] as number;
  const ground = componentOf[GROUND_ITEM] as number;
  if (edges.length === 0) return { kind: 'off' };
  if (hot === ground) return { kind: 'unclean', reason: 'hot is joined to ground (the output is shorted)' };
  const name = (edge: Edge): string => {
    const ids: string[] = [];
    const walk = (node: Network): void => {
      if (node.kind === 'element') ids.push(guitar.elements[node.element]?.id ?? '?');
      else node.parts.forEach(walk);
    };
    walk(edge.network);
    return ids.join(', ');
  };
  for (;;) {
    let changed = false;
    // Parallel: two edges between the same points.
    outer: for (let i = 0; i < edges.length; i += 1) {
      for (let j = i + 1; j < edges.length; j += 1) {
        const a = edges[i] as Edge;
        const b = edges[j] as Edge;
        const same = a.plus === b.plus && a.minus === b.minus;
        const reversed = a.plus === b.minus && a.minus === b.plus;
        if (!same && !reversed) continue;
        a.network = parallel(a.network, reversed ? invertAll(b.network) : b.network);
        edges.splice(j, 1);
        changed = true;
        break outer;
      }
    }
    if (changed) continue;
    // Series: a point other than hot and ground with exactly two edges.
    const degree = new Map<number, number[]>();
    edges.forEach((edge, k) => {
      for (const point of [edge.plus, edge.minus]) degree.set(point, [...(degree.get(point) ?? []), k]);
    });
    for (const [point, touching] of degree) {
      if (point === hot || point === ground) continue;
      if (touching.length === 1) return { kind: 'unclean', reason: `${name(edges[touching[0] as number] as Edge)} left hanging (one lead on a point that goes nowhere else)` };
      if (touching.length !== 2) continue;
      const first = edges[touching[0] as number] as Edge;
      const second = edges[touching[1] as number] as Edge;
      // Orient: first ends at the point (its minus), second starts there (its plus).
      const a = first.minus === point ? first : { plus: first.minus, minus: first.plus, network: invertAll(first.network) };
      const b = second.plus === point ? second : { plus: second.minus, minus: second.plus, network: invertAll(second.network) };
      const merged: Edge = { plus: a.plus, minus: b.minus, network: series(a.network, b.network) };
      edges = edges.filter((_, k) => k !== touching[0] && k !== touching[1]);
      if (merged.plus === merged.minus) return { kind: 'unclean', reason: `${name(merged)} form a closed loop` };
      edges.push(merged);
      changed = true;
      break;
    }
    if (!changed) break;
  }
  if (edges.length === 1) {
    const only = edges[0] as Edge;
    if (only.plus === hot && only.minus === ground) return { kind: 'wiring', network: canonicalize(only.network) };
    if (only.plus === ground && only.minus === hot) return { kind: 'wiring', network: canonicalize(invertAll(only.network)) };
    return { kind: 'unclean', reason: `${name(only)} not between hot and ground` };
  }
  const points = new Set(edges.flatMap((edge) => [edge.plus, edge.minus]));
  if (!points.has(hot) || !points.has(ground)) return { kind: 'unclean', reason: 'the coils do not reach both hot and ground' };
  return { kind: 'unclean', reason: 'a bridge network (not series–parallel)' };
}

