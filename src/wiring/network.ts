/**
 * A wiring as plain data: a two-terminal series–parallel network whose
 * leaves are wiring elements (coils, or two-lead pickups), each in or out of
 * phase. Evaluated by small recursive functions elsewhere.
 */

/** One element in the network. `inverted` means its string signal is inverted (written `~id`). */
export interface ElementLeaf {
  readonly kind: 'element';
  /** Index into the guitar's `elements`. */
  readonly element: number;
  readonly inverted: boolean;
}

/** Two or more parts joined end to end (`+`) or side by side (`//`). */
export interface Group {
  readonly kind: 'series' | 'parallel';
  readonly parts: readonly Network[];
}

export type Network = ElementLeaf | Group;

/** How a wiring is built, as reported: one element, all in series, all in parallel, or a mix. */
export type Topology = 'single' | 'series' | 'parallel' | 'series-parallel';

export function leaf(element: number, inverted = false): ElementLeaf {
  return { kind: 'element', element, inverted };
}

export function series(...parts: Network[]): Group {
  return { kind: 'series', parts };
}

export function parallel(...parts: Network[]): Group {
  return { kind: 'parallel', parts };
}

/** The elements a network uses, in ascending index order. */
export function elementsOf(network: Network): number[] {
  const found: number[] = [];
  const walk = (node: Network): void => {
    if (node.kind === 'element') found.push(node.element);
    else node.parts.forEach(walk);
  };
  walk(network);
  return found.sort((a, b) => a - b);
}

/** Lowest element index in a network: the key that orders parts in canonical form. */
export function firstElement(network: Network): number {
  if (network.kind === 'element') return network.element;
  let lowest = Number.POSITIVE_INFINITY;
  for (const part of network.parts) lowest = Math.min(lowest, firstElement(part));
  return lowest;
}

/** The same network with every element's phase flipped. */
export function invertAll(network: Network): Network {
  if (network.kind === 'element') return leaf(network.element, !network.inverted);
  return { kind: network.kind, parts: network.parts.map(invertAll) };
}

/** Elements written out of phase (`~`), ascending. */
export function invertedElements(network: Network): number[] {
  const found: number[] = [];
  const walk = (node: Network): void => {
    if (node.kind === 'element') {
      if (node.inverted) found.push(node.element);
    } else node.parts.forEach(walk);
  };
  walk(network);
  return found.sort((a, b) => a - b);
}

/** Classify a (canonical) network. */
export function topologyOf(network: Network): Topology {
  if (network.kind === 'element') return 'single';
  return network.parts.every((part) => part.kind === 'element') ? network.kind : 'series-parallel';
}
