/**
 * Distinctness without trusting the canonical form (docs/physics.md §5): give
 * each element a random complex impedance and EMF, compute every wiring's
 * Thevenin source (V, Z) with a small evaluator written here, and count the
 * distinct results up to a global sign of V. Each enumerated wiring must be
 * electrically different from every other, and the raw (unreduced) list must
 * collapse onto the same number.
 */
import { describe, expect, it } from 'vitest';
import { enumerateWirings } from './enumerate-wirings.js';
import { type Network, invertAll } from './network.js';

type Complex = readonly [number, number];
const add = (a: Complex, b: Complex): Complex => [a[0] + b[0], a[1] + b[1]];
const mul = (a: Complex, b: Complex): Complex => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const inv = (a: Complex): Complex => {
  const d = a[0] * a[0] + a[1] * a[1];
  return [a[0] / d, -a[1] / d];
};

/** Deterministic generator (mulberry32) so the check is reproducible. */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Thevenin source of a network: series adds V and Z; parallel by Millman's theorem V = Σ(Vk/Zk)/Σ(1/Zk). */
function thevenin(network: Network, emf: readonly Complex[], impedance: readonly Complex[]): { v: Complex; z: Complex } {
  if (network.kind === 'element') {
    const e = emf[network.element]!;
    return { v: network.inverted ? [-e[0], -e[1]] : e, z: impedance[network.element]! };
  }
  const parts = network.parts.map((part) => thevenin(part, emf, impedance));
  if (network.kind === 'series') {
    return parts.reduce((sum, part) => ({ v: add(sum.v, part.v), z: add(sum.z, part.z) }), { v: [0, 0] as Complex, z: [0, 0] as Complex });
  }
  let current: Complex = [0, 0];
  let admittance: Complex = [0, 0];
  for (const part of parts) {
    const y = inv(part.z);
    current = add(current, mul(part.v, y));
    admittance = add(admittance, y);
  }
  const z = inv(admittance);
  return { v: mul(current, z), z };
}

/** A key equal for sources equal up to the sign of V, at a relative precision far above rounding noise. */
function keyOf(source: { v: Complex; z: Complex }): string {
  const sign = source.v[0] < 0 || (source.v[0] === 0 && source.v[1] < 0) ? -1 : 1;
  const round = (x: number) => x.toPrecision(9);
  return [sign * source.v[0], sign * source.v[1], source.z[0], source.z[1]].map(round).join(',');
}

describe('every enumerated wiring is electrically distinct', () => {
  it.each([
    [2, 6],
    [3, 47],
    [4, 572],
    [5, 9997],
  ])('%d elements: %d distinct Thevenin sources', (n, expected) => {
    const next = random(20261201 + n);
    const emf = Array.from({ length: n }, (): Complex => [next() * 2 - 1, next() * 2 - 1]);
    const impedance = Array.from({ length: n }, (): Complex => [0.5 + next(), next() * 2 - 1]);
    const wirings = enumerateWirings(Array.from({ length: n }, (_, index) => ({ id: `c${index}` })));
    const keys = new Set(wirings.map((wiring) => keyOf(thevenin(wiring.network, emf, impedance))));
    expect(keys.size).toBe(expected);
    // Adding each wiring's global inversion (the raw list) must not add anything new.
    for (const wiring of wirings) keys.add(keyOf(thevenin(invertAll(wiring.network), emf, impedance)));
    expect(keys.size).toBe(expected);
  });
});
