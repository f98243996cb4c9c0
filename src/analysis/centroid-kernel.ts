/**
 * The centroid pass of the audio figures (measure-audio-figures.ts): for the
 * phase patterns of one class, Σ k·|X_k| and Σ |X_k| over the band's bins,
 * X = Σ_u s_u·T_u·H_u (see `measureCentroids` there). It runs as WebAssembly
 * compiled from wasm/centroid-pass.ts: the same operations in the same order
 * as `centroidSums` below, so the same bits (centroid-kernel.test.ts compares
 * the two number for number). The JavaScript runs where a host cannot
 * compile WebAssembly.
 *
 * Why: the pass is most of the audio figures' cost per wiring. As
 * WebAssembly its loops run about twice as fast, warm, and far faster in a
 * process's first classes, which V8 runs in its interpreter as JavaScript
 * (DEVELOPERS.md, "Code the interpreter runs", has the figures).
 *
 * Each prepared pass has an instance and memory of its own
 * (src/math/wasm-arena.ts), holding every coil's windowed band spectrum and
 * the bins' grid places, copied in once; a class's transfers and its
 * patterns' flips go in and the sums come out at each call.
 */
import { F64_BYTES, I32_BYTES, type KernelHost, allocate, copyIn, instantiateArena, kernelHost, memoryView } from '../math/index.js';
import { CENTROID_PASS_WASM } from './centroid-pass-wasm.js';

/** What the pass reads for every class: the band and each coil's windowed spectrum over it. */
export interface CentroidBand {
  /** Every coil's Hann-windowed spectrum over the band's bins (2·bandBins numbers, interleaved complex), in coil order. */
  readonly spectra: readonly Float64Array[];
  /** Each band bin's grid interval (its lower grid point) and the upper point's hat weight. */
  readonly node: Int32Array;
  readonly weight: Float64Array;
  /** Bin number of the band's first bin, and the band's bins. */
  readonly firstBin: number;
  readonly bandBins: number;
  /** Bins taken at a time (AudioFigureOptions.centroidChunkBins, never more than the band). */
  readonly chunk: number;
  /** Grid points of a transfer (each 2·points numbers). */
  readonly points: number;
}

/** A class's patterns for the pass: the used coils and, per pattern, the offsets of its flipped runs (2·u·chunk for used coil u). */
export interface CentroidPatterns {
  /** The used coils (those whose transfer is not all zeros), in order; the first `usedCount` entries count. */
  readonly usedCoils: Int32Array;
  readonly usedCount: number;
  /** Pattern p's flips are flipOffsets[flipStart[p] … flipStart[p + 1] − 1]. */
  readonly flipStart: Int32Array;
  readonly flipOffsets: Int32Array;
  readonly count: number;
}

/** Σ k·|X_k| at 2p and Σ |X_k| at 2p + 1 for each pattern p of a class, from every coil's transfer at the grid (by coil index). */
export type CentroidPass = (transfers: readonly Float64Array[], patterns: CentroidPatterns) => Float64Array;

interface CentroidPassExports {
  centroidSums(
    transfers: number,
    points: number,
    spectra: number,
    usedCoils: number,
    usedCount: number,
    node: number,
    weight: number,
    bandBins: number,
    firstBin: number,
    chunk: number,
    base: number,
    flipped: number,
    products: number,
    zeroRun: number,
    flipStart: number,
    flipOffsets: number,
    count: number,
    sums: number,
  ): void;
}

