/**
 * Each coil's transfer T_i(f) from its string EMF to the amplifier input,
 * for one wiring: "sum the coils' sources, divide by the load".
 *
 * 1. Every coil is a Thevenin source k_i·E_i behind Z_i (prepare-circuit.ts),
 *    oriented so its string signal enters the network with the sign p_i the
 *    wiring gives it (coil-signs.ts). T_i carries p_i.
 * 2. Series: sources and impedances add, V = Σ V_k, Z = Σ Z_k (Kirchhoff's
 *    voltage law).
 *    Parallel: Millman's theorem, V = Σ(V_k/Z_k) / Σ(1/Z_k), Z = 1/Σ(1/Z_k):
 *    each part's sources are scaled by Y_k/ΣY.
 *    Applied recursively over the wiring's tree; unused coils are
 *    disconnected (T = 0).
 * 3. Load (circuit-load.ts): nodal analysis of the two nodes hot (h) and out
 *    (o) with the wiring's Thevenin source (V, Z), Y_s = 1/Z:
 *      [Y_s + Y_h + Y_ho, −Y_ho; −Y_ho, Y_o + Y_ho]·[v_h; v_o] = [V·Y_s; 0]
 *    so v_o/V = Y_ho·Y_s / ((Y_s + Y_h)·Y_o + Y_ho·(Y_s + Y_h + Y_o))
 *    (Cramer's rule), and with the volume fully up (v_o = v_h)
 *      v_o/V = Y_s / (Y_s + Y_h + Y_o).
 */
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { type CircuitGraph, graphOfNetwork } from './circuit-graph.js';
import { usesCoupledCoils } from './coil-coupling.js';
import type { PreparedCircuit, Workspace } from './prepare-circuit.js';
import { solveCoupledSourceFactors } from './nodal-kernel.js';
import { solveNodalTransfers } from './solve-nodal.js';
import { multiplyComplexInPlace } from '../math/index.js';
import { JAVASCRIPT_PASSES, type SeriesParallelArrays, reduceSeriesParallel } from './solve-series-parallel.js';

/** Graphs of networks already laid out, so repeated solves (probes between grid points) reuse them. */
const graphs = new WeakMap<Network, { readonly guitar: Guitar; readonly graph: CircuitGraph }>();

function graphFor(guitar: Guitar, network: Network): CircuitGraph {
  const known = graphs.get(network);
  if (known !== undefined && known.guitar === guitar) return known.graph;
  const graph = graphOfNetwork(guitar, network);
  graphs.set(network, { guitar, graph });
  return graph;
}

function acquire(workspace: Workspace, length: number): Float64Array {
  const buffer = workspace.buffers[workspace.top] ?? new Float64Array(length);
  workspace.buffers[workspace.top] = buffer;
  workspace.top += 1;
  return buffer;
}

/**
 * One interleaved complex array (re, im, …; length 2·F) per guitar coil, in
 * `guitar.coils` order: T_i(f) from coil i's string EMF (acoustic polarity
 * +1) to the amplifier input, including the coil's phase p_i. All zeros for
 * coils the wiring does not use, and for every coil when the volume is at 0.
 * Writes into `out` when given (no allocation per call once warmed up).
 *
 * T_i = S_i·G: the wiring's open-circuit source factors S_i
 * (`solveSourceFactors`) times the load's gain G (`solveLoadGain`).
 *
 * A wiring that holds both coils of a coupled pair (coil-coupling.ts) has no
 * series–parallel reduction: it is solved by nodal analysis of its layout
 * (solve-nodal.ts), with the same conventions.
 */
export function solveTransfers(prepared: PreparedCircuit, network: Network, out?: Float64Array[]): Float64Array[] {
  if (usesCoupledCoils(prepared.guitar, network)) {
    return solveNodalTransfers(prepared, graphFor(prepared.guitar, network), out);
  }
  const length = 2 * prepared.frequenciesHz.length;
  const coils = prepared.guitar.coils.length;
  const result = out ?? Array.from({ length: coils }, () => new Float64Array(length));
  const workspace = prepared.workspace;
  workspace.top = 0;
  const impedance = acquire(workspace, length);
  const used = solveSourceFactorsInto(prepared, network, result, impedance);
  if (prepared.load.silent) {
    for (const array of result) array.fill(0);
    workspace.top = 0;
    return result;
  }
  solveLoadGain(prepared, impedance, impedance);
  for (let c = 0; c < coils; c += 1) if (used[c] === 1) multiplyComplexInPlace(result[c] as Float64Array, impedance, length);
  workspace.top = 0;
  return result;
}

