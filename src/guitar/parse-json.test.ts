import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { findJsonFault, lineAndColumn, parseJsonText } from './parse-json.js';

describe('parseJsonText', () => {
  it.each([
    ['{"a": 1,}', 1, 9, 'trailing comma'],
    ['{\n  "a": 1\n  "b": 2\n}', 3, 3, '"," or "}" expected'],
    ['// note\n{}', 1, 1, 'a comment'],
    ["{'a': 1}", 1, 2, 'single quote'],
    ['{"a": [1, 2}', 1, 12, '"," or "]" expected'],
    ['{"a": "unterminated}', 1, 7, 'never closed'],
    ['{"a": 01}', 1, 8, '"," or "}" expected'],
    ['{} {}', 1, 4, 'more text after the end'],
    ['', 1, 1, 'the file ends'],
  ])('locates the fault in %j at line %d column %d', (text, line, column, reason) => {
    try {
      parseJsonText(text, 'g.json');
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      const [problem] = (error as InputError).problems;
      expect(problem?.path).toBe(`g.json:${line}:${column}`);
      expect(problem?.got).toContain(reason);
    }
  });

  it('agrees with JSON.parse on valid text', () => {
    const text = '{"a": [1, -2.5e3, true, null, "x\\u00e9\\n"], "b": {}}';
    expect(findJsonFault(text)).toBeUndefined();
    expect(parseJsonText(text, 'g.json')).toEqual(JSON.parse(text));
  });

  it('counts lines and columns from 1', () => {
    expect(lineAndColumn('ab\ncd', 4)).toEqual({ line: 2, column: 2 });
  });
});
