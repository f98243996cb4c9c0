import { describe, expect, it } from 'vitest';
import { countWirings } from '../wiring/index.js';
import { wiringCountFor } from './index.js';

describe('wiringCountFor', () => {
  // The closed form against the enumeration's own count, built structure by structure (an independent route).
  it.each([1, 2, 3, 4, 5])('%d elements: the same count as the enumeration', (n) => {
    expect(wiringCountFor(n)).toBe(countWirings(n));
  });

  it('gives the published totals 1, 6, 47, 572, 9997, 228386 (the README and the enumeration tests)', () => {
    expect([1, 2, 3, 4, 5, 6].map(wiringCountFor)).toEqual([1, 6, 47, 572, 9997, 228386]);
  });

  it('names the count a seven-element guitar would have', () => {
    // 7 + 21·4 + 35·32 + 35·416 + 21·7552 + 7·176128 + 78416·64
    expect(wiringCountFor(7)).toBe(6_425_883);
  });
});
