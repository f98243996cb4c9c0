/**
 * The drive stage's transfer curve: an asymmetric soft clipper,
 *
 *   y(u) = tanh(u + b) − tanh(b)
 *
 * u the driven signal (input volts × drive gain), b a small bias. tanh is the
 * usual smooth saturating curve of overdrive models (common practice; e.g.
 * U. Zölzer (ed.), DAFX: Digital Audio Effects, 2nd ed., Wiley 2011, ch. 4,
 * "Nonlinear processing"). The bias shifts the operating point the way an
 * amplifier stage biased off-centre clips one polarity before the other
 * (common practice), which adds even harmonics; y(0) = 0, so silence stays
 * silent, and the slope at rest is y'(0) = 1 − tanh²(b). The curve saturates
 * at +1 − tanh(b) and −1 − tanh(b): the stage never puts out more than about
 * ±1.15, whatever goes in — that is the drive chain's internal headroom.
 *
 * A WaveShaperNode reads its curve over inputs −1…+1 (and holds the end
 * values beyond), so the curve is tabulated over u ∈ [−span, +span] and the
 * chain scales its input by 1/span first. tanh(6) = 1 − 1.2·10⁻⁵, so clamping
 * beyond ±6 changes nothing audible.
 */

/** Bias b of the soft clipper, in units of u (our choice: tanh(0.15) ≈ 0.149, peaks of one polarity about 3 dB lower than the other). */
export const DRIVE_BIAS = 0.15;
/** Half-width of the tabulated input range, in units of u (tanh is within 1.2·10⁻⁵ of its limit beyond). */
export const DRIVE_CURVE_SPAN = 6;
/** Number of curve points: odd, so u = 0 falls on a point (y = 0 exactly); linear interpolation error below 10⁻⁶. */
export const DRIVE_CURVE_POINTS = 4097;

/** The soft clipper y(u) = tanh(u + b) − tanh(b). */
export function shapeDrive(u: number): number {
  return Math.tanh(u + DRIVE_BIAS) - Math.tanh(DRIVE_BIAS);
}

/** Slope of the soft clipper at rest, y'(0) = 1 − tanh²(b): the drive stage's small-signal gain. */
export function measureDriveSlopeAtRest(): number {
  const t = Math.tanh(DRIVE_BIAS);
  return 1 - t * t;
}

/**
 * The curve for a WaveShaperNode: point i holds y(u_i), u_i = span·(2i/(N − 1) − 1),
 * so a node input x ∈ [−1, 1] maps to y(span·x).
 */
export function designDriveCurve(points = DRIVE_CURVE_POINTS, span = DRIVE_CURVE_SPAN): Float32Array<ArrayBuffer> {
  const curve = new Float32Array(points);
  const middle = (points - 1) / 2;
  for (let i = 0; i < points; i += 1) curve[i] = shapeDrive((span * (i - middle)) / middle);
  return curve;
}
