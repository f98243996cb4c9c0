/**
 * Playback gains of the comparison page, dB per entry, for its two level
 * modes. The listening page's playbackGainsDb (page-math-script.ts) with
 * one render extended to several: each set's files were written with that
 * set's own common gain g_s, so an entry's file loudness is
 * F_i = L_i + g_s (L_i its reference loudness), and
 *
 *   matched: gain_i = median(F) − F_i            every sound at one loudness
 *   true:    gain_i = (L_i − F_i) − max_j (L_j − F_j)
 *
 * which restores the measured loudness differences, across sets too (both
 * sets' renders are in volts at the amplifier input), loudest at 0 dB.
 * With one common gain for all this is exactly playbackGainsDb
 * (plan-comparison-gains.test.ts runs both). Entries without a finite
 * loudness, or from a loudness-matched set, get 0 dB and are listed as unknown.
 */
import type { ComparisonReport } from './comparison-report.js';

export interface ComparisonGains {
  readonly matched: Readonly<Record<string, number>>;
  readonly trueLevel: Readonly<Record<string, number>>;
  readonly unknown: readonly string[];
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  if (sorted.length === 0) return 0;
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? (sorted[middle] as number) : ((sorted[middle - 1] as number) + (sorted[middle] as number)) / 2;
}

export function planComparisonGains(report: Pick<ComparisonReport, 'sets' | 'entries'>): ComparisonGains {
  const fileLoudness = new Map<string, number>();
  const unknown: string[] = [];
  for (const entry of report.entries) {
    const render = report.sets[entry.set]?.render;
    if (!render || render.level !== 'true' || !Number.isFinite(entry.loudnessLufs)) unknown.push(entry.id);
    else fileLoudness.set(entry.id, entry.loudnessLufs + render.commonGainDb);
  }
  const usable = report.entries.filter((entry) => fileLoudness.has(entry.id));
  const target = median(usable.map((entry) => fileLoudness.get(entry.id) as number));
  let topRestore = Number.NEGATIVE_INFINITY;
  for (const entry of usable) topRestore = Math.max(topRestore, entry.loudnessLufs - (fileLoudness.get(entry.id) as number));
  const matched: Record<string, number> = {};
  const trueLevel: Record<string, number> = {};
  for (const entry of usable) {
    const file = fileLoudness.get(entry.id) as number;
    matched[entry.id] = target - file;
    trueLevel[entry.id] = entry.loudnessLufs - file - topRestore;
  }
  for (const id of unknown) {
    matched[id] = 0;
    trueLevel[id] = 0;
  }
  return { matched, trueLevel, unknown };
}
