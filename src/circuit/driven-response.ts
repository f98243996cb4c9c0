/**
 * A wiring's response as the strings drive it (docs/design.md, metrics;
 * docs/physics.md, "The response as the string drives it"):
 *
 *   R(f)² = Σ_ij T_i(f)·D_ij(f)·conj(T_j(f)) / Σ_ij T_i(f₀)·D_ij(f)·conj(T_j(f₀)),   f₀ = 100 Hz,
 *
 * T_i the coil-to-output transfers (T_i = p_i·T⁰_i), D the coils' EMF
 * cross-spectra for the reference phrase, smoothed over ERB bands and
 * normalised to the mean coil signal (coil-drive.ts). The numerator is the
 * output power per unit mean coil power at f: the coils' signals are
 * correlated, so a mode in which two coils' contributions cancel (the
 * antisymmetric mode of a series pair of unlike coils) adds nothing the
 * string does not excite. The denominator is the same power had the
 * wiring passed every frequency as it passes 100 Hz: dividing by it takes
 * out what belongs to the strings alone (their spectrum, and how the
 * coils' correlation falls with frequency, which follows where the coils
 * sit on the strings and swings by several dB from one ERB band to the
 * next), and leaves what the circuit does to the strings' signal, so R is
 * 1 at 100 Hz and its peaks are the circuit's as the strings excite them.
 * A lone coil reads |T_i(f)/T_i(f₀)| whatever the strings do; with D = I
 * (equal, uncorrelated coils) R is the power sum √(Σ_i |T_i(f)|²) over its
 * value at 100 Hz.
 */
import type { Network } from '../wiring/index.js';
import { phaseClassNetwork, phaseClassSigns } from './phase-class.js';
import { type CoilDrive, coilDriveAt, drivenPowerAt, sampleCoilDrive } from './coil-drive.js';
import { REFERENCE_FREQUENCY_HZ } from './frequency-grid.js';
import { type PreparedCircuit, fixedProbeAt, probeAt, probeTransfers } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';
import type { CircuitGraph } from './circuit-graph.js';
import { solveNodalTransfers } from './solve-nodal.js';

/** R of one wiring on a prepared grid, and anywhere else by an exact solve. */
export interface DrivenResponse {
  /** R at each frequency of the prepared grid (0 where the reference cancels). */
  readonly values: Float64Array;
  /** R at any frequency, solved exactly there (D interpolated in ln f). */
  readonly at: (frequencyHz: number) => number;
  /**
   * True when the wiring's 100 Hz transfers cancel for the strings' signal
   * (the denominator of R is zero): R does not exist.
   */
  readonly referenceCancelled: boolean;
  /**
   * The numerator's sum with every cross term's magnitude added,
   * √(Σ_ij |T_i|·|D_ij|·|T_j|) over the same denominator, at any frequency:
   * R can only cancel below it (for telling an exact cancellation from a
   * small signal).
   */
  readonly uncancelledAt: (frequencyHz: number) => number;
}

export interface DrivenResponseInputs {
  /** D sampled on the prepared grid (sampleCoilDrive), when already made for many wirings. */
  readonly sampledDrive?: Float64Array;
  /** The phase-class representative's transfers on the grid (solveTransfers of phaseClassNetwork(guitar, network)), when already solved. */
  readonly inPhaseTransfers?: readonly Float64Array[];
}

/** Below this fraction of its uncancelled value the reference sum counts as cancelled (double rounding is ~1e-16; see measure-resonance.ts). */
const REFERENCE_CANCELLED_FRACTION = 1e-9;

/**
 * What R needs of a circuit: each coil's transfer on the grid, a solve at any
 * other frequency, and the sign s_i each transfer is taken with.
 */
interface TransferSource {
  /** s_i per coil (0 for coils not used). */
  readonly phases: Float64Array;
  /** The transfers on the prepared grid. */
  readonly transfers: readonly Float64Array[];
  /** The transfers on a one-frequency probe, written into `out`. */
  readonly solveAt: (probe: PreparedCircuit, out: Float64Array[]) => Float64Array[];
}

/** R of `network` on `prepared` driven by `drive` (coil counts must match). */
export function solveDrivenResponse(
  prepared: PreparedCircuit,
  network: Network,
  drive: CoilDrive,
  inputs: DrivenResponseInputs = {},
): DrivenResponse {
  // T_i = s_i·T_i of the phase-class representative (phase-class.ts; without coupling s_i = p_i and the representative is all in phase)
  const inPhase = phaseClassNetwork(prepared.guitar, network);
  const phases = phaseClassSigns(prepared.guitar, network, new Float64Array(prepared.guitar.coils.length));
  const transfers = inputs.inPhaseTransfers ?? solveTransfers(prepared, inPhase);
  return drivenResponseOf(prepared, drive, inputs, { phases, transfers, solveAt: (probe, out) => solveTransfers(probe, inPhase, out) });
}

/**
 * R of any connection of coil leads (a `CircuitGraph`, solved by nodal
 * analysis, solve-nodal.ts): its transfers already carry every sign, so
 * s_i = 1. `inputs.inPhaseTransfers`, when given, are the graph's own
 * transfers on the grid.
 */
