/**
 * The nodal solver and the graph netlists against an outside simulator:
 * ngspice (the `eecircuit-engine` WebAssembly build from the npm registry)
 * runs the netlist `renderGraphNetlist` writes for a bridge network of five
 * coils (Wheatstone-like: no series–parallel reduction exists) and for
 * circuits with floating leads; the output must match Σ_i T_i·E_i within
 * 0.01 dB and 0.1° at every frequency of the sweep, as the series–parallel
 * netlists do (spice-agreement.test.ts).
 */
import { Simulation } from 'eecircuit-engine';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar } from '../guitar/index.js';
import { runAcSweep } from '../../test/support/ngspice-sweep.js';
import { BRIDGE_GRAPH, FIVE_COILS } from '../../test/support/five-coil-bridge.js';
import {
  type CircuitGraph,
  type CircuitOverrides,
  type SourcePhasor,
  prepareCircuit,
  renderGraphNetlist,
  solveNodalTransfers,
} from './index.js';

const MAGNITUDE_TOLERANCE_DB = 0.01;
const PHASE_TOLERANCE_DEG = 0.1;
const MIN_POINTS = 60;
const DEG_PER_RAD = 180 / Math.PI;

let simulation: Simulation;

beforeAll(async () => {
  simulation = new Simulation();
  await simulation.start();
});

/** Largest deviation in dB and degrees between ngspice and Σ T_i·E_i over the sweep. */
async function compare(guitar: Guitar, graph: CircuitGraph, phasors: readonly SourcePhasor[], overrides: CircuitOverrides = {}): Promise<{ db: number; deg: number; points: number }> {
  const { frequencies, output } = await runAcSweep(simulation, renderGraphNetlist(guitar, graph, 'check', overrides, { sourcePhasors: phasors }));
  const transfers = solveNodalTransfers(prepareCircuit(guitar, frequencies, overrides), graph);
  let db = 0;
  let deg = 0;
  frequencies.forEach((_, k) => {
    let re = 0;
    let im = 0;
    transfers.forEach((transfer, c) => {
      const phasor = phasors[c] as SourcePhasor;
      const ar = phasor.magnitude * Math.cos(phasor.phaseDeg / DEG_PER_RAD);
      const ai = phasor.magnitude * Math.sin(phasor.phaseDeg / DEG_PER_RAD);
      const tr = transfer[2 * k] as number;
      const ti = transfer[2 * k + 1] as number;
      re += tr * ar - ti * ai;
      im += tr * ai + ti * ar;
    });
    const spice = output[k] ?? { real: Number.NaN, img: Number.NaN };
    db = Math.max(db, Math.abs(20 * Math.log10(Math.hypot(re, im) / Math.hypot(spice.real, spice.img))));
    deg = Math.max(deg, Math.abs(Math.atan2(im * spice.real - re * spice.img, re * spice.real + im * spice.img) * DEG_PER_RAD));
  });
  return { db: Number.isNaN(db) ? Infinity : db, deg: Number.isNaN(deg) ? Infinity : deg, points: frequencies.length };
}

/** The five coils with two coupled pairs: one side by side (k = 0.25), one stacked (k = −0.15). */
const COUPLED_FIVE: Guitar = parseGuitar({
  name: 'five-coil bridge check with coupling (invented values)',
  coils: [
    { id: 'neck', pickup: 'front', position: '160mm', resistance: '5.9k', inductance: '2.35H', capacitance: '110p', winding: 'cw', magnet: 'north' },
    { id: 'mid_neck', pickup: 'front', position: '160mm', resistance: '6.3k', inductance: '2.6H', capacitance: '118p', winding: 'ccw', magnet: 'south' },
    { id: 'mid', position: '100mm', resistance: '7.1k', inductance: '3.0H', capacitance: '130p', winding: 'cw', magnet: 'north' },
    { id: 'mid_bridge', pickup: 'rear', position: '50mm', resistance: '4.2k', inductance: '2.2H', capacitance: '145p', winding: 'ccw', magnet: 'north' },
    { id: 'bridge', pickup: 'rear', position: '32mm', resistance: '8.1k', inductance: '3.6H', capacitance: '150p', winding: 'cw', magnet: 'south' },
  ],
  pickups: { front: { coupling: -0.15 }, rear: { coupling: 0.25 } },
  controls: { volume: { pot: '500k', setting: 10, taper: 'audio' }, tone: { pot: '500k', capacitor: '22n', setting: 10 } },
  cable: { capacitance: '470p' },
  amp: { resistance: '1M', capacitance: '50p' },
});

