/**
 * Coupled coils against closed forms. Two coils with mutual inductance M
 * (textbook results for coupled inductors, e.g. Alexander & Sadiku,
 * Fundamentals of Electric Circuits, ch. 13):
 *   series aiding        L = L1 + L2 + 2M
 *   series opposing      L = L1 + L2 − 2M
 *   parallel aiding      L = (L1·L2 − M²)/(L1 + L2 − 2M)
 *   parallel opposing    L = (L1·L2 − M²)/(L1 + L2 + 2M)
 * read from the coils' own impedance between hot and ground as Im(Z)/ω at
 * 100 Hz, with 1 pF self-capacitance and 1 Ω resistance so that C and R
 * shift the reading by under 1e-6 of L. Also: a shorted coil coupled to a
 * working one (the shorted-turn closed form), the two-lead humbucker, and
 * wirings that share transfers up to signs (phase-class.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar, parseGuitarText } from '../guitar/index.js';
import { enumerateWirings, leaf, parallel, series, shapeKey } from '../wiring/index.js';
import {
  type CircuitGraph,
  analysisFrequencies,
  coilCouplings,
  graphOfNetwork,
  mutualInductanceH,
  phaseClassKey,
  phaseClassNetwork,
  phaseClassSigns,
  prepareCircuit,
  renderBuildSheet,
  solveCoilsImpedance,
  solveNodalTransfers,
  solveTransfers,
} from './index.js';

const PROBE_HZ = 100;
/** Im(Z)/ω agrees with the closed form within this fraction (C and R effects are below 1e-6). */
const INDUCTANCE_TOLERANCE = 1e-5;
const L1 = 2.3;
const L2 = 2.1;

function pair(coupling: number, secondWinding: 'cw' | 'ccw', resistance = '1', capacitance = '1p'): Guitar {
  return parseGuitar({
    name: 'coupled pair check (invented values)',
    coils: [
      { id: 'screw', pickup: 'hb', position: '50mm', resistance, inductance: L1, capacitance, winding: 'cw', magnet: 'south', eddyShare: 0 },
      { id: 'slug', pickup: 'hb', position: '32mm', resistance, inductance: L2, capacitance, winding: secondWinding, magnet: 'north', eddyShare: 0 },
    ],
    pickups: { hb: { coupling } },
  });
}

function inductanceOf(guitar: Guitar, graph: CircuitGraph): number {
  const z = solveCoilsImpedance(prepareCircuit(guitar, Float64Array.of(PROBE_HZ)), graph);
  return (z[1] as number) / (2 * Math.PI * PROBE_HZ);
}

const expectClose = (actual: number, expected: number): void => {
  expect(Math.abs(actual / expected - 1)).toBeLessThan(INDUCTANCE_TOLERANCE);
};

