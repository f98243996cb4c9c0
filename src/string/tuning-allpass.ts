/**
 * The fractional part of the string's loop delay: a first-order allpass
 * A(z) = (η + z⁻¹) / (1 + η·z⁻¹) (Jaffe & Smith 1983; Smith, PASP,
 * "First-Order Allpass Interpolation"). Its phase delay at low frequency is
 * Δ = (1 − η)/(1 + η). Keeping Δ in about [0.1, 1.1] avoids the near
 * pole–zero cancellation as Δ → 0 (Smith, PASP).
 *
 * Rather than the low-frequency mapping, the coefficient is solved exactly
 * at the note's fundamental: the phase of A is −2·atan(((1 − η)/(1 + η))·tan(ω/2)),
 * so a phase delay Δ at ω needs η = sin((1 − Δ)·ω/2) / sin((1 + Δ)·ω/2)
 * (derived; the same closed form as Jaffe & Smith's exact tuning). At high
 * notes the low-frequency form would be off by a few hundredths of a sample,
 * a few cents at 1 kHz.
 */

/** Smallest fractional delay the tuning allpass is asked for, samples (Smith, PASP: keep Δ ≳ 0.1). */
export const MIN_ALLPASS_DELAY = 0.1;

/** Coefficient η giving phase delay `delay` samples exactly at ω (radians per sample); ω = 0 gives the low-frequency form. */
export function allpassCoefficient(delay: number, omega: number): number {
  if (omega === 0) return (1 - delay) / (1 + delay);
  return Math.sin(((1 - delay) * omega) / 2) / Math.sin(((1 + delay) * omega) / 2);
}

/** Phase delay of the allpass in samples at ω: 2·atan(((1 − η)/(1 + η))·tan(ω/2)) / ω (derived); at DC (1 − η)/(1 + η). */
export function allpassPhaseDelay(eta: number, omega: number): number {
  const ratio = (1 - eta) / (1 + eta);
  if (omega === 0) return ratio;
  return (2 * Math.atan(ratio * Math.tan(omega / 2))) / omega;
}
