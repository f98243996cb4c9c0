/**
 * The nodal solver against the series–parallel engine (two independent
 * formulations of the same circuit: Millman's theorem over the wiring tree
 * against modified nodal analysis of the lead-by-lead layout) on every
 * wiring of the samples, and its handling of floating and isolated parts.
 * The outside check (ngspice on a bridge network) is in
 * nodal-spice-agreement.test.ts.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import { enumerateWirings, leaf, parallel, series } from '../wiring/index.js';
import {
  type CircuitGraph,
  type CircuitOverrides,
  analysisFrequencies,
  graphOfNetwork,
  prepareCircuit,
  solveNodalTransfers,
  solveTransfers,
} from './index.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');
/** Agreement asked of the two engines: 1e-9 of the largest transfer at that frequency. */
const RELATIVE_TOLERANCE = 1e-9;

/** A sample with every pickup's coupling set to `coupling` (0: the series–parallel engine's model). */
function loadSample(file: string, coupling = 0): Guitar {
  const raw = JSON.parse(readFileSync(join(SAMPLES, file), 'utf8')) as { coils: Array<{ pickup?: string }>; pickups?: Record<string, object> };
  const pickups: Record<string, object> = { ...(raw.pickups ?? {}) };
  for (const coil of raw.coils) if (coil.pickup !== undefined) pickups[coil.pickup] = { ...(pickups[coil.pickup] ?? {}), coupling };
  return parseGuitarText(JSON.stringify({ ...raw, pickups }), file);
}

/** Largest |a − b| / max_i |a_i| over coils and frequencies. */
function worstRelative(a: readonly Float64Array[], b: readonly Float64Array[], points: number): number {
  let worst = 0;
  for (let f = 0; f < points; f += 1) {
    let scale = 0;
    for (const array of a) scale = Math.max(scale, Math.hypot(array[2 * f] as number, array[2 * f + 1] as number));
    if (scale === 0) {
      for (const array of b) if (array[2 * f] !== 0 || array[2 * f + 1] !== 0) return Infinity;
      continue;
    }
    a.forEach((array, c) => {
      const other = b[c] as Float64Array;
      const error = Math.hypot((array[2 * f] as number) - (other[2 * f] as number), (array[2 * f + 1] as number) - (other[2 * f + 1] as number));
      worst = Math.max(worst, error / scale);
    });
  }
  return worst;
}

/** The analysis grid with DC in front. */
const GRID = Float64Array.from([0, ...analysisFrequencies()]);

const LOADS: ReadonlyArray<[string, CircuitOverrides]> = [
  ['as in the file', {}],
  ['volume 4, tone 2', { volumeSetting: 4, toneSetting: 2 }],
  ['volume 7, tone 0, 2 nF cable', { volumeSetting: 7, toneSetting: 0, cableCapacitanceF: 2e-9 }],
];

describe.each([
  ['two-humbucker.json', 572],
  ['three-single-coil.json', 47],
  ['humbucker-two-single-coil.json', 572],
  ['two-lead-humbucker.json', 6],
])('nodal analysis agrees with the series–parallel engine on every wiring of %s', (file, count) => {
  const guitar = loadSample(file);
  const wirings = enumerateWirings(guitar.elements);
  it.each(LOADS)(`all ${count} wirings, load %s: within 1e-9`, (_, overrides) => {
    expect(wirings).toHaveLength(count);
    const prepared = prepareCircuit(guitar, GRID, overrides);
    const nodal = guitar.coils.map(() => new Float64Array(2 * GRID.length));
    let worst = 0;
    for (const wiring of wirings) {
      const series = solveTransfers(prepared, wiring.network);
      solveNodalTransfers(prepared, graphOfNetwork(guitar, wiring.network), nodal);
      worst = Math.max(worst, worstRelative(series, nodal, GRID.length));
    }
    expect(worst).toBeLessThan(RELATIVE_TOLERANCE);
  });
});

