import { describe, expect, it } from 'vitest';
import { hashOf, hashWithShared } from './render-manifest.js';

describe('hashWithShared', () => {
  const shared = { model: 7, sound: { coils: [{ id: 'neck', turns: 5000 }], cable: { capacitanceF: 5e-10 } }, overrides: { volume: undefined }, hum: null, rate: Number.POSITIVE_INFINITY };

  it('hashes the same text as hashOf of the merged object, keys of both sides interleaved', () => {
    const hash = hashWithShared(shared);
    for (const own of [{ expression: 'neck + ~bridge' }, { a: 1 }, { zzz: [1, { b: 2, a: 3 }] }, { expression: 'mid', skipped: undefined }]) {
      expect(hash(own)).toBe(hashOf({ ...shared, ...own }));
    }
    // And it does depend on its own fields.
    expect(hash({ expression: 'neck' })).not.toBe(hash({ expression: 'mid' }));
  });

  it('refuses an own field that repeats a shared one', () => {
    expect(() => hashWithShared(shared)({ model: 8 })).toThrow(/model is a shared field/);
  });
});
