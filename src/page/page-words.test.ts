import { describe, expect, it } from 'vitest';
import { brightnessScale, formatDb, formatHz, humVerdict, describePeak, topologyInWords } from './page-words.js';

describe('page words', () => {
  it('marks hum: quiet at or below −20 dB (docs/design.md humCancelling), partly to −6 dB, noisy above', () => {
    expect(humVerdict(-32, true)).toBe('quiet');
    expect(humVerdict(-20, false)).toBe('quiet');
    expect(humVerdict(-19.6, false)).toBe('quiet'); // printed "−20": the mark follows the printed figure
    expect(humVerdict(-19.4, false)).toBe('partly');
    expect(humVerdict(-6, false)).toBe('partly');
    expect(humVerdict(0, false)).toBe('noisy');
    expect(humVerdict(null, false)).toBe('quiet'); // −∞ dB arrives as null in JSON: no hum at all
  });

  it('describes a peak by its frequency and height only', () => {
    expect(describePeak(4100, 6.24)).toBe('peak at 4.10 kHz, +6.2 dB');
    expect(describePeak(null, 0)).toBe('no peak in the audio band');
  });

  it('ties brightness words to octaves from the median centroid, and bars to a log scale', () => {
    const scale = brightnessScale([500, 1000, 2000]);
    expect(scale.medianHz).toBe(1000);
    expect(scale.word(1000)).toBe('middle');
    expect(scale.word(1000 * 2 ** 0.2)).toBe('brighter');
    expect(scale.word(1000 * 2 ** 0.5)).toBe('much brighter');
    expect(scale.word(1000 * 2 ** -0.2)).toBe('darker');
    expect(scale.word(500)).toBe('much darker');
    expect(scale.fraction(500)).toBe(0);
    expect(scale.fraction(1000)).toBeCloseTo(0.5, 12);
    expect(scale.fraction(2000)).toBe(1);
    // The legend's bands meet where the words change.
    const edges = scale.bands.map(([, low]) => low).filter((low): low is number => low !== null);
    for (const edge of edges) expect(scale.word(edge * 1.0001)).not.toBe(scale.word(edge * 0.9999));
  });

  it('formats figures for people', () => {
    expect(formatDb(-3.04)).toBe('\u22123.0 dB');
    expect(formatDb(2)).toBe('+2.0 dB');
    expect(formatHz(2450)).toBe('2.45 kHz');
    expect(formatHz(null)).toBe('—');
    expect(topologyInWords('series-parallel')).toBe('series and parallel');
  });
});
