/**
 * The nodal solve's WebAssembly form (nodal-kernel.ts, wasm/nodal-block.ts)
 * against its JavaScript form (solve-nodal.ts), bit for bit: every phase
 * class holding a coupled pair of the bundled guitars with humbuckers, on
 * grids of several blocks with a short last block of odd length (the lanes
 * past it are worked out and must never show), and on the synthesis grid of
 * the demo's length. Both forms are our own code, so this holds the port to
 * the original; the original is checked against the series–parallel engine
 * (solve-nodal.test.ts) and ngspice (nodal-spice-agreement.test.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { graphOfNetwork, phaseClassKey, phaseClassNetwork, prepareCircuit, type PreparedCircuit, retuneCircuit, usesCoupledCoils } from './index.js';
import type { CircuitGraph } from './circuit-graph.js';
import { NODAL_KERNEL_MAX_BINS, nodalKernelCompiles, nodalKernelGridBins, solveCoupledSourceFactors } from './nodal-kernel.js';
import { BLOCK_BINS } from './solve-nodal.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

function sample(file: string): Guitar {
  return parseGuitarText(readFileSync(join(SAMPLES, file), 'utf8'), file);
}

/** `bins` bins from 0 Hz to 24 kHz, as a synthesis grid spaces them. */
function grid(bins: number): Float64Array {
  return Float64Array.from({ length: bins }, (_, k) => (k * 24000) / (bins - 1));
}

/** One graph per phase class holding a coupled pair. */
function coupledGraphs(guitar: Guitar): CircuitGraph[] {
  const seen = new Set<string>();
  const graphs: CircuitGraph[] = [];
  for (const wiring of enumerateWirings(guitar.elements)) {
    const key = phaseClassKey(guitar, wiring.network);
    if (seen.has(key)) continue;
    seen.add(key);
    const network = phaseClassNetwork(guitar, wiring.network);
    if (usesCoupledCoils(guitar, network)) graphs.push(graphOfNetwork(guitar, network));
  }
  return graphs;
}

interface Solved {
  readonly factors: Float64Array[];
  readonly impedance: Float64Array;
}

function solve(prepared: PreparedCircuit, graph: CircuitGraph, host: 'webassembly' | 'javascript'): Solved {
  const length = 2 * prepared.frequenciesHz.length;
  // Filled with a marker first: both forms must clear what they do not write.
  const factors = prepared.guitar.coils.map(() => new Float64Array(length).fill(7));
  const impedance = new Float64Array(length).fill(7);
  solveCoupledSourceFactors(prepared, graph, factors, impedance, host);
  return { factors, impedance };
}

/** The first difference between the two forms' numbers, as text, or null. */
function difference(prepared: PreparedCircuit, graph: CircuitGraph): string | null {
  const wasm = solve(prepared, graph, 'webassembly');
  const javascript = solve(prepared, graph, 'javascript');
  const impedance = firstBitDifference(wasm.impedance, javascript.impedance);
  if (impedance !== -1) return `impedance, number ${impedance}`;
  for (let coil = 0; coil < wasm.factors.length; coil += 1) {
    const found = firstBitDifference(wasm.factors[coil] as Float64Array, javascript.factors[coil] as Float64Array);
    if (found !== -1) return `S of coil ${coil}, number ${found}`;
  }
  return null;
}

describe('the nodal solve as WebAssembly', () => {
  it('compiles on this host (Node 20 has 128-bit SIMD), so the comparisons below compare two forms', () => {
    expect(nodalKernelCompiles()).toBe(true);
  });

  // Four blocks and a last one of 233 bins (odd); two humbuckers give two coupling groups in one graph.
  it.each(['humbucker-two-single-coil.json', 'two-humbucker.json'])('%s: every coupled phase class, the same bits on a grid of four blocks', (file) => {
    const guitar = sample(file);
    const graphs = coupledGraphs(guitar);
    expect(graphs.length).toBeGreaterThan(10);
    const prepared = prepareCircuit(guitar, grid(3 * BLOCK_BINS + 233));
    const differences = graphs.map((graph) => difference(prepared, graph)).filter((found) => found !== null);
    expect(differences).toEqual([]);
  });

  it('the same bits on the synthesis grid of the demo (65,537 bins), and after another grid came between', () => {
    const guitar = sample('two-humbucker.json');
    const graphs = coupledGraphs(guitar).slice(0, 3);
    const long = prepareCircuit(guitar, grid(2 ** 16 + 1));
    const short = prepareCircuit(guitar, grid(2 * BLOCK_BINS + 1));
    expect(difference(long, graphs[0] as CircuitGraph)).toBeNull();
    expect(difference(short, graphs[1] as CircuitGraph)).toBeNull();
    expect(difference(long, graphs[2] as CircuitGraph)).toBeNull();
  });

  it('the same bits for a circuit retuned with another coupling (it keeps the coils\' arrays, so what is kept per group must not be reused)', () => {
    const guitar = sample('two-humbucker.json');
    const graphs = coupledGraphs(guitar).slice(0, 2);
    const prepared = prepareCircuit(guitar, grid(2 * BLOCK_BINS + 1));
    expect(difference(prepared, graphs[0] as CircuitGraph)).toBeNull();
    const looser: Guitar = { ...guitar, pickups: guitar.pickups.map((pickup) => ({ ...pickup, coupling: pickup.coupling / 2 })) };
    const retuned = retuneCircuit(prepared, looser);
    expect(retuned.coilImpedance).toBe(prepared.coilImpedance);
    for (const graph of graphs) expect(difference(retuned, graph)).toBeNull();
  });

  it('leaves one-block grids and grids past its limit to JavaScript, with the same numbers', () => {
    const guitar = sample('humbucker-two-single-coil.json');
    const graph = coupledGraphs(guitar)[0] as CircuitGraph;
    const taken = 2 * BLOCK_BINS + 1;
    expect(difference(prepareCircuit(guitar, grid(taken)), graph)).toBeNull();
    expect(nodalKernelGridBins()).toBe(taken);
    for (const bins of [BLOCK_BINS, NODAL_KERNEL_MAX_BINS + 1]) {
      expect(difference(prepareCircuit(guitar, grid(bins)), graph)).toBeNull();
      // The kernel's memory is still laid out for the grid before: it did not take this one.
      expect(nodalKernelGridBins()).toBe(taken);
    }
  });

  it('refuses a singular nodal matrix as the JavaScript does', () => {
    const guitar = sample('humbucker-two-single-coil.json');
    const graph = coupledGraphs(guitar)[0] as CircuitGraph;
    const prepared = prepareCircuit(guitar, grid(2 * BLOCK_BINS + 1));
    // A coil of zero impedance (no coil the file can describe): 1/Z is not a number, nor is any pivot it reaches.
    for (const placed of graph.coils) (prepared.coilImpedance[placed.coil] as Float64Array).fill(0);
    expect(() => solve(prepared, graph, 'javascript')).toThrow(/singular nodal matrix/);
    expect(() => solve(prepared, graph, 'webassembly')).toThrow(/singular nodal matrix/);
  });
});