describe('mutual inductance against the closed forms L1 + L2 ± 2M', () => {
  const k = 0.3;
  const m = k * Math.sqrt(L1 * L2);

  it('M = k·√(L1·L2), positive for coils wound in opposite senses, negative for the same sense', () => {
    const [opposite] = coilCouplings(pair(k, 'ccw'));
    const [same] = coilCouplings(pair(k, 'cw'));
    expect(mutualInductanceH(pair(k, 'ccw'), opposite!)).toBeCloseTo(m, 12);
    expect(mutualInductanceH(pair(k, 'cw'), same!)).toBeCloseTo(-m, 12);
  });

  it('in phase in series (hum cancelling): the coils aid, L1 + L2 + 2M; one reversed: L1 + L2 − 2M', () => {
    const guitar = pair(k, 'ccw');
    expectClose(inductanceOf(guitar, graphOfNetwork(guitar, series(leaf(0), leaf(1)))), L1 + L2 + 2 * m);
    expectClose(inductanceOf(guitar, graphOfNetwork(guitar, series(leaf(0), leaf(1, true)))), L1 + L2 - 2 * m);
    // Same winding sense, magnets still opposite: in phase is still the hum-cancelling connection,
    // in which the loop links no uniform flux, so the coils' own fluxes close through each other: aiding.
    const same = pair(k, 'cw');
    expectClose(inductanceOf(same, graphOfNetwork(same, series(leaf(0), leaf(1)))), L1 + L2 + 2 * m);
    expectClose(inductanceOf(same, graphOfNetwork(same, series(leaf(0), leaf(1, true)))), L1 + L2 - 2 * m);
  });

  it('in parallel: (L1·L2 − M²)/(L1 + L2 ∓ 2M)', () => {
    const guitar = pair(k, 'ccw');
    expectClose(inductanceOf(guitar, graphOfNetwork(guitar, parallel(leaf(0), leaf(1)))), (L1 * L2 - m * m) / (L1 + L2 - 2 * m));
    expectClose(inductanceOf(guitar, graphOfNetwork(guitar, parallel(leaf(0), leaf(1, true)))), (L1 * L2 - m * m) / (L1 + L2 + 2 * m));
  });

  it('without coupling the same readings are L1 + L2 and L1·L2/(L1 + L2)', () => {
    const guitar = pair(0, 'ccw');
    expectClose(inductanceOf(guitar, graphOfNetwork(guitar, series(leaf(0), leaf(1)))), L1 + L2);
    expectClose(inductanceOf(guitar, graphOfNetwork(guitar, parallel(leaf(0), leaf(1)))), (L1 * L2) / (L1 + L2));
  });

  it('a shorted coil acts on its partner as a shorted turn: Z = Z1 + (ωM)²/Z2', () => {
    const guitar = pair(k, 'ccw', '3.9k', '1p');
    const graph: CircuitGraph = {
      nodeCount: 2,
      ground: 0,
      hot: 1,
      coils: [
        { coil: 0, start: 0, finish: 1 },
        { coil: 1, start: 0, finish: 0 },
      ],
    };
    const omega = 2 * Math.PI * PROBE_HZ;
    const z = solveCoilsImpedance(prepareCircuit(guitar, Float64Array.of(PROBE_HZ)), graph);
    // Z1 + (ωM)²/Z2 with Z = R + jωL (the 1 pF across coil 1 is negligible here; coil 2's is shorted)
    const r = 3.9e3;
    const z2n = r * r + (omega * L2) ** 2;
    const w2m2 = (omega * m) ** 2;
    const expectedRe = r + (w2m2 * r) / z2n;
    const expectedIm = omega * L1 - (w2m2 * omega * L2) / z2n;
    expect(Math.abs((z[0] as number) / expectedRe - 1)).toBeLessThan(INDUCTANCE_TOLERANCE);
    expect(Math.abs((z[1] as number) / expectedIm - 1)).toBeLessThan(INDUCTANCE_TOLERANCE);
  });

  it('three coils in one pickup (every pair coupled): in series, L = Σ L_i + 2·Σ M_ij·d_i·d_j', () => {
    const windings = ['cw', 'ccw', 'cw'] as const;
    const magnets = ['north', 'south', 'south'] as const;
    const inductances = [2.3, 2.1, 1.7];
    const triple = parseGuitar({
      name: 'three coupled coils (invented values)',
      coils: inductances.map((inductance, c) => ({
        id: `coil${c + 1}`, pickup: 'triple', position: `${40 + 15 * c}mm`, resistance: '1', inductance, capacitance: '1p', winding: windings[c], magnet: magnets[c], eddyShare: 0,
      })),
      pickups: { triple: { coupling: 0.2 } },
    });
    // d_i: the series current runs start→finish in coil i when its finish is towards hot, c_i = w_i·m_i (in phase).
    const sign = (c: number): number => (windings[c] === 'cw' ? 1 : -1) * (magnets[c] === 'north' ? 1 : -1);
    let expected = inductances.reduce((sum, value) => sum + value, 0);
    for (let a = 0; a < 3; a += 1) {
      for (let b = a + 1; b < 3; b += 1) {
        const mutual = -(windings[a] === windings[b] ? 1 : -1) * 0.2 * Math.sqrt((inductances[a] as number) * (inductances[b] as number));
        expected += 2 * mutual * sign(a) * sign(b);
      }
    }
    expectClose(inductanceOf(triple, graphOfNetwork(triple, series(leaf(0), leaf(1), leaf(2)))), expected);
  });

  it('an open-circuited partner changes nothing: one coil alone reads L1', () => {
    const guitar = pair(k, 'ccw');
    const graph: CircuitGraph = { nodeCount: 3, ground: 0, hot: 1, coils: [{ coil: 0, start: 0, finish: 1 }, { coil: 1, start: 0, finish: 2 }] };
    expectClose(inductanceOf(guitar, graph), L1);
  });
});

