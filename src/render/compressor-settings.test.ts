/**
 * The compressed chain squeezes the loud-to-quiet ratio of a two-level tone
 * by the documented ratio. Expected values from the static curve written out
 * here (D. Giannoulis, M. Massberg, J. D. Reiss, J. Audio Eng. Soc. 60(6),
 * 2012, eq. 4, with the knee from T to T + W as the W3C Web Audio API places
 * it), independently of the code under test.
 */
import { describe, expect, it } from 'vitest';
import { measureSineAmplitude, compressorStaticCurveDb } from '../../test/support/tone-measures.js';
import { COMPRESSOR_KNEE_DB, COMPRESSOR_RATIO, COMPRESSOR_SETTINGS, COMPRESSOR_THRESHOLD_DB, measureCompressorMakeupDb } from './compressor-settings.js';
import { renderEffectsChain } from './effects-chain.js';

/** The static curve with the compressed chain's settings (test/support/tone-measures.ts, from GMR eq. 4). */
function staticCurveDb(inputDb: number): number {
  return compressorStaticCurveDb(inputDb, COMPRESSOR_THRESHOLD_DB, COMPRESSOR_KNEE_DB, COMPRESSOR_RATIO);
}

const TONE_HZ = 440;
const SEGMENT_S = 1;
/** Measure from 0.6 s to 0.95 s into each segment: the levels only rise, so only the attack (5 ms) has to settle. */
const MEASURE_FROM_S = 0.6;
const MEASURE_TO_S = 0.95;

/** A sine whose peak level steps through `levelsDb` (dB re 1 V), one second each. */
function makeSteps(levelsDb: readonly number[], sampleRateHz: number): Float32Array {
  const segment = SEGMENT_S * sampleRateHz;
  const signal = new Float32Array(segment * levelsDb.length);
  levelsDb.forEach((levelDb, k) => {
    const amplitude = 10 ** (levelDb / 20);
    for (let i = k * segment; i < (k + 1) * segment; i += 1) signal[i] = amplitude * Math.sin((2 * Math.PI * TONE_HZ * i) / sampleRateHz);
  });
  return signal;
}

describe('makeup gain', () => {
  it('is (1 / full-range gain)^0.6 with the full-range gain read off the static curve at 0 dB (W3C Web Audio API)', () => {
    expect(measureCompressorMakeupDb(COMPRESSOR_SETTINGS)).toBeCloseTo(-0.6 * staticCurveDb(0), 10);
    expect(measureCompressorMakeupDb(COMPRESSOR_SETTINGS)).toBeCloseTo(14.85, 10); // T' = −33 dB: −0.6·(−33 + 33/4)
  });
});

describe.each([44_100, 48_000])('a two-level tone through the compressed chain at %s Hz', (sampleRateHz) => {
  const levelsDb = [-46, -16, -6]; // below the threshold, above the knee, 10 dB further up
  it('keeps its quiet part at the makeup gain and squeezes the loud part 4:1', async () => {
    const input = makeSteps(levelsDb, sampleRateHz);
    const compressed = await renderEffectsChain(input, sampleRateHz, 'compressed');
    const clean = await renderEffectsChain(input, sampleRateHz, 'clean');
    // The compressed chain is the compressor followed by the clean chain's filters: the level difference between the two
    // renders at the same moment is the compressor's gain, whatever the filters do at 440 Hz.
    const gainsDb = levelsDb.map((_, k) => {
      const from = Math.round((k * SEGMENT_S + MEASURE_FROM_S) * sampleRateHz);
      const end = Math.round((k * SEGMENT_S + MEASURE_TO_S) * sampleRateHz);
      return 20 * Math.log10(measureSineAmplitude(compressed, TONE_HZ, sampleRateHz, from, end) / measureSineAmplitude(clean, TONE_HZ, sampleRateHz, from, end));
    }) as [number, number, number];
    const makeupDb = measureCompressorMakeupDb(COMPRESSOR_SETTINGS);
    // Below the threshold: the makeup gain only.
    expect(gainsDb[0]).toBeCloseTo(makeupDb, 2);
    // Loud against quiet: 30 dB in become 30 − 12.75 = 17.25 dB out by the static curve. The compressor detects level
    // sample by sample and smooths the gain reduction, so a sine's reduction settles a little under its peak's.
    const quietToLoudIn = levelsDb[1]! - levelsDb[0]!;
    const quietToLoudOut = quietToLoudIn + gainsDb[1] - gainsDb[0];
    expect(Math.abs(quietToLoudOut - (staticCurveDb(levelsDb[1]!) - staticCurveDb(levelsDb[0]!)))).toBeLessThan(1);
    expect(quietToLoudOut).toBeLessThan(quietToLoudIn - 10);
    // Above the knee every 10 dB in gives 10/R = 2.5 dB out.
    const stepOut = levelsDb[2]! - levelsDb[1]! + gainsDb[2] - gainsDb[1];
    expect((levelsDb[2]! - levelsDb[1]!) / stepOut).toBeGreaterThan(COMPRESSOR_RATIO * 0.9);
    expect((levelsDb[2]! - levelsDb[1]!) / stepOut).toBeLessThan(COMPRESSOR_RATIO * 1.1);
  });
});
