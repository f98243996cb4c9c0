import { describe, expect, it } from 'vitest';
import { amplitudeOfDb, concatenate, pluckedTone, sine } from '../../test/support/signals.js';
import { InputError } from '../errors/index.js';
import { LOUDNESS_FLOOR_LUFS, measureLoudness } from './measure-loudness.js';

const RATE_HZ = 48_000;
const TONE_HZ = 1000;

/** A stereo 1 kHz sine sequence: [level dBFS, seconds] segments, the same in both channels. */
function toneSequence(segments: readonly (readonly [number, number])[], sampleRateHz = RATE_HZ): Float32Array {
  return concatenate(segments.map(([levelDb, seconds]) => sine(amplitudeOfDb(levelDb), TONE_HZ, sampleRateHz, Math.round(seconds * sampleRateHz))));
}

describe('measureLoudness against EBU Tech 3341', () => {
  // EBU Tech 3341 (V3, 2016), "Loudness Metering: 'EBU Mode' metering to supplement loudness
  // normalisation", Table 1, minimum-requirement test signals 1–6: 1 kHz sines at the stated
  // levels (dBFS peak), integrated loudness expected as stated, tolerance ±0.1 LU. Cases 7 and 8
  // are recorded programme material and cannot be generated here.
  const cases: readonly { name: string; expectedLufs: number; segments: readonly (readonly [number, number])[] }[] = [
    { name: 'case 1: −23 dBFS, 20 s', expectedLufs: -23, segments: [[-23, 20]] },
    { name: 'case 2: −33 dBFS, 20 s', expectedLufs: -33, segments: [[-33, 20]] },
    { name: 'case 3: −36/−23/−36 dBFS, 10/60/10 s', expectedLufs: -23, segments: [[-36, 10], [-23, 60], [-36, 10]] },
    {
      name: 'case 4: −72/−36/−23/−36/−72 dBFS, 10/10/60/10/10 s',
      expectedLufs: -23,
      segments: [[-72, 10], [-36, 10], [-23, 60], [-36, 10], [-72, 10]],
    },
    { name: 'case 5: −26/−20/−26 dBFS, 20/20.1/20 s', expectedLufs: -23, segments: [[-26, 20], [-20, 20.1], [-26, 20]] },
  ];

  for (const { name, expectedLufs, segments } of cases) {
    it(`${name} reads ${expectedLufs} LUFS ±0.1`, () => {
      const channel = toneSequence(segments);
      expect(Math.abs(measureLoudness([channel, channel], RATE_HZ) - expectedLufs)).toBeLessThanOrEqual(0.1);
    });
  }

  it('case 6: 5.0 channels, L/R −28, C −24, Ls/Rs −30 dBFS, reads −23 LUFS ±0.1 with the surround weights', () => {
    // Channel order L, R, C, Ls, Rs; weights from ITU-R BS.1770-4, Annex 1, Table 3.
    const count = 20 * RATE_HZ;
    const front = sine(amplitudeOfDb(-28), TONE_HZ, RATE_HZ, count);
    const centre = sine(amplitudeOfDb(-24), TONE_HZ, RATE_HZ, count);
    const surround = sine(amplitudeOfDb(-30), TONE_HZ, RATE_HZ, count);
    const lufs = measureLoudness([front, front, centre, surround, surround], RATE_HZ, { channelWeights: [1, 1, 1, 1.41, 1.41] });
    expect(Math.abs(lufs + 23)).toBeLessThanOrEqual(0.1);
  });

  it('reads the same signals the same at 44.1 and 96 kHz (coefficients derived per rate)', () => {
    for (const sampleRateHz of [44_100, 96_000]) {
      const channel = toneSequence([[-26, 20], [-20, 20.1], [-26, 20]], sampleRateHz);
      expect(Math.abs(measureLoudness([channel, channel], sampleRateHz) + 23), `${sampleRateHz} Hz`).toBeLessThanOrEqual(0.1);
    }
  });
});

describe('measureLoudness', () => {
  const tone = pluckedTone({
    sampleRateHz: RATE_HZ,
    durationS: 3,
    fundamentalsHz: [82.41, 110, 146.83],
    noteTimesS: [0, 1, 2],
    harmonics: 30,
    decayS: 1.5,
    amplitude: 0.3,
    seed: 11,
  });

  it('moves by exactly the gain applied (20·log10 of the scale)', () => {
    const louder = tone.map((x) => 2 * x);
    expect(measureLoudness([louder], RATE_HZ) - measureLoudness([tone], RATE_HZ)).toBeCloseTo(20 * Math.log10(2), 6);
  });

  it('adds 10·log10(2) for the same signal in two channels', () => {
    expect(measureLoudness([tone, tone], RATE_HZ) - measureLoudness([tone], RATE_HZ)).toBeCloseTo(10 * Math.log10(2), 9);
  });

  it('gives the floor, never -Infinity or NaN, for silence, quiet and short signals', () => {
    expect(measureLoudness([new Float32Array(RATE_HZ)], RATE_HZ)).toBe(LOUDNESS_FLOOR_LUFS);
    expect(measureLoudness([sine(amplitudeOfDb(-80), TONE_HZ, RATE_HZ, RATE_HZ)], RATE_HZ)).toBe(LOUDNESS_FLOOR_LUFS);
    expect(measureLoudness([sine(0.5, TONE_HZ, RATE_HZ, Math.round(0.39 * RATE_HZ))], RATE_HZ)).toBe(LOUDNESS_FLOOR_LUFS);
    expect(measureLoudness([new Float32Array(0)], RATE_HZ)).toBe(LOUDNESS_FLOOR_LUFS);
    // One whole 400 ms block is enough.
    expect(measureLoudness([sine(0.5, TONE_HZ, RATE_HZ, Math.round(0.4 * RATE_HZ))], RATE_HZ)).toBeGreaterThan(LOUDNESS_FLOOR_LUFS);
  });

  it('ignores a quiet tail below the relative gate', () => {
    // −20 dBFS for 10 s then −40 dBFS for 10 s: the tail is 20 LU down and gated out (only the
    // three blocks straddling the step count), so the result stays within 0.1 LU of the loud part
    // instead of falling by 10·log10(2) ≈ 3 dB as an ungated mean would.
    const loud = sine(amplitudeOfDb(-20), TONE_HZ, RATE_HZ, 10 * RATE_HZ);
    const both = concatenate([loud, sine(amplitudeOfDb(-40), TONE_HZ, RATE_HZ, 10 * RATE_HZ)]);
    expect(Math.abs(measureLoudness([both], RATE_HZ) - measureLoudness([loud], RATE_HZ))).toBeLessThan(0.1);
  });

  it('rejects bad input with the path of the problem', () => {
    expect(() => measureLoudness([], RATE_HZ)).toThrow(/channels: expected at least one channel/u);
    expect(() => measureLoudness([tone, tone.subarray(1)], RATE_HZ)).toThrow(/channels\[1\]: expected/u);
    expect(() => measureLoudness([tone], 0)).toThrow(/sampleRateHz: expected a positive sample rate/u);
    expect(() => measureLoudness([tone], RATE_HZ, { channelWeights: [1, 1] })).toThrow(InputError);
    expect(() => measureLoudness([tone], RATE_HZ, { channelWeights: [-1] })).toThrow(/channelWeights\[0\]/u);
    const broken = Float32Array.from(tone);
    broken[RATE_HZ] = Number.NaN;
    expect(() => measureLoudness([broken], RATE_HZ)).toThrow(/channels: expected finite samples/u);
  });
});
