import { describe, expect, it } from 'vitest';
import { createRandom } from '../math/index.js';
import { roundedCosSin, roundedPow10 } from './correctly-rounded.js';

/** Distance between two float64s in units in the last place of the first. */
function ulpsApart(a: number, b: number): number {
  const ulp = 2 ** (Math.floor(Math.log2(Math.abs(a))) - 52);
  return Math.abs(a - b) / ulp;
}

describe('10^x correctly rounded', () => {
  it('gives powers of ten exactly as JavaScript reads their literals (ECMA-262 §6.1.6.1: number literals round to nearest)', () => {
    for (let k = 0; k <= 22; k += 1) {
      expect(roundedPow10(k)).toBe(Number(`1e${k}`));
      expect(roundedPow10(-k)).toBe(Number(`1e-${k}`));
    }
  });
  it('gives 10^0.5 as the correctly rounded square root of 10 (IEEE 754-2019 §5.4.1: sqrt rounds correctly)', () => {
    expect(roundedPow10(0.5)).toBe(Math.sqrt(10));
  });
  it('rounds 10^0.11613034009933472 up where the engine’s Math.pow rounds down', () => {
    // 10^0.11613034009933472 = 1.306562953884617216358320459… (60-digit decimal evaluation); the nearest float64 is
    // 1.3065629538846173 (0.36 ulp away), the C library's pow gives it, and node-web-audio-api uses it for the cabinet's
    // second top roll-off section (Q in dB = 2.3226068…, 10^(Q/20)).
    expect(roundedPow10(0.11613034009933472)).toBe(1.3065629538846173);
  });
  it('is within one ulp of Math.pow everywhere a chain needs it', () => {
    const random = createRandom(5);
    for (let i = 0; i < 300; i += 1) {
      const x = 4 * random() - 2;
      expect(ulpsApart(roundedPow10(x), 10 ** x)).toBeLessThanOrEqual(1);
    }
  });
});

describe('cos and sin correctly rounded', () => {
  it.each([
    // x, cos x, sin x: the float64s nearest to 60-digit decimal evaluations of the series, e.g.
    // cos 1 = 0.540302305868139717400936607442976603…, sin 1 = 0.841470984807896506652502321630298999…
    [1, 0.5403023058681398, 0.8414709848078965],
    [0.5, 0.8775825618903728, 0.479425538604203],
    [2, -0.4161468365471424, 0.9092974268256817],
  ])('at %s', (x, cos, sin) => {
    expect(roundedCosSin(x)).toEqual({ cos, sin });
  });
  it('is within one ulp of Math.cos and Math.sin over (0, π)', () => {
    const random = createRandom(9);
    for (let i = 0; i < 300; i += 1) {
      const x = Math.PI * random();
      const { cos, sin } = roundedCosSin(x);
      expect(ulpsApart(cos, Math.cos(x))).toBeLessThanOrEqual(1);
      expect(ulpsApart(sin, Math.sin(x))).toBeLessThanOrEqual(1);
      expect(cos * cos + sin * sin).toBeCloseTo(1, 15);
    }
  });
});
