/**
 * Any connection of coil leads as plain data: numbered nodes, and for each
 * coil the node its start lead and its finish lead touch (or null for a lead
 * left floating). The controls and load hang off the `hot` node exactly as in
 * circuit-load.ts (volume pot input); `ground` is the ground bus. A switch
 * position, a series–parallel wiring or a bridge network are all graphs;
 * `solveNodalTransfers` solves any of them.
 */
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { GROUND_NODE, HOT_NODE, layoutWiring } from './layout-wiring.js';

/** Where one coil's leads go. */
export interface GraphCoil {
  /** Index into `guitar.coils`. */
  readonly coil: number;
  /** Node the start lead touches, or null when it is left floating (insulated). */
  readonly start: number | null;
  /** Node the finish lead touches, or null when it is left floating. */
  readonly finish: number | null;
}

export interface CircuitGraph {
  /** Nodes are numbered 0 … nodeCount − 1. */
  readonly nodeCount: number;
  /** The node wired to the volume pot's input lug (the load of circuit-load.ts hangs here). */
  readonly hot: number;
  /** The ground bus. `hot === ground` means the output is shorted: every transfer is 0. */
  readonly ground: number;
  /** Coils that touch the circuit; each guitar coil at most once. A coil not listed is disconnected. */
  readonly coils: readonly GraphCoil[];
  /** Optional names, one per node, for messages and netlists. */
  readonly nodeNames?: readonly string[];
}

/**
 * The graph of a series–parallel wiring, lead for lead as `layoutWiring`
 * places them (the netlist and the build sheet use the same layout), so the
 * nodal solver and `solveTransfers` see the same circuit. Node 0 is ground,
 * node 1 hot, then the junctions and the joints inside two-lead pickups.
 */
export function graphOfNetwork(guitar: Guitar, network: Network): CircuitGraph {
  const layout = layoutWiring(guitar, network);
  const names: string[] = [GROUND_NODE, HOT_NODE];
  const index = new Map<string, number>([
    [GROUND_NODE, 0],
    [HOT_NODE, 1],
  ]);
  const nodeOf = (name: string): number => {
    const known = index.get(name);
    if (known !== undefined) return known;
    index.set(name, names.length);
    names.push(name);
    return names.length - 1;
  };
  const coils = layout.placements.map((placement): GraphCoil => {
    const plus = nodeOf(placement.plusNode);
    const minus = nodeOf(placement.minusNode);
    return placement.plusLead === 'finish'
      ? { coil: placement.coil.index, start: minus, finish: plus }
      : { coil: placement.coil.index, start: plus, finish: minus };
  });
  return { nodeCount: names.length, hot: 1, ground: 0, coils, nodeNames: names };
}

/** Does some path of coil windings (both leads connected) join hot to ground? Without one nothing reaches the output. */
export function connectsHotToGround(graph: CircuitGraph): boolean {
  if (graph.hot === graph.ground) return false;
  const parent = Array.from({ length: graph.nodeCount }, (_, node) => node);
  const find = (node: number): number => {
    let n = node;
    while (parent[n] !== n) n = parent[n] as number;
    return n;
  };
  for (const placed of graph.coils) {
    if (placed.start === null || placed.finish === null) continue;
    parent[find(placed.start)] = find(placed.finish);
  }
  return find(graph.hot) === find(graph.ground);
}
