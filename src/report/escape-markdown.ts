/**
 * Text from a guitar or phrase file placed in Markdown (report.md, `analyze
 * --markdown`): shown as written, never read as markup. HTML's special
 * characters become entities (a Markdown viewer passes raw HTML through), the
 * characters with a meaning inline in CommonMark ("Backslash escapes": any
 * ASCII punctuation may be escaped) are escaped with a backslash, and line
 * breaks become spaces so a name cannot start a heading or a list.
 */

/** Inline Markdown punctuation escaped with a backslash (CommonMark 0.31, section 2.4). */
const MARKDOWN_PUNCTUATION = /[\\`*_[\]{}()#+!|~]/gu;
const HTML_ENTITIES: Readonly<Record<string, string>> = Object.freeze({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' });

export function escapeMarkdown(text: string): string {
  return text
    .replace(/[\r\n\u2028\u2029]+/gu, ' ')
    .replace(/[&<>"]/gu, (character) => HTML_ENTITIES[character] ?? character)
    .replace(MARKDOWN_PUNCTUATION, (character) => `\\${character}`);
}
