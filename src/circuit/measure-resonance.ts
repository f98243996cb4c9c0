/**
 * The loaded resonance of a wiring (docs/design.md, metrics), read from its
 * response as the strings drive it, R(f) (driven-response.ts):
 * - resonanceHz: the highest local maximum of R inside 20 Hz–20 kHz, every
 *   local maximum of the grid refined by exact solves before they are
 *   compared; null when R has no maximum inside the band (it only falls or
 *   only rises: the largest value sits at an end). A maximum counts only when
 *   it stands MIN_PEAK_PROMINENCE_DB above the higher of the lowest points on
 *   either side before R rises above it again (its topographic prominence):
 *   where the coils' contributions partly cancel, R is nearly flat and the
 *   drive's interpolation between its ERB-spaced points (coil-drive.ts)
 *   leaves ripples of a few thousandths of a dB, which are no resonance;
 * - peakDb: 20·log10(R(peak) / R(100 Hz)) (R(100 Hz) = 1 by construction),
 *   the peak being the resonance, or the larger end of the band when there
 *   is none;
 * - resonanceQ: resonanceHz / (f_high − f_low), f_low and f_high the −3 dB
 *   points R = R(peak)/√2 on either side (the usual half-power bandwidth
 *   definition of Q); null when either is not reached inside the band.
 *
 * A figure that does not exist is null with its reason beside it, never
 * Infinity or NaN.
 *
 * The −3 dB search starts from the refined peak, not from the best grid
 * point: a peak narrower than the grid (Q above ~30 on 200 points) has its
 * grid points below the half-power level, and a search that started from
 * them found no bandwidth (Q = Infinity).
 */
import type { Network } from '../wiring/index.js';
import { type CoilDrive, incoherentCoilDrive } from './coil-drive.js';
import { amplitudeDb } from './decibels.js';
import { type DrivenResponse, type DrivenResponseInputs, solveDrivenResponse, solveGraphDrivenResponse } from './driven-response.js';
import type { CircuitGraph } from './circuit-graph.js';
import { AUDIO_BAND_HIGH_HZ, AUDIO_BAND_LOW_HZ } from './frequency-grid.js';
import type { PreparedCircuit } from './prepare-circuit.js';

export interface ResonanceMetrics {
  readonly resonanceHz: number | null;
  /** Why resonanceHz is null; null when it is a number. */
  readonly resonanceHzReason: string | null;
  /** Null when nothing reaches the output (volume at 0) or the wiring cancels at 100 Hz. */
  readonly peakDb: number | null;
  readonly peakDbReason: string | null;
  readonly resonanceQ: number | null;
  readonly resonanceQReason: string | null;
}

/** Half power: the −3 dB points sit at R(peak)·√½. */
const HALF_POWER_AMPLITUDE = Math.SQRT1_2;
/** Golden ratio conjugate (√5 − 1)/2 for golden-section steps. */
const GOLDEN_SECTION = (Math.sqrt(5) - 1) / 2;
/** Refinement stops when steps are this small in ln f (relative frequency 1e-7). */
export const LOG_FREQUENCY_TOLERANCE = 1e-7;
/** Safety cap on refinement steps. */
const MAX_REFINEMENT_STEPS = 100;
/**
 * Below this fraction of the uncancelled sum (driven-response.ts) a wiring's
 * output counts as cancelled: double precision leaves ~1e-16 of each term,
 * so 1e-9 is far above rounding and far below any real signal.
 */
export const CANCELLED_FRACTION = 1e-9;
/**
 * Smallest prominence of a maximum of R that counts as a peak, dB: ten times
 * the drive's interpolation ripple (~0.01 dB at most on the samples) and well
 * below the ~1 dB just-noticeable level difference (from memory).
 */
export const MIN_PEAK_PROMINENCE_DB = 0.1;
/** The same as an amplitude ratio. */
export const MIN_PEAK_PROMINENCE = 10 ** (MIN_PEAK_PROMINENCE_DB / 20);

