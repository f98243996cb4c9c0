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
 *
 * The butterflies and the packing hold a complex number in one 128-bit vector
 * (f64x2: real part in lane 0, imaginary part in lane 1); every lane does the
 * operation fft.js does on that part (rotate, minusJ and plusJ say why each is
 * the same bits; docs/design.md, "The FFT kernels"). A host without
 * WebAssembly's SIMD cannot compile this module and runs fft.js's JavaScript.
 */

import { at, put, whole as offsetAt } from './memory';

/** Lane 1's sign bit: XOR with it negates the imaginary part alone, exactly (IEEE 754 negation). */
const IMAGINARY_SIGN: v128 = i64x2(0, 0x8000000000000000);
/** Lane 0's sign bit: XOR with it negates the real part alone. */
const REAL_SIGN: v128 = i64x2(0x8000000000000000, 0);

/** (re, im) → (im, re). */
@inline function swapParts(value: v128): v128 {
  return i64x2.shuffle(value, value, 1, 0);
}

/** (x.re + y.im, x.im − y.re): x − j·y, as fft.js's (T1r + T3i, T1i − T3r), lane by lane. */
@inline function minusJ(x: v128, y: v128): v128 {
  return f64x2.add(x, v128.xor(swapParts(y), IMAGINARY_SIGN));
}

/** (x.re − y.im, x.im + y.re): x + j·y, as fft.js's (T1r − T3i, T1i + T3r). */
@inline function plusJ(x: v128, y: v128): v128 {
  return f64x2.sub(x, v128.xor(swapParts(y), IMAGINARY_SIGN));
}

/**
 * value × (re + j·im) for the twiddle's parts each in both lanes: (vr·re − vi·im, vi·re + vr·im). fft.js writes the
 * imaginary part vr·im + vi·re; the two products are the same roundings, added in the other order, and IEEE 754
 * addition is commutative, so the same bits.
 */
@inline function rotate(value: v128, re: v128, im: v128): v128 {
  return f64x2.add(f64x2.mul(value, re), v128.xor(f64x2.mul(swapParts(value), im), REAL_SIGN));
}

/** value × the table's entry at `entry` (cos, −sin), its imaginary part times fft.js's `inv` (±1: exact). */
@inline function twiddle(value: v128, entry: usize, inv: v128): v128 {
  return rotate(value, v128.load64_splat(entry), f64x2.mul(inv, v128.load64_splat(entry, 8)));
}

/**
 * fft.js `_transform4`: complex data → out (out ≠ data). Each complex number is one 128-bit vector (re, im), and
 * every lane does the operation fft.js does on that part, in its order (the comments of minusJ, plusJ and rotate
 * say why each is the same bits).
 */
