/**
 * A second-order IIR section ("biquad") as plain data, and the one function
 * that runs it. Normalised so a0 = 1; the difference equation (direct form I,
 * J. O. Smith III, *Introduction to Digital Filters*, "Direct-Form I"):
 *
 *   y[n] = b0·x[n] + b1·x[n−1] + b2·x[n−2] − a1·y[n−1] − a2·y[n−2]
 *
 * Transfer function H(z) = (b0 + b1·z⁻¹ + b2·z⁻²) / (1 + a1·z⁻¹ + a2·z⁻²).
 */
export interface Biquad {
  readonly b0: number;
  readonly b1: number;
  readonly b2: number;
  readonly a1: number;
  readonly a2: number;
}

/**
 * Filter `input` through `section` from rest into `output` (same length;
 * `output` may be `input` itself: each sample is read before it is written).
 * Arithmetic in float64 whatever the arrays hold.
 */
export function applyBiquad(section: Biquad, input: ArrayLike<number>, output: Float64Array): Float64Array {
  const { b0, b1, b2, a1, a2 } = section;
  let x1 = 0;
  let x2 = 0;
  let y1 = 0;
  let y2 = 0;
  const count = Math.min(input.length, output.length);
  for (let n = 0; n < count; n += 1) {
    const x = input[n] as number;
    const y = b0 * x + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
    x2 = x1;
    x1 = x;
    y2 = y1;
    y1 = y;
    output[n] = y;
  }
  return output;
}
