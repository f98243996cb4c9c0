/**
 * The radix-4 FFT kernels of fft.js 4.0.4 (Fedor Indutny, MIT), written in
 * AssemblyScript and compiled to WebAssembly (scripts/build-wasm.mjs): the
 * same operations in the same order as its `_transform4` and
 * `_realTransform4` (with `_singleTransform2/4` and `_singleRealTransform2/4`
 * folded in), so the same bits. WebAssembly's f64 arithmetic is IEEE 754
 * binary64 with round-to-nearest, as JavaScript's numbers are, and neither
 * fuses a multiply into an add; compiled code needs no warm-up, where
 * JavaScript's first transforms in each thread run in the interpreter
 * (docs/design.md, "The FFT kernels").
 *
 * Every array is a byte address in this module's memory, laid out by
 * src/math/fft-kernels.ts: `out` and `data` hold `size` numbers (interleaved
 * complex, size = 2 × points; `data` of the real transform holds `points`
 * real numbers), `table` fft.js's 2 × points twiddles (cos, −sin of π·2k/points
 * interleaved), `bitrev` its 1 << width i32 digit-reversal offsets.
 * `inverse` is 1 for fft.js's inverse transform (no division by the size).
 */

import { at, put, whole as offsetAt } from './memory';

/** fft.js `_transform4`: complex data → out (out ≠ data). */
export function transform4(out: usize, data: usize, table: usize, bitrev: usize, size: i32, width: i32, inverse: i32): void {
  let step = 1 << width;
  let len = (size / step) << 1;
  const inv: f64 = inverse ? -1.0 : 1.0;
  let t = 0;
  if (len == 4) {
    // _singleTransform2
    for (let outOff = 0; outOff < size; outOff += len) {
      const off = offsetAt(bitrev, t++);
      const evenR = at(data, off);
      const evenI = at(data, off + 1);
      const oddR = at(data, off + step);
      const oddI = at(data, off + step + 1);
      put(out, outOff, evenR + oddR);
      put(out, outOff + 1, evenI + oddI);
      put(out, outOff + 2, evenR - oddR);
      put(out, outOff + 3, evenI - oddI);
    }
  } else {
    // _singleTransform4
    const step2 = step * 2;
    const step3 = step * 3;
    for (let outOff = 0; outOff < size; outOff += len) {
      const off = offsetAt(bitrev, t++);
      const Ar = at(data, off);
      const Ai = at(data, off + 1);
      const Br = at(data, off + step);
      const Bi = at(data, off + step + 1);
      const Cr = at(data, off + step2);
      const Ci = at(data, off + step2 + 1);
      const Dr = at(data, off + step3);
      const Di = at(data, off + step3 + 1);
      const T0r = Ar + Cr;
      const T0i = Ai + Ci;
      const T1r = Ar - Cr;
      const T1i = Ai - Ci;
      const T2r = Br + Dr;
      const T2i = Bi + Di;
      const T3r = inv * (Br - Dr);
      const T3i = inv * (Bi - Di);
      put(out, outOff, T0r + T2r);
      put(out, outOff + 1, T0i + T2i);
      put(out, outOff + 2, T1r + T3i);
      put(out, outOff + 3, T1i - T3r);
      put(out, outOff + 4, T0r - T2r);
      put(out, outOff + 5, T0i - T2i);
      put(out, outOff + 6, T1r - T3i);
      put(out, outOff + 7, T1i + T3r);
    }
  }
  for (step >>= 2; step >= 2; step >>= 2) {
    len = (size / step) << 1;
    const quarterLen = len >>> 2;
    for (let outOff = 0; outOff < size; outOff += len) {
      const limit = outOff + quarterLen;
      for (let i = outOff, k = 0; i < limit; i += 2, k += step) {
        const A = i;
        const B = A + quarterLen;
        const C = B + quarterLen;
        const D = C + quarterLen;
        const Ar = at(out, A);
        const Ai = at(out, A + 1);
        const Br = at(out, B);
        const Bi = at(out, B + 1);
        const Cr = at(out, C);
        const Ci = at(out, C + 1);
        const Dr = at(out, D);
        const Di = at(out, D + 1);
        const tableBr = at(table, k);
        const tableBi = inv * at(table, k + 1);
        const MBr = Br * tableBr - Bi * tableBi;
        const MBi = Br * tableBi + Bi * tableBr;
        const tableCr = at(table, 2 * k);
        const tableCi = inv * at(table, 2 * k + 1);
        const MCr = Cr * tableCr - Ci * tableCi;
        const MCi = Cr * tableCi + Ci * tableCr;
        const tableDr = at(table, 3 * k);
        const tableDi = inv * at(table, 3 * k + 1);
        const MDr = Dr * tableDr - Di * tableDi;
        const MDi = Dr * tableDi + Di * tableDr;
        const T0r = Ar + MCr;
        const T0i = Ai + MCi;
        const T1r = Ar - MCr;
        const T1i = Ai - MCi;
        const T2r = MBr + MDr;
        const T2i = MBi + MDi;
        const T3r = inv * (MBr - MDr);
        const T3i = inv * (MBi - MDi);
        put(out, A, T0r + T2r);
        put(out, A + 1, T0i + T2i);
        put(out, B, T1r + T3i);
        put(out, B + 1, T1i - T3r);
        put(out, C, T0r - T2r);
        put(out, C + 1, T0i - T2i);
        put(out, D, T1r - T3i);
        put(out, D + 1, T1i + T3r);
      }
    }
  }
}