export function transform4(out: usize, data: usize, table: usize, bitrev: usize, size: i32, width: i32, inverse: i32): void {
  let step = 1 << width;
  let len = (size / step) << 1;
  const inv: f64 = inverse ? -1.0 : 1.0;
  const invBoth = f64x2.splat(inv);
  let t = 0;
  if (len == 4) {
    // _singleTransform2
    for (let outOff = 0; outOff < size; outOff += len) {
      const off = offsetAt(bitrev, t++);
      const even = v128.load(data + ((<usize>off) << 3));
      const odd = v128.load(data + ((<usize>(off + step)) << 3));
      v128.store(out + ((<usize>outOff) << 3), f64x2.add(even, odd));
      v128.store(out + ((<usize>(outOff + 2)) << 3), f64x2.sub(even, odd));
    }
  } else {
    // _singleTransform4
    const step2 = step * 2;
    const step3 = step * 3;
    for (let outOff = 0; outOff < size; outOff += len) {
      const off = offsetAt(bitrev, t++);
      const a = v128.load(data + ((<usize>off) << 3));
      const b = v128.load(data + ((<usize>(off + step)) << 3));
      const c = v128.load(data + ((<usize>(off + step2)) << 3));
      const d = v128.load(data + ((<usize>(off + step3)) << 3));
      const t0 = f64x2.add(a, c);
      const t1 = f64x2.sub(a, c);
      const t2 = f64x2.add(b, d);
      const t3 = f64x2.mul(invBoth, f64x2.sub(b, d));
      const at0 = out + ((<usize>outOff) << 3);
      v128.store(at0, f64x2.add(t0, t2));
      v128.store(at0, minusJ(t1, t3), 16);
      v128.store(at0, f64x2.sub(t0, t2), 32);
      v128.store(at0, plusJ(t1, t3), 48);
    }
  }
  for (step >>= 2; step >= 2; step >>= 2) {
    len = (size / step) << 1;
    const quarterLen = len >>> 2;
    const quarterBytes = (<usize>quarterLen) << 3;
    for (let outOff = 0; outOff < size; outOff += len) {
      const limit = outOff + quarterLen;
      for (let i = outOff, k = 0; i < limit; i += 2, k += step) {
        const pa = out + ((<usize>i) << 3);
        const pb = pa + quarterBytes;
        const pc = pb + quarterBytes;
        const pd = pc + quarterBytes;
        const a = v128.load(pa);
        const mb = twiddle(v128.load(pb), table + ((<usize>k) << 3), invBoth);
        const mc = twiddle(v128.load(pc), table + ((<usize>(2 * k)) << 3), invBoth);
        const md = twiddle(v128.load(pd), table + ((<usize>(3 * k)) << 3), invBoth);
        const t0 = f64x2.add(a, mc);
        const t1 = f64x2.sub(a, mc);
        const t2 = f64x2.add(mb, md);
        const t3 = f64x2.mul(invBoth, f64x2.sub(mb, md));
        v128.store(pa, f64x2.add(t0, t2));
        v128.store(pb, minusJ(t1, t3));
        v128.store(pc, f64x2.sub(t0, t2));
        v128.store(pd, plusJ(t1, t3));
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
  const invBoth = f64x2.splat(inv);
  const negInvBoth = f64x2.splat(-inv);
  for (step >>= 2; step >= 2; step >>= 2) {
    len = (size / step) << 1;
    const halfLen = len >>> 1;
    const quarterLen = halfLen >>> 1;
    const hquarterLen = quarterLen >>> 1;
    const quarterBytes = (<usize>quarterLen) << 3;
    for (let outOff = 0; outOff < size; outOff += len) {
      for (let i = 0, k = 0; i <= hquarterLen; i += 2, k += step) {
        const pa = out + ((<usize>(outOff + i)) << 3);
        const pb = pa + quarterBytes;
        const pc = pb + quarterBytes;
        const pd = pc + quarterBytes;
        const a = v128.load(pa);
        const mb = twiddle(v128.load(pb), table + ((<usize>k) << 3), invBoth);
        const mc = twiddle(v128.load(pc), table + ((<usize>(2 * k)) << 3), invBoth);
        const md = twiddle(v128.load(pd), table + ((<usize>(3 * k)) << 3), invBoth);
        const t0 = f64x2.add(a, mc);
        const t1 = f64x2.sub(a, mc);
        const t2 = f64x2.add(mb, md);
        const t3 = f64x2.mul(invBoth, f64x2.sub(mb, md));
        v128.store(pa, f64x2.add(t0, t2));
        v128.store(pb, minusJ(t1, t3));
        // the middle point: C only for i = 0
        if (i == 0) {
          v128.store(pc, f64x2.sub(t0, t2));
          continue;
        }
        // do not overwrite ourselves
        if (i == hquarterLen) continue;
        // the flipped case: ST0 = conj(T1), ST1 = conj(T0), ST2 = −inv·(T3i, T3r), ST3 = −inv·(T2i, T2r)
        const st0 = v128.xor(t1, IMAGINARY_SIGN);
        const st1 = v128.xor(t0, IMAGINARY_SIGN);
        const st2 = f64x2.mul(negInvBoth, swapParts(t3));
        const st3 = f64x2.mul(negInvBoth, swapParts(t2));
        v128.store(out + ((<usize>(outOff + quarterLen - i)) << 3), f64x2.add(st0, st2));
        v128.store(out + ((<usize>(outOff + halfLen - i)) << 3), minusJ(st1, st3));
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
  const scaleBoth = f64x2.splat(scale);
  const two = f64x2.splat(2.0);
  for (let k = 0; k < half; k++) {
    // (ar, ai) and (br, bi) = (x·scale, −(y·scale)) of the mirrored bin
    const a = f64x2.mul(v128.load(spectrum + ((<usize>(2 * k)) << 3)), scaleBoth);
    const b = v128.xor(f64x2.mul(v128.load(spectrum + ((<usize>(2 * (half - k))) << 3)), scaleBoth), IMAGINARY_SIGN);
    const e = f64x2.div(f64x2.add(a, b), two);
    const d = f64x2.div(f64x2.sub(a, b), two);
    const w = twiddles + ((<usize>(2 * k)) << 3);
    // (or, oi) = d × (wr + j·wi), wi = −table
    const o = rotate(d, v128.load64_splat(w), f64x2.neg(v128.load64_splat(w, 8)));
    // (er − oi, ei + or)
    v128.store(packed + ((<usize>(2 * k)) << 3), plusJ(e, o));
  }
}

/** The half spectrum of a real signal from its packed transform (src/math/fft-kernels.ts, `unpackForwardInto`): the same operations in the same order. */
export function unpackForward(packed: usize, twiddles: usize, half: i32, out: usize): void {
  const two = f64x2.splat(2.0);
  for (let k = 0; k <= half; k++) {
    const a = k % half;
    const b = (half - k) % half;
    const z = v128.load(packed + ((<usize>(2 * a)) << 3));
    // (cr, ci) = conj of the mirrored entry
    const c = v128.xor(v128.load(packed + ((<usize>(2 * b)) << 3)), IMAGINARY_SIGN);
    const e = f64x2.div(f64x2.add(z, c), two);
    // (or, oi) = ((zi − ci)/2, −(zr − cr)/2): negating before or after halving is the same bits
    const o = v128.xor(swapParts(f64x2.div(f64x2.sub(z, c), two)), IMAGINARY_SIGN);
    const wr = k < half ? at(twiddles, 2 * k) : -1.0;
    const wi = k < half ? at(twiddles, 2 * k + 1) : 0.0;
    // (er + wr·or − wi·oi, ei + wr·oi + wi·or), each sum taken left to right as written
    const sum = f64x2.add(e, f64x2.mul(o, f64x2.splat(wr)));
    v128.store(out + ((<usize>(2 * k)) << 3), f64x2.add(sum, v128.xor(f64x2.mul(swapParts(o), f64x2.splat(wi)), REAL_SIGN)));
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
