/**
 * Writes a network in coilbench's wiring notation: `neck + bridge` series,
 * `neck // bridge` parallel, `~bridge` out of phase, nested groups always in parentheses,
 * none around the whole. Print the canonical form to get the canonical text.
 */
import type { Network } from './network.js';

/** Symbol for joining parts of each group kind, with the spaces used in canonical text. */
export const SERIES_SYMBOL = '+';
export const PARALLEL_SYMBOL = '//';
export const OUT_OF_PHASE_SYMBOL = '~';

export function printNetwork(network: Network, ids: readonly string[]): string {
  if (network.kind === 'element') {
    const id = ids[network.element] ?? `#${network.element}`;
    return network.inverted ? `${OUT_OF_PHASE_SYMBOL}${id}` : id;
  }
  const joiner = network.kind === 'series' ? ` ${SERIES_SYMBOL} ` : ` ${PARALLEL_SYMBOL} `;
  return network.parts
    .map((part) => (part.kind === 'element' ? printNetwork(part, ids) : `(${printNetwork(part, ids)})`))
    .join(joiner);
}
