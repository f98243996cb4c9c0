import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatCount } from './format-count.js';

describe('formatCount', () => {
  it('writes the counts of the trade as people read them', () => {
    expect(formatCount(0)).toBe('0');
    expect(formatCount(47)).toBe('47');
    expect(formatCount(572)).toBe('572');
    expect(formatCount(9997)).toBe('9,997');
    expect(formatCount(228386)).toBe('228,386');
    expect(formatCount(1000000)).toBe('1,000,000');
    expect(formatCount(-1234)).toBe('-1,234');
  });

  // Reference: ECMA-402 Number.prototype.toLocaleString with the en-US locale (Node's ICU).
  it('agrees with toLocaleString("en-US") on whole numbers', () => {
    fc.assert(
      fc.property(fc.integer({ min: -Number.MAX_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER }), (count) => {
        expect(formatCount(count)).toBe(count.toLocaleString('en-US'));
      }),
    );
  });
});
