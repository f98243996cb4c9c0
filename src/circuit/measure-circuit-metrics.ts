/**
 * The circuit figures of every wiring, as `analyze` reports them: resonance,
 * peak, Q and hum, on one prepared grid. The core entry point of `analyze`.
 *
 * Phases only flip signs: the solver applies p_i at the leaves and every
 * later step is linear, so T_i(wiring) = p_i·T_i(same network all in phase)
 * exactly. The transfers are therefore solved once per network shape (837
 * shapes for the 9997 wirings of five coils); each phase pattern's driven
 * response R² = Σ_ij p_i·p_j·T⁰_i·D_ij·conj(T⁰_j) (driven-response.ts), and
 * with it resonance, peak and Q, and its hum Σ_i p_i·m_i·h_i·B(x_i)·T_i⁰(mains),
 * follow from those. The poles do not move with polarity, but how strongly
 * the strings excite each of them does: an out-of-phase pattern can hide a
 * peak the in-phase one shows, and the reverse. Coupled coils keep their
 * relative phase in the shape (phase-class.ts).
 */
import type { Guitar } from '../guitar/index.js';
import { type Steps, runSteps } from '../math/index.js';
import type { Network } from '../wiring/index.js';
import { phaseClassKey, phaseClassNetwork, phaseClassSigns } from './phase-class.js';
import type { CircuitLoad, CircuitOverrides } from './circuit-load.js';
import { ANALYSIS_POINTS, analysisFrequencies } from './frequency-grid.js';
import { type HumCategory, humCategory, prepareHumFields, worseHumDb } from './measure-hum.js';
import { type CoilDrive, incoherentCoilDrive, sampleCoilDrive } from './coil-drive.js';
import { SILENT_RESONANCE, measureGraphResonance, measureResonance } from './measure-resonance.js';
import type { CircuitGraph } from './circuit-graph.js';
import { solveNodalTransfers } from './solve-nodal.js';
import { fixedProbeAt, prepareCircuit, probeTransfers } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

export interface WiringCircuitMetrics {
  /** Null at an end of the band, and when nothing reaches the output. */
  readonly resonanceHz: number | null;
  /** Why resonanceHz is null (null when it is a number); the same for the other figures. */
  readonly resonanceHzReason: string | null;
  /** Null when nothing reaches the output (volume at 0) or the coils cancel at 100 Hz. */
  readonly peakDb: number | null;
  readonly peakDbReason: string | null;
  readonly resonanceQ: number | null;
  readonly resonanceQReason: string | null;
  /** Null only when nothing reaches the output. Floored at HUM_FLOOR_DB (measure-hum.ts). */
  readonly humDb: number | null;
  /** Plain category of humDb: cancels (≤ −20 dB), reduces (≤ −6 dB), noisy; null when nothing reaches the output. */
  readonly humCategory: HumCategory | null;
  /** humCategory is "cancels". */
  readonly humCancelling: boolean;
}

export interface CircuitAnalysis {
  readonly load: CircuitLoad;
  /** True when the volume at 0 leaves nothing at the output: every figure is null. */
  readonly silent: boolean;
  /** The grid the peaks were located on before refinement. */
  readonly points: number;
  readonly wirings: readonly WiringCircuitMetrics[];
}

export interface CircuitMetricsOptions {
  /** Log-spaced grid points over 20 Hz–20 kHz used to locate peaks (refined between points). Default 200. */
  readonly points: number;
  /**
   * How the strings drive the coils (coil-drive.ts): the reference phrase's
   * normalised cross-spectra, from src/analysis/measure-coil-drive.ts. Every
   * command passes it; the default D = I (the power sum, equal uncorrelated
   * coils) is for closed-form checks of the circuit alone.
   */
  readonly drive: CoilDrive | undefined;
}

export const DEFAULT_CIRCUIT_METRICS_OPTIONS: Readonly<CircuitMetricsOptions> = Object.freeze({ points: ANALYSIS_POINTS, drive: undefined });

const SILENT_METRICS: WiringCircuitMetrics = Object.freeze({
  ...SILENT_RESONANCE,
  humDb: null,
  humCategory: null,
  humCancelling: false,
});

/**
 * The one-off part of the circuit figures (circuit on the grid, drive, hum
 * reference), then `measure` for any batch of wirings: each batch's figures
 * are the same numbers a single call over every wiring gives, so a caller
 * can work through 228,386 wirings a few at a time in bounded memory.
 */
export interface CircuitMetricsSolver {
  readonly load: CircuitLoad;
  /** True when the volume at 0 leaves nothing at the output: every figure is null. */
  readonly silent: boolean;
  readonly points: number;
  /** Figures of `wirings`, in the order given (the phase patterns of one shape share its transfers). */
  readonly measure: (wirings: readonly { readonly network: Network }[]) => WiringCircuitMetrics[];
  /** The same as steps (math/run-steps.ts): yields after each shape. */
  readonly measureSteps: (wirings: readonly { readonly network: Network }[]) => Steps<WiringCircuitMetrics[]>;
  /** Figures of connections of coil leads (nodal analysis), in the order given. */
  readonly measureGraphs: (graphs: readonly CircuitGraph[]) => WiringCircuitMetrics[];
}

