import { describe, expect, it } from 'vitest';
import { appendAll, maxOf, minOf } from './extremes.js';

describe('maxOf and minOf', () => {
  it('agree with Math.max and Math.min on small lists, empty lists and NaN', () => {
    const cases: number[][] = [[], [3], [1, -2, 5], [1, Number.NaN, 2], [Number.POSITIVE_INFINITY, 1]];
    for (const values of cases) {
      expect(maxOf(values)).toBe(Math.max(...values));
      expect(minOf(values)).toBe(Math.min(...values));
    }
  });

  it('take 300,000 values (more than six elements have wirings), where a spread overflows the call stack', () => {
    const values = Float64Array.from({ length: 300_000 }, (_, i) => Math.sin(i));
    expect(() => Math.max(...values)).toThrow(RangeError);
    let max = Number.NEGATIVE_INFINITY;
    let min = Number.POSITIVE_INFINITY;
    for (const value of values) {
      max = value > max ? value : max;
      min = value < min ? value : min;
    }
    expect(maxOf(values)).toBe(max);
    expect(minOf(values)).toBe(min);
    expect(appendAll([], values).length).toBe(300_000);
  });
});
