import { MIN_PEAK_PROMINENCE } from '../../src/circuit/index.js';
/**
 * The reference reading of a sampled response for the resonance checks: its
 * highest interior local maximum, the vertex of the parabola through it and
 * its neighbours on ln f (Press et al., Numerical Recipes, 3rd ed., §10.3),
 * and the −3 dB points by linear interpolation in ln f between samples.
 * Meant for dense sweeps, where the interpolation error is far inside the
 * checks' tolerances. A maximum counts only with the prominence
 * measureResonance requires (MIN_PEAK_PROMINENCE, measure-resonance.ts).
 */
export interface DensePeak {
  readonly peakHz: number | null;
  readonly q: number | null;
}

export function readDensePeak(frequenciesHz: Float64Array, values: Float64Array, minimumProminence = MIN_PEAK_PROMINENCE): DensePeak {
  const count = frequenciesHz.length;
  let best = -1;
  for (let k = 1; k < count - 1; k += 1) {
    const value = values[k] as number;
    if (value > (values[k - 1] as number) && value >= (values[k + 1] as number) && (best < 0 || value > (values[best] as number))) {
      if (prominence(values, k) >= minimumProminence) best = k;
    }
  }
  if (best < 0) return { peakHz: null, q: null };
  const [x0, x1, x2] = [best - 1, best, best + 1].map((k) => Math.log(frequenciesHz[k] as number)) as [number, number, number];
  const [y0, y1, y2] = [values[best - 1], values[best], values[best + 1]] as [number, number, number];
  const n = (x1 - x0) ** 2 * (y1 - y2) - (x1 - x2) ** 2 * (y1 - y0);
  const d = (x1 - x0) * (y1 - y2) - (x1 - x2) * (y1 - y0);
  const peakHz = d !== 0 ? Math.exp(x1 - n / (2 * d)) : Math.exp(x1);
  const target = (values[best] as number) * Math.SQRT1_2;
  const crossing = (step: 1 | -1): number | null => {
    for (let k = best; k + step >= 0 && k + step < count; k += step) {
      const a = values[k] as number;
      const b = values[k + step] as number;
      if (b <= target) {
        const la = Math.log(frequenciesHz[k] as number);
        const lb = Math.log(frequenciesHz[k + step] as number);
        return Math.exp(la + ((a - target) / (a - b)) * (lb - la));
      }
    }
    return null;
  };
  const low = crossing(-1);
  const high = crossing(1);
  return { peakHz, q: low !== null && high !== null ? peakHz / (high - low) : null };
}

/**
 * Topographic prominence of the maximum at k, as a ratio: its value over the
 * higher of the lowest values on each side before R rises above it again (or
 * the band ends).
 */
export function prominence(values: ArrayLike<number>, k: number): number {
  const peak = values[k] as number;
  const side = (step: 1 | -1): number => {
    let lowest = peak;
    for (let j = k + step; j >= 0 && j < values.length; j += step) {
      const value = values[j] as number;
      if (value > peak) break;
      lowest = Math.min(lowest, value);
    }
    return lowest;
  };
  return peak / Math.max(side(-1), side(1));
}
