/**
 * The plain-text writers of report/ (JSON in chunks, Markdown escaping),
 * for commands that print tables and documents but no page: importing them
 * does not load the page renderers (report/index.ts re-exports them too).
 */
export { escapeMarkdown } from '../escape-markdown.js';
export { StreamedArray, mapIterable, writeJson, writeJsonPausing } from '../write-json.js';