/** The pass over `band`, as WebAssembly where the host compiles it (`host` picks, for tests). */
export function prepareCentroidPass(band: CentroidBand, host: KernelHost = kernelHost()): CentroidPass {
  const arena = host === 'webassembly' ? instantiateArena<CentroidPassExports>(CENTROID_PASS_WASM) : null;
  if (host === 'webassembly' && !arena) throw new Error('this host cannot compile WebAssembly');
  const { spectra, node, weight, firstBin, bandBins, chunk, points } = band;
  const coilCount = spectra.length;
  // After the coils' runs one run of zeros, never written: what a pattern flipping fewer than two coils subtracts.
  const zeroRun = 2 * chunk * coilCount;
  const productsLength = 2 * chunk * (coilCount + 1);
  if (!arena) {
    const base = new Float64Array(2 * chunk);
    const flipped = new Float64Array(2 * chunk);
    const products = new Float64Array(productsLength);
    return (transfers, patterns) => {
      const sums = new Float64Array(2 * patterns.count);
      centroidSums(band, transfers, patterns, { base, flipped, products, zeroRun }, sums);
      return sums;
    };
  }
  const spectraAt = allocate(arena, 2 * bandBins * coilCount, F64_BYTES);
  const spectraInMemory = memoryView(arena.exports.memory, spectraAt, 2 * bandBins * coilCount)();
  spectra.forEach((spectrum, coil) => spectraInMemory.set(spectrum.subarray(0, 2 * bandBins), 2 * bandBins * coil));
  const nodeAt = copyIn(arena, node.subarray(0, bandBins));
  const weightAt = copyIn(arena, weight.subarray(0, bandBins));
  const baseAt = allocate(arena, 2 * chunk, F64_BYTES);
  const flippedAt = allocate(arena, 2 * chunk, F64_BYTES);
  // Fresh memory is zeros, so the zero run needs no writing.
  const productsAt = allocate(arena, productsLength, F64_BYTES);
  const transfersAt = allocate(arena, 2 * points * coilCount, F64_BYTES);
  const transfersView = memoryView(arena.exports.memory, transfersAt, 2 * points * coilCount);
  const usedAt = allocate(arena, coilCount, I32_BYTES);
  // Sized for the class with the most patterns seen so far, grown (a new place) when a class has more.
  let room = { count: -1, flipStartAt: 0, flipOffsetsAt: 0, sumsAt: 0 };
  const roomFor = (count: number): typeof room => {
    if (count <= room.count) return room;
    room = { count, flipStartAt: allocate(arena, count + 1, I32_BYTES), flipOffsetsAt: allocate(arena, count * coilCount, I32_BYTES), sumsAt: allocate(arena, 2 * count, F64_BYTES) };
    return room;
  };
  return (transfers, patterns) => {
    const { usedCoils, usedCount, flipStart, flipOffsets, count } = patterns;
    const { flipStartAt, flipOffsetsAt, sumsAt } = roomFor(count);
    const memory = arena.exports.memory;
    const inMemory = transfersView();
    for (let u = 0; u < usedCount; u += 1) inMemory.set((transfers[usedCoils[u] as number] as Float64Array).subarray(0, 2 * points), 2 * points * u);
    new Int32Array(memory.buffer, usedAt, usedCount).set(usedCoils.subarray(0, usedCount));
    new Int32Array(memory.buffer, flipStartAt, count + 1).set(flipStart.subarray(0, count + 1));
    new Int32Array(memory.buffer, flipOffsetsAt, flipOffsets.length).set(flipOffsets);
    const sums = new Float64Array(memory.buffer, sumsAt, 2 * count);
    sums.fill(0);
    arena.exports.centroidSums(transfersAt, points, spectraAt, usedAt, usedCount, nodeAt, weightAt, bandBins, firstBin, chunk, baseAt, flippedAt, productsAt, zeroRun, flipStartAt, flipOffsetsAt, count, sumsAt);
    return sums.slice();
  };
}

/** The work arrays of the JavaScript pass: B, B less a pattern's first flips, the 2·P_u runs (and the zero run at `zeroRun`). */
interface CentroidWork {
  readonly base: Float64Array;
  readonly flipped: Float64Array;
  readonly products: Float64Array;
  readonly zeroRun: number;
}

/**
 * The pass in JavaScript (where a host cannot compile WebAssembly, and the
 * reference the WebAssembly is held to): chunk by chunk, each used coil's
 * products (addCoilProducts), then each pattern's sums (sumMagnitudesTwoFlips),
 * into `sums` (zeros when new).
 */
export function centroidSums(band: CentroidBand, transfers: readonly Float64Array[], patterns: CentroidPatterns, work: CentroidWork, sums: Float64Array): void {
  const { spectra, node, weight, firstBin, bandBins, chunk } = band;
  const { usedCoils, usedCount, flipStart, flipOffsets, count } = patterns;
  const { base, flipped, products, zeroRun } = work;
  for (let start = 0; start < bandBins; start += chunk) {
    const length = Math.min(chunk, bandBins - start);
    base.fill(0, 0, length);
    base.fill(0, chunk, chunk + length);
    for (let u = 0; u < usedCount; u += 1) {
      const coil = usedCoils[u] as number;
      addCoilProducts(transfers[coil] as Float64Array, spectra[coil] as Float64Array, node, weight, start, length, chunk, base, products, 2 * u * chunk);
    }
    const bin = firstBin + start;
    for (let pattern = 0; pattern < count; pattern += 1) {
      const from = flipStart[pattern] as number;
      const flipCount = (flipStart[pattern + 1] as number) - from;
      if (flipCount <= 2) {
        const a = flipCount > 0 ? (flipOffsets[from] as number) : zeroRun;
        const b = flipCount > 1 ? (flipOffsets[from + 1] as number) : zeroRun;
        sumMagnitudesTwoFlips(base, products, a, b, chunk, length, bin, sums, 2 * pattern);
      } else {
        // More than two (six coils and more): all but the last two first, in order, then the loop above.
        subtractFlips(base, products, flipOffsets.subarray(from, from + flipCount - 2), chunk, length, flipped);
        const a = flipOffsets[from + flipCount - 2] as number;
        const b = flipOffsets[from + flipCount - 1] as number;
        sumMagnitudesTwoFlips(flipped, products, a, b, chunk, length, bin, sums, 2 * pattern);
      }
    }
  }
}

