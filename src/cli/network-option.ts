/**
 * `analyze --network "<connection list>"`: connections of coil leads written
 * joint by joint (the syntax of circuit/parse-connections.ts, the one
 * `netlist` reads), for circuits no +, // and ~ expression writes, such as a
 * bridge network of five coils. Each becomes one extra row (n1, n2, …) after
 * the enumerated wirings.
 */
import { type CircuitGraph, connectsHotToGround, parseConnections } from '../circuit/index.js';
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import { appendAll } from '../math/index.js';
import type { RowWiring } from './metric-columns.js';

export interface NetworkOption {
  /** The joints as written, spaced as "a = b, c = d". */
  readonly text: string;
  readonly graph: CircuitGraph;
}

/** Parse every `--network` value; problems (each naming --network) go into `problems`. */
export function parseNetworkOptions(guitar: Guitar, texts: readonly string[], problems: InputProblem[]): NetworkOption[] {
  const parsed: NetworkOption[] = [];
  texts.forEach((text, index) => {
    const path = texts.length === 1 ? '--network' : `--network (${index + 1} of ${texts.length})`;
    try {
      const graph = parseConnections(guitar, text, path);
      if (!connectsHotToGround(graph)) {
        problems.push(problemAt(path, 'connections that join hot to ground through coil windings (hot and ground on one joint short the output)', text));
        return;
      }
      parsed.push({ text: text.split(',').map((joint) => joint.split('=').map((terminal) => terminal.trim()).join(' = ')).join(', '), graph });
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
    }
  });
  return parsed;
}

/** The table row's wiring fields of the `ordinal`-th network, numbered `number` (after the enumerated wirings). */
export function networkRow(guitar: Guitar, network: NetworkOption, number: number, ordinal: number): RowWiring {
  const connected = new Set(network.graph.coils.filter((placed) => placed.start !== null && placed.finish !== null).map((placed) => placed.coil));
  const elementIds = guitar.elements.filter((element) => element.coilIndices.some((coil) => connected.has(coil))).map((element) => element.id);
  return {
    id: `n${ordinal}`,
    number,
    expression: network.text,
    elementIds,
    topology: 'connection list',
    outOfPhase: [],
    description: `connection list of ${elementIds.length} coil${elementIds.length === 1 ? '' : 's'} (${elementIds.join(', ')}), solved by nodal analysis`,
  };
}
