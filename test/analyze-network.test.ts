/**
 * `analyze --network`: connection lists (bridge networks among them) as extra
 * rows, their figures from the nodal solver.
 *
 * - A connection list of a series–parallel wiring must give that wiring's
 *   figures: the same circuit solved by two independent formulations
 *   (Millman's theorem over the wiring tree, solve-transfers.ts, against
 *   modified nodal analysis, solve-nodal.ts), ≤ 1e-9 relative on peak and
 *   hum, on every wiring of two samples (one with a magnetically coupled
 *   humbucker), and on the audio figures of a few. The resonance and its
 *   −3 dB points are refined only until a step is below
 *   LOG_FREQUENCY_TOLERANCE (1e-7 in ln f, measure-resonance.ts): on a flat
 *   peak, responses equal to 1e-15 can stop the refinement at different
 *   points inside that tolerance, so resonance is held to it (and Q to the
 *   error two such crossings allow, 2·Q·tolerance), the rest to 1e-9.
 * - A bridge network of five coils, which no series–parallel expression
 *   writes, against an outside simulator: ngspice (the eecircuit-engine
 *   WebAssembly build from the npm registry) runs the netlist of the very
 *   connection list the command reads, once per coil; the response as the
 *   strings drive it, R(f) (driven-response.ts), composed from ngspice's
 *   transfers, must match ours within 0.01 dB at every sweep point, and its
 *   peak and −3 dB band (read from the dense sweep, test/support/dense-peak.ts)
 *   match `analyze`'s resonance within 0.1 % and Q within 1 %.
 * - Bad connection lists: exit 2, a message naming --network, nothing written.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Simulation } from 'eecircuit-engine';
import { beforeAll, describe, expect, it } from 'vitest';
import { measureCoilDrive, measureSpectralBasis } from '../src/analysis/index.js';
import {
  LOG_FREQUENCY_TOLERANCE,
  REFERENCE_FREQUENCY_HZ,
  type WiringCircuitMetrics,
  drivenPowerAt,
  graphOfNetwork,
  measureCircuitMetrics,
  measureGraphCircuitMetrics,
  parseConnections,
  prepareCircuit,
  renderGraphNetlist,
  sampleCoilDrive,
  solveGraphDrivenResponse,
} from '../src/circuit/index.js';
import { captureIo, main } from '../src/cli/index.js';
import { type Guitar, parseGuitarText } from '../src/guitar/index.js';
import { measureReferenceFigures, prepareReferenceFigures } from '../src/render/measure-wiring-audio.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { FIVE_COILS } from './support/five-coil-bridge.js';
import { readDensePeak } from './support/dense-peak.js';
import { runAcSweep } from './support/ngspice-sweep.js';
import { testFolder } from './support/temporary-folder.js';

const SAMPLES = join(import.meta.dirname, '..', 'samples');
const RELATIVE_TOLERANCE = 1e-9;
const RESPONSE_TOLERANCE_DB = 0.01;
const FREQUENCY_TOLERANCE = 1e-3;
const Q_TOLERANCE = 0.01;
const POINTS_PER_DECADE = 400;
/** The one-point sweep at 100 Hz: ngspice needs stop > start. */
const REFERENCE_SPAN = 1.001;

/**
 * The bridge network of the five coils, as a user writes it: neck from hot
 * to a, mid_neck from hot to b, mid from a to ground, bridge from b to
 * ground, mid_bridge across a–b.
 */
const BRIDGE_TEXT =
  'neck.finish = mid_neck.start = hot, neck.start = mid.finish = mid_bridge.start, mid_neck.finish = mid_bridge.finish = bridge.start, mid.start = bridge.finish = ground';

function sample(file: string): Guitar {
  return parseGuitarText(readFileSync(join(SAMPLES, file), 'utf8'), file);
}

function relative(a: number | null, b: number | null): number {
  if (a === null || b === null) return a === b ? 0 : Infinity;
  return a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));
}

/** What differs between the circuit figures beyond their tolerances ("" when nothing), and whether any differs beyond 1e-9. */
function compareMetrics(a: WiringCircuitMetrics, b: WiringCircuitMetrics): { problem: string; beyondExact: boolean } {
  const problems: string[] = [];
  const resonance = relative(a.resonanceHz, b.resonanceHz);
  const q = relative(a.resonanceQ, b.resonanceQ);
  if (!(resonance <= LOG_FREQUENCY_TOLERANCE)) problems.push(`resonance ${resonance}`);
  if (!(q <= 2 * (a.resonanceQ ?? 0) * LOG_FREQUENCY_TOLERANCE + RELATIVE_TOLERANCE)) problems.push(`Q ${q}`);
  for (const key of ['peakDb', 'humDb'] as const) {
    const error = relative(a[key], b[key]);
    if (!(error <= RELATIVE_TOLERANCE)) problems.push(`${key} ${error}`);
  }
  for (const key of ['resonanceHzReason', 'peakDbReason', 'resonanceQReason', 'humCategory'] as const) if (a[key] !== b[key]) problems.push(`${key} ${a[key]} / ${b[key]}`);
  return { problem: problems.join(', '), beyondExact: Math.max(resonance, q) > RELATIVE_TOLERANCE };
}