/**
 * The wiring as a Thevenin source seen from its two output leads, before
 * any load (steps 1 and 2 above): per coil the factor S_i(f) taking its
 * string EMF to the open-circuit voltage (p_i included; zeros for unused
 * coils), written into `out`, and the wiring's impedance Z(f) into
 * `impedance`. Neither depends on the knobs, cable or amplifier; the loaded
 * transfers are T_i = S_i·G (`solveLoadGain`). A wiring holding both coils
 * of a coupled pair has no series–parallel reduction: its S_i and Z come
 * from nodal analysis of its layout with the load left off
 * (`solveNodalSourceFactors`, solve-nodal.ts; Thevenin's theorem holds for
 * coupled coils as for any linear network). Returns which coils the wiring
 * uses (1) or not (0), a buffer valid until the next solve.
 */
export function solveSourceFactors(prepared: PreparedCircuit, network: Network, out: Float64Array[], impedance: Float64Array): Uint8Array {
  const workspace = prepared.workspace;
  if (usesCoupledCoils(prepared.guitar, network)) {
    const graph = graphFor(prepared.guitar, network);
    solveCoupledSourceFactors(prepared, graph, out, impedance);
    workspace.used.fill(0);
    for (const placed of graph.coils) if (placed.start !== null && placed.finish !== null) workspace.used[placed.coil] = 1;
    return workspace.used;
  }
  workspace.top = 0;
  const used = solveSourceFactorsInto(prepared, network, out, impedance);
  workspace.top = 0;
  return used;
}

function solveSourceFactorsInto(prepared: PreparedCircuit, network: Network, out: Float64Array[], impedance: Float64Array): Uint8Array {
  const length = 2 * prepared.frequenciesHz.length;
  const coils = prepared.guitar.coils.length;
  let fits = out.length === coils && impedance.length === length;
  for (let c = 0; fits && c < coils; c += 1) fits = (out[c] as Float64Array).length === length;
  if (!fits) throw new RangeError(`solveTransfers: out must hold ${coils} arrays of length ${length}`);
  return reduceSeriesParallel(prepared.guitar, network, seriesParallelArrays(prepared), out, impedance);
}

/** A prepared circuit's arrays for the reduction (solve-series-parallel.ts), made once per circuit. */
const reductionArrays = new WeakMap<PreparedCircuit, SeriesParallelArrays<Float64Array>>();

function seriesParallelArrays(prepared: PreparedCircuit): SeriesParallelArrays<Float64Array> {
  let arrays = reductionArrays.get(prepared);
  if (arrays === undefined) {
    arrays = {
      passes: JAVASCRIPT_PASSES,
      workspace: prepared.workspace,
      coilSource: prepared.coilSource,
      coilImpedance: prepared.coilImpedance,
      length: 2 * prepared.frequenciesHz.length,
    };
    reductionArrays.set(prepared, arrays);
  }
  return arrays;
}

/**
 * The load's gain G(f) = v_o/V for a wiring of impedance Z(f) (step 3 above),
 * written into `gain` (which may be `impedance` itself). All zeros when the
 * volume is at 0. One complex solve per frequency: the part of a transfer
 * that follows the knobs, cable and amplifier.
 */
export function solveLoadGain(prepared: PreparedCircuit, impedance: Float64Array, gain: Float64Array): Float64Array {
  const length = 2 * prepared.frequenciesHz.length;
  if (prepared.load.silent) return gain.fill(0);
  loadGainInto(impedance, prepared.hotAdmittance, prepared.outAdmittance, prepared.bridgeAdmittance, gain, length);
  return gain;
}

/*
 * The load's loop over frequencies is a function of its own: V8 compiles a
 * long loop while it runs (on-stack replacement), and a loop inside a larger
 * function left that compiled code bailing out on the code after it, call
 * after call (src/math/real-fft.ts).
 */

/** The load's gain per frequency (solveLoadGain's formula) from the wiring's impedance and the load's admittances. */
function loadGainInto(impedance: Float64Array, hot: Float64Array, outY: Float64Array, bridge: Float64Array | null, gain: Float64Array, length: number): void {
  for (let i = 0; i < length; i += 2) {
    const zr = impedance[i] as number;
    const zi = impedance[i + 1] as number;
    const zn = zr * zr + zi * zi;
    const sr = zr / zn; // Y_s
    const si = -zi / zn;
    const hr = sr + (hot[i] as number); // Y_s + Y_h
    const hi = si + (hot[i + 1] as number);
    const or = outY[i] as number;
    const oi = outY[i + 1] as number;
    let nr: number;
    let ni: number;
    let dr: number;
    let di: number;
    if (bridge === null) {
      nr = sr;
      ni = si;
      dr = hr + or;
      di = hi + oi;
    } else {
      const br = bridge[i] as number;
      const bi = bridge[i + 1] as number;
      nr = br * sr - bi * si;
      ni = br * si + bi * sr;
      const tr = hr + or; // Y_s + Y_h + Y_o
      const ti = hi + oi;
      dr = hr * or - hi * oi + (br * tr - bi * ti);
      di = hr * oi + hi * or + (br * ti + bi * tr);
    }
    const dn = dr * dr + di * di;
    gain[i] = (nr * dr + ni * di) / dn;
    gain[i + 1] = (ni * dr - nr * di) / dn;
  }
}
