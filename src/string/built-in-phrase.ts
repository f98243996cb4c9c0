/**
 * The phrases coilbench ships: `open-strings` (each open string, low to
 * high), `strum` (an open E major chord, one down strum: the reference phrase
 * for the metrics) and `riff` (a short single-note line written for
 * coilbench). Written for a six-string guitar; on a guitar with fewer
 * strings the notes on missing strings are left out, and on one with more,
 * `open-strings` plays them all.
 */
import type { Phrase, PhraseNote } from './phrase.js';

export type BuiltInPhraseName = 'open-strings' | 'strum' | 'riff';
export const BUILT_IN_PHRASES: readonly BuiltInPhraseName[] = Object.freeze(['open-strings', 'strum', 'riff']);

/** Silence before the first pluck, seconds (leaves room for any filter's attack). */
const LEAD_IN_S = 0.05;
/** Time between the open strings, seconds. */
const OPEN_STRING_SPACING_S = 1;
/** Time between strings in a strum, seconds (from memory: a relaxed strum spreads over a few tens of milliseconds). */
const STRUM_SPREAD_S = 0.012;
/** Velocity of a medium pluck (modelling choice). */
const MEDIUM_VELOCITY = 0.8;
/** Strings of a standard guitar. */
const SIX_STRINGS = 6;
/** Open E major chord: fret per trade string number 6 … 1 (common practice: the first chord shape taught). */
const E_MAJOR_FRETS: readonly number[] = [0, 2, 2, 1, 0, 0];
/** One eighth note at 120 beats per minute, seconds. */
const EIGHTH_NOTE_S = 0.25;
/** The riff: [string, fret, eighth notes long, velocity], an E minor pentatonic line written for coilbench. */
const RIFF: readonly (readonly [number, number, number, number])[] = [
  [6, 0, 1, 0.9],
  [6, 3, 1, 0.7],
  [5, 0, 1, 0.8],
  [5, 2, 1, 0.7],
  [4, 0, 1, 0.8],
  [4, 2, 1, 0.7],
  [3, 0, 1, 0.8],
  [3, 2, 2, 0.9],
  [4, 2, 1, 0.7],
  [4, 0, 1, 0.7],
  [5, 2, 1, 0.8],
  [6, 3, 1, 0.7],
  [6, 0, 2, 1],
];

/** One of the shipped phrases; `stringCount` (default 6) is the number of strings on the guitar. */
export function builtInPhrase(name: BuiltInPhraseName, stringCount: number = SIX_STRINGS): Phrase {
  const notes: PhraseNote[] = [];
  if (name === 'open-strings') {
    for (let number = stringCount; number >= 1; number -= 1) {
      notes.push({ timeS: LEAD_IN_S + (stringCount - number) * OPEN_STRING_SPACING_S, string: number, fret: 0, velocity: MEDIUM_VELOCITY });
    }
  } else if (name === 'strum') {
    E_MAJOR_FRETS.forEach((fret, index) => {
      const number = SIX_STRINGS - index;
      notes.push({ timeS: LEAD_IN_S + index * STRUM_SPREAD_S, string: number, fret, velocity: MEDIUM_VELOCITY, direction: 'down' });
    });
  } else {
    let beat = 0;
    RIFF.forEach(([number, fret, eighths, velocity], index) => {
      const direction = index % 2 === 0 ? 'down' : 'up';
      notes.push({ timeS: LEAD_IN_S + beat * EIGHTH_NOTE_S, string: number, fret, velocity, direction });
      beat += eighths;
    });
  }
  return Object.freeze({ name, notes: Object.freeze(notes.filter((note) => note.string <= stringCount)) });
}
