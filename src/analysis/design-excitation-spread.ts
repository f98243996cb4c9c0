/**
 * How much of each segment's energy each auditory filter passes: the
 * excitation pattern of Glasberg & Moore (1990, "Derivation of auditory filter
 * shapes from notched-noise data", Hearing Research 47, 103–138), with their
 * rounded-exponential filter roex(p):
 *
 *   W(g) = (1 + p·g)·e^(−p·g),   g = |f − f_c| / f_c,   p = 4·f_c / ERB_N(f_c)
 *
 * so the filter centred on f_c passes energy at f with weight W, and a
 * band's excitation is X_b = Σ_s W_b(f_s)·P_s. Spreading energy to the
 * neighbouring filters fills the gaps between a chord's partials, as the
 * ear's own filters do, so a weak band squeezed between two strong ones
 * does not count as a difference of its own. Simplifications: the filter
 * is symmetric and level-independent (real filters widen on the low side
 * at high levels).
 */
import type { BandLayout } from './design-bands.js';
import { erbBandwidthHz } from './erb-scale.js';

/** Glasberg & Moore (1990): ERB = 4·f_c/p for roex(p), so p = 4·f_c/ERB. */
const ROEX_ERB_FACTOR = 4;
/** Weights below this are left out (−70 dB: far under any difference that counts; our choice). */
const NEGLIGIBLE_WEIGHT = 1e-7;

export interface ExcitationSpread {
  readonly bandCount: number;
  /** W for segment s and band b at s·bandCount + b (0 for outer segments and negligible weights). */
  readonly weights: Float64Array;
  /** First and last band each segment reaches (last < first for none). */
  readonly first: Int32Array;
  readonly last: Int32Array;
}

/** roex(p) weight of the filter centred on `centreHz` at `frequencyHz`. */
export function roexWeight(centreHz: number, frequencyHz: number): number {
  const p = (ROEX_ERB_FACTOR * centreHz) / erbBandwidthHz(centreHz);
  const pg = (p * Math.abs(frequencyHz - centreHz)) / centreHz;
  return (1 + pg) * Math.exp(-pg);
}

/** The roex weights from every segment inside the band range to every band's filter. */
export function designExcitationSpread(layout: BandLayout): ExcitationSpread {
  const bandCount = layout.bands.length;
  const segmentCount = layout.segments.length;
  const weights = new Float64Array(segmentCount * bandCount);
  const first = new Int32Array(segmentCount).fill(0);
  const last = new Int32Array(segmentCount).fill(-1);
  layout.segments.forEach((segment, s) => {
    if (segment.band < 0) return;
    let low = bandCount;
    let high = -1;
    layout.bands.forEach((band, b) => {
      const weight = roexWeight(band.centreHz, segment.frequencyHz);
      if (weight < NEGLIGIBLE_WEIGHT) return;
      weights[s * bandCount + b] = weight;
      low = Math.min(low, b);
      high = Math.max(high, b);
    });
    first[s] = low;
    last[s] = high;
  });
  return { bandCount, weights, first, last };
}
