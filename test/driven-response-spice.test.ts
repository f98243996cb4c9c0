/**
 * Resonance, peak and Q as the strings drive the coils, checked against
 * ngspice (the `eecircuit-engine` WebAssembly build from the npm registry).
 *
 * For each wiring ngspice runs coilbench's own netlist once per coil, that
 * coil's EMF source at 1∠0° and the others at 0, over a dense sweep (400
 * points per decade, then 2000 points over the peak's −3 dB band) and at
 * 100 Hz: that gives every T_i(f) from an outside simulator. By superposition the output with all coils driven at once by
 * the strings is Σ_i T_i·E_i, and its power per unit mean coil power for the
 * reference phrase is Σ_ij T_i·D_ij·conj(T_j) with D the same cross-spectra
 * coilbench uses (src/analysis/measure-coil-drive.ts): the coherent response
 * R(f) of src/circuit/driven-response.ts, composed from ngspice's transfers.
 * Its highest interior maximum (vertex of a parabola through the densest
 * three points) and −3 dB points (linear in ln f between sweep points) are
 * compared with `analyze`'s figures: no wiring may show a peak the coherent
 * response lacks, or miss one it has; frequencies within 0.1 %, Q within 1 %.
 *
 * Both readings count only maxima with MIN_PEAK_PROMINENCE_DB of
 * prominence (measure-resonance.ts). Where a peak's top is flatter than the
 * drive's interpolation ripple, its frequency is defined no better than that
 * top: a frequency outside 0.1 % still agrees when ngspice's R there lies
 * within PEAK_FLATNESS_DB of ngspice's peak.
 *
 * The four-coil sample at volume 5 (a humbucker's coils magnetically
 * coupled), where a peak search refining only the best grid point disagreed
 * with ngspice on 22 of 572 wirings, and where wirings holding both coupled
 * coils have nearly flat responses. By default every twentieth network shape
 * is run, and every second of its wirings that hold both coupled coils;
 * COILBENCH_SPICE_ALL=1 runs all of them.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Simulation } from 'eecircuit-engine';
import { beforeAll, describe, expect, it } from 'vitest';
import { measureCoilDrive, measureSpectralBasis } from '../src/analysis/index.js';
import {
  type CoilDrive,
  MIN_PEAK_PROMINENCE_DB,
  REFERENCE_FREQUENCY_HZ,
  drivenPowerAt,
  measureCircuitMetrics,
  phaseClassKey,
  renderNetlist,
  sampleCoilDrive,
} from '../src/circuit/index.js';
import { type Guitar, parseGuitarText } from '../src/guitar/index.js';
import { readDensePeak } from './support/dense-peak.js';
import { type Wiring, coilPhases, enumerateWirings, shapeKey } from '../src/wiring/index.js';
import { runAcSweep } from './support/ngspice-sweep.js';

const SAMPLES = join(import.meta.dirname, '..', 'samples');
const POINTS_PER_DECADE = 400;
/** Points of the second sweep over the peak's −3 dB band, so linear interpolation of the crossings errs far below 1 % of the bandwidth. */
const FINE_POINTS = 2000;
const FREQUENCY_TOLERANCE = 1e-3;
const Q_TOLERANCE = 0.01;
const SHAPE_STRIDE = process.env.COILBENCH_SPICE_ALL === '1' ? 1 : 20;
/** Of the sampled wirings holding both coils of a coupled pair (solved by nodal analysis), every second by default. */
const COUPLED_STRIDE = process.env.COILBENCH_SPICE_ALL === '1' ? 1 : 2;
/** A peak's top within this of its maximum counts as the same peak (ten times smaller than MIN_PEAK_PROMINENCE_DB). */
const PEAK_FLATNESS_DB = MIN_PEAK_PROMINENCE_DB / 10;
const VOLUME_SETTING = 5;
/** The one-point sweep at 100 Hz: ngspice needs stop > start. */
const REFERENCE_SPAN = 1.001;

let simulation: Simulation;
beforeAll(async () => {
  simulation = new Simulation();
  await simulation.start();
});

