/**
 * Second-order (biquad) filter sections as plain data: what a stage of the
 * effects chain is (kind, frequency, Q, gain), its coefficients and its
 * magnitude response. The chain hands the same description to a
 * BiquadFilterNode; the coefficients here are an independent computation of
 * what that node does, used for response curves and checked by the tests.
 *
 * Coefficients: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad
 * filter coefficients" (the Audio EQ Cookbook, W3C Note 2021), with the
 * conventions of the W3C Web Audio API 1.0 §BiquadFilterNode: lowpass and
 * highpass take their Q in dB on the node (Q_node = 20·log10 Q), peaking takes
 * Q as is, and both shelves use the cookbook's slope S = 1 (Q unused).
 */

/** The biquad kinds the chain uses (names as the Web Audio API spells them). */
export type BiquadKind = 'lowpass' | 'highpass' | 'peaking' | 'lowshelf' | 'highshelf';

/** One biquad section, as designed. */
export interface BiquadSpec {
  readonly kind: BiquadKind;
  /** Cutoff (lowpass, highpass), centre (peaking) or midpoint (shelves) frequency, Hz. */
  readonly frequencyHz: number;
  /** Quality factor, plain ratio (not dB), for lowpass, highpass and peaking; ignored by shelves. */
  readonly q: number;
  /** Gain in dB for peaking and shelves; ignored by lowpass and highpass. */
  readonly gainDb: number;
  /** Why the section is there, in a few words (for descriptions and docs). */
  readonly purpose: string;
}

/** Coefficients of H(z) = (b0 + b1·z⁻¹ + b2·z⁻²) / (1 + a1·z⁻¹ + a2·z⁻²), normalised so a0 = 1. */
export interface BiquadCoefficients {
  readonly b0: number;
  readonly b1: number;
  readonly b2: number;
  readonly a1: number;
  readonly a2: number;
}

/** Decibels per factor of ten in amplitude: dB = 20·log10(ratio). */
const DB_PER_DECADE_AMPLITUDE = 20;
/** Cookbook: shelf and peaking amplitude A = 10^(gainDb/40) (the square root of the linear gain). */
const COOKBOOK_GAIN_EXPONENT_DIVISOR = 40;

/** The value a BiquadFilterNode's Q parameter needs for this section (W3C Web Audio API: dB for lowpass and highpass). */
export function webAudioQ(spec: BiquadSpec): number {
  switch (spec.kind) {
    case 'lowpass':
    case 'highpass':
      return DB_PER_DECADE_AMPLITUDE * Math.log10(spec.q);
    case 'peaking':
      return spec.q;
    case 'lowshelf':
    case 'highshelf':
      return 1; // unused by shelves (slope S = 1)
  }
}

/**
 * Audio EQ Cookbook coefficients for one section at `sampleRateHz`.
 * w0 = 2π·f0/fs, A = 10^(gainDb/40), α = sin(w0)/(2Q) (lowpass, highpass,
 * peaking) or α = sin(w0)/2·√((A + 1/A)(1/S − 1) + 2) with S = 1 (shelves).
 */
export function designBiquad(spec: BiquadSpec, sampleRateHz: number): BiquadCoefficients {
  const w0 = (2 * Math.PI * spec.frequencyHz) / sampleRateHz;
  const sinW0 = Math.sin(w0);
  return cookbookSection(spec.kind, Math.cos(w0), sinW0, 10 ** (spec.gainDb / COOKBOOK_GAIN_EXPONENT_DIVISOR), sinW0 / (2 * spec.q));
}

/**
 * The cookbook's coefficients from w0's cosine and sine, the amplitude A and,
 * for lowpass, highpass and peaking, α (the shelves take α = sin(w0)/2·√2,
 * slope S = 1), each divided by a0. One arithmetic, in the order the
 * W3C Web Audio API 1.0 §BiquadFilterNode gives it (the shelves' 2·α·√A as
 * (2·α)·√A), for `designBiquad` and for the node's own values
 * (biquad-filter.ts `designNodeBiquad`, which passes the node's rounded
 * cos, sin, 10^x and its Q in dB).
 */
export function cookbookSection(kind: BiquadKind, cosW0: number, sinW0: number, amplitude: number, alpha: number): BiquadCoefficients {
  let b0: number, b1: number, b2: number, a0: number, a1: number, a2: number;
  switch (kind) {
    case 'lowpass':
      b0 = (1 - cosW0) / 2;
      b1 = 1 - cosW0;
      b2 = (1 - cosW0) / 2;
      a0 = 1 + alpha;
      a1 = -2 * cosW0;
      a2 = 1 - alpha;
      break;
    case 'highpass':
      b0 = (1 + cosW0) / 2;
      b1 = -(1 + cosW0);
      b2 = (1 + cosW0) / 2;
      a0 = 1 + alpha;
      a1 = -2 * cosW0;
      a2 = 1 - alpha;
      break;
    case 'peaking':
      b0 = 1 + alpha * amplitude;
      b1 = -2 * cosW0;
      b2 = 1 - alpha * amplitude;
      a0 = 1 + alpha / amplitude;
      a1 = -2 * cosW0;
      a2 = 1 - alpha / amplitude;
      break;
    case 'lowshelf':
    case 'highshelf': {
      // Slope S = 1: α = sin(w0)/2 · √((A + 1/A)(1/S − 1) + 2) = sin(w0)/√2.
      const shelfAlpha = (sinW0 / 2) * Math.SQRT2;
      const k = 2 * shelfAlpha * Math.sqrt(amplitude);
      const up = amplitude + 1;
      const down = amplitude - 1;
      if (kind === 'lowshelf') {
        b0 = amplitude * (up - down * cosW0 + k);
        b1 = 2 * amplitude * (down - up * cosW0);
        b2 = amplitude * (up - down * cosW0 - k);
        a0 = up + down * cosW0 + k;
        a1 = -2 * (down + up * cosW0);
        a2 = up + down * cosW0 - k;
      } else {
        b0 = amplitude * (up + down * cosW0 + k);
        b1 = -2 * amplitude * (down + up * cosW0);
        b2 = amplitude * (up + down * cosW0 - k);
        a0 = up - down * cosW0 + k;
        a1 = 2 * (down - up * cosW0);
        a2 = up - down * cosW0 - k;
      }
      break;
    }
  }
  return { b0: b0 / a0, b1: b1 / a0, b2: b2 / a0, a1: a1 / a0, a2: a2 / a0 };
}

/** |H(e^{jω})| at `frequencyHz`, ω = 2π·f/fs: the ratio of output to input amplitude of a steady sine. */
export function measureBiquadMagnitude(coefficients: BiquadCoefficients, frequencyHz: number, sampleRateHz: number): number {
  const w = (2 * Math.PI * frequencyHz) / sampleRateHz;
  // z⁻¹ = e^{−jω}, z⁻² = e^{−2jω}
  const c1 = Math.cos(w);
  const s1 = -Math.sin(w);
  const c2 = Math.cos(2 * w);
  const s2 = -Math.sin(2 * w);
  const { b0, b1, b2, a1, a2 } = coefficients;
  const numeratorRe = b0 + b1 * c1 + b2 * c2;
  const numeratorIm = b1 * s1 + b2 * s2;
  const denominatorRe = 1 + a1 * c1 + a2 * c2;
  const denominatorIm = a1 * s1 + a2 * s2;
  return Math.hypot(numeratorRe, numeratorIm) / Math.hypot(denominatorRe, denominatorIm);
}