/** fft.js `_realTransform4`: real data (size / 2 numbers) → out, bins 0 … points/2 (the rest is left for completeSpectrum). */
export function realTransform4(out: usize, data: usize, table: usize, bitrev: usize, size: i32, width: i32, inverse: i32): void {
  let step = 1 << width;
  let len = (size / step) << 1;
  const inv: f64 = inverse ? -1.0 : 1.0;
  let t = 0;
  if (len == 4) {
    // _singleRealTransform2(outOff, off >>> 1, step >>> 1)
    const half = step >>> 1;
    for (let outOff = 0; outOff < size; outOff += len) {
      const off = offsetAt(bitrev, t++) >>> 1;
      const evenR = at(data, off);
      const oddR = at(data, off + half);
      put(out, outOff, evenR + oddR);
      put(out, outOff + 1, 0);
      put(out, outOff + 2, evenR - oddR);
      put(out, outOff + 3, 0);
    }
  } else {
    // _singleRealTransform4(outOff, off >>> 1, step >>> 1)
    const half = step >>> 1;
    const half2 = half * 2;
    const half3 = half * 3;
    for (let outOff = 0; outOff < size; outOff += len) {
      const off = offsetAt(bitrev, t++) >>> 1;
      const Ar = at(data, off);
      const Br = at(data, off + half);
      const Cr = at(data, off + half2);
      const Dr = at(data, off + half3);
      const T0r = Ar + Cr;
      const T1r = Ar - Cr;
      const T2r = Br + Dr;
      const T3r = inv * (Br - Dr);
      put(out, outOff, T0r + T2r);
      put(out, outOff + 1, 0);
      put(out, outOff + 2, T1r);
      put(out, outOff + 3, -T3r);
      put(out, outOff + 4, T0r - T2r);
      put(out, outOff + 5, 0);
      put(out, outOff + 6, T1r);
      put(out, outOff + 7, T3r);
    }
  }
  for (step >>= 2; step >= 2; step >>= 2) {
    len = (size / step) << 1;
    const halfLen = len >>> 1;
    const quarterLen = halfLen >>> 1;
    const hquarterLen = quarterLen >>> 1;
    for (let outOff = 0; outOff < size; outOff += len) {
      for (let i = 0, k = 0; i <= hquarterLen; i += 2, k += step) {
        const A = outOff + i;
        const B = A + quarterLen;
        const C = B + quarterLen;
        const D = C + quarterLen;
        const Ar = at(out, A);
        const Ai = at(out, A + 1);
        const Br = at(out, B);
        const Bi = at(out, B + 1);
        const Cr = at(out, C);
        const Ci = at(out, C + 1);
        const Dr = at(out, D);
        const Di = at(out, D + 1);
        const tableBr = at(table, k);
        const tableBi = inv * at(table, k + 1);
        const MBr = Br * tableBr - Bi * tableBi;
        const MBi = Br * tableBi + Bi * tableBr;
        const tableCr = at(table, 2 * k);
        const tableCi = inv * at(table, 2 * k + 1);
        const MCr = Cr * tableCr - Ci * tableCi;
        const MCi = Cr * tableCi + Ci * tableCr;
        const tableDr = at(table, 3 * k);
        const tableDi = inv * at(table, 3 * k + 1);
        const MDr = Dr * tableDr - Di * tableDi;
        const MDi = Dr * tableDi + Di * tableDr;
        const T0r = Ar + MCr;
        const T0i = Ai + MCi;
        const T1r = Ar - MCr;
        const T1i = Ai - MCi;
        const T2r = MBr + MDr;
        const T2i = MBi + MDi;
        const T3r = inv * (MBr - MDr);
        const T3i = inv * (MBi - MDi);
        put(out, A, T0r + T2r);
        put(out, A + 1, T0i + T2i);
        put(out, B, T1r + T3i);
        put(out, B + 1, T1i - T3r);
        // the middle point: C only for i = 0
        if (i == 0) {
          put(out, C, T0r - T2r);
          put(out, C + 1, T0i - T2i);
          continue;
        }
        // do not overwrite ourselves
        if (i == hquarterLen) continue;
        // the flipped case
        const ST0r = T1r;
        const ST0i = -T1i;
        const ST1r = T0r;
        const ST1i = -T0i;
        const ST2r = -inv * T3i;
        const ST2i = -inv * T3r;
        const ST3r = -inv * T2i;
        const ST3i = -inv * T2r;
        const SA = outOff + quarterLen - i;
        const SB = outOff + halfLen - i;
        put(out, SA, ST0r + ST2r);
        put(out, SA + 1, ST0i + ST2i);
        put(out, SB, ST1r + ST3i);
        put(out, SB + 1, ST1i - ST3r);
      }
    }
  }
}

