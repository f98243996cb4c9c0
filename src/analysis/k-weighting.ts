/**
 * K-weighting (ITU-R BS.1770-4, Annex 1, §2): a high-shelf "pre-filter"
 * (the acoustic effect of the head) followed by the RLB high-pass, two
 * biquads in cascade.
 *
 * The standard gives the coefficients for 48 kHz only (Tables 1 and 2) and
 * asks other rates for the same frequency response. For another rate we go
 * back to the analog prototype and forward again by the bilinear transform
 * with frequency prewarping (A. V. Oppenheim, R. W. Schafer, *Discrete-Time
 * Signal Processing*, 3rd ed., §7.2.2; the method of re-deriving the
 * BS.1770 sections per rate is also D. Ward's, *Applications of loudness
 * models in audio engineering*, PhD thesis, Birmingham City University,
 * 2017). The analog prototype is recovered from the standard's own 48 kHz
 * numbers, prewarped at each section's pole frequency, so 48 kHz gives the
 * table exactly and every rate keeps the pole frequency, the Q and the
 * gains at DC and at high frequency. (libebur128 designs the same poles from
 * fitted analog parameters but keeps the RLB numerator 1, −2, 1 at every
 * rate, so its passband gain drifts from the table's +0.043 dB to +0.047 dB
 * at 44.1 kHz and +0.022 dB at 96 kHz; here it stays +0.043 dB.)
 */
import { InputError } from '../errors/index.js';
import type { Biquad } from './biquad.js';

/** The rate the standard's coefficient tables are for, Hz (ITU-R BS.1770-4, Annex 1). */
export const BS1770_TABLE_RATE_HZ = 48_000;

/** Stage 1, the pre-filter (high shelf, ≈ +4 dB above ≈ 1.7 kHz): ITU-R BS.1770-4, Annex 1, Table 1, at 48 kHz. */
export const BS1770_PRE_FILTER_48K: Biquad = Object.freeze({
  b0: 1.53512485958697,
  b1: -2.69169618940638,
  b2: 1.19839281085285,
  a1: -1.69065929318241,
  a2: 0.73248077421585,
});

/** Stage 2, the RLB weighting curve (high-pass near 38 Hz): ITU-R BS.1770-4, Annex 1, Table 2, at 48 kHz. */
export const BS1770_RLB_FILTER_48K: Biquad = Object.freeze({
  b0: 1,
  b1: -2,
  b2: 1,
  a1: -1.99004745483398,
  a2: 0.99007225036621,
});

/**
 * A biquad's analog prototype in the prewarped bilinear variable p, where
 * z⁻¹ = (1 − p)/(1 + p) and p = s·tan(ω0·T/2)/ω0, ω0 being the section's
 * pole frequency (so the prototype is the same for every rate once p is
 * rescaled). Substituting into H(z) and multiplying by (1 + p)²:
 *   N(p) = (b0 − b1 + b2)·p² + 2·(b0 − b2)·p + (b0 + b1 + b2)
 *   D(p) = (1 − a1 + a2)·p² + 2·(1 − a2)·p + (1 + a1 + a2)
 * and the pole frequency satisfies tan(π·f0/fs)² = D(0)/D₂ (the p² term).
 */
interface PrewarpedPrototype {
  readonly numerator: readonly [number, number, number]; // p², p¹, p⁰
  readonly denominator: readonly [number, number, number];
  readonly poleHz: number;
}

function prototypeOf(section: Biquad, sampleRateHz: number): PrewarpedPrototype {
  const { b0, b1, b2, a1, a2 } = section;
  const denominator = [1 - a1 + a2, 2 * (1 - a2), 1 + a1 + a2] as const;
  const warpedPole = Math.sqrt(denominator[2] / denominator[0]); // tan(π·f0/fs)
  return {
    numerator: [b0 - b1 + b2, 2 * (b0 - b2), b0 + b1 + b2],
    denominator,
    poleHz: (sampleRateHz * Math.atan(warpedPole)) / Math.PI,
  };
}

/**
 * Back from a polynomial in p to z by p = (1 − z⁻¹)/(1 + z⁻¹), times (1 + z⁻¹)²:
 *   c2·p² + c1·p + c0  →  (c2 + c1 + c0) + 2·(c0 − c2)·z⁻¹ + (c2 − c1 + c0)·z⁻²
 */
function toZ([c2, c1, c0]: readonly [number, number, number]): [number, number, number] {
  return [c2 + c1 + c0, 2 * (c0 - c2), c2 - c1 + c0];
}

/**
 * The same analog section for another sample rate: the prototype's p is
 * rescaled by r = tan(π·f0/fs_from) / tan(π·f0/fs_to), i.e. p_from = r·p_to,
 * which keeps f0 exactly where it was (prewarping), then mapped back to z.
 */
export function resampleBiquad(section: Biquad, fromRateHz: number, toRateHz: number): Biquad {
  const prototype = prototypeOf(section, fromRateHz);
  if (!(2 * prototype.poleHz < toRateHz)) {
    throw InputError.at('sampleRateHz', `a sample rate above ${(2 * prototype.poleHz).toFixed(0)} Hz (twice the filter's pole frequency)`, toRateHz);
  }
  const ratio = Math.tan((Math.PI * prototype.poleHz) / fromRateHz) / Math.tan((Math.PI * prototype.poleHz) / toRateHz);
  const scale = ([c2, c1, c0]: readonly [number, number, number]): [number, number, number] => [c2 * ratio * ratio, c1 * ratio, c0];
  const [n0, n1, n2] = toZ(scale(prototype.numerator));
  const [d0, d1, d2] = toZ(scale(prototype.denominator));
  return Object.freeze({ b0: n0 / d0, b1: n1 / d0, b2: n2 / d0, a1: d1 / d0, a2: d2 / d0 });
}

const cache = new Map<number, readonly [Biquad, Biquad]>();

/**
 * The two K-weighting sections for `sampleRateHz`: [pre-filter, RLB
 * high-pass]. 48 kHz returns the standard's tables as they are.
 */
export function designKWeighting(sampleRateHz: number): readonly [Biquad, Biquad] {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) throw InputError.at('sampleRateHz', 'a positive sample rate in Hz', sampleRateHz);
  const cached = cache.get(sampleRateHz);
  if (cached) return cached;
  const sections =
    sampleRateHz === BS1770_TABLE_RATE_HZ
      ? ([BS1770_PRE_FILTER_48K, BS1770_RLB_FILTER_48K] as const)
      : ([
          resampleBiquad(BS1770_PRE_FILTER_48K, BS1770_TABLE_RATE_HZ, sampleRateHz),
          resampleBiquad(BS1770_RLB_FILTER_48K, BS1770_TABLE_RATE_HZ, sampleRateHz),
        ] as const);
  cache.set(sampleRateHz, sections);
  return sections;
}