/**
 * Prominence of a maximum of `value` at grid index k, as a ratio: the value
 * over the higher of the lowest grid values on each side before R rises above
 * the value again (or the band ends, `first`/`last`).
 */
function gridProminence(values: Float64Array, k: number, value: number, first: number, last: number): number {
  const side = (step: 1 | -1): number => {
    let lowest = value;
    for (let j = k + step; j >= first && j <= last; j += step) {
      const here = values[j] as number;
      if (here > value) break;
      if (here < lowest) lowest = here;
    }
    return lowest;
  };
  return value / Math.max(side(-1), side(1));
}

export const SILENT_REASON = 'the volume at 0 shorts the output: nothing reaches the amplifier';
export const CANCELLED_REASON = 'the coils cancel: their signals are equal and opposite at the output';
const NO_PEAK_REASON = 'no peak inside 20 Hz–20 kHz: the response only falls or only rises there';
const REFERENCE_CANCELLED_REASON = 'the coils cancel at 100 Hz, the reference of the response';
const NO_LOW_REASON = 'the response does not fall 3 dB below the peak between 20 Hz and the peak';
const NO_HIGH_REASON = 'the response does not fall 3 dB below the peak between the peak and 20 kHz';

export const SILENT_RESONANCE: ResonanceMetrics = Object.freeze({
  resonanceHz: null,
  resonanceHzReason: SILENT_REASON,
  peakDb: null,
  peakDbReason: SILENT_REASON,
  resonanceQ: null,
  resonanceQReason: SILENT_REASON,
});

const CANCELLED: ResonanceMetrics = Object.freeze({
  resonanceHz: null,
  resonanceHzReason: CANCELLED_REASON,
  peakDb: null,
  peakDbReason: CANCELLED_REASON,
  resonanceQ: null,
  resonanceQReason: CANCELLED_REASON,
});

const REFERENCE_CANCELLED: ResonanceMetrics = Object.freeze({
  resonanceHz: null,
  resonanceHzReason: REFERENCE_CANCELLED_REASON,
  peakDb: null,
  peakDbReason: REFERENCE_CANCELLED_REASON,
  resonanceQ: null,
  resonanceQReason: REFERENCE_CANCELLED_REASON,
});

interface Point {
  readonly hz: number;
  readonly value: number;
}

/**
 * Maximum of R between grid points: successive parabolic interpolation on
 * ln f (the vertex of the parabola through three points, x* = x1 − ½·N/D with
 * N = (x1−x0)²(y1−y2) − (x1−x2)²(y1−y0), D = (x1−x0)(y1−y2) − (x1−x2)(y1−y0);
 * Press et al., Numerical Recipes, 3rd ed., §10.3), falling back to a
 * golden-section step when the vertex leaves the bracket. Starts from a grid
 * maximum and its two neighbours.
 */
function refinePeak(response: Pick<DrivenResponse, 'at'>, points: readonly [number, number, number], values: readonly [number, number, number]): Point {
  let [x0, x1, x2] = points.map(Math.log) as [number, number, number];
  let [y0, y1, y2] = values;
  for (let step = 0; step < MAX_REFINEMENT_STEPS; step += 1) {
    const n = (x1 - x0) ** 2 * (y1 - y2) - (x1 - x2) ** 2 * (y1 - y0);
    const d = (x1 - x0) * (y1 - y2) - (x1 - x2) * (y1 - y0);
    let x = d !== 0 ? x1 - n / (2 * d) : Number.NaN;
    const inside = x > x0 && x < x2 && Number.isFinite(x);
    if (inside && Math.abs(x - x1) < LOG_FREQUENCY_TOLERANCE) break;
    if (!inside || Math.abs(x - x1) < LOG_FREQUENCY_TOLERANCE) {
      // golden-section step into the wider side
      x = x2 - x1 > x1 - x0 ? x1 + (1 - GOLDEN_SECTION) * (x2 - x1) : x1 - (1 - GOLDEN_SECTION) * (x1 - x0);
    }
    const y = response.at(Math.exp(x));
    if (y >= y1) {
      // the new point is the best: its neighbours are x1 and the bracket end on its side
      if (x > x1) {
        x0 = x1;
        y0 = y1;
      } else {
        x2 = x1;
        y2 = y1;
      }
      x1 = x;
      y1 = y;
    } else if (x > x1) {
      x2 = x;
      y2 = y;
    } else {
      x0 = x;
      y0 = y;
    }
    if (x2 - x0 < 2 * LOG_FREQUENCY_TOLERANCE) break;
  }
  return { hz: Math.exp(x1), value: y1 };
}

