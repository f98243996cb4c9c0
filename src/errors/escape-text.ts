/**
 * Text from a file or the command line shown safely inside a one-line
 * message: control characters (line breaks, escape, NUL…), bidirectional
 * formatting marks (which can make a terminal show text in a different order
 * than it is stored; Unicode Standard Annex #9, "Explicit Directional
 * Formatting Characters") and other invisible format characters are shown as
 * `\n`, `\t` or `\u{…}` escapes, and a long text is elided in the middle with
 * its full length, so a message never breaks over lines and never runs to
 * kilobytes.
 */

/** Longest text shown in a message before it is elided, characters (judgement: one terminal line keeps its shape). */
export const MAX_SHOWN_TEXT = 60;

/** Characters shown as escapes: C0 and C1 controls, DEL, and the invisible format characters (Unicode general category Cc and Cf, line and paragraph separators). */
const HIDDEN_CHARACTER = /[\p{Cc}\p{Cf}\u2028\u2029]/gu;

const NAMED_ESCAPES: Readonly<Record<string, string>> = Object.freeze({ '\n': '\\n', '\r': '\\r', '\t': '\\t' });

function escapeCharacter(character: string): string {
  const named = NAMED_ESCAPES[character];
  if (named !== undefined) return named;
  const code = character.codePointAt(0) ?? 0;
  return `\\u{${code.toString(16).toUpperCase()}}`;
}

/** Make every hidden character visible (no elision). */
export function revealHiddenCharacters(text: string): string {
  return text.replace(HIDDEN_CHARACTER, escapeCharacter);
}

/**
 * Text shown in a message: hidden characters made visible, then elided in the
 * middle to at most `limit` characters with its full length stated
 * ("abc…xyz (10000 characters)").
 */
export function escapeForMessage(text: string, limit: number = MAX_SHOWN_TEXT): string {
  const shown = revealHiddenCharacters(text);
  if (shown.length <= limit) return shown;
  const keep = Math.max(2, limit - 2);
  const head = Math.ceil(keep / 2);
  const tail = keep - head;
  return `${shown.slice(0, head)}…${shown.slice(shown.length - tail)} (${[...text].length} characters)`;
}