interface Sweep {
  readonly frequenciesHz: Float64Array;
  /** One interleaved complex transfer per coil. */
  readonly transfers: Float64Array[];
}

/** Every coil's transfer of `wiring` from ngspice, one run per coil. */
async function spiceTransfers(guitar: Guitar, wiring: Wiring, startHz: number, stopHz: number, pointsPerDecade: number): Promise<Sweep> {
  let frequenciesHz = new Float64Array(0);
  const transfers: Float64Array[] = [];
  for (let c = 0; c < guitar.coils.length; c += 1) {
    const sourcePhasors = guitar.coils.map((_, other) => ({ magnitude: other === c ? 1 : 0, phaseDeg: 0 }));
    const sweep = await runAcSweep(simulation, renderNetlist(guitar, wiring, { volumeSetting: VOLUME_SETTING }, { sourcePhasors, startHz, stopHz, pointsPerDecade }));
    frequenciesHz = sweep.frequencies;
    transfers.push(Float64Array.from(sweep.output.flatMap((value) => [value.real, value.img])));
  }
  return { frequenciesHz, transfers };
}

interface CoherentFigures {
  readonly resonanceHz: number | null;
  readonly resonanceQ: number | null;
  /** R on the sweep, for reading it at our peak. */
  readonly frequenciesHz: Float64Array;
  readonly values: Float64Array;
}

/** R of a sweep at `frequencyHz`, linear in ln f between sweep points; null outside the sweep. */
function valueAt(figures: CoherentFigures, frequencyHz: number): number | null {
  const grid = figures.frequenciesHz;
  for (let k = 1; k < grid.length; k += 1) {
    const high = grid[k] as number;
    if (high < frequencyHz) continue;
    const low = grid[k - 1] as number;
    if (low > frequencyHz) return null;
    const t = Math.log(frequencyHz / low) / Math.log(high / low);
    return (figures.values[k - 1] as number) * (1 - t) + (figures.values[k] as number) * t;
  }
  return null;
}

/** R(f) composed from ngspice's transfers, and its highest interior maximum and −3 dB bandwidth. */
function coherentFigures(guitar: Guitar, wiring: Wiring, drive: CoilDrive, sweep: Sweep, reference: Sweep): CoherentFigures {
  const phases = coilPhases(guitar.elements, wiring.network, new Float64Array(guitar.coils.length));
  // the netlist carries the phases already: T_i from ngspice is p_i·T⁰_i, so compose with p = |p|
  const used = Float64Array.from(phases, Math.abs);
  const grid = sweep.frequenciesHz;
  const sampled = sampleCoilDrive(drive, grid);
  const width = 2 * drive.pairCount;
  const r = Float64Array.from(grid, (_, k) =>
    Math.sqrt(drivenPowerAt(sweep.transfers, k, used, sampled, k * width) / drivenPowerAt(reference.transfers, 0, used, sampled, k * width)),
  );
  const figures = readDensePeak(grid, r);
  return { resonanceHz: figures.peakHz, resonanceQ: figures.q, frequenciesHz: grid, values: r };
}