describe('nodal analysis: floating and isolated parts', () => {
  const guitar = loadSample('three-single-coil.json');
  const prepared = prepareCircuit(guitar, GRID);
  const points = GRID.length;

  it('a coil with one lead floating contributes nothing and changes nothing', () => {
    // neck alone from hot to ground; mid's start on hot, its finish floating; bridge's leads on a node of their own and ground.
    const graph: CircuitGraph = {
      nodeCount: 3,
      ground: 0,
      hot: 1,
      coils: [
        { coil: 0, start: 0, finish: 1 },
        { coil: 1, start: 1, finish: null },
        { coil: 2, start: 2, finish: null },
      ],
    };
    const nodal = solveNodalTransfers(prepared, graph);
    const alone = solveTransfers(prepared, leaf(0));
    expect(worstRelative(alone, nodal, points)).toBeLessThan(RELATIVE_TOLERANCE);
    expect(nodal[1]?.every((value) => value === 0)).toBe(true);
    expect(nodal[2]?.every((value) => value === 0)).toBe(true);
  });

  it('a loop of coils with no path to ground contributes nothing (no coupling)', () => {
    // mid and bridge joined end to end in a closed loop on nodes 2 and 3, away from hot and ground.
    const graph: CircuitGraph = {
      nodeCount: 4,
      ground: 0,
      hot: 1,
      coils: [
        { coil: 0, start: 0, finish: 1 },
        { coil: 1, start: 2, finish: 3 },
        { coil: 2, start: 3, finish: 2 },
      ],
    };
    const nodal = solveNodalTransfers(prepared, graph);
    expect(worstRelative(solveTransfers(prepared, leaf(0)), nodal, points)).toBeLessThan(RELATIVE_TOLERANCE);
    expect(nodal[1]?.every((value) => value === 0)).toBe(true);
  });

  it('hot on ground silences everything; so does the volume at 0', () => {
    const shorted = solveNodalTransfers(prepared, { nodeCount: 2, ground: 0, hot: 0, coils: [{ coil: 0, start: 0, finish: 1 }] });
    expect(shorted.every((array) => array.every((value) => value === 0))).toBe(true);
    const silent = solveNodalTransfers(prepareCircuit(guitar, GRID, { volumeSetting: 0 }), graphOfNetwork(guitar, leaf(0)));
    expect(silent.every((array) => array.every((value) => value === 0))).toBe(true);
  });

  it('renumbering the nodes changes nothing; swapping a coil\'s leads inverts its transfer', () => {
    const network = series(parallel(leaf(0), leaf(1, true)), leaf(2));
    const graph = graphOfNetwork(guitar, network);
    const order = [2, 0, 1];
    const renumbered: CircuitGraph = {
      nodeCount: graph.nodeCount,
      ground: order[graph.ground] as number,
      hot: order[graph.hot] as number,
      coils: [...graph.coils].reverse().map((placed) => ({
        coil: placed.coil,
        start: order[placed.start as number] as number,
        finish: order[placed.finish as number] as number,
      })),
    };
    expect(graph.nodeCount).toBe(3);
    const a = solveNodalTransfers(prepared, graph);
    const b = solveNodalTransfers(prepared, renumbered);
    expect(worstRelative(a, b, points)).toBeLessThan(RELATIVE_TOLERANCE);
    const swapped: CircuitGraph = {
      ...graph,
      coils: graph.coils.map((placed) => (placed.coil === 2 ? { coil: 2, start: placed.finish, finish: placed.start } : placed)),
    };
    const c = solveNodalTransfers(prepared, swapped);
    const flipped = solveTransfers(prepared, series(parallel(leaf(0), leaf(1, true)), leaf(2, true)));
    expect(worstRelative(flipped, c, points)).toBeLessThan(RELATIVE_TOLERANCE);
  });

  it('rejects a graph that names a missing coil, a coil twice or a node out of range', () => {
    expect(() => solveNodalTransfers(prepared, { nodeCount: 2, ground: 0, hot: 1, coils: [{ coil: 7, start: 0, finish: 1 }] })).toThrow(/no coil 7/u);
    expect(() =>
      solveNodalTransfers(prepared, {
        nodeCount: 2,
        ground: 0,
        hot: 1,
        coils: [
          { coil: 0, start: 0, finish: 1 },
          { coil: 0, start: 1, finish: 0 },
        ],
      }),
    ).toThrow(/placed twice/u);
    expect(() => solveNodalTransfers(prepared, { nodeCount: 2, ground: 0, hot: 1, coils: [{ coil: 0, start: 0, finish: 5 }] })).toThrow(/node from 0 to 1/u);
  });
});
