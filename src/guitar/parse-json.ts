/**
 * JSON.parse with errors a person can act on: the line and column of the
 * first syntax error, in the project's message grammar. Node's own messages
 * do not always give a position, so on failure a small scanner that follows
 * the JSON grammar (RFC 8259) finds the first offending character.
 */
import { InputError } from '../errors/index.js';

/**
 * Deepest nesting of objects and lists accepted in an input file (judgement:
 * a guitar file nests 4 deep, a phrase file 3; far deeper is a mistake or an
 * attack, and would exhaust the call stack of recursive readers).
 */
export const MAX_JSON_DEPTH = 32;
/**
 * Largest input file accepted, characters (judgement: a guitar file is a few
 * kB; a phrase file at its 20,000-note limit is about 1.6 MB).
 */
export const MAX_JSON_CHARACTERS = 4 * 1024 * 1024;

/** Offset at which nesting first passes `limit` (brackets inside strings do not count), or undefined. */
export function findTooDeep(text: string, limit: number = MAX_JSON_DEPTH): number | undefined {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i += 1) {
    const code = text.charCodeAt(i);
    if (inString) {
      if (code === 0x5c) i += 1; // backslash: skip the escaped character
      else if (code === 0x22) inString = false;
    } else if (code === 0x22) inString = true;
    else if (code === 0x7b || code === 0x5b) {
      depth += 1;
      if (depth > limit) return i;
    } else if (code === 0x7d || code === 0x5d) depth -= 1;
  }
  return undefined;
}

/** Line and column (both from 1) of a character offset in a text. */
export function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  const end = Math.min(offset, text.length);
  for (let i = 0; i < end; i += 1) {
    if (text.charCodeAt(i) === 10) {
      line += 1;
      lineStart = i + 1;
    }
  }
  return { line, column: end - lineStart + 1 };
}

interface SyntaxFault {
  readonly offset: number;
  readonly reason: string;
}

/** Walks JSON text by RFC 8259's grammar; returns the first fault, or undefined when the text is valid. */
export function findJsonFault(text: string): SyntaxFault | undefined {
  let i = 0;
  const fault = (reason: string, at = i): SyntaxFault => ({ offset: at, reason });
  const skipSpace = (): void => {
    while (i < text.length && ' \t\n\r'.includes(text[i] ?? '')) i += 1;
  };
  const describeHere = (): string => {
    if (i >= text.length) return 'the file ends';
    const char = text[i] ?? '';
    if (char === '/') return 'a comment, which JSON does not allow';
    if (char === "'") return 'a single quote (JSON needs double quotes)';
    return `unexpected ${JSON.stringify(char)}`;
  };
  const value = (): SyntaxFault | undefined => {
    skipSpace();
    const char = text[i];
    if (char === '{') return object();
    if (char === '[') return array();
    if (char === '"') return string();
    if (char === '-' || (char !== undefined && char >= '0' && char <= '9')) return number();
    for (const word of ['true', 'false', 'null']) {
      if (text.startsWith(word, i)) {
        i += word.length;
        return undefined;
      }
    }
    return fault(`a value expected, but ${describeHere()}`);
  };
  const string = (): SyntaxFault | undefined => {
    const start = i;
    i += 1;
    while (i < text.length) {
      const char = text[i] ?? '';
      if (char === '"') {
        i += 1;
        return undefined;
      }
      if (char === '\\') {
        const next = text[i + 1] ?? '';
        if ('"\\/bfnrt'.includes(next) && next !== '') i += 2;
        else if (next === 'u' && /^[0-9a-fA-F]{4}$/u.test(text.slice(i + 2, i + 6))) i += 6;
        else return fault('a bad escape in a string');
      } else if (char.charCodeAt(0) < 0x20) {
        return fault('a line break or control character inside a string');
      } else i += 1;
    }
    return fault('a string that is never closed', start);
  };
  const number = (): SyntaxFault | undefined => {
    const match = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/u.exec(text.slice(i));
    if (!match) return fault('a malformed number');
    i += match[0].length;
    return undefined;
  };
  const array = (): SyntaxFault | undefined => {
    i += 1;
    skipSpace();
    if (text[i] === ']') {
      i += 1;
      return undefined;
    }
    for (;;) {
      const inner = value();
      if (inner) return inner;
      skipSpace();
      if (text[i] === ',') {
        i += 1;
        skipSpace();
        if (text[i] === ']') return fault('a trailing comma before "]"');
        continue;
      }
      if (text[i] === ']') {
        i += 1;
        return undefined;
      }
      return fault(`"," or "]" expected, but ${describeHere()}`);
    }
  };
  const object = (): SyntaxFault | undefined => {
    i += 1;
    skipSpace();
    if (text[i] === '}') {
      i += 1;
      return undefined;
    }
    for (;;) {
      skipSpace();
      if (text[i] !== '"') return fault(`a double-quoted field name expected, but ${describeHere()}`);
      const name = string();
      if (name) return name;
      skipSpace();
      if (text[i] !== ':') return fault(`":" expected after a field name, but ${describeHere()}`);
      i += 1;
      const inner = value();
      if (inner) return inner;
      skipSpace();
      if (text[i] === ',') {
        i += 1;
        skipSpace();
        if (text[i] === '}') return fault('a trailing comma before "}"');
        continue;
      }
      if (text[i] === '}') {
        i += 1;
        return undefined;
      }
      return fault(`"," or "}" expected, but ${describeHere()}`);
    }
  };
  const top = value();
  if (top) return top;
  skipSpace();
  return i < text.length ? fault(`more text after the end of the JSON document: ${describeHere()}`) : undefined;
}

/** Parse JSON text; on a syntax error throw an InputError naming `source` with line and column. */
export function parseJsonText(text: string, source: string): unknown {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text; // tolerate a UTF-8 byte-order mark
  if (body.length > MAX_JSON_CHARACTERS) {
    throw InputError.at(source, `a file of at most ${MAX_JSON_CHARACTERS / (1024 * 1024)} MB`, `${body.length} characters`);
  }
  const deep = findTooDeep(body);
  if (deep !== undefined) {
    const where = lineAndColumn(body, deep);
    throw new InputError([
      { path: `${source}:${where.line}:${where.column}`, expected: `objects and lists nested at most ${MAX_JSON_DEPTH} deep`, got: 'deeper nesting' },
    ]);
  }
  try {
    return JSON.parse(body);
  } catch (error) {
    const found = findJsonFault(body) ?? { offset: body.length, reason: error instanceof Error ? error.message : String(error) };
    const where = lineAndColumn(body, found.offset);
    throw new InputError([
      {
        path: `${source}:${where.line}:${where.column}`,
        expected: 'valid JSON (double-quoted names and strings, commas between items, no comments or trailing commas)',
        got: found.reason,
      },
    ]);
  }
}
