import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import type { ComparisonEntry, ComparisonSetReport } from './comparison-report.js';
import { PAGE_MATH_FUNCTIONS, PAGE_MATH_SCRIPT } from './page-math-script.js';
import { planComparisonGains } from './plan-comparison-gains.js';

interface PageMath {
  playbackGainsDb(
    wirings: { id: string; loudnessLufs: number | null }[],
    render: { level: 'true' | 'matched'; commonGainDb: number },
  ): { matched: Record<string, number>; trueLevel: Record<string, number>; unknown: string[] };
}
const math = runInNewContext(`${PAGE_MATH_SCRIPT}\n({ ${PAGE_MATH_FUNCTIONS.join(', ')} })`) as PageMath;

const render = (commonGainDb: number, level: 'true' | 'matched' = 'true'): ComparisonSetReport['render'] => ({
  phrase: 'strum', chain: 'clean', sampleRateHz: 48000, durationS: 2.6, level, commonGainDb, mainsHz: 60, humMixHz: null, format: 'pcm24',
});
const set = (label: string, commonGainDb: number, level: 'true' | 'matched' = 'true'): ComparisonSetReport => ({ label, name: label, folder: label.toLowerCase(), render: render(commonGainDb, level) });
const entry = (id: string, setIndex: number, loudnessLufs: number): ComparisonEntry => ({
  id, set: setIndex, wiringId: id.split(':')[1] ?? id, expression: 'neck', wav: null, levelDb: 0, loudnessLufs, brightnessHz: 500, resonanceHz: null, humDb: 0, humCancelling: false,
});

describe('planComparisonGains', () => {
  it('is the listening page\'s playbackGainsDb when every set has the same common gain', () => {
    const entries = [entry('A:w1', 0, -21.5), entry('A:w2', 0, -18.2), entry('B:w1', 1, -20.1), entry('B:w2', 1, -16.9), entry('B:w3', 1, -25)];
    const gains = planComparisonGains({ sets: [set('A', 6.5), set('B', 6.5)], entries });
    const page = math.playbackGainsDb(entries.map((e) => ({ id: e.id, loudnessLufs: e.loudnessLufs })), { level: 'true', commonGainDb: 6.5 });
    for (const e of entries) {
      expect(gains.matched[e.id]).toBeCloseTo(page.matched[e.id] as number, 12);
      expect(gains.trueLevel[e.id]).toBeCloseTo(page.trueLevel[e.id] as number, 12);
    }
  });

  it('undoes each set\'s own common gain: true level keeps the loudness differences across sets, matched levels them', () => {
    const entries = [entry('A:w1', 0, -20), entry('B:w1', 1, -18)];
    const gains = planComparisonGains({ sets: [set('A', 8), set('B', 5)], entries });
    // files: A at −12 LUFS, B at −13 LUFS; truly B is 2 dB louder than A
    const played = (id: string, table: Readonly<Record<string, number>>, file: number): number => file + (table[id] as number);
    expect(played('B:w1', gains.trueLevel, -13) - played('A:w1', gains.trueLevel, -12)).toBeCloseTo(2, 12);
    expect(played('B:w1', gains.matched, -13) - played('A:w1', gains.matched, -12)).toBeCloseTo(0, 12);
    expect(Math.max(gains.trueLevel['A:w1'] as number, gains.trueLevel['B:w1'] as number)).toBeCloseTo(0, 12);
  });

  it('leaves unknown loudness and loudness-matched sets at 0 dB', () => {
    const gains = planComparisonGains({ sets: [set('A', 3), set('B', 0, 'matched')], entries: [entry('A:w1', 0, Number.NaN), entry('B:w1', 1, -20), entry('A:w2', 0, -20)] });
    expect(gains.unknown).toEqual(['A:w1', 'B:w1']);
    expect(gains.matched['B:w1']).toBe(0);
    expect(gains.trueLevel['A:w2']).toBe(0);
  });
});