/** A different string signal in every coil, so each transfer counts on its own. */
function genericPhasors(guitar: Guitar): SourcePhasor[] {
  return guitar.coils.map((_, c) => ({ magnitude: 1 + 0.37 * c, phaseDeg: -23 + 41 * c }));
}

describe('ngspice (eecircuit-engine) agrees with the nodal solver on a bridge network of five coils', () => {
  it.each<[string, CircuitOverrides]>([
    ['controls as in the file', {}],
    ['volume 6, tone 3', { volumeSetting: 6, toneSetting: 3 }],
  ])('%s: within 0.01 dB and 0.1°', async (_, overrides) => {
    const deviation = await compare(FIVE_COILS, BRIDGE_GRAPH, genericPhasors(FIVE_COILS), overrides);
    expect(deviation.points).toBeGreaterThanOrEqual(MIN_POINTS);
    expect(deviation.db).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
    expect(deviation.deg).toBeLessThan(PHASE_TOLERANCE_DEG);
  });

  it('with the bridge coil\'s finish lead floating (then it is two series pairs in parallel)', async () => {
    const graph: CircuitGraph = {
      ...BRIDGE_GRAPH,
      coils: BRIDGE_GRAPH.coils.map((placed) => (placed.coil === 3 ? { ...placed, finish: null } : placed)),
    };
    const deviation = await compare(FIVE_COILS, graph, genericPhasors(FIVE_COILS));
    expect(deviation.db).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
    expect(deviation.deg).toBeLessThan(PHASE_TOLERANCE_DEG);
  });
});

describe('ngspice (eecircuit-engine) agrees with the nodal solver on coupled coils (K lines)', () => {
  it('the bridge network with two coupled pairs: within 0.01 dB and 0.1°', async () => {
    const netlist = renderGraphNetlist(COUPLED_FIVE, BRIDGE_GRAPH, 'check');
    expect(netlist.match(/^K/gmu)).toHaveLength(2);
    const deviation = await compare(COUPLED_FIVE, BRIDGE_GRAPH, genericPhasors(COUPLED_FIVE), { volumeSetting: 7 });
    expect(deviation.db).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
    expect(deviation.deg).toBeLessThan(PHASE_TOLERANCE_DEG);
  });

  it('a coil shorted on itself acts on its coupled partner (a shorted turn)', async () => {
    // neck from hot to ground; mid_neck's leads both on ground; mid_bridge floating at one end.
    const graph: CircuitGraph = {
      nodeCount: 3,
      ground: 0,
      hot: 1,
      coils: [
        { coil: 0, start: 0, finish: 1 },
        { coil: 1, start: 0, finish: 0 },
        { coil: 3, start: 1, finish: null },
      ],
    };
    const deviation = await compare(COUPLED_FIVE, graph, genericPhasors(COUPLED_FIVE));
    expect(deviation.db).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
    expect(deviation.deg).toBeLessThan(PHASE_TOLERANCE_DEG);
    // and the short matters: without it the neck coil alone peaks higher.
    const alone = solveNodalTransfers(prepareCircuit(COUPLED_FIVE, Float64Array.of(3000)), { ...graph, coils: [graph.coils[0]!] });
    const shorted = solveNodalTransfers(prepareCircuit(COUPLED_FIVE, Float64Array.of(3000)), graph);
    expect(Math.abs(Math.hypot(alone[0]![0]!, alone[0]![1]!) - Math.hypot(shorted[0]![0]!, shorted[0]![1]!))).toBeGreaterThan(0.01);
  });
});
