/**
 * The string's loop filter for brightness: Jaffe and Smith's one-zero
 * damping ("decay stretching") filter, Hd(z) = (1 − S) + S·z⁻¹, S ∈ [0, ½]
 * (Jaffe & Smith 1983; Smith, PASP, "One-Zero String Damping Filter").
 * S = ½ is the two-point average of plain Karplus–Strong (the darkest,
 * highs die fastest); S = 0 is no filter (every harmonic decays alike).
 *
 * Its gain is 1 at DC, so the overall decay is set apart by the loop gain ρ.
 */

/** S of the darkest setting: the two-point average of plain Karplus–Strong (Karplus & Strong 1983). */
export const PLAIN_KARPLUS_STRONG_STRETCH = 0.5;

/** Stretch factor S for a brightness in [0, 1]: brightness 0 → S = ½ (plain Karplus–Strong), 1 → S = 0 (no high-frequency loss). */
export function stretchForBrightness(brightness: number): number {
  return PLAIN_KARPLUS_STRONG_STRETCH * (1 - brightness);
}

/**
 * |Hd(e^{jω})| = sqrt((1 − S)² + S² + 2S(1 − S)·cos ω) (Smith, PASP, "One-Zero
 * String Damping Filter"); ω in radians per sample.
 */
export function dampingFilterGain(stretch: number, omega: number): number {
  const a = 1 - stretch;
  return Math.sqrt(a * a + stretch * stretch + 2 * stretch * a * Math.cos(omega));
}

/**
 * Phase delay of Hd in samples at ω: τ = atan2(S·sin ω, (1 − S) + S·cos ω) / ω
 * (from arg Hd(e^{jω}) = −atan2(S·sin ω, 1 − S + S·cos ω), derived); S at DC.
 */
export function dampingFilterPhaseDelay(stretch: number, omega: number): number {
  if (omega === 0) return stretch;
  return Math.atan2(stretch * Math.sin(omega), 1 - stretch + stretch * Math.cos(omega)) / omega;
}
