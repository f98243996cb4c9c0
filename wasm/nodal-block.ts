/**
 * The nodal solve of a wiring holding a coupled pair, for its source factors
 * (src/circuit/solve-nodal.ts, `solveNodalSourceFactors`): per block of
 * frequency bins, stamp the nodal matrix, eliminate, and read the impedance
 * and the factors S_i off the adjoint solution. Written in AssemblyScript and
 * compiled to WebAssembly (scripts/build-wasm.mjs). Each step does the
 * operations of its JavaScript namesake in src/circuit/solve-nodal.ts and
 * src/circuit/solve-blocked.ts in the same order, two bins at a time in
 * 128-bit lanes (f64x2: each lane is one IEEE 754 binary64 operation,
 * rounding to nearest, as JavaScript's), so the same bits.
 *
 * Every array is a byte address in this module's memory, laid out by
 * src/circuit/nodal-kernel.ts. A block holds each complex quantity as two
 * runs of STRIDE f64, real parts then imaginary parts (solve-blocked.ts).
 * A block's last bins past `length` (an odd length, or the grid's short last
 * block) are worked out too, from the zeros the loader leaves there, and
 * never written out or checked.
 */

import { whole } from './memory';

/** Bins in a block: solve-nodal.ts's BLOCK_BINS, which the loader lays runs out by (nodal-kernel.test.ts fails if they part); even, so a block is whole lane pairs. */
const STRIDE: i32 = 256;
/** Bytes of one run. */
const RUN: usize = <usize>STRIDE << 3;

@inline function lanes(length: i32): i32 {
  return (length + 1) & ~1;
}

/** Quantity q's real run in a block array at `base`. */
@inline function realRun(base: usize, quantity: i32): usize {
  return base + ((<usize>quantity) << 1) * RUN;
}

/**
 * target −= factor·source over the block, complex: the runs at `target`,
 * `factor`, `source` (each real run, its imaginary run RUN bytes on).
 */
@inline function subtractProduct(target: usize, factor: usize, source: usize, pairs: i32): void {
  for (let b = 0; b < pairs; b += 2) {
    const o = (<usize>b) << 3;
    const fr = v128.load(factor + o);
    const fi = v128.load(factor + RUN + o);
    const xr = v128.load(source + o);
    const xi = v128.load(source + RUN + o);
    v128.store(target + o, f64x2.sub(v128.load(target + o), f64x2.sub(f64x2.mul(fr, xr), f64x2.mul(fi, xi))));
    v128.store(target + RUN + o, f64x2.sub(v128.load(target + RUN + o), f64x2.add(f64x2.mul(fr, xi), f64x2.mul(fi, xr))));
  }
}

/** out = a·b over the block, complex: (ar·br − ai·bi) + j(ar·bi + ai·br); `out` may be `a`. */
@inline function multiplyRuns(out: usize, a: usize, b: usize, pairs: i32): void {
  for (let k = 0; k < pairs; k += 2) {
    const o = (<usize>k) << 3;
    const ar = v128.load(a + o);
    const ai = v128.load(a + RUN + o);
    const br = v128.load(b + o);
    const bi = v128.load(b + RUN + o);
    v128.store(out + o, f64x2.sub(f64x2.mul(ar, br), f64x2.mul(ai, bi)));
    v128.store(out + RUN + o, f64x2.add(f64x2.mul(ar, bi), f64x2.mul(ai, br)));
  }
}

/**
 * solveBlock (solve-blocked.ts): A·x = b in place, A (n×n) at `matrix`, b
 * then x at `rhs`, the elimination's steps at `rowStart`, `rows`,
 * `columnStart`, `columns` (i32). Scratch: `inverses` (n complex runs),
 * `factor` (one complex run), `norms` (one run). Returns 0, or 1 when a
 * pivot of the first `length` bins is not positive in norm (singular).
 */
