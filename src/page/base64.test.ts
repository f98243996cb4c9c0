import { describe, expect, it } from 'vitest';
import { decodeBase64, encodeBase64 } from './base64.js';

// Reference: Node's Buffer base64 (RFC 4648 §4, standard alphabet, padded).
const reference = (bytes: Uint8Array) => Buffer.from(bytes).toString('base64');

describe('base64 codec', () => {
  it('matches the RFC 4648 §10 test vectors', () => {
    const vectors: Array<[string, string]> = [['', ''], ['f', 'Zg=='], ['fo', 'Zm8='], ['foo', 'Zm9v'], ['foob', 'Zm9vYg=='], ['fooba', 'Zm9vYmE='], ['foobar', 'Zm9vYmFy']];
    for (const [plain, coded] of vectors) {
      const bytes = new TextEncoder().encode(plain);
      expect(encodeBase64(bytes)).toBe(coded);
      expect(Array.from(decodeBase64(coded))).toEqual(Array.from(bytes));
    }
  });

  it('agrees with Node Buffer on every byte value and every tail length, both ways', () => {
    for (const length of [1, 2, 3, 255, 256, 257, 0x2000 * 3 + 1, 100_003]) {
      const bytes = Uint8Array.from({ length }, (_, i) => (i * 131 + (i >> 8) * 7) & 0xff);
      const text = encodeBase64(bytes);
      expect(text).toBe(reference(bytes));
      expect(Buffer.from(decodeBase64(text)).equals(Buffer.from(bytes))).toBe(true);
    }
  });

  it('refuses text outside the alphabet or of a broken length', () => {
    expect(() => decodeBase64('Zm9')).toThrow(/multiple of 4/);
    expect(() => decodeBase64('Zm*v')).toThrow(/outside the alphabet/);
    expect(() => decodeBase64('Zé9v')).toThrow(/outside the alphabet/);
  });
});
