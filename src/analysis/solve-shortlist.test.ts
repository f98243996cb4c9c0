import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureCircuitMetrics } from '../circuit/index.js';
import { InputError } from '../errors/index.js';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { measureDistinctness } from './measure-distinctness.js';
import { measureWiringDistance } from './measure-wiring-difference.js';
import { type ShortlistRequest, type ShortlistWiring, solveShortlist } from './solve-shortlist.js';
import { maxOf, minOf } from '../math/index.js';

const file = join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json');
const guitar = parseGuitarText(readFileSync(file, 'utf8'), 'three-single-coil.json');
const wirings = enumerateWirings(guitar.elements);
// A uniform hum field (docs/physics.md §6.1) leaves enough hum-cancelling wirings to exercise every constraint.
const circuit = measureCircuitMetrics(guitar, wirings, { humGradientPerM: 0 }).wirings;
const { profiles, thresholds } = measureDistinctness(guitar, wirings);
const table = wirings.map((_, a) => wirings.map((__, b) => measureWiringDistance(profiles, a, profiles, b, thresholds)));
const distance = (a: number, b: number): number => table[a]![b]!;
const list: ShortlistWiring[] = wirings.map((wiring, index) => ({
  rank: wiring.number,
  levelDb: profiles.levelsDb[index]!,
  humCancelling: circuit[index]!.humCancelling,
  elements: wiring.elements,
  expression: wiring.expression,
}));
const index = (expression: string): number => wirings.findIndex((wiring) => wiring.expression === expression);
const request = (fields: Partial<ShortlistRequest>): ShortlistRequest => ({
  count: 3,
  humCancelling: false,
  elements: null,
  elementIds: guitar.elements.map((element) => element.id),
  include: [],
  levelWindowDb: null,
  ...fields,
});

/** The best smallest distance over every set of `count` wirings meeting `allowed`, holding `include` and spanning at most `window` dB. */
function bruteForce(count: number, allowed: (index: number) => boolean, include: readonly number[], window: number | null): number {
  const pool = wirings.map((_, i) => i).filter((i) => allowed(i) && !include.includes(i));
  let best = Number.NEGATIVE_INFINITY;
  const walk = (start: number, chosen: number[]): void => {
    if (chosen.length === count) {
      const levels = chosen.map((i) => list[i]!.levelDb);
      if (window !== null && maxOf(levels) - minOf(levels) > window) return;
      let smallest = Number.POSITIVE_INFINITY;
      for (let i = 0; i < chosen.length; i += 1) for (let j = i + 1; j < chosen.length; j += 1) smallest = Math.min(smallest, distance(chosen[i]!, chosen[j]!));
      best = Math.max(best, smallest);
      return;
    }
    for (let p = start; p < pool.length; p += 1) walk(p + 1, [...chosen, pool[p]!]);
  };
  walk(0, [...include]);
  return best;
}

function problemOf(run: () => unknown): { path: string; expected: string } {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error.problems[0] as { path: string; expected: string };
    throw error;
  }
  throw new Error('expected an InputError');
}