/**
 * The packing of a real signal's inverse transform into one complex transform
 * of M = half points (src/math/fft-kernels.ts, `packInverseInto`, has the
 * derivation): the same operations in the same order as that function.
 */
export function packInverse(spectrum: usize, twiddles: usize, half: i32, scale: f64, packed: usize): void {
  for (let k = 0; k < half; k++) {
    const ar = at(spectrum, 2 * k) * scale;
    const ai = at(spectrum, 2 * k + 1) * scale;
    const br = at(spectrum, 2 * (half - k)) * scale;
    const bi = -(at(spectrum, 2 * (half - k) + 1) * scale);
    const er = (ar + br) / 2;
    const ei = (ai + bi) / 2;
    const dr = (ar - br) / 2;
    const di = (ai - bi) / 2;
    const wr = at(twiddles, 2 * k);
    const wi = -at(twiddles, 2 * k + 1);
    const or = dr * wr - di * wi;
    const oi = dr * wi + di * wr;
    put(packed, 2 * k, er - oi);
    put(packed, 2 * k + 1, ei + or);
  }
}

/** The half spectrum of a real signal from its packed transform (src/math/fft-kernels.ts, `unpackForwardInto`): the same operations in the same order. */
export function unpackForward(packed: usize, twiddles: usize, half: i32, out: usize): void {
  for (let k = 0; k <= half; k++) {
    const a = k % half;
    const b = (half - k) % half;
    const zr = at(packed, 2 * a);
    const zi = at(packed, 2 * a + 1);
    const cr = at(packed, 2 * b);
    const ci = -at(packed, 2 * b + 1);
    const er = (zr + cr) / 2;
    const ei = (zi + ci) / 2;
    const or = (zi - ci) / 2;
    const oi = -(zr - cr) / 2;
    const wr = k < half ? at(twiddles, 2 * k) : -1.0;
    const wi = k < half ? at(twiddles, 2 * k + 1) : 0.0;
    put(out, 2 * k, er + wr * or - wi * oi);
    put(out, 2 * k + 1, ei + wr * oi + wi * or);
  }
}

/** fft.js's digit-reversal offsets for `width` into bitrev (1 << width i32). */
export function digitReversal(bitrev: usize, width: i32): void {
  const count = 1 << width;
  for (let j = 0; j < count; j++) {
    let reversed = 0;
    for (let shift = 0; shift < width; shift += 2) reversed |= ((j >>> shift) & 3) << (width - shift - 2);
    store<i32>(bitrev + ((<usize>j) << 2), reversed);
  }
}

/** Every second complex entry of a twiddle table of `points` entries: the table for half the size (`points` numbers). */
export function halveTable(table: usize, points: i32, out: usize): void {
  for (let k = 0; 2 * k < points; k++) {
    put(out, 2 * k, at(table, 4 * k));
    put(out, 2 * k + 1, at(table, 4 * k + 1));
  }
}
