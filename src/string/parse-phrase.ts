/**
 * Reads a phrase file: JSON `{ "name"?: text, "notes": [ { "time": 0.0,
 * "string": 5, "fret": 0, "velocity": 1.0, "pluck"?: "130mm", "direction"?:
 * "down" | "up" } ] }`. Time in seconds; string by trade number (1 = highest);
 * pluck a distance from the bridge written as the guitar file writes lengths.
 * Every problem is reported at once, each with its path (`notes[3].fret`).
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import { parseJsonText } from '../guitar/index.js';
import { QUANTITY_EXAMPLES, QuantityError, parseQuantity } from '../units/index.js';
import { MAX_FRET, MAX_PHRASE_TIME_S, type Phrase, type PhraseNote } from './phrase.js';

/** Millimetres in a metre (SI), for messages in the units people write. */
const MILLIMETRES_PER_METRE = 1000;
/** Most notes a phrase file may hold (a guard against runaway files; a long song has a few thousand). */
export const MAX_PHRASE_NOTES = 20000;
/** Longest pluck distance accepted before the guitar is known, metres (longer than any scale, common practice). */
const MAX_PLUCK_M = 2;

const TOP_FIELDS = ['$schema', 'name', 'notes'];
const NOTE_FIELDS = ['time', 'string', 'fret', 'velocity', 'pluck', 'direction'];

type Raw = Record<string, unknown>;
const isRecord = (value: unknown): value is Raw => typeof value === 'object' && value !== null && !Array.isArray(value);

/** Parse phrase file text; `source` names the file (used as the phrase name when it has none). Throws InputError. */
export function parsePhrase(text: string, source: string, stringCount: number): Phrase {
  const raw = parseJsonText(text, source);
  const problems: InputProblem[] = [];
  if (!isRecord(raw)) throw InputError.at(source, 'a phrase: an object with a "notes" list', raw);
  for (const key of Object.keys(raw)) {
    if (!TOP_FIELDS.includes(key)) problems.push(problemAt(key, `one of the fields ${TOP_FIELDS.slice(1).join(', ')}`, key));
  }
  let name = source;
  if (raw.name !== undefined) {
    if (typeof raw.name === 'string' && raw.name.trim() !== '') name = raw.name;
    else problems.push(problemAt('name', 'a non-empty text', raw.name));
  }
  const notes: PhraseNote[] = [];
  if (!Array.isArray(raw.notes) || raw.notes.length === 0) {
    problems.push(problemAt('notes', 'a non-empty list of notes like { "time": 0, "string": 6, "fret": 0, "velocity": 1 }', raw.notes));
  } else if (raw.notes.length > MAX_PHRASE_NOTES) {
    problems.push(problemAt('notes', `at most ${MAX_PHRASE_NOTES} notes`, `${raw.notes.length} notes`));
  } else {
    raw.notes.forEach((item: unknown, index) => {
      const note = parseNote(item, `notes[${index}]`, stringCount, problems);
      if (note) notes.push(note);
    });
  }
  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze({ name, notes: Object.freeze(notes) });
}

function parseNote(item: unknown, path: string, stringCount: number, problems: InputProblem[]): PhraseNote | undefined {
  if (!isRecord(item)) {
    problems.push(problemAt(path, 'a note like { "time": 0, "string": 6, "fret": 0, "velocity": 1 }', item));
    return undefined;
  }
  const before = problems.length;
  for (const key of Object.keys(item)) {
    if (!NOTE_FIELDS.includes(key)) problems.push(problemAt(`${path}.${key}`, `one of the fields ${NOTE_FIELDS.join(', ')}`, key));
  }
  const number = (key: string, ok: (value: number) => boolean, expected: string): number => {
    const value = item[key];
    if (typeof value === 'number' && Number.isFinite(value) && ok(value)) return value;
    problems.push(problemAt(`${path}.${key}`, expected, value));
    return 0;
  };
  const timeS = number('time', (t) => t >= 0 && t <= MAX_PHRASE_TIME_S, `a time in seconds from 0 to ${MAX_PHRASE_TIME_S}`);
  const string = number(
    'string',
    (s) => Number.isInteger(s) && s >= 1 && s <= stringCount,
    `a string number from 1 (highest) to ${stringCount} (lowest)`,
  );
  const fret = number('fret', (f) => Number.isInteger(f) && f >= 0 && f <= MAX_FRET, `a fret from 0 (open) to ${MAX_FRET}`);
  const velocity = number('velocity', (v) => v > 0 && v <= 1, 'a velocity above 0 and at most 1');
  let pluckM: number | undefined;
  if (item.pluck !== undefined) {
    const expected = `a distance from the bridge like ${QUANTITY_EXAMPLES.length}, above 0 and under ${MAX_PLUCK_M * MILLIMETRES_PER_METRE} mm`;
    try {
      const value = parseQuantity(item.pluck, 'length');
      if (value > 0 && value < MAX_PLUCK_M) pluckM = value;
      else problems.push(problemAt(`${path}.pluck`, expected, item.pluck));
    } catch (error) {
      if (!(error instanceof QuantityError)) throw error;
      problems.push(problemAt(`${path}.pluck`, error.expected, item.pluck));
    }
  }
  let direction: 'down' | 'up' | undefined;
  if (item.direction !== undefined) {
    if (item.direction === 'down' || item.direction === 'up') direction = item.direction;
    else problems.push(problemAt(`${path}.direction`, '"down" or "up"', item.direction));
  }
  if (problems.length > before) return undefined;
  return Object.freeze({
    timeS,
    string,
    fret,
    velocity,
    ...(pluckM === undefined ? {} : { pluckM }),
    ...(direction === undefined ? {} : { direction }),
  });
}
