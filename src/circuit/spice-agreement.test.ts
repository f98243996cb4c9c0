/**
 * The netlist and the solver checked together against an outside simulator:
 * every wiring's exported netlist is run through ngspice (the
 * `eecircuit-engine` WebAssembly build of ngspice from the npm registry) and
 * the output's magnitude and phase are compared with coilbench's
 * Σ_i T_i(f)·E_i at the 61 log-spaced frequencies of the sweep, 20 Hz–20 kHz:
 * within 0.01 dB and 0.1°.
 *
 * Where the output cancels exactly (two identical coils out of phase with
 * equal string signals: the sample's neck and middle coils), dB and phase are
 * meaningless; there both outputs must be below 1e-9 of the uncancelled sum
 * Σ_i |T_i·E_i|.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Simulation } from 'eecircuit-engine';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import { enumerateWirings, type Wiring } from '../wiring/index.js';
import { type SourcePhasor, prepareCircuit, renderNetlist, solveTransfers } from './index.js';
import { runAcSweep } from '../../test/support/ngspice-sweep.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');
const MAGNITUDE_TOLERANCE_DB = 0.01;
const PHASE_TOLERANCE_DEG = 0.1;
const MIN_POINTS = 60;
const DEG_PER_RAD = 180 / Math.PI;
/** Below this fraction of Σ|T_i·E_i| an output counts as cancelled. */
const CANCELLED_FRACTION = 1e-9;

function loadSample(file: string): Guitar {
  return parseGuitarText(readFileSync(join(SAMPLES, file), 'utf8'), file);
}

interface Deviation {
  readonly db: number;
  readonly deg: number;
  readonly points: number;
  /** Frequencies where both outputs cancel (not compared in dB). */
  readonly cancelled: number;
}

let simulation: Simulation;

beforeAll(async () => {
  simulation = new Simulation();
  await simulation.start();
});

/** Largest deviation between ngspice and coilbench over the sweep of one wiring. */
async function compare(guitar: Guitar, wiring: Wiring, phasors: readonly SourcePhasor[] | null): Promise<Deviation> {
  const { frequencies, output } = await runAcSweep(simulation, renderNetlist(guitar, wiring, undefined, phasors ? { sourcePhasors: phasors } : {}));
  const transfers = solveTransfers(prepareCircuit(guitar, frequencies), wiring.network);
  let db = 0;
  let deg = 0;
  let cancelled = 0;
  frequencies.forEach((_, k) => {
    let re = 0;
    let im = 0;
    let scale = 0;
    transfers.forEach((transfer, c) => {
      const phasor = phasors?.[c] ?? { magnitude: 1, phaseDeg: 0 };
      const ar = phasor.magnitude * Math.cos(phasor.phaseDeg / DEG_PER_RAD);
      const ai = phasor.magnitude * Math.sin(phasor.phaseDeg / DEG_PER_RAD);
      const tr = transfer[2 * k] as number;
      const ti = transfer[2 * k + 1] as number;
      re += tr * ar - ti * ai;
      im += tr * ai + ti * ar;
      scale += Math.hypot(tr, ti) * phasor.magnitude;
    });
    const spice = output[k] ?? { real: Number.NaN, img: Number.NaN };
    const ours = Math.hypot(re, im);
    const theirs = Math.hypot(spice.real, spice.img);
    if (ours < CANCELLED_FRACTION * scale) {
      cancelled += 1;
      if (!(theirs < CANCELLED_FRACTION * scale)) db = Infinity;
      return;
    }
    db = Math.max(db, Math.abs(20 * Math.log10(ours / theirs)));
    // phase difference: arg(ours · conj(theirs)), wrapped to ±180°
    const dr = re * spice.real + im * spice.img;
    const di = im * spice.real - re * spice.img;
    deg = Math.max(deg, Math.abs(Math.atan2(di, dr) * DEG_PER_RAD));
  });
  return { db: Number.isNaN(db) ? Infinity : db, deg: Number.isNaN(deg) ? Infinity : deg, points: frequencies.length, cancelled };
}

/** Distinct, generic string signals per coil, so each coil's transfer counts on its own (no symmetric cancellation). */
function genericPhasors(guitar: Guitar): SourcePhasor[] {
  return guitar.coils.map((_, c) => ({ magnitude: 1 + 0.37 * c, phaseDeg: -23 + 41 * c }));
}

