/**
 * Connection lists: the same circuit written as joints solves exactly as the
 * series–parallel engine solves the same wiring in +, // and ~ notation
 * (two formulations of one circuit), and bad lists are refused with the path.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { parseGuitarText } from '../guitar/index.js';
import { leaf, parallel, series } from '../wiring/index.js';
import { analysisFrequencies, parseConnections, prepareCircuit, solveNodalTransfers, solveTransfers } from './index.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');
const guitar = parseGuitarText(readFileSync(join(SAMPLES, 'three-single-coil.json'), 'utf8'));
const prepared = prepareCircuit(guitar, analysisFrequencies(50));

function worst(a: readonly Float64Array[], b: readonly Float64Array[]): number {
  let scale = 0;
  let error = 0;
  a.forEach((array, c) =>
    array.forEach((value, i) => {
      scale = Math.max(scale, Math.abs(value));
      error = Math.max(error, Math.abs(value - (b[c]?.[i] as number)));
    }),
  );
  return error / scale;
}

describe('parseConnections', () => {
  it('(neck // bridge) + mid written as joints solves as the notation does (cw/north neck and bridge, ccw/south mid: finish leads towards hot = in phase)', () => {
    const graph = parseConnections(guitar, 'neck.finish = hot, neck.start = mid.finish = bridge.start, mid.start = ground, bridge.finish = hot');
    expect(graph.nodeCount).toBe(3);
    const nodal = solveNodalTransfers(prepared, graph);
    expect(worst(solveTransfers(prepared, series(parallel(leaf(0), leaf(2)), leaf(1))), nodal)).toBeLessThan(1e-12);
  });

  it('swapping a coil\'s leads puts it out of phase; joints that share a terminal merge; unwritten leads float', () => {
    const graph = parseConnections(guitar, 'neck.start = hot, neck.finish = mid.finish, mid.finish = bridge.start, mid.start = ground');
    // bridge.start touches the joint, bridge.finish floats: only neck (reversed) + mid remain.
    expect(graph.coils.find((placed) => placed.coil === 2)?.finish).toBeNull();
    expect(worst(solveTransfers(prepared, series(leaf(0, true), leaf(1))), solveNodalTransfers(prepared, graph))).toBeLessThan(1e-12);
  });

  it('hot joined to ground silences everything', () => {
    const graph = parseConnections(guitar, 'hot = ground, neck.start = ground, neck.finish = mid.start');
    expect(graph.hot).toBe(graph.ground);
    expect(solveNodalTransfers(prepared, graph).every((array) => array.every((value) => value === 0))).toBe(true);
  });

  it.each([
    ['neck.end = hot', /expected hot, ground or a coil lead/u],
    ['fret.start = hot', /coils: neck, mid, bridge/u],
    ['neck.start hot', /two or more terminals joined by "="/u],
    ['neck.start = hot,, mid.start = ground', /a joint between each pair of commas/u],
    ['', /joints like/u],
  ])('refuses %j', (text, message) => {
    expect(() => parseConnections(guitar, text, '--connect')).toThrow(InputError);
    expect(() => parseConnections(guitar, text, '--connect')).toThrow(message);
    expect(() => parseConnections(guitar, text, '--connect')).toThrow(/^--connect: expected/u);
  });

  it('refuses a coil inside a two-lead pickup', () => {
    const twoLead = parseGuitarText(readFileSync(join(SAMPLES, 'two-lead-humbucker.json'), 'utf8'));
    expect(() => parseConnections(twoLead, 'bridge_screw.start = hot, bridge_screw.finish = ground')).toThrow(/inside a two-lead pickup/u);
  });
});
