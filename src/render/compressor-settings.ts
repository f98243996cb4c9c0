/**
 * The compressed chain's compressor settings (run by render-compressor.ts,
 * our own code in every host), and the makeup gain it adds.
 *
 * Levels here are dB relative to 1 (one volt at the amplifier input when the
 * chain's input is in volts, see ChainOptions.inputGain): a plucked string
 * peaks at a few hundred mV (−20 to −10 dB, from memory), and its decay passes
 * through the knee, so the compressor evens out attack and sustain the way a
 * guitar compressor pedal does (common practice: ratio 3–5:1, attack 5–20 ms,
 * release 0.1–0.3 s for guitar).
 *
 * Static curve (D. Giannoulis, M. Massberg, J. D. Reiss, "Digital Dynamic
 * Range Compressor Design — A Tutorial and Analysis", J. Audio Eng. Soc.
 * 60(6), 2012, eq. 4, with the knee placed from T to T + W as the W3C Web
 * Audio API 1.0 places a DynamicsCompressorNode's): with T the threshold, W
 * the knee, R the ratio and T' = T + W/2,
 *   y = x                                   for x ≤ T
 *   y = x + (1/R − 1)·(x − T)² / (2W)        for T < x < T + W
 *   y = T' + (x − T')/R                      for x ≥ T + W
 * Above T + W every extra dB in gives 1/R dB out.
 */

/** Threshold where compression starts, dB re 1 V (our choice: about 16 mV, so the decay of a pluck is compressed). */
export const COMPRESSOR_THRESHOLD_DB = -36;
/** Soft-knee width, dB (our choice; compression reaches the full ratio at −30 dB). */
export const COMPRESSOR_KNEE_DB = 6;
/** Ratio above the knee, dB in per dB out (common practice for guitar: 3–5). */
export const COMPRESSOR_RATIO = 4;
/**
 * Attack time constant τ_A, s (common practice for guitar: 5–20 ms, lets some of the pick attack through; we take the
 * fast end, which keeps the first peak of a firm pluck closest to its sustain).
 */
export const COMPRESSOR_ATTACK_S = 0.005;
/** Release time constant τ_R, s (common practice for guitar: 0.1–0.3 s). */
export const COMPRESSOR_RELEASE_S = 0.25;

/** Makeup gain = (1 / full-range gain)^0.6: the W3C Web Audio API 1.0 §DynamicsCompressorNode rule, which we keep as our choice. */
const MAKEUP_EXPONENT = 0.6;

export interface CompressorSettings {
  readonly thresholdDb: number;
  readonly kneeDb: number;
  readonly ratio: number;
  readonly attackS: number;
  readonly releaseS: number;
}

export const COMPRESSOR_SETTINGS: CompressorSettings = Object.freeze({
  thresholdDb: COMPRESSOR_THRESHOLD_DB,
  kneeDb: COMPRESSOR_KNEE_DB,
  ratio: COMPRESSOR_RATIO,
  attackS: COMPRESSOR_ATTACK_S,
  releaseS: COMPRESSOR_RELEASE_S,
});

/**
 * The makeup gain M, dB, the compressor applies to everything (the W3C Web
 * Audio API 1.0 rule: full-range gain = the static curve at 0 dB; makeup =
 * (1/full-range gain)^0.6). With the knee centred at T' = T + W/2: full-range
 * gain = T' − T'/R dB. For the settings above: T' = −33 dB, full-range gain
 * −24.75 dB, makeup +14.85 dB — the gain of signals below the threshold.
 */
export function measureCompressorMakeupDb(settings: CompressorSettings): number {
  const centre = settings.kneeDb > 0 ? settings.thresholdDb + settings.kneeDb / 2 : settings.thresholdDb;
  const fullRangeGainDb = centre - centre / settings.ratio;
  return -MAKEUP_EXPONENT * fullRangeGainDb;
}
