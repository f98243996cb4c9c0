/**
 * Gains applied to rendered files. "true" level: one common gain for every
 * file, so relative levels stay as the circuit makes them, chosen so the
 * loudest peak sits at the headroom ceiling. "matched": each file brought to
 * one common loudness, the highest that lets every file stay under the
 * ceiling (so nothing clips and nothing is limited).
 */
import { maxOf } from '../math/index.js';

/** Peak ceiling below digital full scale for written files, dB (common practice: leave about 1 dB for inter-sample peaks). */
export const PEAK_CEILING_DB = -1;

const dbToGain = (db: number): number => 10 ** (db / 20);
const gainToDb = (gain: number): number => 20 * Math.log10(gain);

/** One gain for all files: ceiling / largest peak. Peaks are linear sample magnitudes. */
export function planTrueLevelGain(peaks: readonly number[], ceilingDb = PEAK_CEILING_DB): number {
  const loudest = Math.max(maxOf(peaks.filter((peak) => Number.isFinite(peak))), 0);
  return loudest > 0 ? dbToGain(ceilingDb) / loudest : 1;
}

export interface MatchedGains {
  /** Loudness every file reaches, LUFS. */
  readonly targetLufs: number;
  /** Gain per file, in the order given. */
  readonly gains: readonly number[];
}

/**
 * Per-file gains to a common loudness: target = min over files of
 * (loudness + headroom to the ceiling), so the file with the least headroom
 * just reaches the ceiling. Loudness changes by 20·log10(gain) under a gain
 * (ITU-R BS.1770 is linear in signal power).
 */
export function planMatchedGains(
  loudnessLufs: readonly number[],
  peaks: readonly number[],
  ceilingDb = PEAK_CEILING_DB,
): MatchedGains {
  let target = Number.POSITIVE_INFINITY;
  loudnessLufs.forEach((loudness, index) => {
    const peak = peaks[index] ?? 0;
    if (peak > 0 && Number.isFinite(loudness)) target = Math.min(target, loudness + ceilingDb - gainToDb(peak));
  });
  if (!Number.isFinite(target)) return { targetLufs: Number.NaN, gains: loudnessLufs.map(() => 1) };
  return {
    targetLufs: target,
    gains: loudnessLufs.map((loudness) => (Number.isFinite(loudness) ? dbToGain(target - loudness) : 1)),
  };
}

export { dbToGain, gainToDb };
