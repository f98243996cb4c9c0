/**
 * How the reference phrase drives the guitar's coils, for the circuit's
 * resonance figures (src/circuit/coil-drive.ts): the coils' EMF
 * cross-spectra of the phrase (measure-spectral-basis.ts), smoothed with a
 * sliding Hann window one ERB wide at half height (Glasberg & Moore 1990,
 * erb-scale.ts) and normalised to the mean coil signal:
 *
 *   D_ij(f_s) = S_ij(f_s) / ((1/n)·Σ_i S_ii(f_s)),   S_ij(f_s) = Σ_t w(t)·C_ij,s+t
 *
 * with C the band cross-spectra (measure-cross-spectra.ts), at each segment
 * centre f_s inside the band spectrum's range. One ERB is the ear's
 * resolution; it also spans several partials of the strings above a few
 * hundred hertz, so D describes how correlated the coils' signals are, not
 * where single partials fall. A window where the strings put nothing (below
 * EMPTY_FRACTION of the strongest) takes D from its nearest neighbour that
 * has signal.
 */
import { type CoilDrive, drivePairIndex, incoherentCoilDrive } from '../circuit/index.js';
import type { SpectralBasis } from './measure-spectral-basis.js';

/** Width at half height of the Hann window D is smoothed with, in ERB: one auditory filter (Glasberg & Moore 1990). */
export const SMOOTHING_ERB = 1;

/** A window with less than this fraction of the strongest window's mean coil power has no signal to correlate (rounding level, far below any partial). */
const EMPTY_FRACTION = 1e-15;

/** The normalised, ERB-smoothed cross-spectra of `basis` as a circuit drive. */
export function measureCoilDrive(basis: SpectralBasis): CoilDrive {
  const { layout, cross } = basis;
  const { coilCount, pairCount } = cross;
  const inBand: number[] = [];
  layout.segments.forEach((segment, s) => {
    if (segment.band >= 0) inBand.push(s);
  });
  // Hann weights w(t) = ½ + ½·cos(π·t/(H + 1)), |t| ≤ H segments, H one smoothing width: half height at ±½ width
  const segmentsPerErb = layout.options.segmentsPerBand / layout.options.bandwidthErb;
  const half = Math.max(1, Math.round(SMOOTHING_ERB * segmentsPerErb));
  const weights = Float64Array.from({ length: 2 * half + 1 }, (_, t) => 0.5 + 0.5 * Math.cos((Math.PI * (t - half)) / (half + 1)));
  const count = inBand.length;
  if (count === 0) return incoherentCoilDrive(coilCount);
  const width = 2 * pairCount;
  const sums = new Float64Array(width * count);
  const meanPower = new Float64Array(count);
  for (let w = 0; w < count; w += 1) {
    for (let v = Math.max(0, w - half); v <= Math.min(count - 1, w + half); v += 1) {
      const s = inBand[v] as number;
      const weight = weights[v - w + half] as number;
      for (let p = 0; p < width; p += 1) sums[w * width + p] = (sums[w * width + p] as number) + weight * (cross.energy[s * width + p] as number);
    }
    let diagonal = 0;
    for (let i = 0; i < coilCount; i += 1) diagonal += sums[w * width + 2 * drivePairIndex(i, i, coilCount)] as number;
    meanPower[w] = diagonal / coilCount;
  }
  let strongest = 0;
  for (const power of meanPower) strongest = Math.max(strongest, power);
  if (!(strongest > 0)) return incoherentCoilDrive(coilCount);
  const usable = (w: number): boolean => (meanPower[w] as number) > EMPTY_FRACTION * strongest;
  const out = new Float64Array(width * count);
  for (let w = 0; w < count; w += 1) {
    let source = w;
    for (let distance = 1; !usable(source); distance += 1) {
      if (w - distance >= 0 && usable(w - distance)) source = w - distance;
      else if (w + distance < count && usable(w + distance)) source = w + distance;
    }
    const scale = 1 / (meanPower[source] as number);
    for (let p = 0; p < width; p += 1) out[w * width + p] = (sums[source * width + p] as number) * scale;
  }
  const frequenciesHz = Float64Array.from(inBand, (s) => (layout.segments[s] as { frequencyHz: number }).frequencyHz);
  return { coilCount, pairCount, frequenciesHz, cross: out };
}
