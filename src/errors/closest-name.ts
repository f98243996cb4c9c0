/**
 * "Did you mean …?" for a misspelt name: the known name nearest to what was
 * typed, by the optimal string alignment distance (Levenshtein's insertions,
 * deletions and substitutions, plus swaps of two neighbouring characters;
 * Damerau 1964, "A technique for computer detection and correction of
 * spelling errors", Communications of the ACM 7(3)), ignoring letter case.
 */

/** Most edits a suggestion may be away (common practice for command-line spelling hints: one or two). */
export const MAX_SUGGESTION_EDITS = 2;

/** Optimal string alignment distance between `a` and `b`. */
export function editDistance(a: string, b: string): number {
  const rows = a.length + 1;
  const columns = b.length + 1;
  const table = new Int32Array(rows * columns);
  for (let i = 0; i < rows; i += 1) table[i * columns] = i;
  for (let j = 0; j < columns; j += 1) table[j] = j;
  for (let i = 1; i < rows; i += 1) {
    for (let j = 1; j < columns; j += 1) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min((table[(i - 1) * columns + j] as number) + 1, (table[i * columns + j - 1] as number) + 1, (table[(i - 1) * columns + j - 1] as number) + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) best = Math.min(best, (table[(i - 2) * columns + j - 2] as number) + 1);
      table[i * columns + j] = best;
    }
  }
  return table[rows * columns - 1] as number;
}

/**
 * The one known name nearest to `typed` (letter case ignored), if it is at
 * most MAX_SUGGESTION_EDITS edits away and fewer edits than `typed` has
 * characters; undefined when none is, or when two are equally near.
 */
export function closestName(typed: string, known: readonly string[]): string | undefined {
  const limit = Math.min(MAX_SUGGESTION_EDITS, typed.length - 1);
  const lowered = typed.toLowerCase();
  const distances = known.map((name) => editDistance(lowered, name.toLowerCase()));
  const nearest = distances.reduce((least, distance) => Math.min(least, distance), Infinity);
  if (!(nearest <= limit)) return undefined;
  const candidates = known.filter((_, index) => distances[index] === nearest);
  return candidates.length === 1 ? candidates[0] : undefined;
}

/**
 * "one of a, b, c" for a choice typed as `typed`, with " (did you mean b?)" after it when `typed` is text near one of
 * the choices: the expected part of a message about a value outside a fixed set. `quoted` lists them as a file
 * spells them, `one of "a" or "b"` (the guitar file's enumerated fields).
 */
export function oneOfChoices(typed: unknown, choices: readonly (string | number)[], quoted = false): string {
  const names = choices.map(String);
  const name = typeof typed === 'string' ? closestName(typed, names) : undefined;
  const show = (choice: string | number): string => (quoted ? JSON.stringify(choice) : String(choice));
  const listed = choices.map(show).join(quoted ? ' or ' : ', ');
  return `one of ${listed}${name === undefined ? '' : ` (did you mean ${quoted ? JSON.stringify(name) : name}?)`}`;
}

/** "a, b, c" with "; did you mean b?" after it when `typed` is near one of them: the inside of a parenthesised list of choices. */
export function listWithSuggestion(typed: string, known: readonly string[]): string {
  const name = closestName(typed, known);
  return `${known.join(', ')}${name === undefined ? '' : `; did you mean ${name}?`}`;
}
