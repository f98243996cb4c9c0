import { describe, expect, it } from 'vitest';
import { describeRenderedCount } from './render.js';

describe('describeRenderedCount', () => {
  it('says how many of all the wirings were rendered, and that the groups cover all of them', () => {
    expect(describeRenderedCount(47, 47)).toBe('47 wirings rendered');
    expect(describeRenderedCount(2, 47)).toBe('2 of 47 wirings rendered (groups over all 47)');
    expect(describeRenderedCount(1, 1)).toBe('1 wiring rendered');
  });
});
