/**
 * What the strings play: notes with a time, a string (numbered as the trade
 * numbers them, 1 = the highest), a fret, a velocity and optionally a pluck
 * distance from the bridge and a pick direction.
 */
import type { PickDirection } from './render-excitation.js';

export interface PhraseNote {
  /** Pluck time from the start of the render, seconds. */
  readonly timeS: number;
  /** Trade number of the string: 1 is the highest (thinnest). */
  readonly string: number;
  /** Fret, 0 = open string. */
  readonly fret: number;
  /** How hard, 0 … 1: scales the pluck's displacement and its brightness. */
  readonly velocity: number;
  /** Distance of the pluck from the bridge, metres; the render's default when absent. */
  readonly pluckM?: number;
  /** Pick stroke; 'down' when absent. */
  readonly direction?: PickDirection;
}

export interface Phrase {
  readonly name: string;
  readonly notes: readonly PhraseNote[];
}

/** Highest fret a note may use (common practice: guitars have 21 to 24 frets). */
export const MAX_FRET = 24;
/** Longest phrase, seconds: a guard against typing milliseconds for seconds (a modelling limit). */
export const MAX_PHRASE_TIME_S = 600;
