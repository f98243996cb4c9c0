/**
 * The loaded resonance of a wiring (docs/design.md, metrics), from the power sum
 * P(f) = √(Σ_i |T_i(f)|²):
 * - resonanceHz: where P is largest within 20 Hz–20 kHz; null when that
 *   maximum sits at an end of the band;
 * - peakDb: 20·log10(P(peak) / P(100 Hz));
 * - resonanceQ: resonanceHz / (f_high − f_low), f_low and f_high the −3 dB
 *   points P = P(peak)/√2 on either side (the usual half-power bandwidth
 *   definition of Q); null when either is not reached inside the band.
 *
 * The grid locates the peak; parabolic interpolation and regula falsi then
 * refine it with exact solves between grid points (so the figures do not
 * depend on the grid spacing).
 */
import type { Network } from '../wiring/index.js';
import { amplitudeDb } from './decibels.js';
import { AUDIO_BAND_HIGH_HZ, AUDIO_BAND_LOW_HZ, REFERENCE_FREQUENCY_HZ } from './frequency-grid.js';
import { powerSumAt, solvePowerSumAt, solvePowerSumAtFixed } from './power-sum.js';
import type { PreparedCircuit } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

export interface ResonanceMetrics {
  readonly resonanceHz: number | null;
  /** Null only when nothing reaches the output (volume at 0). */
  readonly peakDb: number | null;
  readonly resonanceQ: number | null;
}

/** Half power: the −3 dB points sit at P(peak)·√½. */
const HALF_POWER_AMPLITUDE = Math.SQRT1_2;
/** Golden ratio conjugate (√5 − 1)/2 for golden-section steps. */
const GOLDEN_SECTION = (Math.sqrt(5) - 1) / 2;
/** Refinement stops when steps are this small in ln f (relative frequency 1e-6). */
const LOG_FREQUENCY_TOLERANCE = 1e-6;
/** Safety cap on refinement steps. */
const MAX_REFINEMENT_STEPS = 100;

const SILENT: ResonanceMetrics = Object.freeze({ resonanceHz: null, peakDb: null, resonanceQ: null });

/**
 * Maximum of P between grid points: successive parabolic interpolation on
 * ln f (the vertex of the parabola through three points, x* = x1 − ½·N/D with
 * N = (x1−x0)²(y1−y2) − (x1−x2)²(y1−y0), D = (x1−x0)(y1−y2) − (x1−x2)(y1−y0);
 * Press et al., Numerical Recipes, 3rd ed., §10.3), falling back to a
 * golden-section step when the vertex leaves the bracket. Starts from the
 * grid's best point and its two neighbours.
 */
function refinePeak(
  prepared: PreparedCircuit,
  network: Network,
  points: readonly [number, number, number],
  values: readonly [number, number, number],
): { hz: number; value: number } {
  let [x0, x1, x2] = points.map(Math.log) as [number, number, number];
  let [y0, y1, y2] = values;
  for (let step = 0; step < MAX_REFINEMENT_STEPS; step += 1) {
    const n = (x1 - x0) ** 2 * (y1 - y2) - (x1 - x2) ** 2 * (y1 - y0);
    const d = (x1 - x0) * (y1 - y2) - (x1 - x2) * (y1 - y0);
    let x = d !== 0 ? x1 - n / (2 * d) : Number.NaN;
    const inside = x > x0 && x < x2 && Number.isFinite(x);
    if (!inside || Math.abs(x - x1) < LOG_FREQUENCY_TOLERANCE) {
      if (inside || x2 - x0 < 2 * LOG_FREQUENCY_TOLERANCE) break;
    }
    if (!inside) {
      // golden-section step into the wider side
      x = x2 - x1 > x1 - x0 ? x1 + (1 - GOLDEN_SECTION) * (x2 - x1) : x1 - (1 - GOLDEN_SECTION) * (x1 - x0);
    }
    const y = solvePowerSumAt(prepared, network, Math.exp(x));
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

/** Where P crosses `target` between `insideHz` (P above target) and `outsideHz` (P at or below): Illinois regula falsi on ln f. */
function refineCrossing(
  prepared: PreparedCircuit,
  network: Network,
  insideHz: number,
  insideValue: number,
  outsideHz: number,
  outsideValue: number,
  target: number,
): number {
  let a = Math.log(insideHz);
  let b = Math.log(outsideHz);
  let fa = insideValue - target;
  let fb = outsideValue - target;
  let side = 0;
  for (let step = 0; step < MAX_REFINEMENT_STEPS && Math.abs(b - a) > LOG_FREQUENCY_TOLERANCE; step += 1) {
    const x = (a * fb - b * fa) / (fb - fa);
    const fx = solvePowerSumAt(prepared, network, Math.exp(x)) - target;
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
 * Resonance metrics of `network` on `prepared`'s grid, refined between grid
 * points. `transfers` may be passed when already solved on the grid.
 */
export function measureResonance(
  prepared: PreparedCircuit,
  network: Network,
  transfers?: readonly Float64Array[],
): ResonanceMetrics {
  if (prepared.load.silent) return SILENT;
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
  const solved = transfers ?? solveTransfers(prepared, network);
  let best = first;
  let bestValue = -1;
  for (let k = first; k <= last; k += 1) {
    const value = powerSumAt(solved, k);
    if (value > bestValue) {
      bestValue = value;
      best = k;
    }
  }
  const reference = solvePowerSumAtFixed(prepared, network, REFERENCE_FREQUENCY_HZ);
  const toDb = (value: number): number => amplitudeDb(value / reference);
  if (best === first || best === last) {
    return { resonanceHz: null, peakDb: toDb(bestValue), resonanceQ: null };
  }
  const peak = refinePeak(
    prepared,
    network,
    [grid[best - 1] as number, grid[best] as number, grid[best + 1] as number],
    [powerSumAt(solved, best - 1), bestValue, powerSumAt(solved, best + 1)],
  );
  const peakValue = Math.max(peak.value, bestValue);
  const target = peakValue * HALF_POWER_AMPLITUDE;
  // The half-power crossings are searched outward from the refined peak itself: a sharp resonance can stand
  // far above the grid points beside it, so that even the best grid point is already below half power, and a
  // bracket starting there would have both ends below the target (no crossing, NaN).
  const peakHz = peak.value >= bestValue ? peak.hz : (grid[best] as number);
  const peakAt = peak.value >= bestValue ? peak.value : bestValue;
  let lowHz: number | null = null;
  let insideHz = peakHz;
  let insideValue = peakAt;
  for (let k = best; k >= first; k -= 1) {
    const f = grid[k] as number;
    if (f >= peakHz) continue;
    const value = powerSumAt(solved, k);
    if (value <= target) {
      lowHz = refineCrossing(prepared, network, insideHz, insideValue, f, value, target);
      break;
    }
    insideHz = f;
    insideValue = value;
  }
  let highHz: number | null = null;
  insideHz = peakHz;
  insideValue = peakAt;
  for (let k = best; k <= last; k += 1) {
    const f = grid[k] as number;
    if (f <= peakHz) continue;
    const value = powerSumAt(solved, k);
    if (value <= target) {
      highHz = refineCrossing(prepared, network, insideHz, insideValue, f, value, target);
      break;
    }
    insideHz = f;
    insideValue = value;
  }
  const resonanceQ = lowHz !== null && highHz !== null ? peak.hz / (highHz - lowHz) : null;
  return { resonanceHz: peak.hz, peakDb: toDb(peakValue), resonanceQ };
}
