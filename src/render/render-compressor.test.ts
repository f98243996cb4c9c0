/**
 * The compressor (render-compressor.ts) against closed forms written out here:
 * - static curve: D. Giannoulis, M. Massberg, J. D. Reiss, J. Audio Eng. Soc.
 *   60(6), 2012, eq. 4 (knee from T to T + W), for steady levels;
 * - timing: the one-pole detector's step response, 1 − e^(−t/τ) towards a
 *   higher gain reduction (attack) and e^(−t/τ) back from it (release), the
 *   time-constant definition of the same paper (§2.2).
 * A steady level is a constant (DC) input, so the detector sees one level.
 */
import { describe, expect, it } from 'vitest';
import { compressorStaticCurveDb } from '../../test/support/tone-measures.js';
import { COMPRESSOR_KNEE_DB, COMPRESSOR_RATIO, COMPRESSOR_SETTINGS, COMPRESSOR_THRESHOLD_DB } from './compressor-settings.js';
import { designCompressor, renderCompressor } from './render-compressor.js';

const SAMPLE_RATE_HZ = 48_000;
const design = designCompressor(COMPRESSOR_SETTINGS, SAMPLE_RATE_HZ);

/** The static curve with the compressed chain's settings (test/support/tone-measures.ts, from GMR eq. 4). */
function staticCurveDb(inputDb: number): number {
  return compressorStaticCurveDb(inputDb, COMPRESSOR_THRESHOLD_DB, COMPRESSOR_KNEE_DB, COMPRESSOR_RATIO);
}

const decibels = (ratio: number): number => 20 * Math.log10(ratio);
const constant = (levelDb: number, frames: number): Float32Array => new Float32Array(frames).fill(10 ** (levelDb / 20));

describe('compressor: steady levels follow the static curve plus the makeup gain', () => {
  it.each([-60, -40, -35, -33, -31, -20, -6, 0])('a steady %s dB', (levelDb) => {
    const frames = SAMPLE_RATE_HZ; // 1 s: 200 attack time constants
    const input = constant(levelDb, frames);
    const output = renderCompressor(input, design);
    const gainDb = decibels((output[frames - 1] as number) / (input[frames - 1] as number));
    expect(gainDb).toBeCloseTo(design.makeupDb + staticCurveDb(levelDb) - levelDb, 4);
  });

  it('silence stays silent and a quiet signal gets the makeup gain only', () => {
    expect(Array.from(renderCompressor(new Float32Array(64), design))).toEqual(new Array(64).fill(0));
    const quiet = Float32Array.from({ length: 480 }, (_, n) => 1e-3 * Math.sin(n / 7));
    const out = renderCompressor(quiet, design);
    const makeup = 10 ** (design.makeupDb / 20);
    for (let n = 0; n < quiet.length; n += 1) expect(out[n]).toBeCloseTo(Math.fround((quiet[n] as number) * makeup), 9);
  });
});

describe('compressor: attack and release are one-pole steps with the set time constants', () => {
  const loudDb = -10;
  const reductionDb = loudDb - staticCurveDb(loudDb); // 17.25 dB for −10 dB
  it('attack: the reduction reaches 1 − e^(−t/τ_A) of its target', () => {
    const frames = Math.round(4 * COMPRESSOR_SETTINGS.attackS * SAMPLE_RATE_HZ);
    const input = constant(loudDb, frames);
    const output = renderCompressor(input, design);
    for (const n of [0, 10, Math.round(COMPRESSOR_SETTINGS.attackS * SAMPLE_RATE_HZ) - 1, frames - 1]) {
      const expected = reductionDb * (1 - Math.exp(-(n + 1) / (COMPRESSOR_SETTINGS.attackS * SAMPLE_RATE_HZ)));
      expect(design.makeupDb - decibels((output[n] as number) / (input[n] as number))).toBeCloseTo(expected, 4);
    }
  });

  it('release: after a loud steady level, a quiet one regains e^(−t/τ_R) per time constant', () => {
    const settle = SAMPLE_RATE_HZ;
    const after = Math.round(2 * COMPRESSOR_SETTINGS.releaseS * SAMPLE_RATE_HZ);
    const input = new Float32Array(settle + after);
    input.fill(10 ** (loudDb / 20), 0, settle);
    input.fill(1e-3, settle); // −60 dB, below the threshold
    const output = renderCompressor(input, design);
    for (const k of [0, 100, Math.round(COMPRESSOR_SETTINGS.releaseS * SAMPLE_RATE_HZ) - 1, after - 1]) {
      const n = settle + k;
      const expected = reductionDb * Math.exp(-(k + 1) / (COMPRESSOR_SETTINGS.releaseS * SAMPLE_RATE_HZ));
      expect(design.makeupDb - decibels((output[n] as number) / (input[n] as number))).toBeCloseTo(expected, 3);
    }
  });

  it('keeps time: no look-ahead, sample n of the output depends only on samples up to n', () => {
    const input = Float32Array.from({ length: 2000 }, (_, n) => 0.3 * Math.sin(n / 5));
    const whole = renderCompressor(input, design);
    const head = renderCompressor(input.subarray(0, 1000), design);
    expect(Array.from(head)).toEqual(Array.from(whole.subarray(0, 1000)));
  });
});
