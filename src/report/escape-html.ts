/**
 * Text from the guitar file goes into the page only through these: as
 * element text or attribute values (every character that can end text or an
 * attribute becomes a character reference), or as JSON inside a
 * `<script type="application/json">` element (every `<` becomes `\u003c`, so
 * no string can close the element or open a comment).
 */

const HTML_REFERENCES: Readonly<Record<string, string>> = Object.freeze({
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
});

/** Text safe inside an element or a quoted attribute value (HTML Living Standard §13.1.2.6, character references). */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/gu, (character) => HTML_REFERENCES[character] ?? character);
}

/**
 * JSON safe inside a `<script>` element: `<`, `>` and `&` as `\u` escapes
 * (so `</script>` and `<!--` cannot appear), and U+2028/U+2029, which older
 * script parsers treat as line ends, escaped too. The result is still valid
 * JSON for `JSON.parse` (RFC 8259 §7, any character may be `\u` escaped).
 */
export function serializeJsonForScript(value: unknown): string {
  return JSON.stringify(value).replace(/[<>&\u2028\u2029]/gu, (character) => {
    return `\\u${character.charCodeAt(0).toString(16).padStart(4, '0')}`;
  });
}