/**
 * One used coil's share of a chunk of the band, bins start … start +
 * length − 1: P_u = T_u·H_u (T_u interpolated from the grid), written as
 * 2·P_u into `products` from `at` (real parts, then the imaginary parts
 * `chunk` numbers later) and added into B = Σ_u P_u in `base` (real at j,
 * imaginary at chunk + j, j the bin's place in the chunk). Called coil by
 * coil from 0 on a zeroed `base`, each coil one loop over the chunk: every
 * bin's B receives its coils in order, so the same numbers as a loop over
 * the coils inside one over the bins.
 */
export function addCoilProducts(
  transfer: Float64Array,
  spectrum: Float64Array,
  node: Int32Array,
  weight: Float64Array,
  start: number,
  length: number,
  chunk: number,
  base: Float64Array,
  products: Float64Array,
  at: number,
): void {
  for (let j = 0; j < length; j += 1) {
    const k = start + j;
    const m = node[k] as number;
    const t = weight[k] as number;
    const s = 1 - t;
    const tr = (transfer[2 * m] as number) * s + (transfer[2 * m + 2] as number) * t;
    const ti = (transfer[2 * m + 1] as number) * s + (transfer[2 * m + 3] as number) * t;
    const hr = spectrum[2 * k] as number;
    const hi = spectrum[2 * k + 1] as number;
    const pr = tr * hr - ti * hi;
    const pi = tr * hi + ti * hr;
    base[j] = (base[j] as number) + pr;
    base[chunk + j] = (base[chunk + j] as number) + pi;
    products[at + j] = 2 * pr;
    products[at + chunk + j] = 2 * pi;
  }
}

/**
 * One pattern's share of a chunk: X = B − Σ of its flipped 2·P_u (in the
 * order of its flip list), then Σ bin·|X| and Σ |X| added bin by bin into
 * sums[at] and sums[at + 1] (`chunk` numbers between a run of real parts
 * and its imaginary parts). One loop with two flips and no inner loop
 * (nothing to mispredict): a missing flip reads a run of zeros, and
 * x − 0 = x exactly (−0 included), so the same bits as subtracting nothing;
 * a pattern flipping more than two has its other flips subtracted first, in
 * order (subtractFlips), so its X too is B minus its flips one by one.
 */
export function sumMagnitudesTwoFlips(base: Float64Array, products: Float64Array, a: number, b: number, chunk: number, length: number, firstBin: number, sums: Float64Array, at: number): void {
  let weighted = sums[at] as number;
  let total = sums[at + 1] as number;
  for (let j = 0; j < length; j += 1) {
    let re = base[j] as number;
    let im = base[chunk + j] as number;
    re -= products[a + j] as number;
    im -= products[a + chunk + j] as number;
    re -= products[b + j] as number;
    im -= products[b + chunk + j] as number;
    const magnitude = Math.sqrt(re * re + im * im);
    weighted += (firstBin + j) * magnitude;
    total += magnitude;
  }
  sums[at] = weighted;
  sums[at + 1] = total;
}

/** target = source − the runs at `flips`, in that order, over the chunk's `length` bins (real and imaginary runs). */
export function subtractFlips(source: Float64Array, products: Float64Array, flips: Int32Array, chunk: number, length: number, target: Float64Array): void {
  target.set(source.subarray(0, length));
  target.set(source.subarray(chunk, chunk + length), chunk);
  for (const offset of flips) {
    for (let j = 0; j < length; j += 1) {
      target[j] = (target[j] as number) - (products[offset + j] as number);
      target[chunk + j] = (target[chunk + j] as number) - (products[offset + chunk + j] as number);
    }
  }
}

