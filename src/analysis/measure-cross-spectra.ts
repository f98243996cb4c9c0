/**
 * Band-summed cross-spectra of the coils' EMFs: everything about the strings
 * and pickups that a wiring's band energies need, computed once per guitar
 * and phrase.
 *
 * A wiring's output spectrum is Y(f) = Σ_i T_i(f)·E_i(f) (docs/design.md, data
 * flow), so its energy in a segment s of bins is
 *
 *   P_s = Σ_{k∈s} w_k·|Σ_i T_i(f_k)·E_i(f_k)|²
 *       ≈ Σ_i Σ_j T_i(f_s)·conj(T_j(f_s))·C_ij,s,   C_ij,s = Σ_{k∈s} w_k·E_i(f_k)·conj(E_j(f_k))
 *
 * exact when the transfers do not change across the segment; the circuit is
 * smooth on that scale (an eighth of an ERB by default), the strings'
 * spectra are not, which is why they are summed bin by bin here.
 *
 * w_k are Parseval's weights for a half spectrum of an N-point transform:
 * Σ_n y[n]² = (1/N)·Σ_{k=0}^{N−1} |Y_k|² (Oppenheim & Schafer, Discrete-Time
 * Signal Processing, §8.5), so w_0 = w_{N/2} = 1/N and w_k = 2/N otherwise,
 * and P summed over every segment is the energy of the rendered output.
 * M_ij,s = Σ_{k∈s} w_k·f_k·E_i·conj(E_j) is the first moment, for the
 * power-weighted centroid.
 */
import type { BandLayout } from './design-bands.js';

export interface CrossSpectra {
  readonly coilCount: number;
  /** Coil pairs (i ≤ j), in the order (0,0), (0,1), …, (0,n−1), (1,1), … */
  readonly pairCount: number;
  readonly segmentCount: number;
  /** C per segment and pair, interleaved complex: index 2·(s·pairCount + pair). */
  readonly energy: Float64Array;
  /** M per segment and pair, same layout, in Hz × energy. */
  readonly moment: Float64Array;
}

/** Index of pair (i, j), i ≤ j, among n coils. */
export function pairIndex(i: number, j: number, coilCount: number): number {
  return i * coilCount - (i * (i - 1)) / 2 + (j - i);
}

/**
 * Sum the coils' half spectra (realFft layout for an N = fftSize transform,
 * one per coil) into the layout's segments. All spectra must have the same
 * length 2·(N/2 + 1).
 */
export function measureCrossSpectra(coilSpectra: readonly Float64Array[], fftSize: number, layout: BandLayout): CrossSpectra {
  const coilCount = coilSpectra.length;
  const bins = fftSize / 2 + 1;
  for (const spectrum of coilSpectra) {
    if (spectrum.length !== 2 * bins) throw new RangeError(`measureCrossSpectra: each spectrum must hold ${2 * bins} numbers, got ${spectrum.length}`);
  }
  const pairCount = (coilCount * (coilCount + 1)) / 2;
  const segments = layout.segments;
  const energy = new Float64Array(2 * segments.length * pairCount);
  const moment = new Float64Array(2 * segments.length * pairCount);
  const binHz = layout.sampleRateHz / fftSize;
  const re = new Float64Array(coilCount);
  const im = new Float64Array(coilCount);
  // The segment's upper edge in a local: the loop's first call runs in V8's interpreter, where a property read
  // costs as much as the arithmetic (DEVELOPERS.md, "Code the interpreter runs").
  const lastSegment = segments.length - 1;
  let segment = 0;
  let segmentHighHz = (segments[0] as { highHz: number } | undefined)?.highHz ?? Number.POSITIVE_INFINITY;
  for (let k = 0; k < bins; k += 1) {
    const frequencyHz = k * binHz;
    while (segment < lastSegment && frequencyHz >= segmentHighHz) {
      segment += 1;
      segmentHighHz = (segments[segment] as { highHz: number }).highHz;
    }
    const weight = (k === 0 || k === bins - 1 ? 1 : 2) / fftSize;
    const weightedFrequency = weight * frequencyHz;
    for (let c = 0; c < coilCount; c += 1) {
      const spectrum = coilSpectra[c] as Float64Array;
      re[c] = spectrum[2 * k] as number;
      im[c] = spectrum[2 * k + 1] as number;
    }
    let at = 2 * segment * pairCount;
    for (let i = 0; i < coilCount; i += 1) {
      const ar = re[i] as number;
      const ai = im[i] as number;
      for (let j = i; j < coilCount; j += 1) {
        const br = re[j] as number;
        const bi = im[j] as number;
        // E_i·conj(E_j) = (ar + j·ai)(br − j·bi)
        const pr = ar * br + ai * bi;
        const pi = ai * br - ar * bi;
        energy[at] = (energy[at] as number) + weight * pr;
        energy[at + 1] = (energy[at + 1] as number) + weight * pi;
        moment[at] = (moment[at] as number) + weightedFrequency * pr;
        moment[at + 1] = (moment[at + 1] as number) + weightedFrequency * pi;
        at += 2;
      }
    }
  }
  return { coilCount, pairCount, segmentCount: segments.length, energy, moment };
}