function solveBlock(matrix: usize, rhs: usize, n: i32, rowStart: usize, rows: usize, columnStart: usize, columns: usize, length: i32, inverses: usize, factor: usize, norms: usize): i32 {
  const pairs = lanes(length);
  for (let col = 0; col < n; col++) {
    const pivot = realRun(matrix, col * n + col);
    const inverse = realRun(inverses, col);
    for (let b = 0; b < pairs; b += 2) {
      const o = (<usize>b) << 3;
      const ar = v128.load(pivot + o);
      const ai = v128.load(pivot + RUN + o);
      const norm = f64x2.add(f64x2.mul(ar, ar), f64x2.mul(ai, ai));
      v128.store(norms + o, norm);
      v128.store(inverse + o, f64x2.div(ar, norm));
      v128.store(inverse + RUN + o, f64x2.div(f64x2.neg(ai), norm));
    }
    for (let b = 0; b < length; b++) {
      if (!(load<f64>(norms + ((<usize>b) << 3)) > 0)) return 1;
    }
    for (let at = whole(rowStart, col); at < whole(rowStart, col + 1); at++) {
      const r = whole(rows, at);
      // factor = A[r][col] / A[col][col]
      multiplyRuns(factor, realRun(matrix, r * n + col), inverse, pairs);
      for (let to = whole(columnStart, col); to < whole(columnStart, col + 1); to++) {
        const c = whole(columns, to);
        subtractProduct(realRun(matrix, r * n + c), factor, realRun(matrix, col * n + c), pairs);
      }
      subtractProduct(realRun(rhs, r), factor, realRun(rhs, col), pairs);
    }
  }
  // Back substitution: x_r = (b_r − Σ_{c>r} U_rc·x_c)/U_rr.
  for (let r = n - 1; r >= 0; r--) {
    const x = realRun(rhs, r);
    for (let to = whole(columnStart, r); to < whole(columnStart, r + 1); to++) {
      const c = whole(columns, to);
      subtractProduct(x, realRun(matrix, r * n + c), realRun(rhs, c), pairs);
    }
    multiplyRuns(x, x, realRun(inverses, r), pairs);
  }
  return 0;
}

/** The run pair at `target` (real, imaginary) stored interleaved (re, im, …) at `out` for the first `length` bins. */
function interleave(target: usize, out: usize, length: i32): void {
  let b = 0;
  for (; b + 1 < length; b += 2) {
    const o = (<usize>b) << 3;
    const re = v128.load(target + o);
    const im = v128.load(target + RUN + o);
    v128.store(out + (o << 1), v128.shuffle<f64>(re, im, 0, 2));
    v128.store(out + (o << 1) + 16, v128.shuffle<f64>(re, im, 1, 3));
  }
  if (b < length) {
    const o = (<usize>b) << 3;
    store<f64>(out + (o << 1), load<f64>(target + o));
    store<f64>(out + (o << 1) + 8, load<f64>(target + RUN + o));
  }
}

/**
 * target (interleaved complex at `out`) ← kept·target + sign·y·d for the first
 * `length` bins (accumulateProduct, solve-nodal.ts): kept 0 starts the sum
 * (the first term added to 0, as the JavaScript does), kept 1 adds to it.
 */
function accumulateProduct(out: usize, sign: f64, y: usize, d: usize, kept: i32, length: i32): void {
  const s = f64x2.splat(sign);
  let b = 0;
  for (; b + 1 < length; b += 2) {
    const o = (<usize>b) << 3;
    const yr = v128.load(y + o);
    const yi = v128.load(y + RUN + o);
    const dr = v128.load(d + o);
    const di = v128.load(d + RUN + o);
    let re = f64x2.splat(0);
    let im = f64x2.splat(0);
    if (kept !== 0) {
      const low = v128.load(out + (o << 1));
      const high = v128.load(out + (o << 1) + 16);
      re = v128.shuffle<f64>(low, high, 0, 2);
      im = v128.shuffle<f64>(low, high, 1, 3);
    }
    re = f64x2.add(re, f64x2.mul(s, f64x2.sub(f64x2.mul(yr, dr), f64x2.mul(yi, di))));
    im = f64x2.add(im, f64x2.mul(s, f64x2.add(f64x2.mul(yr, di), f64x2.mul(yi, dr))));
    v128.store(out + (o << 1), v128.shuffle<f64>(re, im, 0, 2));
    v128.store(out + (o << 1) + 16, v128.shuffle<f64>(re, im, 1, 3));
  }
  if (b < length) {
    const o = (<usize>b) << 3;
    const yr = load<f64>(y + o);
    const yi = load<f64>(y + RUN + o);
    const dr = load<f64>(d + o);
    const di = load<f64>(d + RUN + o);
    const re: f64 = kept === 0 ? 0 : load<f64>(out + (o << 1));
    const im: f64 = kept === 0 ? 0 : load<f64>(out + (o << 1) + 8);
    store<f64>(out + (o << 1), re + sign * (yr * dr - yi * di));
    store<f64>(out + (o << 1) + 8, im + sign * (yr * di + yi * dr));
  }
}

