/**
 * The centroid pass of the audio figures (src/analysis/measure-audio-figures.ts,
 * docs/design.md "Metrics"), written in AssemblyScript and compiled to
 * WebAssembly (scripts/build-wasm.mjs): the same operations in the same order
 * as the JavaScript in src/analysis/centroid-kernel.ts (`centroidSums`,
 * `addCoilProducts`, `subtractFlips`, `sumMagnitudesTwoFlips`), so the same
 * bits (WebAssembly's f64 arithmetic and square root are IEEE 754 binary64
 * rounding to nearest, as JavaScript's are, and neither fuses a multiply into
 * an add).
 *
 * For the phase patterns of one class, over the band's bins k, a chunk of
 * bins at a time: P_u = T_u(f_k)·H_u(k) for each used coil u (T_u linear
 * between the grid points around f_k, H_u the coil's Hann-windowed
 * spectrum), B = Σ_u P_u, and per pattern X = B − Σ of its flipped 2·P_u;
 * then Σ k·|X| and Σ |X| added bin by bin into the pattern's two sums.
 *
 * Every array is a byte address in this module's memory, laid out by
 * src/analysis/centroid-kernel.ts: `transfers` usedCount runs of 2·points f64
 * (interleaved complex, the used coils in order), `spectra` coilCount runs of
 * 2·bandBins f64, `usedCoils` usedCount i32, `node` bandBins i32 and `weight`
 * bandBins f64 (each bin's grid interval and the upper point's hat weight),
 * `base` and `flipped` 2·chunk f64, `products` 2·chunk·(coilCount + 1) f64
 * (its last run zeros, never written: `zeroRun`), `flipStart` count + 1 i32
 * and `flipOffsets` i32 (each pattern's flipped runs, as offsets into
 * `products`), `sums` 2·count f64.
 */

import { at, put, whole } from './memory';

/** One used coil's share of the chunk: 2·P_u into `products` from `offset` (real run, then imaginary run) and P_u added into B. */
function addCoilProducts(transfer: usize, spectrum: usize, node: usize, weight: usize, start: i32, length: i32, chunk: i32, base: usize, products: usize, offset: i32): void {
  for (let j = 0; j < length; j += 1) {
    const k = start + j;
    const m = whole(node, k);
    const t = at(weight, k);
    const s = 1 - t;
    const tr = at(transfer, 2 * m) * s + at(transfer, 2 * m + 2) * t;
    const ti = at(transfer, 2 * m + 1) * s + at(transfer, 2 * m + 3) * t;
    const hr = at(spectrum, 2 * k);
    const hi = at(spectrum, 2 * k + 1);
    const pr = tr * hr - ti * hi;
    const pi = tr * hi + ti * hr;
    put(base, j, at(base, j) + pr);
    put(base, chunk + j, at(base, chunk + j) + pi);
    put(products, offset + j, 2 * pr);
    put(products, offset + chunk + j, 2 * pi);
  }
}

/** target = source − the runs at `flips[0 … flipCount − 1]`, in that order, over the chunk's `length` bins. */
function subtractFlips(source: usize, products: usize, flips: usize, flipCount: i32, chunk: i32, length: i32, target: usize): void {
  for (let j = 0; j < length; j += 1) {
    put(target, j, at(source, j));
    put(target, chunk + j, at(source, chunk + j));
  }
  for (let f = 0; f < flipCount; f += 1) {
    const offset = whole(flips, f);
    for (let j = 0; j < length; j += 1) {
      put(target, j, at(target, j) - at(products, offset + j));
      put(target, chunk + j, at(target, chunk + j) - at(products, offset + chunk + j));
    }
  }
}

/** One pattern's share of the chunk: X = B − the runs at a and b, then Σ bin·|X| and Σ |X| into sums[index], sums[index + 1]. */
function sumMagnitudesTwoFlips(base: usize, products: usize, a: i32, b: i32, chunk: i32, length: i32, firstBin: i32, sums: usize, index: i32): void {
  let weighted = at(sums, index);
  let total = at(sums, index + 1);
  for (let j = 0; j < length; j += 1) {
    let re = at(base, j);
    let im = at(base, chunk + j);
    re -= at(products, a + j);
    im -= at(products, a + chunk + j);
    re -= at(products, b + j);
    im -= at(products, b + chunk + j);
    const magnitude = Math.sqrt(re * re + im * im);
    weighted += <f64>(firstBin + j) * magnitude;
    total += magnitude;
  }
  put(sums, index, weighted);
  put(sums, index + 1, total);
}

export function centroidSums(
  transfers: usize,
  points: i32,
  spectra: usize,
  usedCoils: usize,
  usedCount: i32,
  node: usize,
  weight: usize,
  bandBins: i32,
  firstBin: i32,
  chunk: i32,
  base: usize,
  flipped: usize,
  products: usize,
  zeroRun: i32,
  flipStart: usize,
  flipOffsets: usize,
  count: i32,
  sums: usize,
): void {
  for (let start = 0; start < bandBins; start += chunk) {
    const length = min(chunk, bandBins - start);
    for (let j = 0; j < length; j += 1) {
      put(base, j, 0);
      put(base, chunk + j, 0);
    }
    for (let u = 0; u < usedCount; u += 1) {
      const transfer = transfers + ((<usize>(2 * u * points)) << 3);
      const spectrum = spectra + ((<usize>(2 * whole(usedCoils, u) * bandBins)) << 3);
      addCoilProducts(transfer, spectrum, node, weight, start, length, chunk, base, products, 2 * u * chunk);
    }
    const bin = firstBin + start;
    for (let pattern = 0; pattern < count; pattern += 1) {
      const from = whole(flipStart, pattern);
      const flipCount = whole(flipStart, pattern + 1) - from;
      if (flipCount <= 2) {
        const a = flipCount > 0 ? whole(flipOffsets, from) : zeroRun;
        const b = flipCount > 1 ? whole(flipOffsets, from + 1) : zeroRun;
        sumMagnitudesTwoFlips(base, products, a, b, chunk, length, bin, sums, 2 * pattern);
      } else {
        // More than two (six coils and more): all but the last two first, in order, then the two.
        subtractFlips(base, products, flipOffsets + ((<usize>from) << 2), flipCount - 2, chunk, length, flipped);
        const a = whole(flipOffsets, from + flipCount - 2);
        const b = whole(flipOffsets, from + flipCount - 1);
        sumMagnitudesTwoFlips(flipped, products, a, b, chunk, length, bin, sums, 2 * pattern);
      }
    }
  }
}