describe('a connection list of a series–parallel wiring gives that wiring\'s figures', () => {
  it.each([
    ['three-single-coil.json', {}],
    ['humbucker-two-single-coil.json', { volumeSetting: 5 }],
  ])('%s: peak and hum of every wiring within 1e-9, resonance and Q within the refinement tolerance', (file, overrides) => {
    const guitar = sample(file);
    const wirings = enumerateWirings(guitar.elements);
    const drive = measureCoilDrive(measureSpectralBasis(guitar));
    const ours = measureCircuitMetrics(guitar, wirings, overrides, { drive }).wirings;
    const graphs = measureGraphCircuitMetrics(guitar, wirings.map((wiring) => graphOfNetwork(guitar, wiring.network)), overrides, { drive }).wirings;
    const failures: string[] = [];
    let withQ = 0;
    let beyondExact = 0;
    wirings.forEach((wiring, index) => {
      const comparison = compareMetrics(ours[index] as WiringCircuitMetrics, graphs[index] as WiringCircuitMetrics);
      if (comparison.problem !== '') failures.push(`${wiring.id} ${wiring.expression}: ${comparison.problem}`);
      if (comparison.beyondExact) beyondExact += 1;
      if (ours[index]?.resonanceQ !== null) withQ += 1;
    });
    expect(failures).toEqual([]);
    expect(withQ).toBeGreaterThan(3);
    // the refinement's latitude is the exception, not the rule
    expect(beyondExact).toBeLessThanOrEqual(wirings.length / 100);
  });

  it('the audio figures (energy, loudness, centroid) of a few wirings within 1e-9', () => {
    const guitar = sample('three-single-coil.json');
    const wirings = enumerateWirings(guitar.elements).filter((_, index) => index % 9 === 0);
    const meter = prepareReferenceFigures(guitar, {});
    const expected = measureReferenceFigures(guitar, wirings, {}, undefined, meter);
    for (const wiring of wirings) {
      const want = expected.get(wiring.id);
      const got = meter.measureGraph(graphOfNetwork(guitar, wiring.network));
      expect(relative(got.energy, want?.energy ?? null)).toBeLessThanOrEqual(RELATIVE_TOLERANCE);
      expect(relative(got.loudnessLufs, want?.loudnessLufs ?? null)).toBeLessThanOrEqual(RELATIVE_TOLERANCE);
      expect(relative(got.centroidHz, want?.centroidHz ?? null)).toBeLessThanOrEqual(RELATIVE_TOLERANCE);
    }
  });
});

describe('a bridge network of five coils against ngspice (eecircuit-engine)', () => {
  let simulation: Simulation;
  beforeAll(async () => {
    simulation = new Simulation();
    await simulation.start();
  });

  /** Every coil's transfer of the graph from ngspice, one run per coil. */
  async function spiceTransfers(netlistOf: (phasors: { magnitude: number; phaseDeg: number }[], startHz: number, stopHz: number) => string, startHz: number, stopHz: number) {
    let frequenciesHz = new Float64Array(0);
    const transfers: Float64Array[] = [];
    for (let c = 0; c < FIVE_COILS.coils.length; c += 1) {
      const phasors = FIVE_COILS.coils.map((_, other) => ({ magnitude: other === c ? 1 : 0, phaseDeg: 0 }));
      const sweep = await runAcSweep(simulation, netlistOf(phasors, startHz, stopHz));
      frequenciesHz = sweep.frequencies;
      transfers.push(Float64Array.from(sweep.output.flatMap((value) => [value.real, value.img])));
    }
    return { frequenciesHz, transfers };
  }

  it('the response as the strings drive it within 0.01 dB; resonance within 0.1 %, Q within 1 %', async () => {
    const guitar = FIVE_COILS;
    const graph = parseConnections(guitar, BRIDGE_TEXT, '--network');
    const overrides = { volumeSetting: 7 };
    const netlistOf = (sourcePhasors: { magnitude: number; phaseDeg: number }[], startHz: number, stopHz: number, pointsPerDecade = POINTS_PER_DECADE): string =>
      renderGraphNetlist(guitar, graph, 'bridge', overrides, { sourcePhasors, startHz, stopHz, pointsPerDecade });
    const sweep = await spiceTransfers(netlistOf, 20, 20_000);
    const reference = await spiceTransfers((phasors, start, stop) => netlistOf(phasors, start, stop, 1), REFERENCE_FREQUENCY_HZ, REFERENCE_FREQUENCY_HZ * REFERENCE_SPAN);
    const drive = measureCoilDrive(measureSpectralBasis(guitar));
    // R(f) from ngspice's transfers (the netlist carries every sign: s_i = 1)
    const grid = sweep.frequenciesHz;
    const ones = new Float64Array(guitar.coils.length).fill(1);
    const sampled = sampleCoilDrive(drive, grid);
    const width = 2 * drive.pairCount;
    const theirs = Float64Array.from(grid, (_, k) =>
      Math.sqrt(drivenPowerAt(sweep.transfers, k, ones, sampled, k * width) / drivenPowerAt(reference.transfers, 0, ones, sampled, k * width)),
    );
    const ours = solveGraphDrivenResponse(prepareCircuit(guitar, grid, overrides), graph, drive).values;
    let worstDb = 0;
    grid.forEach((_, k) => {
      worstDb = Math.max(worstDb, Math.abs(20 * Math.log10((ours[k] as number) / (theirs[k] as number))));
    });
    expect(grid.length).toBeGreaterThan(1000);
    expect(worstDb).toBeLessThan(RESPONSE_TOLERANCE_DB);

    const peak = readDensePeak(grid, theirs);
    const metrics = measureGraphCircuitMetrics(guitar, [graph], overrides, { drive }).wirings[0] as WiringCircuitMetrics;
    expect(peak.peakHz).not.toBeNull();
    expect(peak.q).not.toBeNull();
    expect(Math.abs((metrics.resonanceHz as number) / (peak.peakHz as number) - 1)).toBeLessThan(FREQUENCY_TOLERANCE);
    expect(Math.abs((metrics.resonanceQ as number) / (peak.q as number) - 1)).toBeLessThan(Q_TOLERANCE);
  }, 60_000);
});

