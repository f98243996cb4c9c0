/**
 * Reads coilbench's wiring notation into a canonical network.
 *
 *   series   := parallel ('+' parallel)*
 *   parallel := unary ('//' unary)*        ('//' binds tighter than '+')
 *   unary    := '~' unary | primary         ('~' flips every element inside)
 *   primary  := element-id | '(' series ')'
 *
 * Any spacing, order and redundant parentheses are accepted; the result is
 * canonical, so `printNetwork(parseWiring(s))` is the canonical spelling.
 * Unknown names, an element used twice, empty groups and stray symbols are
 * errors naming the column.
 */
import { InputError, listWithSuggestion, showValue } from '../errors/index.js';
import { canonicalize } from './canonicalize.js';
import { type Network, invertAll, leaf } from './network.js';

/** What the parser needs to know about the guitar: element ids, and coils that are only reachable through a two-lead pickup. */
export interface WiringVocabulary {
  /** Element ids in declaration order. */
  readonly elementIds: readonly string[];
  /** Coil id → name of the two-lead pickup that houses it (such coils cannot be wired on their own). */
  readonly housedCoils?: ReadonlyMap<string, string>;
}

type Token =
  | { readonly type: 'name'; readonly text: string; readonly column: number }
  | { readonly type: '+' | '//' | '~' | '(' | ')'; readonly text: string; readonly column: number }
  | { readonly type: 'end'; readonly text: ''; readonly column: number };

const NAME_CHAR = /[A-Za-z0-9_.-]/u;
const NAME_START = /[A-Za-z]/u;

/** Hints for symbols people use for series and parallel in other notations. */
const STRAY_HINTS: Readonly<Record<string, string>> = Object.freeze({
  '|': 'write parallel as "//"',
  '||': 'write parallel as "//"',
  '/': 'write parallel as "//" (two slashes)',
  '-': 'write series as "+"',
  '*': 'write series as "+"',
  '!': 'write out of phase as "~"',
  '^': 'write out of phase as "~"',
  ',': 'join coils with "+" (series) or "//" (parallel)',
});

class Parser {
  private position = 0;
  private readonly used = new Map<number, number>();

  constructor(
    private readonly tokens: readonly Token[],
    private readonly source: string,
    private readonly path: string,
    private readonly vocabulary: WiringVocabulary,
  ) {}

  private fail(expected: string, token: Token): never {
    // Already shown as written (showValue: quoted, hidden characters visible), so not quoted a second time.
    const where = token.type === 'end' ? 'the end' : `${showValue(token.text)} at column ${token.column}`;
    throw new InputError([{ path: this.path, expected, got: `${where} of ${showValue(this.source)}` }]);
  }

  private peek(): Token {
    return this.tokens[this.position] ?? { type: 'end', text: '', column: this.source.length + 1 };
  }

  private take(): Token {
    const token = this.peek();
    this.position += 1;
    return token;
  }

  parseAll(): Network {
    if (this.peek().type === 'end') {
      throw InputError.at(this.path, 'a wiring such as "neck + ~bridge" or "(neck + mid) // bridge"', this.source);
    }
    const network = this.parseSeries();
    const rest = this.peek();
    if (rest.type !== 'end') {
      this.fail(rest.type === ')' ? 'no ")" without a matching "("' : '"+", "//" or the end of the wiring', rest);
    }
    return network;
  }

  private parseSeries(): Network {
    const parts = [this.parseParallel()];
    while (this.peek().type === '+') {
      this.take();
      parts.push(this.parseParallel());
    }
    return parts.length === 1 ? (parts[0] as Network) : { kind: 'series', parts };
  }

  private parseParallel(): Network {
    const parts = [this.parseUnary()];
    while (this.peek().type === '//') {
      this.take();
      parts.push(this.parseUnary());
    }
    return parts.length === 1 ? (parts[0] as Network) : { kind: 'parallel', parts };
  }

  private parseUnary(): Network {
    if (this.peek().type === '~') {
      this.take();
      return invertAll(this.parseUnary());
    }
    return this.parsePrimary();
  }

  private parsePrimary(): Network {
    const token = this.take();
    if (token.type === '(') {
      if (this.peek().type === ')') this.fail('a coil or group inside the parentheses (empty group)', this.peek());
      const inner = this.parseSeries();
      const close = this.take();
      if (close.type !== ')') this.fail('")" to close the group opened at column ' + token.column, close);
      return inner;
    }
    if (token.type === 'name') return this.element(token);
    this.fail(`a coil name (${this.vocabulary.elementIds.join(', ')}), "~" or "("`, token);
  }

  private element(token: Token & { type: 'name' }): Network {
    const index = this.vocabulary.elementIds.indexOf(token.text);
    if (index < 0) {
      const housing = this.vocabulary.housedCoils?.get(token.text);
      if (housing !== undefined) {
        this.fail(`a wiring element; coil "${token.text}" is inside the two-lead pickup "${housing}", so use "${housing}" as a whole`, token);
      }
      const pieces = token.text.split('-');
      const hint =
        pieces.length > 1 && pieces.every((piece) => this.vocabulary.elementIds.includes(piece))
          ? '; write series as "+"'
          : '';
      this.fail(`a known coil (${listWithSuggestion(token.text, this.vocabulary.elementIds)})${hint}`, token);
    }
    const earlier = this.used.get(index);
    if (earlier !== undefined) {
      this.fail(`each coil at most once ("${token.text}" is already used at column ${earlier})`, token);
    }
    this.used.set(index, token.column);
    return leaf(index, false);
  }
}

function tokenize(source: string, path: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < source.length) {
    const char = source[i] ?? '';
    const column = i + 1;
    if (/\s/u.test(char)) {
      i += 1;
    } else if (source.startsWith('//', i)) {
      tokens.push({ type: '//', text: '//', column });
      i += 2;
    } else if (char === '+' || char === '~' || char === '(' || char === ')') {
      tokens.push({ type: char, text: char, column });
      i += 1;
    } else if (NAME_START.test(char)) {
      let end = i + 1;
      while (end < source.length && NAME_CHAR.test(source[end] ?? '')) end += 1;
      tokens.push({ type: 'name', text: source.slice(i, end), column });
      i = end;
    } else {
      const stray = source.startsWith('||', i) ? '||' : char;
      const hint = STRAY_HINTS[stray];
      throw new InputError([
        {
          path,
          expected: `only coil names, "+", "//", "~" and parentheses${hint ? ` (${hint})` : ''}`,
          got: `${showValue(stray)} at column ${column} of ${showValue(source)}`,
        },
      ]);
    }
  }
  return tokens;
}

/**
 * Parse a wiring expression against a guitar's elements and return its
 * canonical network. `path` names where the text came from in messages
 * (`--only`, `expression`).
 */
export function parseWiring(source: string, vocabulary: WiringVocabulary, path = 'wiring'): Network {
  const parser = new Parser(tokenize(source, path), source, path, vocabulary);
  return canonicalize(parser.parseAll());
}
