import { describe, expect, it } from 'vitest';
import { countWirings, enumerateWirings } from './enumerate-wirings.js';
import { parseWiring } from './parse-wiring.js';
import { printNetwork } from './print-wiring.js';

// OEIS A006351, "Number of series-parallel networks with n labeled edges":
// 1, 2, 8, 52, 472, 5504 (https://oeis.org/A006351).
const A006351 = [1, 2, 8, 52, 472, 5504];

const binomial = (n: number, k: number): number => {
  let value = 1;
  for (let i = 1; i <= k; i += 1) value = (value * (n - k + i)) / i;
  return value;
};

/** W(n) = Σ_k C(n,k)·A006351(k)·2^(k−1) (docs/physics.md §5). */
const expectedCount = (n: number): number =>
  A006351.slice(0, n).reduce((sum, networks, index) => sum + binomial(n, index + 1) * networks * 2 ** index, 0);

const ids = (n: number) => Array.from({ length: n }, (_, index) => ({ id: `coil${index + 1}` }));

describe('enumerateWirings', () => {
  it('gives 1, 6, 47, 572, 9997 wirings for 1 to 5 elements (OEIS A006351 × 2^(k−1) over subsets)', () => {
    const counts = [1, 2, 3, 4, 5].map((n) => enumerateWirings(ids(n)).length);
    expect(counts).toEqual([1, 6, 47, 572, 9997]);
    expect(counts).toEqual([1, 2, 3, 4, 5].map(expectedCount));
  });

  it('counts 228386 for six elements (same formula)', () => {
    expect(countWirings(6)).toBe(expectedCount(6));
    expect(countWirings(6)).toBe(228386);
  });

  it('networks on the full set of k elements follow A006351', () => {
    for (let k = 1; k <= 5; k += 1) {
      const full = enumerateWirings(ids(k)).filter((wiring) => wiring.elements.length === k);
      expect(full.length).toBe((A006351[k - 1] ?? 0) * 2 ** (k - 1));
    }
  });

  it('prints canonical text that parses back to itself', () => {
    const elements = ids(4);
    const vocabulary = { elementIds: elements.map((element) => element.id) };
    const wirings = enumerateWirings(elements);
    const expressions = new Set(wirings.map((wiring) => wiring.expression));
    expect(expressions.size).toBe(wirings.length);
    for (const wiring of wirings) {
      expect(printNetwork(parseWiring(wiring.expression, vocabulary), vocabulary.elementIds)).toBe(wiring.expression);
    }
  });

  it('numbers in the stable order: fewer coils, then coils used, then series, parallel, mixed, then in phase first', () => {
    const wirings = enumerateWirings([{ id: 'neck' }, { id: 'mid' }, { id: 'bridge' }]);
    expect(wirings.slice(0, 7).map((wiring) => wiring.expression)).toEqual([
      'neck',
      'mid',
      'bridge',
      'neck + mid',
      'neck + ~mid',
      'neck // mid',
      'neck // ~mid',
    ]);
    expect(wirings.map((wiring) => wiring.id)).toEqual(wirings.map((_, index) => `w${index + 1}`));
    const rank = { single: 0, series: 0, parallel: 1, 'series-parallel': 2 } as const;
    for (let i = 1; i < wirings.length; i += 1) {
      const before = wirings[i - 1]!;
      const after = wirings[i]!;
      expect(before.elements.length).toBeLessThanOrEqual(after.elements.length);
      if (before.elements.join() === after.elements.join()) {
        expect(rank[before.topology]).toBeLessThanOrEqual(rank[after.topology]);
        if (before.topology === after.topology) {
          expect(before.outOfPhase.length).toBeLessThanOrEqual(after.outOfPhase.length);
        }
      }
    }
  });

  it('never marks the earliest-declared element out of phase', () => {
    for (const wiring of enumerateWirings(ids(4))) expect(wiring.outOfPhase).not.toContain(wiring.elementIds[0]);
  });

  it('describes wirings in plain words', () => {
    const wirings = enumerateWirings([{ id: 'neck' }, { id: 'mid' }, { id: 'bridge' }]);
    const byExpression = new Map(wirings.map((wiring) => [wiring.expression, wiring]));
    expect(byExpression.get('neck + ~bridge')?.description).toBe('neck and bridge in series, bridge out of phase');
    expect(byExpression.get('mid')?.description).toBe('mid alone');
    expect(byExpression.get('(neck + mid) // bridge')?.description).toBe('neck and mid in series, in parallel with bridge');
    expect(byExpression.get('neck + ~mid + ~bridge')?.description).toBe(
      'neck, mid and bridge in series; neck is out of phase with the others',
    );
    expect(byExpression.get('(neck + mid) // bridge')?.topology).toBe('series-parallel');
  });
});
