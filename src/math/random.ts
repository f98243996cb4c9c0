/**
 * Seeded pseudo-random numbers, so every render is reproducible byte for
 * byte. mulberry32 (T. Ettinger, public domain, 2017): a 32-bit state,
 * uniform output in [0, 1).
 */
export type Random = () => number;

const GOLDEN_GAMMA = 0x6d2b79f5; // mulberry32's increment
const TWO_TO_32 = 4294967296;

export function createRandom(seed: number): Random {
  let state = seed >>> 0;
  return () => {
    state = (state + GOLDEN_GAMMA) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / TWO_TO_32;
  };
}

/** A 32-bit seed from text (FNV-1a, Fowler–Noll–Vo), to derive independent streams by name. */
export function seedFromText(text: string): number {
  let hash = 0x811c9dc5; // FNV-1a 32-bit offset basis
  for (let i = 0; i < text.length; i += 1) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0; // FNV-1a 32-bit prime
  }
  return hash >>> 0;
}