// The humbucker's coils are coupled (the default coupling), so those netlists carry K lines and
// the solver takes its nodal path for wirings holding both coils.
describe.each([
  ['three-single-coil.json', 47],
  ['humbucker-two-single-coil.json', 572],
  ['two-lead-humbucker.json', 6],
])('ngspice (eecircuit-engine) agrees with the solver for every wiring of %s', (file, count) => {
  const guitar = loadSample(file);
  const wirings = enumerateWirings(guitar.elements);

  it(`has ${count} wirings`, () => {
    expect(wirings).toHaveLength(count);
  });

  it('exported netlists: within 0.01 dB and 0.1° at 60+ frequencies', async () => {
    const failures: string[] = [];
    let worst = { db: 0, deg: 0 };
    let cancelledWirings = 0;
    for (const wiring of wirings) {
      const deviation = await compare(guitar, wiring, null);
      expect(deviation.points).toBeGreaterThanOrEqual(MIN_POINTS);
      if (deviation.db > MAGNITUDE_TOLERANCE_DB || deviation.deg > PHASE_TOLERANCE_DEG) {
        failures.push(`${wiring.id} ${wiring.expression}: ${deviation.db.toExponential(2)} dB, ${deviation.deg.toExponential(2)}°`);
      }
      worst = { db: Math.max(worst.db, deviation.db), deg: Math.max(worst.deg, deviation.deg) };
      if (deviation.cancelled > 0) cancelledWirings += 1;
    }
    expect(failures).toEqual([]);
    expect(worst.db).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
    // Only the sample's two identical coils out of phase cancel (series and parallel), and only there.
    expect(cancelledWirings).toBe(file === 'humbucker-two-single-coil.json' ? 2 : 0);
    if (file !== 'three-single-coil.json') expect(wirings.some((wiring) => renderNetlist(guitar, wiring).includes('\nK'))).toBe(true);
  });

  it('with a different string signal in every coil: within 0.01 dB and 0.1°', async () => {
    const phasors = genericPhasors(guitar);
    const failures: string[] = [];
    for (const wiring of wirings) {
      const deviation = await compare(guitar, wiring, phasors);
      expect(deviation.cancelled).toBe(0);
      if (deviation.db > MAGNITUDE_TOLERANCE_DB || deviation.deg > PHASE_TOLERANCE_DEG) {
        failures.push(`${wiring.id} ${wiring.expression}: ${deviation.db} dB, ${deviation.deg}°`);
      }
    }
    expect(failures).toEqual([]);
  });
});

describe('ngspice (eecircuit-engine) with every part of the load in play', () => {
  // Volume and tone part-way, a series treble bleed, then a parallel one: every branch of the load model.
  const base = JSON.parse(readFileSync(join(SAMPLES, 'three-single-coil.json'), 'utf8')) as Record<string, unknown>;
  const variants: Array<[string, Record<string, unknown>]> = [
    ['volume 6, tone 3, series bleed', { volume: { pot: '250k', setting: 6, taper: 'audio' }, tone: { pot: '250k', capacitor: '22n', setting: 3, taper: 'linear' }, trebleBleed: { capacitor: '1n', resistor: '150k', arrangement: 'series' } }],
    ['volume 3 linear, tone 0, parallel bleed', { volume: { pot: '500k', setting: 3, taper: 'linear' }, tone: { pot: '500k', capacitor: '47n', setting: 0 }, trebleBleed: { capacitor: '470p', resistor: '220k', arrangement: 'parallel' } }],
    ['volume 8, no tone, bleed capacitor only', { volume: { pot: '250k', setting: 8 }, tone: null, trebleBleed: { capacitor: '1n' } }],
  ];
  it.each(variants)('%s', async (_, controls) => {
    const guitar = parseGuitarText(JSON.stringify({ ...base, controls }), 'variant');
    const phasors = genericPhasors(guitar);
    for (const wiring of enumerateWirings(guitar.elements)) {
      const deviation = await compare(guitar, wiring, phasors);
      expect(deviation.db, wiring.expression).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
      expect(deviation.deg, wiring.expression).toBeLessThan(PHASE_TOLERANCE_DEG);
    }
  });
});

describe('ngspice (eecircuit-engine) with every loss element of the coil model (docs/physics.md §1.6)', () => {
  // Invented losses: a parallel loss resistance on every coil, different eddy branches, one coil without any.
  const base = JSON.parse(readFileSync(join(SAMPLES, 'three-single-coil.json'), 'utf8')) as { coils: Array<Record<string, unknown>> };
  const losses: Array<Record<string, unknown>> = [
    { lossResistance: '450k', eddyShare: 0.3, eddyCorner: '4k' },
    { lossResistance: '1.2M', eddyShare: 0 },
    { lossResistance: '700k', eddyShare: 0.6, eddyCorner: '900' },
  ];
  it('every wiring within 0.01 dB and 0.1°, with a different string signal in every coil', async () => {
    const guitar = parseGuitarText(JSON.stringify({ ...base, coils: base.coils.map((coil, index) => ({ ...coil, ...losses[index] })) }), 'lossy variant');
    expect(renderNetlist(guitar, enumerateWirings(guitar.elements)[0] as Wiring)).toMatch(/^Rneck__loss /mu);
    const phasors = genericPhasors(guitar);
    for (const wiring of enumerateWirings(guitar.elements)) {
      const deviation = await compare(guitar, wiring, phasors);
      expect(deviation.db, wiring.expression).toBeLessThan(MAGNITUDE_TOLERANCE_DB);
      expect(deviation.deg, wiring.expression).toBeLessThan(PHASE_TOLERANCE_DEG);
    }
  });
});