describe('coilbench analyze --network', () => {
  async function run(...argv: string[]) {
    const io = captureIo(SAMPLES);
    const status = await main(argv, io);
    return { status, out: io.out(), err: io.err() };
  }

  it('appends n1 after the wirings, with the figures of the wiring it wires (w4: neck + mid)', async () => {
    const { status, out, err } = await run('analyze', 'three-single-coil.json', '--json', '--network', 'neck.finish = hot, neck.start = mid.finish,mid.start=ground');
    expect(status).toBe(0);
    expect(err).toBe('');
    const document = JSON.parse(out) as { count: number; wirings: Array<Record<string, unknown>> };
    expect(document.count).toBe(48);
    const last = document.wirings[47] as Record<string, unknown>;
    const w4 = document.wirings.find((row) => row.id === 'w4') as Record<string, unknown>;
    expect(w4.expression).toBe('neck + mid');
    expect(last).toMatchObject({ id: 'n1', expression: 'neck.finish = hot, neck.start = mid.finish, mid.start = ground', coils: ['neck', 'mid'], topology: 'connection list', group: null });
    for (const key of ['resonanceHz', 'peakDb', 'resonanceQ', 'humDb', 'levelDb', 'loudnessLufs', 'centroidHz']) {
      expect(relative(last[key] as number | null, w4[key] as number | null), key).toBeLessThanOrEqual(RELATIVE_TOLERANCE);
    }
    expect(last.humCategory).toBe(w4.humCategory);
  });

  it.each([
    [['--network', 'neck.finish + mid.start'], /^coilbench: --network: expected two or more terminals joined by "=" in each joint, got "neck\.finish \+ mid\.start"\n$/u],
    [['--network', 'neck.finish = hot, neck.start = middle.finish'], /^coilbench: --network: expected hot, ground or a coil lead such as "neck\.start" \(coils: neck, mid, bridge\), got "middle\.finish"\n$/u],
    [['--network', 'neck.finish = hot, mid.start = ground'], /^coilbench: --network: expected connections that join hot to ground through coil windings/u],
    [['--network', 'neck.finish = hot, neck.start = ground', '--network', 'hot = ground, neck.start = neck.finish'], /^coilbench: --network \(2 of 2\): expected connections that join hot to ground/u],
  ])('refuses %j with exit 2, naming --network, writing nothing', async (options, message) => {
    const folder = testFolder('network');
    const csv = join(folder, 'table.csv');
    const io = captureIo(SAMPLES);
    const status = await main(['analyze', 'three-single-coil.json', '--no-audio', '--csv', csv, ...options], io);
    expect(status).toBe(2);
    expect(io.err()).toMatch(message);
    expect(io.out()).toBe('');
    expect(existsSync(csv)).toBe(false);
  });

  it('refuses --network on a guitar whose analysis streams (six elements)', async () => {
    const { status, err } = await run('analyze', 'three-humbucker.json', '--no-audio', '--network', 'neck_slug.finish = hot, neck_slug.start = ground');
    expect(status).toBe(2);
    expect(err).toMatch(/^coilbench: --network: expected a guitar of at most 9,997 wirings .*, got "[\d,]+ wirings"\n$/u);
  });
});
