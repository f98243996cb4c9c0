/**
 * Writes a JSON document exactly as `JSON.stringify(value, null, 2)` would
 * print it, but in chunks: long arrays are written item by item, so a
 * document of a few hundred thousand wirings never exists as one string.
 */

/** Arrays longer than this are written item by item. */
const STREAMED_ARRAY_LENGTH = 256;
/** Characters gathered before each write. */
const JSON_CHUNK_CHARACTERS = 1 << 16;
const INDENT = '  ';

/** `JSON.stringify(value, null, 2)` with every line after the first indented by `indent`. */
function stringifyAt(value: unknown, indent: string): string {
  const text = JSON.stringify(value, null, INDENT) ?? 'null';
  return indent === '' ? text : text.split('\n').join(`\n${indent}`);
}

/** An array written item by item as its items are produced (never held): writeJson prints it as JSON.stringify prints an array. */
export class StreamedArray {
  constructor(readonly items: Iterable<unknown>) {}
}

/** The items of `iterable` mapped by `map`, as a StreamedArray (each item made when it is written). */
export function mapIterable<T>(iterable: Iterable<T>, map: (item: T) => unknown): StreamedArray {
  return new StreamedArray({
    *[Symbol.iterator]() {
      for (const item of iterable) yield map(item);
    },
  });
}

function holdsLongArray(value: unknown): boolean {
  if (value instanceof StreamedArray) return true;
  if (Array.isArray(value)) return value.length > STREAMED_ARRAY_LENGTH || value.some(holdsLongArray);
  if (value !== null && typeof value === 'object' && !('toJSON' in value)) return Object.values(value).some(holdsLongArray);
  return false;
}

/** The text of `value` as `JSON.stringify(value, null, 2)` and a newline, in chunks; `null` between items of long arrays (a place to pause). */
function* jsonChunks(value: unknown): Generator<string | null> {
  let chunk = '';
  function* visit(node: unknown, indent: string): Generator<string | null> {
    if (!holdsLongArray(node)) {
      chunk += stringifyAt(node, indent);
      return;
    }
    const inner = indent + INDENT;
    if (Array.isArray(node) || node instanceof StreamedArray) {
      const items: Iterable<unknown> = node instanceof StreamedArray ? node.items : node;
      let first = true;
      for (const item of items) {
        chunk += first ? '[\n' : ',\n';
        first = false;
        chunk += inner;
        // JSON.stringify writes null for array items it cannot print (undefined, functions).
        if (item === undefined || typeof item === 'function') chunk += 'null';
        else yield* visit(item, inner);
        if (chunk.length >= JSON_CHUNK_CHARACTERS) {
          yield chunk;
          chunk = '';
        }
        yield null;
      }
      chunk += first ? '[]' : `\n${indent}]`;
      return;
    }
    const entries = Object.entries(node as Record<string, unknown>).filter(([, item]) => item !== undefined && typeof item !== 'function');
    chunk += '{\n';
    for (const [index, [key, item]] of entries.entries()) {
      chunk += `${inner}${JSON.stringify(key)}: `;
      yield* visit(item, inner);
      chunk += index < entries.length - 1 ? ',\n' : '\n';
    }
    chunk += `${indent}}`;
  }
  yield* visit(value, '');
  chunk += '\n';
  yield chunk;
}

/** Write `value` as `JSON.stringify(value, null, 2)` followed by a newline, in chunks through `write`. */
export function writeJson(value: unknown, write: (text: string) => void): void {
  for (const chunk of jsonChunks(value)) if (chunk !== null) write(chunk);
}

/** The same, waiting on `pause` between items of long arrays (pause-for-signals.ts). */
export async function writeJsonPausing(value: unknown, write: (text: string) => void, pause: () => Promise<void>): Promise<void> {
  for (const chunk of jsonChunks(value)) {
    if (chunk !== null) write(chunk);
    await pause();
  }
}
