/**
 * A small seeded generator for reproducible random tests: mulberry32 (Tommy
 * Ettinger's 32-bit generator, public domain), enough for test inputs, not
 * for statistics.
 */
export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Whole number in [0, n). */
  below(n: number): number;
  /** One item of a non-empty list. */
  pick<T>(items: readonly T[]): T;
  /** Uniform in [low, high). */
  between(low: number, high: number): number;
  /** Log-uniform in [low, high) (both above 0): every decade equally likely. */
  logBetween(low: number, high: number): number;
}

/** UINT32 range, 2^32. */
const UINT32 = 4294967296;

export function seededRandom(seed: number): Random {
  let state = seed >>> 0;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / UINT32;
  };
  const below = (n: number): number => Math.floor(next() * n);
  return {
    next,
    below,
    pick: (items) => items[below(items.length)] as (typeof items)[number],
    between: (low, high) => low + (high - low) * next(),
    logBetween: (low, high) => Math.exp(Math.log(low) + (Math.log(high) - Math.log(low)) * next()),
  };
}

/** A count from an environment variable (for heavier runs), or the default. */
export function countFromEnvironment(name: string, fallback: number): number {
  const text = process.env[name];
  const value = text === undefined ? Number.NaN : Number(text);
  return Number.isInteger(value) && value > 0 ? value : fallback;
}
