/**
 * Circuit speed: `analyze`'s figures for every wiring of 3, 4 and 5 coils on
 * 200 log-spaced frequencies, and the same responses from ngspice (the
 * eecircuit-engine WebAssembly build) for the 47 three-coil wirings, with the
 * ratio and the largest disagreement. Printed, never asserted.
 */
import { performance } from 'node:perf_hooks';
import { Simulation } from 'eecircuit-engine';
import {
  analysisFrequencies,
  measureCircuitMetrics,
  prepareCircuit,
  renderNetlist,
  solveTransfers,
} from '../../src/circuit/index.js';
import type { Guitar } from '../../src/guitar/index.js';
import { enumerateWirings, type Wiring } from '../../src/wiring/index.js';
import { fiveCoilGuitar, sample } from './guitars.js';
import { heading, line, medianMs } from './timing.js';

const POINTS = 200;
/** 67 points per decade over the three decades 20 Hz–20 kHz gives 202 log-spaced points, the nearest sweep to 200. */
const SPICE_POINTS_PER_DECADE = 67;



export async function benchCircuit(): Promise<void> {
  heading(`Circuit: analyze (resonance, peak, Q, hum for every wiring; ${POINTS} log-spaced frequencies, peaks refined)`);
  const cases: Array<[string, Guitar]> = [
    ['3 coils', sample('three-single-coil.json')],
    ['4 coils', sample('humbucker-two-single-coil.json')],
    ['5 coils', fiveCoilGuitar()],
  ];
  let analyze47Ms = 0;
  for (const [label, guitar] of cases) {
    const wirings = enumerateWirings(guitar.elements);
    const ms = medianMs(() => measureCircuitMetrics(guitar, wirings), wirings.length > 1000 ? 3 : 5);
    if (wirings.length === 47) analyze47Ms = ms;
    const prepared = prepareCircuit(guitar, analysisFrequencies(POINTS));
    const out = guitar.coils.map(() => new Float64Array(2 * POINTS));
    const solveMs = medianMs(() => {
      for (const wiring of wirings) solveTransfers(prepared, wiring.network, out);
    });
    line(`${label}: ${wirings.length} wirings, analyze`, `${ms.toFixed(1)} ms`);
    line(`${label}: ${wirings.length} wirings, every transfer solved (as render needs)`, `${solveMs.toFixed(1)} ms`);
  }

  heading('Circuit: the 47 three-coil responses from ngspice (eecircuit-engine) in the same run');
  const guitar = sample('three-single-coil.json');
  const wirings = enumerateWirings(guitar.elements);
  const simulation = new Simulation();
  let start = performance.now();
  await simulation.start();
  line('ngspice engine start (once)', `${(performance.now() - start).toFixed(0)} ms`);
  const netlists = wirings.map((wiring) => renderNetlist(guitar, wiring, undefined, { pointsPerDecade: SPICE_POINTS_PER_DECADE }));
  const spiceOutputs: Array<{ frequencies: Float64Array; values: Array<{ real: number; img: number }> }> = [];
  start = performance.now();
  for (const netlist of netlists) {
    simulation.setNetList(netlist);
    const result = await simulation.runSim();
    if (result.dataType !== 'complex') throw new Error('expected an AC result');
    const frequency = result.data.find((vector) => vector.name === 'frequency');
    const output = result.data.find((vector) => vector.name === 'v(out)');
    if (!frequency || !output) throw new Error('no v(out)');
    spiceOutputs.push({ frequencies: Float64Array.from(frequency.values.map((value) => value.real)), values: output.values });
  }
  const spiceMs = performance.now() - start;
  const frequencies = spiceOutputs[0]?.frequencies ?? new Float64Array(0);
  const ourMs = medianMs(() => {
    const prepared = prepareCircuit(guitar, frequencies);
    const out = guitar.coils.map(() => new Float64Array(2 * frequencies.length));
    for (const wiring of wirings) solveTransfers(prepared, wiring.network, out);
  }, 20);
  const { db, deg } = worstDeviation(guitar, wirings, frequencies, spiceOutputs);
  line(`ngspice: 47 responses × ${frequencies.length} frequencies`, `${spiceMs.toFixed(0)} ms`);
  line(`coilbench: the same 47 responses (prepare + solve)`, `${ourMs.toFixed(2)} ms`);
  line('speed-up, responses (ngspice / coilbench)', `${(spiceMs / ourMs).toFixed(0)}×`);
  line('speed-up, full analyze of 47 wirings vs ngspice responses', `${(spiceMs / analyze47Ms).toFixed(0)}×`);
  line('largest disagreement over all 47 × points', `${db.toExponential(2)} dB, ${deg.toExponential(2)}°`);
}

function worstDeviation(
  guitar: Guitar,
  wirings: readonly Wiring[],
  frequencies: Float64Array,
  outputs: ReadonlyArray<{ values: Array<{ real: number; img: number }> }>,
): { db: number; deg: number } {
  const prepared = prepareCircuit(guitar, frequencies);
  let db = 0;
  let deg = 0;
  wirings.forEach((wiring, w) => {
    const transfers = solveTransfers(prepared, wiring.network);
    frequencies.forEach((_, k) => {
      let re = 0;
      let im = 0;
      for (const transfer of transfers) {
        re += transfer[2 * k] as number;
        im += transfer[2 * k + 1] as number;
      }
      const spice = outputs[w]?.values[k] ?? { real: Number.NaN, img: Number.NaN };
      db = Math.max(db, Math.abs(20 * Math.log10(Math.hypot(re, im) / Math.hypot(spice.real, spice.img))));
      deg = Math.max(deg, Math.abs((Math.atan2(im * spice.real - re * spice.img, re * spice.real + im * spice.img) * 180) / Math.PI));
    });
  });
  return { db, deg };
}
