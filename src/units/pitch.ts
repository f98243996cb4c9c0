/**
 * Musical pitch in twelve-tone equal temperament with A4 = 440 Hz
 * (ISO 16:1975, standard tuning frequency): f = 440 · 2^((m − 69)/12),
 * m the MIDI note number (scientific pitch notation: C4 = 60).
 */

/** Standard tuning frequency, ISO 16:1975. */
export const A4_HZ = 440;
/** MIDI note number of A4 (MIDI 1.0 Detailed Specification). */
export const A4_MIDI = 69;
/** Semitones per octave in equal temperament. */
export const SEMITONES_PER_OCTAVE = 12;
/** MIDI number of C at octave −1 in scientific pitch notation (C4 = 60). */
const MIDI_OF_C_MINUS_1 = 0;
/** Cents per semitone (definition of the cent). */
export const CENTS_PER_SEMITONE = 100;

const NOTE_OFFSETS: Readonly<Record<string, number>> = Object.freeze({
  C: 0,
  D: 2,
  E: 4,
  F: 5,
  G: 7,
  A: 9,
  B: 11,
});

const NOTE_NAME = /^([A-Ga-g])([#♯]{0,2}|[b♭]{0,2})(-?\d+)$/u;

/** Frequency in Hz of MIDI note `midi` (may be fractional), equal temperament, A4 = 440 Hz. */
export function midiToHz(midi: number): number {
  return A4_HZ * 2 ** ((midi - A4_MIDI) / SEMITONES_PER_OCTAVE);
}

/** Fractional MIDI note number of a frequency in Hz. */
export function hzToMidi(frequencyHz: number): number {
  return A4_MIDI + SEMITONES_PER_OCTAVE * Math.log2(frequencyHz / A4_HZ);
}

/** Difference in cents between two frequencies: 1200 · log2(measured/reference). */
export function centsBetween(measuredHz: number, referenceHz: number): number {
  return SEMITONES_PER_OCTAVE * CENTS_PER_SEMITONE * Math.log2(measuredHz / referenceHz);
}

/**
 * MIDI number of a note name in scientific pitch notation ("E2", "F#3", "Bb1").
 * Returns undefined when the text is not a note name.
 */
export function parseNoteName(text: string): number | undefined {
  const match = NOTE_NAME.exec(text.trim());
  if (!match) return undefined;
  const [, letter, accidentals, octave] = match;
  const base = NOTE_OFFSETS[(letter ?? '').toUpperCase()];
  if (base === undefined) return undefined;
  let shift = 0;
  for (const mark of accidentals ?? '') shift += mark === '#' || mark === '♯' ? 1 : -1;
  return MIDI_OF_C_MINUS_1 + (Number(octave) + 1) * SEMITONES_PER_OCTAVE + base + shift;
}

const SHARP_NAMES = ['C', 'C#', 'D', 'D#', 'E', 'F', 'F#', 'G', 'G#', 'A', 'A#', 'B'] as const;

/** Name of an integer MIDI note with sharps ("E2"). */
export function noteName(midi: number): string {
  const rounded = Math.round(midi);
  const pitchClass = ((rounded % SEMITONES_PER_OCTAVE) + SEMITONES_PER_OCTAVE) % SEMITONES_PER_OCTAVE;
  const octave = Math.floor(rounded / SEMITONES_PER_OCTAVE) - 1;
  return `${SHARP_NAMES[pitchClass] ?? '?'}${octave}`;
}