describe('solveShortlist on the demo guitar', () => {
  it('picks the set with the largest smallest distance (brute force over all 16 215 triples)', () => {
    const shortlist = solveShortlist(list, distance, request({ count: 3 }));
    expect(shortlist.method).toBe('exact');
    expect(shortlist.members).toHaveLength(3);
    expect(shortlist.minDistance).toBeCloseTo(bruteForce(3, () => true, [], null), 12);
  });

  it('--hum-cancelling: only hum-cancelling wirings, the best of them', () => {
    const shortlist = solveShortlist(list, distance, request({ count: 4, humCancelling: true }));
    for (const member of shortlist.members) expect(list[member]!.humCancelling, wirings[member]!.expression).toBe(true);
    expect(shortlist.candidateCount).toBe(12);
    expect(shortlist.minDistance).toBeCloseTo(bruteForce(4, (i) => list[i]!.humCancelling, [], null), 12);
  });

  it('--coils: only wirings of the allowed coils (neck and bridge give exactly six)', () => {
    const shortlist = solveShortlist(list, distance, request({ count: 6, elements: [0, 2] }));
    expect(shortlist.members.map((member) => wirings[member]!.expression)).toEqual(['neck', 'bridge', 'neck + bridge', 'neck + ~bridge', 'neck // bridge', 'neck // ~bridge']);
    const four = solveShortlist(list, distance, request({ count: 4, elements: [0, 2] }));
    for (const member of four.members) expect(wirings[member]!.elements.every((element) => element === 0 || element === 2)).toBe(true);
  });

  it('--include: the given wirings are in, the rest chosen around them', () => {
    const include = [index('neck'), index('neck // mid'), index('mid')];
    const shortlist = solveShortlist(list, distance, request({ count: 5, include }));
    for (const member of include) expect(shortlist.members).toContain(member);
    expect(shortlist.minDistance).toBeCloseTo(bruteForce(5, () => true, include, null), 12);
  });

  it('--level-window: every chosen wiring within the window of every other, best such set', () => {
    for (const window of [1, 3, 6]) {
      const shortlist = solveShortlist(list, distance, request({ count: 4, levelWindowDb: window }));
      const levels = shortlist.members.map((member) => list[member]!.levelDb);
      expect(maxOf(levels) - minOf(levels)).toBeLessThanOrEqual(window);
      expect(shortlist.minDistance, `${window} dB`).toBeCloseTo(bruteForce(4, () => true, [], window), 12);
    }
    const withInclude = solveShortlist(list, distance, request({ count: 3, levelWindowDb: 2, include: [index('neck')] }));
    expect(withInclude.members).toContain(index('neck'));
    const levels = withInclude.members.map((member) => list[member]!.levelDb);
    expect(maxOf(levels) - minOf(levels)).toBeLessThanOrEqual(2);
    expect(withInclude.minDistance).toBeCloseTo(bruteForce(3, () => true, [index('neck')], 2), 12);
  });

  it('beyond the exact method, the heuristic still keeps every constraint, and never beats the exact optimum', () => {
    for (const window of [4, 8]) {
      const include = [index('neck + mid')];
      const fields = { count: 4, humCancelling: true, include, levelWindowDb: window };
      const heuristic = solveShortlist(list, distance, request(fields), { exactLimit: 0 });
      const exact = solveShortlist(list, distance, request(fields));
      expect(heuristic.method).toBe('heuristic');
      expect(heuristic.members).toContain(include[0]);
      for (const member of heuristic.members) expect(list[member]!.humCancelling).toBe(true);
      const levels = heuristic.members.map((member) => list[member]!.levelDb);
      expect(maxOf(levels) - minOf(levels)).toBeLessThanOrEqual(window);
      expect(heuristic.minDistance).toBeLessThanOrEqual(exact.minDistance + 1e-12);
    }
  });

  it('all constraints at once', () => {
    const include = [index('neck + mid')];
    const shortlist = solveShortlist(list, distance, request({ count: 3, humCancelling: true, elements: [0, 1, 2], include, levelWindowDb: 4 }));
    expect(shortlist.members).toContain(include[0]);
    const levels = shortlist.members.map((member) => list[member]!.levelDb);
    expect(maxOf(levels) - minOf(levels)).toBeLessThanOrEqual(4);
    for (const member of shortlist.members) expect(list[member]!.humCancelling).toBe(true);
    expect(shortlist.minDistance).toBeCloseTo(bruteForce(3, (i) => list[i]!.humCancelling, include, 4), 12);
  });

  it('says which constraint to relax when they cannot be met', () => {
    const tooMany = problemOf(() => solveShortlist(list, distance, request({ count: 13, humCancelling: true })));
    expect(tooMany.path).toBe('count');
    expect(tooMany.expected).toMatch(/only 12 wirings are hum cancelling; relax the hum-cancelling constraint/u);
    const coils = problemOf(() => solveShortlist(list, distance, request({ count: 7, elements: [0, 2] })));
    expect(coils.expected).toMatch(/only 6 wirings use only neck, bridge; relax the coils allowed/u);
    const all = problemOf(() => solveShortlist(list, distance, request({ count: 48 })));
    expect(all).toMatchObject({ path: 'count', expected: 'at most 47, the number of wirings' });
    const notQuiet = problemOf(() => solveShortlist(list, distance, request({ humCancelling: true, include: [index('neck')] })));
    expect(notQuiet.path).toBe('include[0]');
    expect(notQuiet.expected).toMatch(/hum-cancelling/u);
    const otherCoil = problemOf(() => solveShortlist(list, distance, request({ elements: [0], include: [index('mid')] })));
    expect(otherCoil.path).toBe('include[0]');
    const narrow = problemOf(() => solveShortlist(list, distance, request({ count: 6, levelWindowDb: 0.05 })));
    expect(narrow.path).toBe('levelWindowDb');
    expect(narrow.expected).toMatch(/no 6 of the 47 wirings lie within 0\.1 dB of each other \(the closest 6 span \d+\.\d dB\); widen the level window/u);
    const spread = problemOf(() => solveShortlist(list, distance, request({ levelWindowDb: 1, include: [index('neck + mid + bridge'), index('neck // ~mid')] })));
    expect(spread.path).toBe('levelWindowDb');
    expect(spread.expected).toMatch(/the wirings that must be included span that much/u);
    const fewer = problemOf(() => solveShortlist(list, distance, request({ count: 1, include: [0, 1] })));
    expect(fewer.path).toBe('count');
  });
});
