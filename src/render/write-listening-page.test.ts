import { describe, expect, it } from 'vitest';
import { createRandom } from '../math/index.js';
import { decodeSignal, encodeSignal } from '../page/index.js';
import { encodeSignalNatively } from './write-listening-page.js';

describe('encodeSignalNatively', () => {
  it("gives the page's own base64 text (encodeSignal) for every tail length and for a view into a larger buffer", () => {
    const random = createRandom(5);
    const whole = Float32Array.from({ length: 40 }, () => random() * 2 - 1);
    for (let length = 0; length < 8; length += 1) {
      const samples = whole.slice(0, length);
      expect(encodeSignalNatively(samples)).toBe(encodeSignal(samples));
    }
    // A view that starts past its buffer's start (a chain's output, a signal with header room before it).
    const view = whole.subarray(3, 31);
    expect(encodeSignalNatively(view)).toBe(encodeSignal(view));
    expect(decodeSignal(encodeSignalNatively(view))).toEqual(view);
  });
});
