/**
 * Canonical form of a wiring, so two wirings are the same exactly when their
 * canonical forms are equal:
 * - nested groups of the same kind merge (series and parallel associate);
 * - the parts of a group are ordered by the earliest-declared element they
 *   contain (series and parallel commute);
 * - global polarity is chosen so the earliest-declared element is in phase
 *   (inverting every coil only inverts the output, which is not audible).
 */
import { type Network, firstElement, invertAll, leaf } from './network.js';

/** Merge same-kind nesting and sort parts; keep phases as given. */
export function normaliseStructure(network: Network): Network {
  if (network.kind === 'element') return leaf(network.element, network.inverted);
  const parts: Network[] = [];
  for (const part of network.parts) {
    const inner = normaliseStructure(part);
    if (inner.kind === network.kind) for (const part of inner.parts) parts.push(part);
    else parts.push(inner);
  }
  if (parts.length === 1) return parts[0] as Network;
  parts.sort((a, b) => firstElement(a) - firstElement(b));
  return { kind: network.kind, parts };
}

/** Phase of the earliest-declared element in a network. */
function firstIsInverted(network: Network): boolean {
  if (network.kind === 'element') return network.inverted;
  const first = firstElement(network);
  const holder = network.parts.find((part) => firstElement(part) === first);
  return holder === undefined ? false : firstIsInverted(holder);
}

/** The canonical form: normalised structure, earliest element in phase. */
export function canonicalize(network: Network): Network {
  const normalised = normaliseStructure(network);
  return firstIsInverted(normalised) ? invertAll(normalised) : normalised;
}
