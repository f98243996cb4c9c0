/**
 * The same wiring on two guitars: matched by expression, element by element.
 * Element ids must correspond one to one, directly or through a renaming
 * (`neck=neck-coil`). Declaration order may differ: each wiring of the first
 * guitar is rebuilt on the second's elements and put in canonical form
 * there, so `neck + ~mid` finds `~mid + neck` spelled as the second guitar
 * spells it (flipping every coil at once is the same wiring).
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import { type Network, type Wiring, canonicalize, leaf, printNetwork } from '../wiring/index.js';

/**
 * For each element of A, the index of the element of B with the same id
 * (after `rename`, A id → B id). Throws InputError (at `path`) unless the
 * ids correspond one to one.
 */
export function matchElements(idsA: readonly string[], idsB: readonly string[], rename: ReadonlyMap<string, string>, path: string): Int32Array {
  const problems: InputProblem[] = [];
  for (const from of rename.keys()) {
    if (!idsA.includes(from)) problems.push(problemAt(path, `renamings of the first guitar's elements (${idsA.join(', ')})`, from));
  }
  const mapped = idsA.map((id) => rename.get(id) ?? id);
  const result = new Int32Array(idsA.length);
  mapped.forEach((id, index) => {
    result[index] = idsB.indexOf(id);
  });
  const matchesOneToOne = idsA.length === idsB.length && result.every((index) => index >= 0) && new Set(mapped).size === mapped.length;
  if (!matchesOneToOne) {
    problems.push(
      problemAt(
        path,
        `elements that match ${mapped.join(', ')} one to one (rename with --map first=second,…)`,
        idsB.join(', '),
      ),
    );
  }
  if (problems.length > 0) throw new InputError(problems);
  return result;
}

/** The network with each element index replaced through `elementMap`. */
function mapNetwork(network: Network, elementMap: Int32Array): Network {
  if (network.kind === 'element') return leaf(elementMap[network.element] as number, network.inverted);
  return { kind: network.kind, parts: network.parts.map((part) => mapNetwork(part, elementMap)) };
}

/** For each wiring of A, the index of the same wiring among B's (−1 if B has none). */
export function matchWirings(
  wiringsA: readonly Wiring[],
  wiringsB: readonly Wiring[],
  elementMap: Int32Array,
  idsB: readonly string[],
): Int32Array {
  const byExpression = new Map(wiringsB.map((wiring, index) => [wiring.expression, index]));
  return Int32Array.from(wiringsA, (wiring) => byExpression.get(printNetwork(canonicalize(mapNetwork(wiring.network, elementMap)), idsB)) ?? -1);
}
