/**
 * The ERB-number scale: the ear's frequency resolution as a ruler. One unit
 * is one equivalent rectangular bandwidth of the auditory filter at that
 * frequency, so bands one ERB wide weigh every part of the spectrum as the
 * cochlea resolves it (B. R. Glasberg, B. C. J. Moore, "Derivation of
 * auditory filter shapes from notched-noise data", Hearing Research 47,
 * 103–138, 1990, eqs. 3 and 4):
 *
 *   ERB_N(f)  = 24.7·(4.37·F + 1) Hz               F = f in kHz
 *   number(f) = 21.4·log10(4.37·F + 1)             (ERB-number, "Cams")
 *
 * 21.4 = 1000·ln(10)/(24.7·4.37) rounded, so number(f) is the integral of
 * 1/ERB_N: d(number)/df = 1/ERB_N(f).
 */

/** Glasberg & Moore (1990): bandwidth at 0 Hz, Hz. */
const ERB_AT_ZERO_HZ = 24.7;
/** Glasberg & Moore (1990): slope of the bandwidth, per kHz. */
const ERB_SLOPE_PER_KHZ = 4.37;
/** Glasberg & Moore (1990): scale factor of the ERB-number, 21.4 ≈ 1000·ln 10/(24.7·4.37). */
const ERB_NUMBER_SCALE = 21.4;
const HZ_PER_KHZ = 1000;

/** Equivalent rectangular bandwidth of the auditory filter centred on `frequencyHz`, Hz. */
export function erbBandwidthHz(frequencyHz: number): number {
  return ERB_AT_ZERO_HZ * ((ERB_SLOPE_PER_KHZ * frequencyHz) / HZ_PER_KHZ + 1);
}

/** ERB-number of `frequencyHz` (0 at 0 Hz, about 41.65 at 20 kHz). */
export function erbNumber(frequencyHz: number): number {
  return ERB_NUMBER_SCALE * Math.log10((ERB_SLOPE_PER_KHZ * frequencyHz) / HZ_PER_KHZ + 1);
}

/** The frequency, Hz, whose ERB-number is `number` (inverse of `erbNumber`). */
export function erbNumberToHz(number: number): number {
  return ((10 ** (number / ERB_NUMBER_SCALE) - 1) * HZ_PER_KHZ) / ERB_SLOPE_PER_KHZ;
}
