/**
 * The circuit figures of every wiring, as `analyze` reports them: resonance,
 * peak, Q and hum, on one prepared grid. The core entry point of `analyze`.
 */
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import type { CircuitLoad, CircuitOverrides } from './circuit-load.js';
import { ANALYSIS_POINTS, analysisFrequencies } from './frequency-grid.js';
import { humDecibels, isHumCancelling, measureHum, measureHumReference } from './measure-hum.js';
import { measureResonance } from './measure-resonance.js';
import { prepareCircuit } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

export interface WiringCircuitMetrics {
  /** Null at an end of the band, and when nothing reaches the output. */
  readonly resonanceHz: number | null;
  /** Null only when nothing reaches the output (volume at 0). */
  readonly peakDb: number | null;
  readonly resonanceQ: number | null;
  /** Null only when nothing reaches the output. */
  readonly humDb: number | null;
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
}

export const DEFAULT_CIRCUIT_METRICS_OPTIONS: Readonly<CircuitMetricsOptions> = Object.freeze({ points: ANALYSIS_POINTS });

const SILENT_METRICS: WiringCircuitMetrics = Object.freeze({
  resonanceHz: null,
  peakDb: null,
  resonanceQ: null,
  humDb: null,
  humCancelling: false,
});

/** Resonance, peak, Q and hum of each wiring, in the order given. Throws InputError for a bad override. */
export function measureCircuitMetrics(
  guitar: Guitar,
  wirings: readonly { readonly network: Network }[],
  overrides?: CircuitOverrides,
  options: Partial<CircuitMetricsOptions> = {},
): CircuitAnalysis {
  const { points } = { ...DEFAULT_CIRCUIT_METRICS_OPTIONS, ...options };
  if (!Number.isInteger(points) || points < 3) throw new RangeError(`measureCircuitMetrics: points must be an integer ≥ 3, got ${points}`);
  const prepared = prepareCircuit(guitar, analysisFrequencies(points), overrides);
  if (prepared.load.silent) {
    return { load: prepared.load, silent: true, points, wirings: wirings.map(() => SILENT_METRICS) };
  }
  const transfers = guitar.coils.map(() => new Float64Array(2 * points));
  const reference = measureHumReference(prepared);
  const metrics = wirings.map(({ network }): WiringCircuitMetrics => {
    solveTransfers(prepared, network, transfers);
    const resonance = measureResonance(prepared, network, transfers);
    const humDb = humDecibels(measureHum(prepared, network), reference);
    return { ...resonance, humDb, humCancelling: isHumCancelling(humDb) };
  });
  return { load: prepared.load, silent: false, points, wirings: metrics };
}
