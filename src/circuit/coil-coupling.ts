/**
 * Mutual inductance between the coils of one pickup (docs/physics.md §12.3).
 *
 * The coils of a humbucker sit side by side on one magnetic circuit: flux
 * that a current drives down through one coil's core returns up through the
 * other's. With each coil's current and voltage referred from its start lead
 * to its finish lead, and w = ±1 its winding sense (coil-signs.ts), the
 * mutual inductance is
 *   M = −w_a·w_b·k·√(L_a·L_b)
 * (k the pickup's coupling coefficient, |k| < 1; the definition of k is the
 * textbook one, M = k·√(L_a·L_b)). The usual humbucker, coils wound in
 * opposite senses, has M = +k·√(L_a·L_b): in its hum-cancelling series
 * connection the coils aid, L = L_a + L_b + 2M. A negative k describes coils
 * whose fluxes pass through each other in the same direction (coils stacked
 * on one axis).
 */
import type { Coil, Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { windingSign } from './coil-signs.js';

/** One coupled pair: M = sign·coefficient·√(L_first·L_second), coils by index. */
export interface CoilCoupling {
  readonly first: number;
  readonly second: number;
  /** The pickup's coupling coefficient k. */
  readonly coefficient: number;
  /** −w_first·w_second. */
  readonly sign: 1 | -1;
}

const cache = new WeakMap<Guitar, readonly CoilCoupling[]>();

/** Every coupled pair of the guitar (each pair of coils in one pickup with k ≠ 0). */
export function coilCouplings(guitar: Guitar): readonly CoilCoupling[] {
  const known = cache.get(guitar);
  if (known !== undefined) return known;
  const pairs: CoilCoupling[] = [];
  for (const pickup of guitar.pickups) {
    if (pickup.coupling === 0) continue;
    const members = pickup.coilIndices;
    for (let a = 0; a < members.length; a += 1) {
      for (let b = a + 1; b < members.length; b += 1) {
        const first = guitar.coils[members[a] as number] as Coil;
        const second = guitar.coils[members[b] as number] as Coil;
        pairs.push({
          first: first.index,
          second: second.index,
          coefficient: pickup.coupling,
          sign: windingSign(first.winding) === windingSign(second.winding) ? -1 : 1,
        });
      }
    }
  }
  const frozen = Object.freeze(pairs);
  cache.set(guitar, frozen);
  return frozen;
}

/** Mutual inductance of a pair, henries. */
export function mutualInductanceH(guitar: Guitar, coupling: CoilCoupling): number {
  const first = guitar.coils[coupling.first] as Coil;
  const second = guitar.coils[coupling.second] as Coil;
  return coupling.sign * coupling.coefficient * Math.sqrt(first.inductanceH * second.inductanceH);
}

/** Per wiring element, the index of its coupling group (elements whose coils are coupled), or −1. */
const elementGroupCache = new WeakMap<Guitar, Int32Array>();

export function elementCouplingGroups(guitar: Guitar): Int32Array {
  const known = elementGroupCache.get(guitar);
  if (known !== undefined) return known;
  const elementOfCoil = new Int32Array(guitar.coils.length);
  for (const element of guitar.elements) for (const coil of element.coilIndices) elementOfCoil[coil] = element.index;
  const parent = Int32Array.from({ length: guitar.elements.length }, (_, k) => k);
  const find = (k: number): number => {
    let n = k;
    while (parent[n] !== n) n = parent[n] as number;
    return n;
  };
  const coupled = new Uint8Array(guitar.elements.length);
  for (const pair of coilCouplings(guitar)) {
    const a = elementOfCoil[pair.first] as number;
    const b = elementOfCoil[pair.second] as number;
    coupled[a] = 1;
    coupled[b] = 1;
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  }
  const groups = new Int32Array(guitar.elements.length).fill(-1);
  for (let e = 0; e < groups.length; e += 1) if (coupled[e] === 1) groups[e] = find(e);
  elementGroupCache.set(guitar, groups);
  return groups;
}

/** Answers already found, by network (a solver asks again for every frequency probe of a wiring). */
const coupledAnswers = new WeakMap<Network, { readonly guitar: Guitar; readonly uses: boolean }>();

/** Does the network hold both coils of a coupled pair (so only nodal analysis solves it)? */
export function usesCoupledCoils(guitar: Guitar, network: Network): boolean {
  const known = coupledAnswers.get(network);
  if (known !== undefined && known.guitar === guitar) return known.uses;
  const uses = findCoupledCoils(guitar, network);
  coupledAnswers.set(network, { guitar, uses });
  return uses;
}

function findCoupledCoils(guitar: Guitar, network: Network): boolean {
  const couplings = coilCouplings(guitar);
  if (couplings.length === 0) return false;
  const present = new Uint8Array(guitar.coils.length);
  const walk = (node: Network): void => {
    if (node.kind === 'element') {
      for (const coil of guitar.elements[node.element]?.coilIndices ?? []) present[coil] = 1;
    } else node.parts.forEach(walk);
  };
  walk(network);
  return couplings.some((pair) => present[pair.first] === 1 && present[pair.second] === 1);
}