/** Prepare the circuit figures of `guitar`. Throws InputError for a bad override. */
export function prepareCircuitMetrics(guitar: Guitar, overrides?: CircuitOverrides, options: Partial<CircuitMetricsOptions> = {}): CircuitMetricsSolver {
  const { points } = { ...DEFAULT_CIRCUIT_METRICS_OPTIONS, ...options };
  if (!Number.isInteger(points) || points < 3) throw new RangeError(`measureCircuitMetrics: points must be an integer ≥ 3, got ${points}`);
  const prepared = prepareCircuit(guitar, analysisFrequencies(points), overrides);
  if (prepared.load.silent) {
    const silent = (wirings: readonly { readonly network: Network }[]): WiringCircuitMetrics[] => wirings.map(() => SILENT_METRICS);
    const silentSteps = function* (wirings: readonly { readonly network: Network }[]): Steps<WiringCircuitMetrics[]> {
      return silent(wirings);
    };
    return { load: prepared.load, silent: true, points, measure: silent, measureSteps: silentSteps, measureGraphs: (graphs) => graphs.map(() => SILENT_METRICS) };
  }
  const drive = options.drive ?? incoherentCoilDrive(guitar.coils.length);
  if (drive.coilCount !== guitar.coils.length) throw new RangeError(`measureCircuitMetrics: the drive has ${drive.coilCount} coils, the guitar ${guitar.coils.length}`);
  const sampledDrive = sampleCoilDrive(drive, prepared.frequenciesHz);
  const transfers = guitar.coils.map(() => new Float64Array(2 * points));
  const humFields = prepareHumFields(prepared);
  const mains = fixedProbeAt(prepared, prepared.load.mainsHz);
  const phases = new Float64Array(guitar.coils.length);
  const signedMains = new Float64Array(2 * guitar.coils.length);
  const measureSteps = function* (wirings: readonly { readonly network: Network }[]): Steps<WiringCircuitMetrics[]> {
    // wirings grouped by network shape, shapes in order of first appearance
    const byShape = new Map<string, number[]>();
    wirings.forEach(({ network }, index) => {
      const key = phaseClassKey(guitar, network);
      const members = byShape.get(key);
      if (members === undefined) byShape.set(key, [index]);
      else members.push(index);
    });
    const metrics = new Array<WiringCircuitMetrics>(wirings.length);
    for (const members of byShape.values()) {
      const inPhase = phaseClassNetwork(guitar, (wirings[members[0] as number] as { network: Network }).network);
      solveTransfers(prepared, inPhase, transfers);
      const atMains = solveTransfers(mains, inPhase, probeTransfers(prepared));
      const mainsTransfers = Float64Array.from(atMains.flatMap((transfer) => [transfer[0] as number, transfer[1] as number]));
      for (const index of members) {
        const network = (wirings[index] as { network: Network }).network;
        const resonance = measureResonance(prepared, network, { drive, sampledDrive, inPhaseTransfers: transfers });
        phaseClassSigns(guitar, network, phases);
        // H = Σ_i m_i·h_i·B(x_i)·T_i with T_i = p_i·T_i⁰ (measure-hum.ts), in the worse field direction
        for (let c = 0; c < phases.length; c += 1) {
          signedMains[2 * c] = (phases[c] as number) * (mainsTransfers[2 * c] as number);
          signedMains[2 * c + 1] = (phases[c] as number) * (mainsTransfers[2 * c + 1] as number);
        }
        const humDb = worseHumDb(humFields, signedMains);
        const category = humCategory(humDb);
        metrics[index] = { ...resonance, humDb, humCategory: category, humCancelling: category === 'cancels' };
      }
      yield;
    }
    return metrics;
  };
  const measureGraphs = (graphs: readonly CircuitGraph[]): WiringCircuitMetrics[] =>
    graphs.map((graph) => {
      const graphTransfers = solveNodalTransfers(prepared, graph);
      const resonance = measureGraphResonance(prepared, graph, { drive, sampledDrive, inPhaseTransfers: graphTransfers });
      // H = Σ_i m_i·h_i·B(x_i)·T_i (measure-hum.ts); the graph's T_i carry their signs
      const atMains = solveNodalTransfers(mains, graph, probeTransfers(prepared));
      const humDb = worseHumDb(humFields, Float64Array.from(atMains.flatMap((transfer) => [transfer[0] as number, transfer[1] as number])));
      const category = humCategory(humDb);
      return { ...resonance, humDb, humCategory: category, humCancelling: category === 'cancels' };
    });
  return { load: prepared.load, silent: false, points, measure: (wirings) => runSteps(measureSteps(wirings)), measureSteps, measureGraphs };
}

/** Resonance, peak, Q and hum of each wiring, in the order given. Throws InputError for a bad override. */
export function measureCircuitMetrics(
  guitar: Guitar,
  wirings: readonly { readonly network: Network }[],
  overrides?: CircuitOverrides,
  options: Partial<CircuitMetricsOptions> = {},
): CircuitAnalysis {
  const solver = prepareCircuitMetrics(guitar, overrides, options);
  return { load: solver.load, silent: solver.silent, points: solver.points, wirings: solver.measure(wirings) };
}

/**
 * The same figures for connections of coil leads written out joint by joint
 * (a `CircuitGraph`, e.g. a bridge network of five coils that no +, // and ~
 * expression writes), solved by nodal analysis (solve-nodal.ts) on the same
 * grid, drive and hum reference as `measureCircuitMetrics`, so a graph of a
 * series–parallel wiring gets that wiring's figures.
 */
export function measureGraphCircuitMetrics(
  guitar: Guitar,
  graphs: readonly CircuitGraph[],
  overrides?: CircuitOverrides,
  options: Partial<CircuitMetricsOptions> = {},
): CircuitAnalysis {
  const solver = prepareCircuitMetrics(guitar, overrides, options);
  return { load: solver.load, silent: solver.silent, points: solver.points, wirings: solver.measureGraphs(graphs) };
}
