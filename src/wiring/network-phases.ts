/**
 * Phases only flip signs: the circuit solver applies each coil's phase p_i
 * at the leaves and every later step is linear, so a wiring's transfers are
 * T_i = p_i·T_i⁰, T⁰ being those of the same network with every element in
 * phase. Solving once per network shape serves all 2^(k−1) phase patterns;
 * the circuit metrics, the render and the distinctness analysis all do so.
 */
import type { WiringElement } from '../guitar/index.js';
import type { Network } from './network.js';

/** A key equal for networks that differ only in phases (same structure, same element order). */
export function shapeKey(network: Network): string {
  if (network.kind === 'element') return String(network.element);
  return `${network.kind === 'series' ? 's' : 'p'}(${network.parts.map(shapeKey).join(',')})`;
}

/** The network with every element in phase. */
export function withoutPhases(network: Network): Network {
  if (network.kind === 'element') return network.inverted ? { ...network, inverted: false } : network;
  return { kind: network.kind, parts: network.parts.map(withoutPhases) };
}

/** p_i per coil (+1, −1, or 0 for coils the wiring does not use), written into `out`. */
export function coilPhases(elements: readonly Pick<WiringElement, 'coilIndices'>[], network: Network, out: Float64Array): Float64Array {
  out.fill(0);
  const walk = (node: Network): void => {
    if (node.kind === 'element') {
      for (const coil of elements[node.element]?.coilIndices ?? []) out[coil] = node.inverted ? -1 : 1;
    } else node.parts.forEach(walk);
  };
  walk(network);
  return out;
}
