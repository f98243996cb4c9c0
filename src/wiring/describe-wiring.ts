/**
 * Plain-language description of a canonical wiring, for people who do not
 * read the notation: "neck and bridge in series, bridge out of phase".
 */
import { type Network, elementsOf, invertedElements } from './network.js';

const KIND_WORDS: Readonly<Record<'series' | 'parallel', string>> = Object.freeze({
  series: 'in series',
  parallel: 'in parallel',
});

/** "a", "a and b", "a, b and c". */
export function listInWords(names: readonly string[]): string {
  if (names.length <= 1) return names[0] ?? '';
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1] ?? ''}`;
}

function describeStructure(network: Network, ids: readonly string[]): string {
  if (network.kind === 'element') return ids[network.element] ?? '?';
  const leaves = network.parts.filter((part) => part.kind === 'element').map((part) => describeStructure(part, ids));
  const groups = network.parts.filter((part) => part.kind !== 'element');
  const joined = KIND_WORDS[network.kind];
  if (groups.length === 0) return `${listInWords(leaves)} ${joined}`;
  // A group of groups: describe each inner group, then how they are joined.
  const inner = groups.map((group) => describeStructure(group, ids));
  if (groups.length === 1 && leaves.length > 0) return `${inner[0] ?? ''}, ${joined} with ${listInWords(leaves)}`;
  const all = [...inner.map((text) => `(${text})`), ...leaves];
  return `${listInWords(all)}, ${joined}`;
}

/**
 * Describe a canonical network. Phase is told by the smaller side: in a
 * three-coil series wiring with two coils marked `~`, the one other coil is
 * the one "out of phase with the others".
 */
export function describeWiring(network: Network, ids: readonly string[]): string {
  return describePhases(describeShape(network, ids), elementsOf(network), invertedElements(network), ids);
}

/** The structure in words, phase left out ("neck and bridge in series"); the same for every phase pattern of one shape. */
export function describeShape(network: Network, ids: readonly string[]): string {
  return network.kind === 'element' ? `${ids[network.element] ?? '?'} alone` : describeStructure(network, ids);
}

/** A shape's words with the phase told by the smaller side (`used` and `inverted` ascending element indices). */
export function describePhases(structure: string, used: readonly number[], inverted: readonly number[], ids: readonly string[]): string {
  if (inverted.length === 0) return structure;
  const name = (index: number): string => ids[index] ?? '?';
  if (inverted.length * 2 > used.length) {
    const others = used.filter((index) => !inverted.includes(index));
    const verb = others.length === 1 ? 'is' : 'are';
    return `${structure}; ${listInWords(others.map(name))} ${verb} out of phase with the others`;
  }
  return `${structure}, ${listInWords(inverted.map(name))} out of phase`;
}
