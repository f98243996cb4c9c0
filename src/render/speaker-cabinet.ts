/**
 * The speaker-cabinet response shared by the clean, drive and compressed
 * chains: a closed box with one guitar loudspeaker, as four biquads.
 *
 * - Low end: a closed-box loudspeaker is a second-order high-pass whose
 *   quality factor Qtc sets the bump at the box resonance (R. H. Small,
 *   "Closed-Box Loudspeaker Systems, Part I: Analysis", J. Audio Eng. Soc. 20(10),
 *   1972). We take fc = 90 Hz and Qtc = 1.1 (common practice for guitar
 *   cabinets: a resonance near 80–120 Hz, slightly under-damped), which gives
 *   about +2 dB near 110 Hz and −12 dB per octave below.
 * - Presence: guitar speakers show a broad peak from cone break-up a few kHz
 *   up (common practice); one peaking section, +4 dB at 2.6 kHz.
 * - Top: guitar speakers fall steeply above about 5 kHz (common practice);
 *   a fourth-order Butterworth low-pass at 5 kHz (two sections, Q = 0.5412
 *   and 1.3066: Q_k = 1/(2·cos((2k − 1)π/8)), Butterworth pole angles, any
 *   filter-design text, e.g. Oppenheim & Schafer, Discrete-Time Signal
 *   Processing, §7) gives −24 dB per octave above 5 kHz.
 *
 * Computed, deterministic sections: no recorded impulse response is used.
 */
import type { BiquadSpec } from './biquad-design.js';

/** Closed-box resonance (high-pass corner), Hz (common practice: 80–120 Hz for guitar cabinets). */
export const CABINET_BOX_RESONANCE_HZ = 90;
/** Closed-box total quality factor Qtc (Small 1972; 1.1 our choice within the usual 0.7–1.2). */
export const CABINET_BOX_Q = 1.1;
/** Presence peak centre, Hz (common practice: cone break-up peak of guitar speakers at 2–4 kHz). */
export const CABINET_PRESENCE_HZ = 2600;
/** Presence peak height, dB (our choice). */
export const CABINET_PRESENCE_DB = 4;
/** Presence peak quality factor (our choice: about an octave wide). */
export const CABINET_PRESENCE_Q = 1.5;
/** Top roll-off corner, Hz (common practice: guitar speakers fall steeply above about 5 kHz). */
export const CABINET_TOP_CUTOFF_HZ = 5000;
/** Fourth-order Butterworth section quality factors, 1/(2·cos(π/8)) and 1/(2·cos(3π/8)). */
export const BUTTERWORTH_FOURTH_ORDER_Q: readonly [number, number] = Object.freeze([
  1 / (2 * Math.cos(Math.PI / 8)),
  1 / (2 * Math.cos((3 * Math.PI) / 8)),
]) as readonly [number, number];

/** The cabinet, in signal order. */
export const SPEAKER_CABINET: readonly BiquadSpec[] = Object.freeze([
  { kind: 'highpass', frequencyHz: CABINET_BOX_RESONANCE_HZ, q: CABINET_BOX_Q, gainDb: 0, purpose: 'cabinet closed-box low end' },
  { kind: 'peaking', frequencyHz: CABINET_PRESENCE_HZ, q: CABINET_PRESENCE_Q, gainDb: CABINET_PRESENCE_DB, purpose: 'cabinet presence peak' },
  { kind: 'lowpass', frequencyHz: CABINET_TOP_CUTOFF_HZ, q: BUTTERWORTH_FOURTH_ORDER_Q[0], gainDb: 0, purpose: 'cabinet top roll-off (1 of 2)' },
  { kind: 'lowpass', frequencyHz: CABINET_TOP_CUTOFF_HZ, q: BUTTERWORTH_FOURTH_ORDER_Q[1], gainDb: 0, purpose: 'cabinet top roll-off (2 of 2)' },
]);
