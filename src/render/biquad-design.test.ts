import { OfflineAudioContext } from 'node-web-audio-api';
import { describe, expect, it } from 'vitest';
import { type BiquadSpec, designBiquad, measureBiquadMagnitude, webAudioQ } from './biquad-design.js';
import { DRIVE_LOW_CUT_HZ, DRIVE_LOW_CUT_Q } from './chain-design.js';
import { SPEAKER_CABINET } from './speaker-cabinet.js';
import { TONE_STACK } from './tone-stack.js';

const db = (ratio: number): number => 20 * Math.log10(ratio);
const spec = (kind: BiquadSpec['kind'], frequencyHz: number, q: number, gainDb: number): BiquadSpec => ({ kind, frequencyHz, q, gainDb, purpose: 'test' });
const magnitudeDb = (s: BiquadSpec, frequencyHz: number, sampleRateHz: number): number =>
  db(measureBiquadMagnitude(designBiquad(s, sampleRateHz), frequencyHz, sampleRateHz));

describe('Audio EQ Cookbook biquads, hand-worked values', () => {
  // Second-order sections of the cookbook are bilinear transforms of analog prototypes with the design frequency
  // pre-warped, so the analog values hold exactly at f0: |H(f0)| = Q for lowpass and highpass (H(s) = 1/(s² + s/Q + 1)
  // at s = j), the full gain at f0 for peaking, half the gain in dB at f0 for shelves (R. Bristow-Johnson, Audio EQ
  // Cookbook: "midpoint" of the shelf).
  const fs = 48_000;
  it.each([0.5, 0.7071, 1.1, 2])('lowpass and highpass at f0 have |H| = Q (Q = %s)', (q) => {
    expect(measureBiquadMagnitude(designBiquad(spec('lowpass', 1000, q, 0), fs), 1000, fs)).toBeCloseTo(q, 10);
    expect(measureBiquadMagnitude(designBiquad(spec('highpass', 1000, q, 0), fs), 1000, fs)).toBeCloseTo(q, 10);
  });
  it('lowpass passes DC and stops the Nyquist frequency; highpass the reverse', () => {
    expect(measureBiquadMagnitude(designBiquad(spec('lowpass', 1000, 0.7, 0), fs), 0, fs)).toBeCloseTo(1, 12);
    expect(measureBiquadMagnitude(designBiquad(spec('lowpass', 1000, 0.7, 0), fs), fs / 2, fs)).toBeCloseTo(0, 12);
    expect(measureBiquadMagnitude(designBiquad(spec('highpass', 1000, 0.7, 0), fs), 0, fs)).toBeCloseTo(0, 12);
    expect(measureBiquadMagnitude(designBiquad(spec('highpass', 1000, 0.7, 0), fs), fs / 2, fs)).toBeCloseTo(1, 12);
  });
  it.each([-6, 4])('peaking of %s dB has that gain at f0 and none at DC or Nyquist', (gainDb) => {
    expect(magnitudeDb(spec('peaking', 2600, 1.5, gainDb), 2600, fs)).toBeCloseTo(gainDb, 10);
    expect(magnitudeDb(spec('peaking', 2600, 1.5, gainDb), 0, fs)).toBeCloseTo(0, 10);
    expect(magnitudeDb(spec('peaking', 2600, 1.5, gainDb), fs / 2, fs)).toBeCloseTo(0, 10);
  });
  it.each([-5, 3])('shelves of %s dB: full gain on their side, half at f0, none on the other side', (gainDb) => {
    expect(magnitudeDb(spec('lowshelf', 200, 1, gainDb), 0, fs)).toBeCloseTo(gainDb, 10);
    expect(magnitudeDb(spec('lowshelf', 200, 1, gainDb), 200, fs)).toBeCloseTo(gainDb / 2, 10);
    expect(magnitudeDb(spec('lowshelf', 200, 1, gainDb), fs / 2, fs)).toBeCloseTo(0, 10);
    expect(magnitudeDb(spec('highshelf', 2500, 1, gainDb), 0, fs)).toBeCloseTo(0, 10);
    expect(magnitudeDb(spec('highshelf', 2500, 1, gainDb), 2500, fs)).toBeCloseTo(gainDb / 2, 10);
    expect(magnitudeDb(spec('highshelf', 2500, 1, gainDb), fs / 2, fs)).toBeCloseTo(gainDb, 10);
  });
  it('gives lowpass and highpass Q to the node in dB, as the W3C Web Audio API specifies', () => {
    expect(webAudioQ(spec('lowpass', 1000, 1, 0))).toBe(0);
    expect(webAudioQ(spec('highpass', 1000, 0.5, 0))).toBeCloseTo(-6.0206, 4);
    expect(webAudioQ(spec('peaking', 1000, 1.5, 0))).toBe(1.5);
  });
});

describe('every section the chains use, against BiquadFilterNode.getFrequencyResponse (node-web-audio-api 1.0.9)', () => {
  // The library's own reference: its magnitude response for the same type, frequency, Q and gain.
  const sections: BiquadSpec[] = [...TONE_STACK, ...SPEAKER_CABINET, spec('highpass', DRIVE_LOW_CUT_HZ, DRIVE_LOW_CUT_Q, 0)];
  const frequenciesHz = [30, 60, 82.41, 100, 150, 220, 440, 600, 1000, 2000, 2600, 4000, 5000, 7000, 10_000, 15_000, 20_000];
  const TOLERANCE_DB = 1e-4; // float32 responses; observed differences are below 10⁻⁵ dB

  it.each([44_100, 48_000])('at %s Hz', (sampleRateHz) => {
    const context = new OfflineAudioContext({ numberOfChannels: 1, length: 128, sampleRate: sampleRateHz });
    for (const section of sections) {
      const node = context.createBiquadFilter();
      node.type = section.kind;
      node.frequency.value = section.frequencyHz;
      node.Q.value = webAudioQ(section);
      node.gain.value = section.gainDb;
      const magnitude = new Float32Array(frequenciesHz.length);
      node.getFrequencyResponse(Float32Array.from(frequenciesHz), magnitude, new Float32Array(frequenciesHz.length));
      frequenciesHz.forEach((frequencyHz, i) => {
        const ours = magnitudeDb(section, frequencyHz, sampleRateHz);
        expect(Math.abs(db(magnitude[i] ?? 0) - ours), `${section.purpose} at ${frequencyHz} Hz`).toBeLessThan(TOLERANCE_DB);
      });
    }
  });
});
