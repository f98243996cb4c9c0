/**
 * One sample as a PCM integer (wav-file.ts, sample-passes.ts).
 */

/** Half a quantisation step, for rounding half away from zero. */
const HALF = 0.5;
/** Shift that spreads a 32-bit integer's sign bit over the word (−1 or 0). */
const SIGN_SHIFT = 31;

/**
 * The arithmetic of quantizeSample, written for the sample loops: clip, scale,
 * round half away from zero. The magnitude is |x| + 0.5 truncated by `| 0`
 * (|x| < 2^31), and the sign is put back without a branch, since audio's sign
 * is the least predictable of branches: s = ((x − 1) | 0) >> 31 is −1 for
 * x < 0 (−0 included) and 0 otherwise, and (m ^ s) − s is m or −m. The same
 * integers as (x < 0 ? x − 0.5 : x + 0.5) | 0, since x − 0.5 = −(|x| + 0.5)
 * exactly for x < 0 (rounding to nearest is symmetric); twice as fast on
 * noise. A NaN sample gives 0 (and is reported by the caller).
 */
export function pcmValue(sample: number, fullScale: number): number {
  const scaled = (sample > 1 ? 1 : sample < -1 ? -1 : sample) * fullScale;
  const magnitude = (Math.abs(scaled) + HALF) | 0;
  const negative = ((scaled - 1) | 0) >> SIGN_SHIFT;
  return (magnitude ^ negative) - negative;
}
