import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { enumerateWirings } from './enumerate-wirings.js';
import { type Network, invertAll } from './network.js';
import { parseWiring } from './parse-wiring.js';
import { printNetwork } from './print-wiring.js';

const elementIds = ['neck', 'mid', 'bridge', 'bridge_screw'];
const vocabulary = { elementIds, housedCoils: new Map([['inner', 'bridge_hb']]) };
const canonical = (text: string) => printNetwork(parseWiring(text, vocabulary), elementIds);

describe('parseWiring', () => {
  it.each([
    ['bridge // (~mid + neck)', '(neck + ~mid) // bridge'],
    ['neck+~bridge', 'neck + ~bridge'],
    ['~neck + bridge', 'neck + ~bridge'],
    ['((neck))', 'neck'],
    ['neck // mid + bridge', '(neck // mid) + bridge'], // '//' binds tighter than '+'
    ['neck + (mid + bridge)', 'neck + mid + bridge'],
    ['~(mid // bridge) + neck', 'neck + (~mid // ~bridge)'],
    ['~~neck + mid', 'neck + mid'],
    ['  bridge_screw //neck ', 'neck // bridge_screw'],
  ])('reads %j as %j', (text, expected) => {
    expect(canonical(text)).toBe(expected);
  });

  it.each([
    ['neck + pickup', 'a known coil'],
    ['neck + brdge', 'did you mean bridge?'],
    ['neck + neck', 'each coil at most once'],
    ['neck + ()', 'empty group'],
    ['neck | mid', 'write parallel as "//"'],
    ['neck - mid', 'write series as "+"'],
    ['neck-mid', 'write series as "+"'],
    ['neck +', 'the end of "neck +"'],
    ['(neck + mid', '")" to close the group'],
    ['neck + mid)', 'no ")" without a matching "("'],
    ['', 'a wiring such as'],
    ['neck mid', '"+", "//" or the end'],
    ['inner + neck', 'two-lead pickup "bridge_hb"'],
  ])('refuses %j with a clear message', (text, message) => {
    expect(() => parseWiring(text, vocabulary, '--only')).toThrow(InputError);
    try {
      parseWiring(text, vocabulary, '--only');
    } catch (error) {
      const [problem] = (error as InputError).problems;
      expect(problem?.path).toBe('--only');
      expect(`${problem?.expected} ${problem?.got}`).toContain(message);
    }
  });
});

/** Random respelling of a network: shuffled parts, redundant regrouping of same-kind parts, and optionally everything inverted. */
function respell(network: Network, random: () => number): string {
  const spell = (node: Network): string => {
    if (node.kind === 'element') return `${node.inverted ? '~' : ''}${elementIds[node.element]}`;
    const parts = node.parts.map(spell).map((part) => (part.includes(' ') || random() < 0.3 ? `(${part})` : part));
    for (let i = parts.length - 1; i > 0; i -= 1) {
      const j = Math.floor(random() * (i + 1));
      [parts[i], parts[j]] = [parts[j]!, parts[i]!];
    }
    const joiner = node.kind === 'series' ? ' + ' : ' // ';
    if (parts.length > 2 && random() < 0.5) return `(${parts.slice(0, 2).join(joiner)})${joiner}${parts.slice(2).join(joiner)}`;
    return parts.join(joiner);
  };
  return spell(random() < 0.5 ? invertAll(network) : network);
}

describe('canonical form (property)', () => {
  const wirings = enumerateWirings(elementIds.map((id) => ({ id })));
  it('any respelling of a wiring prints as its canonical expression', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: wirings.length - 1 }), fc.integer(), (index, seed) => {
        const wiring = wirings[index]!;
        let state = seed >>> 0;
        const random = () => {
          state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
          return state / 4294967296;
        };
        expect(canonical(respell(wiring.network, random))).toBe(wiring.expression);
      }),
      { numRuns: 500 },
    );
  });
});
