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

function holdsLongArray(value: unknown): boolean {
  if (Array.isArray(value)) return value.length > STREAMED_ARRAY_LENGTH || value.some(holdsLongArray);
  if (value !== null && typeof value === 'object' && !('toJSON' in value)) return Object.values(value).some(holdsLongArray);
  return false;
}

/** Write `value` as `JSON.stringify(value, null, 2)` followed by a newline, in chunks through `write`. */
export function writeJson(value: unknown, write: (text: string) => void): void {
  let chunk = '';
  const emit = (text: string): void => {
    chunk += text;
    if (chunk.length >= JSON_CHUNK_CHARACTERS) {
      write(chunk);
      chunk = '';
    }
  };
  const visit = (node: unknown, indent: string): void => {
    if (!holdsLongArray(node)) {
      emit(stringifyAt(node, indent));
      return;
    }
    const inner = indent + INDENT;
    if (Array.isArray(node)) {
      emit('[\n');
      node.forEach((item, index) => {
        emit(inner);
        // JSON.stringify writes null for array items it cannot print (undefined, functions).
        if (item === undefined || typeof item === 'function') emit('null');
        else visit(item, inner);
        emit(index < node.length - 1 ? ',\n' : '\n');
      });
      emit(`${indent}]`);
      return;
    }
    const entries = Object.entries(node as Record<string, unknown>).filter(([, item]) => item !== undefined && typeof item !== 'function');
    emit('{\n');
    entries.forEach(([key, item], index) => {
      emit(`${inner}${JSON.stringify(key)}: `);
      visit(item, inner);
      emit(index < entries.length - 1 ? ',\n' : '\n');
    });
    emit(`${indent}}`);
  };
  visit(value, '');
  emit('\n');
  write(chunk);
}