export function solveGraphDrivenResponse(
  prepared: PreparedCircuit,
  graph: CircuitGraph,
  drive: CoilDrive,
  inputs: DrivenResponseInputs = {},
): DrivenResponse {
  const phases = new Float64Array(prepared.guitar.coils.length).fill(1);
  const transfers = inputs.inPhaseTransfers ?? solveNodalTransfers(prepared, graph);
  return drivenResponseOf(prepared, drive, inputs, { phases, transfers, solveAt: (probe, out) => solveNodalTransfers(probe, graph, out) });
}

/** |D| per pair of `d` from `offset` (`width` numbers, interleaved complex) into `out` from `outOffset`, imaginary parts 0. */
function magnitudesOf(d: Float64Array, offset: number, width: number, out: Float64Array, outOffset: number): void {
  for (let p = 0; p < width; p += 2) {
    out[outOffset + p] = Math.hypot(d[offset + p] as number, d[offset + p + 1] as number);
    out[outOffset + p + 1] = 0;
  }
}

/** |D| of a sampled drive at every grid point, computed once per sampled drive (every wiring on the grid shares it). */
const sampledMagnitudeCache = new WeakMap<Float64Array, Float64Array>();

function magnitudesOfSampled(sampled: Float64Array, width: number): Float64Array {
  let known = sampledMagnitudeCache.get(sampled);
  if (known === undefined) {
    known = new Float64Array(sampled.length);
    for (let offset = 0; offset < sampled.length; offset += width) magnitudesOf(sampled, offset, width, known, offset);
    sampledMagnitudeCache.set(sampled, known);
  }
  return known;
}

function drivenResponseOf(prepared: PreparedCircuit, drive: CoilDrive, inputs: DrivenResponseInputs, source: TransferSource): DrivenResponse {
  const coilCount = prepared.guitar.coils.length;
  if (drive.coilCount !== coilCount) throw new RangeError(`solveDrivenResponse: the drive has ${drive.coilCount} coils, the guitar ${coilCount}`);
  const { phases, transfers, solveAt } = source;
  const used = Float64Array.from(phases, Math.abs);
  const grid = prepared.frequenciesHz;
  const sampled = inputs.sampledDrive ?? sampleCoilDrive(drive, grid);
  const width = 2 * drive.pairCount;
  // the transfers at 100 Hz, kept (the probe's buffers are reused by every later solve)
  const reference = solveAt(fixedProbeAt(prepared, REFERENCE_FREQUENCY_HZ), probeTransfers(prepared)).map((transfer) => Float64Array.from(transfer));
  const referenceAbsolute = reference.map((transfer) => Float64Array.of(Math.hypot(transfer[0] as number, transfer[1] as number), 0));
  const driveHere = new Float64Array(width);
  const magnitudes = new Float64Array(width);
  let referenceCancelled = false;
  // The denominator at D (`d` from `offset`), |D| per pair given (`absolute` from `absoluteOffset`) for the cancellation test.
  const denominatorWith = (d: Float64Array, offset: number, absolute: Float64Array, absoluteOffset: number): number => {
    const value = drivenPowerAt(reference, 0, phases, d, offset);
    if (!(value > REFERENCE_CANCELLED_FRACTION * drivenPowerAt(referenceAbsolute, 0, used, absolute, absoluteOffset))) referenceCancelled = true;
    return value;
  };
  const denominator = (d: Float64Array, offset: number): number => {
    magnitudesOf(d, offset, width, magnitudes, 0);
    return denominatorWith(d, offset, magnitudes, 0);
  };
  const sampledMagnitudes = magnitudesOfSampled(sampled, width);
  const values = new Float64Array(grid.length);
  for (let k = 0; k < grid.length; k += 1) {
    const below = denominatorWith(sampled, k * width, sampledMagnitudes, k * width);
    values[k] = below > 0 ? Math.sqrt(drivenPowerAt(transfers, k, phases, sampled, k * width) / below) : 0;
  }
  if (referenceCancelled) values.fill(0);
  return {
    values,
    referenceCancelled,
    at: (frequencyHz) => {
      if (referenceCancelled) return 0;
      const solved = solveAt(probeAt(prepared, frequencyHz), probeTransfers(prepared));
      coilDriveAt(drive, frequencyHz, driveHere);
      const below = denominator(driveHere, 0);
      return below > 0 ? Math.sqrt(drivenPowerAt(solved, 0, phases, driveHere, 0) / below) : 0;
    },
    uncancelledAt: (frequencyHz) => {
      const solved = solveAt(probeAt(prepared, frequencyHz), probeTransfers(prepared));
      coilDriveAt(drive, frequencyHz, driveHere);
      const below = denominator(driveHere, 0);
      // |T_i|·|D_ij|·|T_j| summed: the same form on magnitudes, every used coil's phase +1
      const absolute = solved.map((transfer) => Float64Array.of(Math.hypot(transfer[0] as number, transfer[1] as number), 0));
      return below > 0 ? Math.sqrt(drivenPowerAt(absolute, 0, used, magnitudes, 0) / below) : Number.POSITIVE_INFINITY;
    },
  };
}
