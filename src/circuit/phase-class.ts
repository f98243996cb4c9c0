/**
 * Which wirings share transfers up to signs. Without coupling a wiring's
 * phases only flip the signs of its coils' transfers (wiring/network-phases.ts):
 * T_i = p_i·T_i⁰, T⁰ solved once per network shape. Coupled coils break that
 * in part: reversing one coil of a coupled pair reverses the sign of their
 * mutual inductance's effect, so their relative phase changes the circuit.
 * Reversing every element of a coupling group together changes nothing but
 * signs (the admittance block D·Y_g·D with D = −I is Y_g again).
 *
 * So a phase class is the network shape plus, for each coupling group it
 * uses, the phase of each member relative to the group's first element
 * present. Its representative network keeps those relative phases (the
 * group's first element in phase) and puts every other element in phase; a
 * wiring's transfers are then s_i·T_i of the representative, with s_i the
 * phase of coil i's element, or of its group's first element.
 */
import type { Guitar } from '../guitar/index.js';
import { type Network, shapeKey } from '../wiring/index.js';
import { elementCouplingGroups } from './coil-coupling.js';

/** Phase (+1/−1) of each element the network uses, 0 for the rest. */
function elementPhases(guitar: Guitar, network: Network): Int8Array {
  const phases = new Int8Array(guitar.elements.length);
  const walk = (node: Network): void => {
    if (node.kind === 'element') phases[node.element] = node.inverted ? -1 : 1;
    else node.parts.forEach(walk);
  };
  walk(network);
  return phases;
}

/** Per element, the phase its class representative takes off: its own, or its coupling group's first present element's. */
function classSigns(guitar: Guitar, phases: Int8Array): Int8Array {
  const groups = elementCouplingGroups(guitar);
  const leaderPhase = new Map<number, number>();
  const signs = new Int8Array(phases.length);
  for (let e = 0; e < phases.length; e += 1) {
    const phase = phases[e] as number;
    if (phase === 0) continue;
    const group = groups[e] as number;
    if (group < 0) {
      signs[e] = phase;
      continue;
    }
    const leader = leaderPhase.get(group);
    if (leader === undefined) leaderPhase.set(group, phase);
    signs[e] = leader ?? phase;
  }
  return signs;
}

/** Equal for wirings whose transfers differ only by the signs `phaseClassSigns` gives. */
export function phaseClassKey(guitar: Guitar, network: Network): string {
  const shape = shapeKey(network);
  const groups = elementCouplingGroups(guitar);
  const phases = elementPhases(guitar, network);
  const signs = classSigns(guitar, phases);
  let relative = '';
  for (let e = 0; e < phases.length; e += 1) {
    if (phases[e] !== 0 && (groups[e] as number) >= 0) relative += (phases[e] as number) * (signs[e] as number) > 0 ? '+' : '-';
  }
  return relative === '' ? shape : `${shape}|${relative}`;
}

/** The class representative: coupled elements keep their phase relative to their group's first element, the rest in phase. */
export function phaseClassNetwork(guitar: Guitar, network: Network): Network {
  const signs = classSigns(guitar, elementPhases(guitar, network));
  const rewrite = (node: Network): Network => {
    if (node.kind !== 'element') return { kind: node.kind, parts: node.parts.map(rewrite) };
    const inverted = (node.inverted ? -1 : 1) * (signs[node.element] as number) < 0;
    return inverted === node.inverted ? node : { ...node, inverted };
  };
  return rewrite(network);
}

/** s_i per coil (0 for coils not used): the wiring's T_i = s_i·T_i of `phaseClassNetwork`. Written into `out`. */
export function phaseClassSigns(guitar: Guitar, network: Network, out: Float64Array): Float64Array {
  const signs = classSigns(guitar, elementPhases(guitar, network));
  out.fill(0);
  for (const element of guitar.elements) for (const coil of element.coilIndices) out[coil] = signs[element.index] as number;
  return out;
}
