import { describe, expect, it } from 'vitest';
import { createBlockScratch, eliminationPattern, eliminationSteps, imagAt, realAt, solveBlock } from './solve-blocked.js';

/** A small deterministic generator (a linear congruential generator, Numerical Recipes' constants), so the systems are the same on every run. */
function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/**
 * A block of `length` n×n systems of the nodal kind: A = G + jB with G real
 * symmetric positive definite (diagonally dominant) and B real symmetric of
 * any sign, zero outside `pattern`; the right-hand side A·x of a known x.
 */
function systems(n: number, pattern: Uint8Array, length: number, stride: number, susceptance: number, seed: number) {
  const random = generator(seed);
  const matrix = new Float64Array(2 * n * n * stride);
  const rhs = new Float64Array(2 * n * stride);
  const x = new Float64Array(2 * n * stride);
  for (let b = 0; b < length; b += 1) {
    for (let r = 0; r < n; r += 1) {
      for (let c = r + 1; c < n; c += 1) {
        if (pattern[r * n + c] === 0) continue;
        const g = -Math.abs(random());
        const s = susceptance * random();
        for (const [i, j] of [[r, c], [c, r]] as const) {
          matrix[realAt(i * n + j, stride) + b] = g;
          matrix[imagAt(i * n + j, stride) + b] = s;
        }
      }
    }
    for (let r = 0; r < n; r += 1) {
      let off = 0;
      for (let c = 0; c < n; c += 1) if (c !== r) off += Math.abs(matrix[realAt(r * n + c, stride) + b] as number);
      matrix[realAt(r * n + r, stride) + b] = off + 0.1 + Math.abs(random());
      matrix[imagAt(r * n + r, stride) + b] = susceptance * random();
      x[realAt(r, stride) + b] = random();
      x[imagAt(r, stride) + b] = random();
    }
    for (let r = 0; r < n; r += 1) {
      let sr = 0;
      let si = 0;
      for (let c = 0; c < n; c += 1) {
        const ar = matrix[realAt(r * n + c, stride) + b] as number;
        const ai = matrix[imagAt(r * n + c, stride) + b] as number;
        const xr = x[realAt(c, stride) + b] as number;
        const xi = x[imagAt(c, stride) + b] as number;
        sr += ar * xr - ai * xi;
        si += ar * xi + ai * xr;
      }
      rhs[realAt(r, stride) + b] = sr;
      rhs[imagAt(r, stride) + b] = si;
    }
  }
  return { matrix, rhs, x };
}

function worstError(solved: Float64Array, x: Float64Array, n: number, length: number, stride: number): number {
  let worst = 0;
  for (let b = 0; b < length; b += 1) {
    for (let r = 0; r < n; r += 1) {
      const dr = (solved[realAt(r, stride) + b] as number) - (x[realAt(r, stride) + b] as number);
      const di = (solved[imagAt(r, stride) + b] as number) - (x[imagAt(r, stride) + b] as number);
      worst = Math.max(worst, Math.hypot(dr, di) / Math.hypot(x[realAt(r, stride) + b] as number, x[imagAt(r, stride) + b] as number));
    }
  }
  return worst;
}

describe('solveBlock', () => {
  it('recovers x from A·x for dense systems with a positive definite real part, large susceptances included', () => {
    for (const n of [1, 2, 3, 5, 8]) {
      const stride = 16;
      const length = 13; // a block not filled to its stride
      const dense = new Uint8Array(n * n).fill(1);
      for (const susceptance of [0.1, 10, 1000]) {
        const { matrix, rhs, x } = systems(n, dense, length, stride, susceptance, 7 * n + susceptance);
        solveBlock(matrix, rhs, eliminationSteps(eliminationPattern(dense, n), n), length, stride, createBlockScratch(n, stride));
        expect(worstError(rhs, x, n, length, stride)).toBeLessThan(1e-11);
      }
    }
  });

  it('fills in where the elimination needs it, and only reads the pattern it is given', () => {
    // An arrow: the last node touches every other, which touch only themselves and it.
    const n = 5;
    const arrow = new Uint8Array(n * n);
    for (let r = 0; r < n; r += 1) {
      arrow[r * n + r] = 1;
      arrow[r * n + (n - 1)] = 1;
      arrow[(n - 1) * n + r] = 1;
    }
    expect(Array.from(eliminationPattern(arrow, n))).toEqual(Array.from(arrow)); // eliminating the spokes first fills nothing
    const reversed = new Uint8Array(n * n);
    for (let r = 0; r < n; r += 1) {
      reversed[r * n + r] = 1;
      reversed[r * n] = 1;
      reversed[r] = 1;
    }
    expect(eliminationPattern(reversed, n).every((entry) => entry === 1)).toBe(true); // the hub first fills everything
    const stride = 8;
    // With the hub first, every entry fills in: they start at 0 (the caller zeroes the block) and the solve computes them.
    const hubFirst = systems(n, reversed, stride, stride, 5, 3);
    solveBlock(hubFirst.matrix, hubFirst.rhs, eliminationSteps(eliminationPattern(reversed, n), n), stride, stride, createBlockScratch(n, stride));
    expect(worstError(hubFirst.rhs, hubFirst.x, n, stride, stride)).toBeLessThan(1e-12);
    // With the spokes first nothing fills in, so entries outside the pattern may hold anything: the solve does not read them.
    const spokesFirst = systems(n, arrow, stride, stride, 5, 4);
    for (let r = 0; r < n - 1; r += 1) {
      for (let c = 0; c < n - 1; c += 1) {
        if (r !== c) spokesFirst.matrix.fill(Number.NaN, realAt(r * n + c, stride), realAt(r * n + c, stride) + 2 * stride);
      }
    }
    solveBlock(spokesFirst.matrix, spokesFirst.rhs, eliminationSteps(eliminationPattern(arrow, n), n), stride, stride, createBlockScratch(n, stride));
    expect(worstError(spokesFirst.rhs, spokesFirst.x, n, stride, stride)).toBeLessThan(1e-12);
  });

  it('refuses a vanishing pivot', () => {
    const n = 2;
    const stride = 4;
    const dense = new Uint8Array(n * n).fill(1);
    const matrix = new Float64Array(2 * n * n * stride);
    matrix[realAt(1, stride)] = 1; // A = [0 1; 1 0] at bin 0: a matrix outside the nodal class
    matrix[realAt(2, stride)] = 1;
    const rhs = new Float64Array(2 * n * stride);
    expect(() => solveBlock(matrix, rhs, eliminationSteps(eliminationPattern(dense, n), n), 1, stride, createBlockScratch(n, stride))).toThrow(/singular/);
  });
});
