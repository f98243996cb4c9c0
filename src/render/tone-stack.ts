/**
 * The amplifier-like tone stack shared by the clean, drive and compressed
 * chains: an approximation, by three biquads, of the curve a guitar
 * amplifier's passive bass–middle–treble network gives with its knobs near the
 * middle — lows and highs kept, a broad dip in the middle (common practice:
 * such networks scoop the mids by roughly 5–10 dB somewhere around
 * 400–800 Hz). Our own choice of values, not a model of any circuit.
 *
 * Net curve (tone stack alone, computed with the Audio EQ Cookbook):
 * about +2 dB below 100 Hz, −5 dB at 600 Hz, about +2 dB above 5 kHz.
 */
import type { BiquadSpec } from './biquad-design.js';

/** Bass shelf midpoint, Hz (our choice: below the low E string's second harmonic, 165 Hz). */
export const TONE_STACK_BASS_HZ = 180;
/** Bass shelf gain, dB (our choice; common practice: a little bass lift with the knob past noon). */
export const TONE_STACK_BASS_DB = 2;
/** Middle dip centre, Hz (common practice: the dip of a passive stack lies around 400–800 Hz). */
export const TONE_STACK_MIDDLE_HZ = 600;
/** Middle dip depth, dB (common practice: 5–10 dB; we take the gentle end). */
export const TONE_STACK_MIDDLE_DB = -5;
/** Middle dip quality factor (our choice: broad, a bit over an octave and a half wide between half-gain points). */
export const TONE_STACK_MIDDLE_Q = 0.7;
/** Treble shelf midpoint, Hz (our choice). */
export const TONE_STACK_TREBLE_HZ = 2500;
/** Treble shelf gain, dB (our choice; common practice: a little treble lift with the knob past noon). */
export const TONE_STACK_TREBLE_DB = 2;

/** The tone stack, in signal order. */
export const TONE_STACK: readonly BiquadSpec[] = Object.freeze([
  { kind: 'lowshelf', frequencyHz: TONE_STACK_BASS_HZ, q: 1, gainDb: TONE_STACK_BASS_DB, purpose: 'tone stack bass' },
  { kind: 'peaking', frequencyHz: TONE_STACK_MIDDLE_HZ, q: TONE_STACK_MIDDLE_Q, gainDb: TONE_STACK_MIDDLE_DB, purpose: 'tone stack middle dip' },
  { kind: 'highshelf', frequencyHz: TONE_STACK_TREBLE_HZ, q: 1, gainDb: TONE_STACK_TREBLE_DB, purpose: 'tone stack treble' },
]);
