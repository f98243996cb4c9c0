import { describe, expect, it } from 'vitest';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import { type KernelHost, createRandom, maxOf } from '../math/index.js';
import { type CentroidBand, type CentroidPatterns, prepareCentroidPass } from './centroid-kernel.js';

const HOSTS: readonly KernelHost[] = ['webassembly', 'javascript'];

/** A band of `bandBins` bins over a grid of `points` points, with `coilCount` random windowed spectra (varied exponents, zeros of both signs). */
function randomBand(seed: number, coilCount: number, bandBins: number, points: number, chunk: number): CentroidBand {
  const random = createRandom(seed);
  const awkward = (): number => {
    const roll = random();
    if (roll < 0.02) return 0;
    if (roll < 0.04) return -0;
    return (random() - 0.5) * 10 ** Math.floor(8 * random() - 4);
  };
  const node = new Int32Array(bandBins);
  const weight = new Float64Array(bandBins);
  for (let k = 0; k < bandBins; k += 1) {
    node[k] = Math.min(points - 2, Math.floor((k * (points - 1)) / bandBins));
    weight[k] = random();
  }
  return {
    spectra: Array.from({ length: coilCount }, () => Float64Array.from({ length: 2 * bandBins }, awkward)),
    node,
    weight,
    firstBin: 55,
    bandBins,
    chunk,
    points,
  };
}

/** Every sign pattern of the used coils, each flipping the smaller set (as measureCentroids does): 0 to ⌊used/2⌋ flips. */
function everyPattern(usedCoils: Int32Array, chunk: number): CentroidPatterns {
  const usedCount = usedCoils.length;
  const count = 2 ** usedCount;
  const flipStart = new Int32Array(count + 1);
  const flips: number[] = [];
  for (let pattern = 0; pattern < count; pattern += 1) {
    const negative: number[] = [];
    const positive: number[] = [];
    for (let u = 0; u < usedCount; u += 1) ((pattern >> u) & 1 ? negative : positive).push(2 * u * chunk);
    for (const offset of negative.length <= positive.length ? negative : positive) flips.push(offset);
    flipStart[pattern + 1] = flips.length;
  }
  return { usedCoils, usedCount, flipStart, flipOffsets: Int32Array.from(flips), count };
}

describe('the centroid pass', () => {
  // Seven coils, six of them used (a coil left out of the wiring has zero transfers): patterns flipping up to three
  // runs, so the path that subtracts the first flips apart is taken too; chunks that do not divide the band, and one bin.
  it.each([
    [512, 2_999],
    [97, 1_000],
    [1, 40],
  ])('gives the same sums to the last bit as WebAssembly and as JavaScript (chunk %i, %i bins)', (chunk, bandBins) => {
    const points = 37;
    const band = randomBand(chunk, 7, bandBins, points, chunk);
    const random = createRandom(bandBins);
    const transfers = Array.from({ length: 7 }, (_, coil) => Float64Array.from({ length: 2 * points }, () => (coil === 3 ? 0 : (random() - 0.5) * 10 ** Math.floor(4 * random() - 2))));
    const patterns = everyPattern(Int32Array.from([0, 1, 2, 4, 5, 6]), chunk);
    expect(maxOf(Array.from(patterns.flipStart.subarray(1), (end, p) => end - (patterns.flipStart[p] as number)))).toBe(3);
    const [wasm, javascript] = HOSTS.map((host) => {
      const pass = prepareCentroidPass(band, host);
      // Twice over the same pass: the second call starts from fresh sums, not the first call's.
      pass(transfers, patterns);
      return pass(transfers, patterns);
    }) as [Float64Array, Float64Array];
    expect(wasm).toHaveLength(2 * patterns.count);
    expect(firstBitDifference(javascript, wasm)).toBe(-1);
    expect(javascript.every((value) => Number.isFinite(value) && value > 0)).toBe(true);
  });

  it('takes a class with more patterns after one with fewer (its arrays grow)', () => {
    const band = randomBand(3, 4, 700, 20, 128);
    const random = createRandom(4);
    const transfers = Array.from({ length: 4 }, () => Float64Array.from({ length: 40 }, () => random() - 0.5));
    const passes = HOSTS.map((host) => prepareCentroidPass(band, host));
    for (const used of [[0], [0, 1, 2, 3], [1, 2]]) {
      const patterns = everyPattern(Int32Array.from(used), 128);
      const [wasm, javascript] = passes.map((pass) => pass(transfers, patterns)) as [Float64Array, Float64Array];
      expect(firstBitDifference(javascript, wasm), `used ${used.join(' ')}`).toBe(-1);
    }
  });
});
