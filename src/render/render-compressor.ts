/**
 * The compressed chain's compressor, our own code so that the command line
 * and the listening page run the very same numbers (a Web Audio
 * DynamicsCompressorNode differs from one implementation to the next: the
 * node-web-audio-api and chromium ones differed by up to 2.2 LU and 15 %
 * centroid on the same plucks).
 *
 * A feed-forward compressor with the level detected in the log domain after
 * the gain computer, the design D. Giannoulis, M. Massberg and J. D. Reiss
 * recommend ("Digital Dynamic Range Compressor Design — A Tutorial and
 * Analysis", J. Audio Eng. Soc. 60(6), 399–408, 2012; GMR below). Per sample n:
 *
 *   x_G = 20·log10|x[n]|                                  input level, dB
 *   y_G = static curve of x_G (GMR eq. 4, soft knee; compressor-settings.ts)
 *   x_L = x_G − y_G                                       wanted gain reduction, dB (≥ 0)
 *   y_L[n] = α_A·y_L[n−1] + (1 − α_A)·x_L   if x_L > y_L[n−1]  (attack)
 *          = α_R·y_L[n−1] + (1 − α_R)·x_L   otherwise           (release)
 *        (GMR §2.2, the smooth branching peak detector)
 *   c = M − y_L[n]                                        gain, dB (M the makeup gain)
 *   y[n] = x[n]·10^(c/20)
 *
 * with α = e^(−1/(τ·fs)) for a time constant τ (GMR §2.2: the detector's
 * step response reaches 1 − 1/e of a step in τ). No look-ahead: the output
 * lines up with the input sample for sample. Below the threshold x_L = 0,
 * so silence and quiet signals pass with the makeup gain only.
 *
 * Design and running are separate: `designCompressor` turns the settings and
 * the sample rate into plain numbers, `renderCompressor` applies them.
 */
import { type CompressorSettings, measureCompressorMakeupDb } from './compressor-settings.js';

/** dB per decade of amplitude (20·log10). */
const DB_PER_DECADE = 20;

export interface CompressorDesign {
  readonly thresholdDb: number;
  readonly kneeDb: number;
  readonly ratio: number;
  /** Attack coefficient α_A = e^(−1/(τ_A·fs)). */
  readonly attackCoefficient: number;
  /** Release coefficient α_R = e^(−1/(τ_R·fs)). */
  readonly releaseCoefficient: number;
  /** Makeup gain M, dB. */
  readonly makeupDb: number;
  /** Amplitude below which the gain computer does nothing (10^(T/20)): x_L = 0 there. */
  readonly thresholdAmplitude: number;
}

/** The compressor's numbers at `sampleRateHz`. */
export function designCompressor(settings: CompressorSettings, sampleRateHz: number): CompressorDesign {
  return Object.freeze({
    thresholdDb: settings.thresholdDb,
    kneeDb: settings.kneeDb,
    ratio: settings.ratio,
    // GMR §2.2: α = e^(−1/(τ·fs))
    attackCoefficient: Math.exp(-1 / (settings.attackS * sampleRateHz)),
    releaseCoefficient: Math.exp(-1 / (settings.releaseS * sampleRateHz)),
    makeupDb: measureCompressorMakeupDb(settings),
    thresholdAmplitude: 10 ** (settings.thresholdDb / DB_PER_DECADE),
  });
}

/**
 * Gain reduction x_L = x_G − y_G, dB, for an input level `levelDb` (GMR eq. 4
 * with the knee from T to T + W, T' = T + W/2):
 *   x ≤ T:          0
 *   T < x < T + W:  (1 − 1/R)·(x − T)²/(2W)
 *   x ≥ T + W:      (x − T')·(1 − 1/R)
 */
export function measureGainReductionDb(design: Pick<CompressorDesign, 'thresholdDb' | 'kneeDb' | 'ratio'>, levelDb: number): number {
  const { thresholdDb, kneeDb, ratio } = design;
  const slope = 1 - 1 / ratio;
  if (levelDb <= thresholdDb) return 0;
  if (levelDb < thresholdDb + kneeDb) {
    const over = levelDb - thresholdDb;
    return (slope * over * over) / (2 * kneeDb);
  }
  return (levelDb - (thresholdDb + kneeDb / 2)) * slope;
}

/** Run mono `samples` through the compressor; writes into `out` (a new array by default; may be `samples` itself). */
export function renderCompressor(samples: Float32Array, design: CompressorDesign, out: Float32Array = new Float32Array(samples.length)): Float32Array {
  const { attackCoefficient, releaseCoefficient, makeupDb, thresholdAmplitude } = design;
  let smoothed = 0; // y_L[n − 1], dB
  for (let n = 0; n < samples.length; n += 1) {
    const x = samples[n] as number;
    const magnitude = Math.abs(x);
    const wanted = magnitude > thresholdAmplitude ? measureGainReductionDb(design, DB_PER_DECADE * Math.log10(magnitude)) : 0;
    const coefficient = wanted > smoothed ? attackCoefficient : releaseCoefficient;
    smoothed = coefficient * smoothed + (1 - coefficient) * wanted;
    out[n] = x * 10 ** ((makeupDb - smoothed) / DB_PER_DECADE);
  }
  return out;
}