/** Where R crosses `target` between `inside` (R above target) and `outside` (R at or below): Illinois regula falsi on ln f. */
function refineCrossing(response: DrivenResponse, inside: Point, outside: Point, target: number): number {
  let a = Math.log(inside.hz);
  let b = Math.log(outside.hz);
  let fa = inside.value - target;
  let fb = outside.value - target;
  let side = 0;
  for (let step = 0; step < MAX_REFINEMENT_STEPS && Math.abs(b - a) > LOG_FREQUENCY_TOLERANCE; step += 1) {
    const x = (a * fb - b * fa) / (fb - fa);
    const fx = response.at(Math.exp(x)) - target;
    if (fx === 0) return Math.exp(x);
    if (fx > 0) {
      a = x;
      fa = fx;
      if (side === 1) fb /= 2; // Illinois step: halve the stale end
      side = 1;
    } else {
      b = x;
      fb = fx;
      if (side === -1) fa /= 2;
      side = -1;
    }
  }
  return Math.exp((a + b) / 2);
}

/**
 * The −3 dB point on one side of `peak`: walk the grid away from the peak
 * (`step` −1 or +1, starting at grid index `start`) until R falls to the
 * target, then refine between the last point above and the first at or
 * below. A dip between grid points (a local minimum of the grid still above
 * the target: a notch of an out-of-phase wiring can be narrower than the
 * grid) is refined too, and counts when its bottom falls below the target.
 */
function halfPowerPoint(response: DrivenResponse, grid: Float64Array, peak: Point, start: number, end: number, step: 1 | -1, target: number): number | null {
  let inside = peak;
  const values = response.values;
  const negated = { at: (frequencyHz: number) => -response.at(frequencyHz) };
  for (let k = start; step < 0 ? k >= end : k <= end; k += step) {
    const point = { hz: grid[k] as number, value: values[k] as number };
    if (point.value <= target) return refineCrossing(response, inside, point, target);
    const next = k + step;
    if (next >= 0 && next < grid.length && point.value < inside.value && point.value <= (values[next] as number)) {
      // a local minimum of the grid: refine it (a maximum of −R) and see whether it reaches the target
      const around = step < 0 ? [next, k, k - step] : [k - step, k, next];
      const hz = around.map((index) => (index === k - step ? inside.hz : (grid[index] as number))) as [number, number, number];
      const at = around.map((index) => -(index === k - step ? inside.value : (values[index] as number))) as [number, number, number];
      if (hz[0] < hz[1] && hz[1] < hz[2]) {
        const bottom = refinePeak(negated, hz, at);
        if (-bottom.value <= target) return refineCrossing(response, inside, { hz: bottom.hz, value: -bottom.value }, target);
      }
    }
    inside = point;
  }
  return null;
}

/** Options of `measureResonance`: the drive (default D = I, the power sum) and what is already solved. */
export interface ResonanceInputs extends DrivenResponseInputs {
  readonly drive?: CoilDrive;
}

/** Resonance metrics of `network` on `prepared`'s grid, refined between grid points. */
export function measureResonance(prepared: PreparedCircuit, network: Network, inputs: ResonanceInputs = {}): ResonanceMetrics {
  if (prepared.load.silent) return SILENT_RESONANCE;
  const drive = inputs.drive ?? incoherentCoilDrive(prepared.guitar.coils.length);
  return resonanceOf(prepared, () => solveDrivenResponse(prepared, network, drive, inputs));
}