/**
 * Every block of one solve. The plan, laid out by the loader (i32 unless
 * said):
 * - `stamps`, `stampCount` entries of four: the matrix entry's real run
 *   (bytes from `matrix`), the source's real run in block 0 (an address),
 *   the source's bytes from one block to the next, and 1 to add or −1 to
 *   subtract (stampCross, addBlockRun: the same entries in the same order);
 * - the elimination's steps: `rowStart`, `rows`, `columnStart`, `columns`;
 * - `drops`, `dropCount` entries of two: the finish's and the start's real
 *   run (addresses: in `rhs`, or `zeros` for a lead fixed at 0 V), the
 *   drop d_j written to quantity j of `drop`;
 * - `products`, `productCount` entries of five: the target (the interleaved
 *   complex array of a coil's factor S_i), the y run in block 0 (an address)
 *   and its bytes from block to block, the d quantity in `drop`, kept (0 or
 *   1); and `signs`, an f64 per product (writeTransfers' order).
 * The output's unknown is `output`; its x, the impedance, goes interleaved
 * to `impedance`. Returns 0, or 1 + the block of a singular matrix.
 */
export function solveGrid(
  bins: i32, n: i32, output: i32,
  matrix: usize, rhs: usize, inverses: usize, factor: usize, norms: usize, drop: usize,
  stamps: usize, stampCount: i32,
  rowStart: usize, rows: usize, columnStart: usize, columns: usize,
  drops: usize, dropCount: i32,
  products: usize, signs: usize, productCount: i32,
  impedance: usize,
): i32 {
  const matrixBytes = ((<usize>(n * n)) << 1) * RUN;
  const rhsBytes = ((<usize>n) << 1) * RUN;
  for (let first = 0, block = 0; first < bins; first += STRIDE, block++) {
    const length = min(STRIDE, bins - first);
    const pairs = lanes(length);
    memory.fill(matrix, 0, matrixBytes);
    memory.fill(rhs, 0, rhsBytes);
    for (let s = 0; s < stampCount; s++) {
      const target = matrix + <usize>whole(stamps, 4 * s);
      const source = <usize>whole(stamps, 4 * s + 1) + (<usize>whole(stamps, 4 * s + 2)) * (<usize>block);
      if (whole(stamps, 4 * s + 3) > 0) {
        for (let b = 0; b < pairs; b += 2) {
          const o = (<usize>b) << 3;
          v128.store(target + o, f64x2.add(v128.load(target + o), v128.load(source + o)));
          v128.store(target + RUN + o, f64x2.add(v128.load(target + RUN + o), v128.load(source + RUN + o)));
        }
      } else {
        for (let b = 0; b < pairs; b += 2) {
          const o = (<usize>b) << 3;
          v128.store(target + o, f64x2.sub(v128.load(target + o), v128.load(source + o)));
          v128.store(target + RUN + o, f64x2.sub(v128.load(target + RUN + o), v128.load(source + RUN + o)));
        }
      }
    }
    // Adjoint solve: A·x = u_output.
    const unit = realRun(rhs, output);
    for (let b = 0; b < length; b++) store<f64>(unit + ((<usize>b) << 3), 1);
    if (solveBlock(matrix, rhs, n, rowStart, rows, columnStart, columns, length, inverses, factor, norms) !== 0) return 1 + block;
    const offset = (<usize>first) << 4;
    interleave(unit, impedance + offset, length);
    for (let j = 0; j < dropCount; j++) {
      const finish = <usize>whole(drops, 2 * j);
      const start = <usize>whole(drops, 2 * j + 1);
      const d = realRun(drop, j);
      for (let b = 0; b < pairs; b += 2) {
        const o = (<usize>b) << 3;
        v128.store(d + o, f64x2.sub(v128.load(finish + o), v128.load(start + o)));
        v128.store(d + RUN + o, f64x2.sub(v128.load(finish + RUN + o), v128.load(start + RUN + o)));
      }
    }
    for (let p = 0; p < productCount; p++) {
      const target = <usize>whole(products, 5 * p) + offset;
      const y = <usize>whole(products, 5 * p + 1) + (<usize>whole(products, 5 * p + 2)) * (<usize>block);
      const d = realRun(drop, whole(products, 5 * p + 3));
      accumulateProduct(target, load<f64>(signs + ((<usize>p) << 3)), y, d, whole(products, 5 * p + 4), length);
    }
  }
  return 0;
}