describe('resonance as the strings drive it agrees with ngspice (eecircuit-engine)', () => {
  const guitar = parseGuitarText(readFileSync(join(SAMPLES, 'humbucker-two-single-coil.json'), 'utf8'), 'humbucker-two-single-coil.json');
  const wirings = enumerateWirings(guitar.elements);
  const drive = measureCoilDrive(measureSpectralBasis(guitar));
  const ours = measureCircuitMetrics(guitar, wirings, { volumeSetting: VOLUME_SETTING }, { drive }).wirings;
  const shapes = [...new Set(wirings.map((wiring) => shapeKey(wiring.network)))].filter((_, index) => index % SHAPE_STRIDE === 0);
  const sampled = wirings.map((wiring, index) => ({ wiring, index })).filter(({ wiring }) => shapes.includes(shapeKey(wiring.network)));
  // wirings holding both coils of a coupled pair: their phase class carries the coupled coils' relative phase after a '|' (phase-class.ts)
  const coupled = sampled.filter(({ wiring }) => phaseClassKey(guitar, wiring.network).includes('|'));
  const picked = [...sampled.filter((entry) => !coupled.includes(entry)), ...coupled.filter((_, k) => k % COUPLED_STRIDE === 0)];

  it(`the same peaks, within 0.1 % in frequency and 1 % in Q, on ${picked.length} of ${wirings.length} wirings at volume ${VOLUME_SETTING}`, async () => {
    const failures: string[] = [];
    let compared = 0;
    let comparedCoupled = 0;
    let withQ = 0;
    for (const { wiring, index } of picked) {
      const metrics = ours[index];
      if (metrics === undefined || metrics.resonanceHzReason?.startsWith('the coils cancel')) continue;
      const reference = await spiceTransfers(guitar, wiring, REFERENCE_FREQUENCY_HZ, REFERENCE_FREQUENCY_HZ * REFERENCE_SPAN, 1); // first point: 100 Hz
      const coarse = coherentFigures(guitar, wiring, drive, await spiceTransfers(guitar, wiring, 20, 20_000, POINTS_PER_DECADE), reference);
      let theirs = coarse;
      if (coarse.resonanceHz !== null && coarse.resonanceQ !== null) {
        // a second, finer sweep over the peak and its −3 dB band (±3 bandwidths), about FINE_POINTS points
        const bandwidthHz = coarse.resonanceHz / coarse.resonanceQ;
        const startHz = Math.max(20, coarse.resonanceHz - 3 * bandwidthHz);
        const stopHz = Math.min(20_000, coarse.resonanceHz + 3 * bandwidthHz);
        const perDecade = Math.ceil(FINE_POINTS / Math.log10(stopHz / startHz));
        theirs = coherentFigures(guitar, wiring, drive, await spiceTransfers(guitar, wiring, startHz, stopHz, perDecade), reference);
      }
      compared += 1;
      const label = `${wiring.id} ${wiring.expression}`;
      if ((metrics.resonanceHz === null) !== (theirs.resonanceHz === null)) {
        failures.push(`${label}: resonance ${metrics.resonanceHz} here, ${theirs.resonanceHz} in ngspice`);
        continue;
      }
      if (coupled.some((entry) => entry.index === index)) comparedCoupled += 1;
      if (metrics.resonanceHz !== null && theirs.resonanceHz !== null && Math.abs(metrics.resonanceHz / theirs.resonanceHz - 1) > FREQUENCY_TOLERANCE) {
        // the same flat top? ngspice's R at our frequency against ngspice's peak
        const there = valueAt(theirs, metrics.resonanceHz);
        const top = valueAt(theirs, theirs.resonanceHz);
        const offDb = there !== null && top !== null && there > 0 ? 20 * Math.log10(top / there) : Number.POSITIVE_INFINITY;
        if (!(offDb <= PEAK_FLATNESS_DB)) {
          failures.push(`${label}: resonance ${metrics.resonanceHz.toFixed(1)} Hz here, ${theirs.resonanceHz.toFixed(1)} Hz in ngspice (${offDb.toFixed(4)} dB below its peak there)`);
        }
      }
      if (theirs.resonanceQ !== null) {
        withQ += 1;
        if (metrics.resonanceQ === null || !Number.isFinite(metrics.resonanceQ) || Math.abs(metrics.resonanceQ / theirs.resonanceQ - 1) > Q_TOLERANCE) {
          failures.push(`${label}: Q ${metrics.resonanceQ} here, ${theirs.resonanceQ.toFixed(3)} in ngspice`);
        }
      } else if (metrics.resonanceQ !== null) failures.push(`${label}: Q ${metrics.resonanceQ} here, none in ngspice`);
    }
    expect(failures).toEqual([]);
    expect(compared).toBeGreaterThan(10);
    expect(comparedCoupled).toBeGreaterThan(3);
    expect(withQ).toBeGreaterThan(3);
  }, 600_000);
});