/** The same for any connection of coil leads (nodal analysis); `inputs.inPhaseTransfers` are the graph's own transfers. */
export function measureGraphResonance(prepared: PreparedCircuit, graph: CircuitGraph, inputs: ResonanceInputs = {}): ResonanceMetrics {
  if (prepared.load.silent) return SILENT_RESONANCE;
  const drive = inputs.drive ?? incoherentCoilDrive(prepared.guitar.coils.length);
  return resonanceOf(prepared, () => solveGraphDrivenResponse(prepared, graph, drive, inputs));
}

function resonanceOf(prepared: PreparedCircuit, solveResponse: () => DrivenResponse): ResonanceMetrics {
  const grid = prepared.frequenciesHz;
  let first = -1;
  let last = -1;
  for (let k = 0; k < grid.length; k += 1) {
    const f = grid[k] as number;
    if (f >= AUDIO_BAND_LOW_HZ && f <= AUDIO_BAND_HIGH_HZ) {
      if (first < 0) first = k;
      last = k;
    }
  }
  if (first < 0 || last - first < 2) throw new RangeError('measureResonance: the grid needs at least 3 points within 20 Hz–20 kHz');
  const response = solveResponse();
  const values = response.values;

  let best: Point | null = null;
  let bestIndex = -1;
  let largest = first;
  for (let k = first; k <= last; k += 1) {
    const value = values[k] as number;
    if (value > (values[largest] as number)) largest = k;
    // every local maximum of the grid (a plateau counts once, at its first point), refined
    if (k > first && k < last && value > (values[k - 1] as number) && value >= (values[k + 1] as number)) {
      const peak = refinePeak(response, [grid[k - 1] as number, grid[k] as number, grid[k + 1] as number], [values[k - 1] as number, value, values[k + 1] as number]);
      const refined = peak.value >= value ? peak : { hz: grid[k] as number, value };
      if ((best === null || refined.value > best.value) && gridProminence(values, k, refined.value, first, last) >= MIN_PEAK_PROMINENCE) {
        best = refined;
        bestIndex = k;
      }
    }
  }
  if (response.referenceCancelled) return REFERENCE_CANCELLED;
  const top = best ?? { hz: grid[largest] as number, value: values[largest] as number };
  if (!(top.value > CANCELLED_FRACTION * response.uncancelledAt(top.hz))) return CANCELLED;
  // R(100 Hz) = 1 by construction (driven-response.ts)
  const peakDb = amplitudeDb(top.value);
  const peakDbReason = null;
  if (best === null) {
    return { resonanceHz: null, resonanceHzReason: NO_PEAK_REASON, peakDb, peakDbReason, resonanceQ: null, resonanceQReason: NO_PEAK_REASON };
  }
  const target = best.value * HALF_POWER_AMPLITUDE;
  // grid points strictly below and above the refined peak
  const below = (grid[bestIndex] as number) < best.hz ? bestIndex : bestIndex - 1;
  const above = (grid[bestIndex] as number) > best.hz ? bestIndex : bestIndex + 1;
  const lowHz = halfPowerPoint(response, grid, best, below, first, -1, target);
  const highHz = halfPowerPoint(response, grid, best, above, last, 1, target);
  let resonanceQ: number | null = null;
  let resonanceQReason: string | null = null;
  if (lowHz === null) resonanceQReason = NO_LOW_REASON;
  else if (highHz === null) resonanceQReason = NO_HIGH_REASON;
  else resonanceQ = best.hz / (highHz - lowHz);
  if (resonanceQ !== null && !(Number.isFinite(resonanceQ) && resonanceQ > 0)) {
    // lowHz ≤ peak ≤ highHz by construction; a zero width would need R(peak) = 0, excluded above
    resonanceQ = null;
    resonanceQReason = 'the −3 dB points could not be told apart from the peak';
  }
  return { resonanceHz: best.hz, resonanceHzReason: null, peakDb, peakDbReason, resonanceQ, resonanceQReason };
}
