/**
 * The circuit figures of every wiring, as `analyze` reports them: resonance,
 * peak, Q and hum, on one prepared grid. The core entry point of `analyze`.
 *
 * Phases only flip signs: the solver applies p_i at the leaves and every
 * later step is linear, so T_i(wiring) = p_i·T_i(same network all in phase)
 * exactly. The power sum, and with it resonance, peak and Q, is therefore
 * shared by all 2^(k−1) phase patterns of a network ("the poles do not move
 * with polarity"), and each pattern's hum is Σ_i p_i·m_i·h_i·B(x_i)·T_i⁰(mains).
 * So the figures are solved once per network shape (837 shapes for the 9997
 * wirings of five coils) and the hum once more per wiring from those.
 * Coupled coils keep their relative phase in the shape (phase-class.ts).
 */
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { phaseClassKey, phaseClassNetwork, phaseClassSigns } from './phase-class.js';
import type { CircuitLoad, CircuitOverrides } from './circuit-load.js';
import { ANALYSIS_POINTS, analysisFrequencies } from './frequency-grid.js';
import { type HumCategory, humCategory, humDecibels, humFieldWeights, measureHumReference } from './measure-hum.js';
import { type ResonanceMetrics, measureResonance } from './measure-resonance.js';
import { fixedProbeAt, prepareCircuit, probeTransfers } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

export interface WiringCircuitMetrics {
  /** Null at an end of the band, and when nothing reaches the output. */
  readonly resonanceHz: number | null;
  /** Null only when nothing reaches the output (volume at 0). */
  readonly peakDb: number | null;
  readonly resonanceQ: number | null;
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
}

export const DEFAULT_CIRCUIT_METRICS_OPTIONS: Readonly<CircuitMetricsOptions> = Object.freeze({ points: ANALYSIS_POINTS });

const SILENT_METRICS: WiringCircuitMetrics = Object.freeze({
  resonanceHz: null,
  peakDb: null,
  resonanceQ: null,
  humDb: null,
  humCategory: null,
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
  const mains = fixedProbeAt(prepared, prepared.load.mainsHz);
  const humWeights = humFieldWeights(guitar, prepared.load);
  const shapes = new Map<string, { resonance: ResonanceMetrics; mainsTransfers: Float64Array }>();
  const phases = new Float64Array(guitar.coils.length);
  const metrics = wirings.map(({ network }): WiringCircuitMetrics => {
    const key = phaseClassKey(guitar, network);
    let shape = shapes.get(key);
    if (shape === undefined) {
      const inPhase = phaseClassNetwork(guitar, network);
      solveTransfers(prepared, inPhase, transfers);
      const resonance = measureResonance(prepared, inPhase, transfers);
      const atMains = solveTransfers(mains, inPhase, probeTransfers(prepared));
      shape = { resonance, mainsTransfers: Float64Array.from(atMains.flatMap((transfer) => [transfer[0] as number, transfer[1] as number])) };
      shapes.set(key, shape);
    }
    phaseClassSigns(guitar, network, phases);
    // H = Σ_i m_i·h_i·T_i = Σ_i p_i·m_i·h_i·T_i⁰ (measure-hum.ts)
    let re = 0;
    let im = 0;
    for (let c = 0; c < phases.length; c += 1) {
      const weight = (phases[c] as number) * (humWeights[c] as number);
      re += weight * (shape.mainsTransfers[2 * c] as number);
      im += weight * (shape.mainsTransfers[2 * c + 1] as number);
    }
    const humDb = humDecibels(Math.hypot(re, im), reference);
    const category = humCategory(humDb);
    return { ...shape.resonance, humDb, humCategory: category, humCancelling: category === 'cancels' };
  });
  return { load: prepared.load, silent: false, points, wirings: metrics };
}

