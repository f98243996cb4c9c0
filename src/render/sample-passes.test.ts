/**
 * The sample passes as WebAssembly (wasm/sample-passes.ts) against their
 * JavaScript form (sample-passes.ts): the same peak, the same float32
 * products bit for bit, the same PCM bytes, and nothing written outside the
 * data, on samples chosen to meet every edge of the arithmetic: values past
 * full scale, halfway points of the rounding, signed zeros, subnormals,
 * infinities and NaN, and lengths from 0 up (a longer render after a shorter
 * one grows the kernel's room).
 */
import { describe, expect, it } from 'vitest';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import { createRandom } from '../math/index.js';
import { pcmFullScale } from './wav-file.js';
import { JAVASCRIPT_SAMPLE_PASSES, samplePasses } from './sample-passes.js';

const FULL_SCALE_24 = pcmFullScale(3);
/** Bytes kept around the data, filled with a sentinel, that no pass may touch. */
const GUARD_BYTES = 5;
const SENTINEL = 0xa5;

/** Samples at the edges: full scale and past it, a rounding's halfway points, zeros of both signs, tiny and huge values. */
function edgeSamples(): number[] {
  const halfway = (k: number): number => (k + 0.5) / FULL_SCALE_24;
  return [
    0, -0, 1, -1, 1.5, -1.5, 0.5, -0.5,
    halfway(0), -halfway(0), halfway(1), -halfway(1), halfway(4_194_303), -halfway(4_194_303),
    1 / FULL_SCALE_24, -1 / FULL_SCALE_24, 1e-45, -1e-45, 3e38, -3e38, Infinity, -Infinity,
  ];
}

/** `length` samples: the edges first, then noise of a few sizes (a seeded generator, so every run is the same). */
function samplesOf(length: number, seed: number, withUnfinite: boolean): Float32Array {
  const random = createRandom(seed);
  const samples = new Float32Array(length);
  const edges = edgeSamples().filter((value) => withUnfinite || Number.isFinite(value));
  for (let n = 0; n < length; n += 1) {
    samples[n] = n < edges.length ? (edges[n] as number) : (random() * 2 - 1) * 10 ** -Math.floor(random() * 4);
  }
  if (withUnfinite && length > edges.length) samples[length - 1] = Number.NaN;
  return samples;
}

describe('the sample passes as WebAssembly give the JavaScript form’s numbers and bytes', () => {
  const webassembly = samplePasses('webassembly');
  const cases = [
    [0, false],
    [1, false],
    [2, false],
    [30, true],
    [1_000, false],
    [4_099, true],
    [300, false],
  ] as const;

  it.each(cases)('%i samples (NaN and infinities among them: %s)', (length, withUnfinite) => {
    const samples = samplesOf(length, length + 1, withUnfinite);
    expect(Number.isNaN(webassembly.finiteSum(samples))).toBe(withUnfinite);
    expect(Object.is(webassembly.finiteSum(samples), JAVASCRIPT_SAMPLE_PASSES.finiteSum(samples))).toBe(true);
    const peak = JAVASCRIPT_SAMPLE_PASSES.peak(samples);
    expect(Object.is(webassembly.peak(samples), peak)).toBe(true);

    for (const gain of [1, 0.7071067811865476, 3.3, -2.5e-3]) {
      const expected = Float32Array.from(samples);
      const got = Float32Array.from(samples);
      JAVASCRIPT_SAMPLE_PASSES.scale(expected, gain);
      webassembly.scale(got, gain);
      expect(firstBitDifference(expected, got)).toBe(-1);
    }

    const size = 2 * GUARD_BYTES + 3 * length;
    const expected = new Uint8Array(size).fill(SENTINEL);
    const got = new Uint8Array(size).fill(SENTINEL);
    const expectedUnfinite = JAVASCRIPT_SAMPLE_PASSES.writeMonoPcm24(samples, expected, GUARD_BYTES, FULL_SCALE_24);
    const gotUnfinite = webassembly.writeMonoPcm24(samples, got, GUARD_BYTES, FULL_SCALE_24);
    expect(got).toEqual(expected);
    expect(Number.isNaN(gotUnfinite)).toBe(withUnfinite);
    expect(Number.isNaN(expectedUnfinite)).toBe(withUnfinite);
    expect(got.subarray(size - GUARD_BYTES).every((byte) => byte === SENTINEL)).toBe(true);
  });

  it('writes the PCM the WAV format defines: 24-bit two’s complement, low byte first, rounded half away from zero (IBM/Microsoft 1991)', () => {
    // 0.5·(2^23 − 1) = 4,194,303.5 rounds away from zero to ±4,194,304 = ±0x400000.
    const samples = Float32Array.of(1, -1, 0.5, -0.5, 2);
    const bytes = new Uint8Array(3 * samples.length);
    webassembly.writeMonoPcm24(samples, bytes, 0, FULL_SCALE_24);
    expect(Array.from(bytes)).toEqual([0xff, 0xff, 0x7f, 0x01, 0x00, 0x80, 0x00, 0x00, 0x40, 0x00, 0x00, 0xc0, 0xff, 0xff, 0x7f]);
  });
});