describe('a two-lead humbucker with coupling', () => {
  const raw = JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'two-lead-humbucker.json'), 'utf8')) as Record<string, unknown>;
  const guitar = parseGuitarText(JSON.stringify({ ...raw, pickups: { bridge: { leads: 2, coupling: 0.2 } } }), 'two-lead');
  const bridge = guitar.elements.findIndex((element) => element.kind === 'two-lead pickup');

  it('reads L1 + L2 + 2M across its two leads (its coils joined inside, in phase, hum cancelling)', () => {
    const tiny = parseGuitarText(
      JSON.stringify({
        ...raw,
        coils: (raw.coils as Array<Record<string, unknown>>).map((coil) => ({ ...coil, capacitance: '1p', resistance: '1', eddyShare: 0 })),
        pickups: { bridge: { leads: 2, coupling: 0.2 } },
      }),
      'two-lead',
    );
    const inside = tiny.elements[bridge]?.coilIndices ?? [];
    const [a, b] = inside.map((index) => tiny.coils[index]?.inductanceH as number) as [number, number];
    expectClose(inductanceOf(tiny, graphOfNetwork(tiny, leaf(bridge))), a + b + 2 * 0.2 * Math.sqrt(a * b));
  });

  it('solveTransfers takes the nodal path for it (exactly the nodal result) and agrees elsewhere', () => {
    const prepared = prepareCircuit(guitar, analysisFrequencies());
    for (const wiring of enumerateWirings(guitar.elements)) {
      const direct = solveTransfers(prepared, wiring.network);
      const nodal = solveNodalTransfers(prepared, graphOfNetwork(guitar, wiring.network));
      const exact = wiring.elements.includes(bridge);
      direct.forEach((transfer, c) =>
        transfer.forEach((value, i) => {
          const other = nodal[c]?.[i] as number;
          if (exact) expect(value).toBe(other);
          else expect(Math.abs(value - other)).toBeLessThanOrEqual(1e-12 * Math.abs(other));
        }),
      );
    }
  });

  it('coupling lowers the loaded resonance of the pickup (more inductance): the response peaks lower than with k = 0', () => {
    const uncoupled = parseGuitarText(JSON.stringify({ ...raw, pickups: { bridge: { leads: 2, coupling: 0 } } }), 'two-lead');
    const grid = analysisFrequencies(2000);
    const peakOf = (g: Guitar): number => {
      const t = solveTransfers(prepareCircuit(g, grid), leaf(bridge));
      let best = 0;
      let at = 0;
      for (let f = 0; f < grid.length; f += 1) {
        let re = 0;
        let im = 0;
        for (const transfer of t) {
          re += transfer[2 * f] as number;
          im += transfer[2 * f + 1] as number;
        }
        if (Math.hypot(re, im) > best) {
          best = Math.hypot(re, im);
          at = grid[f] as number;
        }
      }
      return at;
    };
    const coupledPeak = peakOf(guitar);
    const freePeak = peakOf(uncoupled);
    // f ∝ 1/√L at fixed capacitance: (L1 + L2)/(L1 + L2 + 2M) = 1/(1 + k) for equal coils, so the ratio is near √(1/1.2).
    expect(coupledPeak / freePeak).toBeLessThan(1);
    expect(coupledPeak / freePeak).toBeGreaterThan(Math.sqrt(1 / 1.2) * 0.97);
  });
});

describe('phase classes: coupled coils keep their relative phase', () => {
  const guitar = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'two-humbucker.json'), 'utf8'));
  const wirings = enumerateWirings(guitar.elements);
  const grid = analysisFrequencies(40);
  const prepared = prepareCircuit(guitar, grid);

  it('every wiring\'s transfers are s_i·T_i of its class representative', () => {
    const signs = new Float64Array(guitar.coils.length);
    let worst = 0;
    for (const wiring of wirings) {
      const direct = solveTransfers(prepared, wiring.network);
      const representative = solveTransfers(prepared, phaseClassNetwork(guitar, wiring.network));
      phaseClassSigns(guitar, wiring.network, signs);
      direct.forEach((transfer, c) => {
        const other = representative[c] as Float64Array;
        transfer.forEach((value, i) => {
          worst = Math.max(worst, Math.abs(value - (signs[c] as number) * (other[i] as number)));
        });
      });
    }
    expect(worst).toBeLessThan(1e-15);
  });

  it('there are more classes than shapes, and phase flips of a coupled pair do change the transfers', () => {
    const classes = new Set(wirings.map((wiring) => phaseClassKey(guitar, wiring.network)));
    const shapes = new Set(wirings.map((wiring) => shapeKey(wiring.network)));
    expect(classes.size).toBeGreaterThan(shapes.size);
    const inPhase = solveTransfers(prepared, series(leaf(0), leaf(1)));
    const reversed = solveTransfers(prepared, series(leaf(0), leaf(1, true)));
    // Without coupling reversed[1] would be exactly −inPhase[1].
    const differs = (inPhase[1] as Float64Array).some((value, i) => Math.abs(value + (reversed[1] as Float64Array)[i]!) > 1e-6 * Math.abs(value));
    expect(differs).toBe(true);
  });
});

describe('the build sheet\'s meter reading includes the coupling', () => {
  it('two coils of 2.2 H with k = 0.1: in phase (hum cancelling) 4.84 H = L1 + L2 + 2M, one reversed 3.96 H', () => {
    // Lossless coils, so the closed form holds exactly (the eddy branch lowers a real meter's reading slightly).
    const raw = JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'two-humbucker.json'), 'utf8')) as Record<string, unknown>;
    const coils = (raw.coils as Array<Record<string, unknown>>).map((coil) => ({ ...coil, eddyShare: 0 }));
    const guitar = parseGuitarText(JSON.stringify({ ...raw, coils }), 'two-humbucker');
    const sheet = (network: ReturnType<typeof series>): string =>
      renderBuildSheet(guitar, { network, expression: 'check', description: 'check' });
    // 2.2 + 2.2 ± 2·0.1·2.2 (the sample's neck coils, default coupling)
    expect(sheet(series(leaf(0), leaf(1)))).toMatch(/inductance meter \(series mode, 120 Hz\): about 4\.84 H/u);
    expect(sheet(series(leaf(0), leaf(1, true)))).toMatch(/inductance meter \(series mode, 120 Hz\): about 3\.96 H/u);
  });
});
