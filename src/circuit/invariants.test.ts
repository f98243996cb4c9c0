/**
 * Invariants of any linear network, as property tests (fast-check) over
 * random guitars and their wirings: inverting every coil changes no
 * magnitude; the order of coils in a group changes nothing; a wiring's poles
 * (the power-sum curve and its resonance) do not move with polarity.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar } from '../guitar/index.js';
import { enumerateWirings, invertAll, type Network } from '../wiring/index.js';
import { analysisFrequencies, measureResonance, prepareCircuit, solvePowerSum, solveTransfers } from './index.js';
import { maxOf } from '../math/index.js';

const RELATIVE_TOLERANCE = 1e-11;
const FREQUENCIES = analysisFrequencies(40);

const coilArbitrary = fc.record({
  resistance: fc.double({ min: 2e3, max: 16e3, noNaN: true }),
  inductance: fc.double({ min: 1, max: 8, noNaN: true }),
  capacitance: fc.double({ min: 60e-12, max: 250e-12, noNaN: true }),
  winding: fc.constantFrom('cw', 'ccw'),
  magnet: fc.constantFrom('north', 'south'),
  humSensitivity: fc.double({ min: 0.5, max: 1.5, noNaN: true }),
});

const guitarArbitrary = fc
  .record({
    coils: fc.array(coilArbitrary, { minLength: 2, maxLength: 4 }),
    volume: fc.double({ min: 0.5, max: 10, noNaN: true }),
    tone: fc.double({ min: 0, max: 10, noNaN: true }),
    cable: fc.double({ min: 100e-12, max: 2e-9, noNaN: true }),
  })
  .map(
    ({ coils, volume, tone, cable }): Guitar =>
      parseGuitar({
        name: 'random guitar (invented values)',
        coils: coils.map((coil, index) => ({ id: `coil${index + 1}`, position: `${40 + 30 * index}mm`, ...coil })),
        controls: { volume: { pot: '250k', setting: volume }, tone: { pot: '250k', capacitor: '22n', setting: tone } },
        cable: { capacitance: cable },
      }),
  );

/** A guitar with one of its wirings, chosen by a random index. */
const wiringArbitrary = fc.tuple(guitarArbitrary, fc.nat()).map(([guitar, pick]) => {
  const wirings = enumerateWirings(guitar.elements);
  return { guitar, network: (wirings[pick % wirings.length] as (typeof wirings)[number]).network };
});

function close(a: Float64Array, b: Float64Array, scale: number): boolean {
  return a.every((value, index) => Math.abs(value - (b[index] as number)) <= RELATIVE_TOLERANCE * scale);
}

function largest(arrays: readonly Float64Array[]): number {
  return maxOf(arrays.flatMap((array) => Array.from(array, Math.abs)));
}

/** The same network with every group's parts in reverse order and the top group wrapped in a redundant group. */
function reordered(network: Network): Network {
  if (network.kind === 'element') return network;
  return { kind: network.kind, parts: [...network.parts].reverse().map(reordered) };
}

/** Every element's phase set from the bits of `mask`. */
function withPhases(network: Network, mask: number): Network {
  if (network.kind === 'element') return { ...network, inverted: ((mask >> network.element) & 1) === 1 };
  return { kind: network.kind, parts: network.parts.map((part) => withPhases(part, mask)) };
}

describe('circuit invariants (property tests)', () => {
  it('inverting every coil negates every transfer and so leaves every magnitude unchanged', () => {
    fc.assert(
      fc.property(wiringArbitrary, ({ guitar, network }) => {
        const prepared = prepareCircuit(guitar, FREQUENCIES);
        const straight = solveTransfers(prepared, network);
        const inverted = solveTransfers(prepared, invertAll(network));
        const scale = largest(straight);
        return straight.every((transfer, c) => close(transfer, (inverted[c] as Float64Array).map((value) => -value), scale));
      }),
      { numRuns: 60 },
    );
  });

  it('the order of coils in a group changes nothing, nor does a redundant group', () => {
    fc.assert(
      fc.property(wiringArbitrary, ({ guitar, network }) => {
        const prepared = prepareCircuit(guitar, FREQUENCIES);
        const canonical = solveTransfers(prepared, network);
        const shuffled = solveTransfers(prepared, { kind: 'series', parts: [reordered(network)] });
        const scale = largest(canonical);
        return canonical.every((transfer, c) => close(transfer, shuffled[c] as Float64Array, scale));
      }),
      { numRuns: 60 },
    );
  });

  it('the poles do not move with polarity: the power sum and the resonance are the same for every phase pattern', () => {
    fc.assert(
      fc.property(wiringArbitrary, fc.nat(), ({ guitar, network }, mask) => {
        const prepared = prepareCircuit(guitar, FREQUENCIES);
        const flipped = withPhases(network, mask);
        const a = solvePowerSum(solveTransfers(prepared, network), FREQUENCIES.length);
        const b = solvePowerSum(solveTransfers(prepared, flipped), FREQUENCIES.length);
        if (!close(a, b, maxOf(a))) return false;
        const ra = measureResonance(prepared, network).resonanceHz;
        const rb = measureResonance(prepared, flipped).resonanceHz;
        return ra === rb || (ra !== null && rb !== null && Math.abs(ra / rb - 1) < 1e-9);
      }),
      { numRuns: 40 },
    );
  });
});
