/**
 * The per-frequency passes of a wiring's synthesis (src/render/synthesize-wirings.ts):
 * the series–parallel solve of its source factors and impedance
 * (src/circuit/solve-transfers.ts), the load's gain, the products with the
 * coils' spectra and the signed sum Y = G·Σ_i p_i·P_i. Written in
 * AssemblyScript and compiled to WebAssembly (scripts/build-wasm.mjs): each
 * function does the operations of its JavaScript namesake in
 * src/circuit/solve-transfers.ts, src/math/multiply-complex.ts or
 * src/render/synthesize-wirings.ts in the same order, so the same bits
 * (WebAssembly's f64 arithmetic is IEEE 754 binary64 rounding to nearest, as
 * JavaScript's is, and neither fuses a multiply into an add).
 *
 * Every array is a byte address in this module's memory, laid out by
 * src/render/synthesis-kernel.ts; a complex array is `length` f64
 * (interleaved re, im), `length` even.
 */

import { at, put, whole } from './memory';

/** target = 0 over `length` numbers. */
export function clear(target: usize, length: i32): void {
  memory.fill(target, 0, (<usize>length) << 3);
}

/** A coil's terms: target = sign·source, impedance += z. */
export function addCoil(source: usize, z: usize, sign: f64, target: usize, impedance: usize, length: i32): void {
  for (let i = 0; i < length; i++) {
    put(target, i, sign * at(source, i));
    put(impedance, i, at(impedance, i) + at(z, i));
  }
}

/** target += part. */
export function addInto(target: usize, part: usize, length: i32): void {
  for (let i = 0; i < length; i++) put(target, i, at(target, i) + at(part, i));
}

/** y ← 1/y, complex, and total += the new y. */
export function invertAndAdd(y: usize, total: usize, length: i32): void {
  for (let i = 0; i < length; i += 2) {
    const zr = at(y, i);
    const zi = at(y, i + 1);
    const norm = zr * zr + zi * zi;
    const yr = zr / norm;
    const yi = -zi / norm;
    put(y, i, yr);
    put(y, i + 1, yi);
    put(total, i, at(total, i) + yr);
    put(total, i + 1, at(total, i + 1) + yi);
  }
}

/** y ← y/total, complex: (a + jb)/(c + jd) = ((ac + bd) + j(bc − ad))/(c² + d²). */
export function divideInPlace(y: usize, total: usize, length: i32): void {
  for (let i = 0; i < length; i += 2) {
    const ar = at(y, i);
    const ai = at(y, i + 1);
    const br = at(total, i);
    const bi = at(total, i + 1);
    const norm = br * br + bi * bi;
    put(y, i, (ar * br + ai * bi) / norm);
    put(y, i + 1, (ai * br - ar * bi) / norm);
  }
}

/** out = 1/total, complex. */
export function invertInto(total: usize, out: usize, length: i32): void {
  for (let i = 0; i < length; i += 2) {
    const br = at(total, i);
    const bi = at(total, i + 1);
    const norm = br * br + bi * bi;
    put(out, i, br / norm);
    put(out, i + 1, -bi / norm);
  }
}

/** product = a·b, complex (`product` may be `a` itself: each bin's factors are read before its product is written). */
export function multiplyComplexInto(a: usize, b: usize, product: usize, length: i32): void {
  for (let i = 0; i < length; i += 2) {
    const ar = at(a, i);
    const ai = at(a, i + 1);
    const br = at(b, i);
    const bi = at(b, i + 1);
    put(product, i, ar * br - ai * bi);
    put(product, i + 1, ar * bi + ai * br);
  }
}

/** 1 when `values` holds an entry that is not 0 (NaN included), else 0. */
export function anyNonZero(values: usize, length: i32): i32 {
  for (let i = 0; i < length; i++) if (at(values, i) != 0) return 1;
  return 0;
}

/**
 * The load's gain per frequency from the wiring's impedance and the load's admittances (Y_s = 1/Z; without a bridge
 * G = Y_s/(Y_s + Y_h + Y_o), with one G = Y_ho·Y_s/((Y_s + Y_h)·Y_o + Y_ho·(Y_s + Y_h + Y_o))).
 */
export function loadGain(impedance: usize, hot: usize, outY: usize, bridge: usize, hasBridge: i32, gain: usize, length: i32): void {
  for (let i = 0; i < length; i += 2) {
    const zr = at(impedance, i);
    const zi = at(impedance, i + 1);
    const zn = zr * zr + zi * zi;
    const sr = zr / zn;
    const si = -zi / zn;
    const hr = sr + at(hot, i);
    const hi = si + at(hot, i + 1);
    const or = at(outY, i);
    const oi = at(outY, i + 1);
    let nr: f64;
    let ni: f64;
    let dr: f64;
    let di: f64;
    if (hasBridge == 0) {
      nr = sr;
      ni = si;
      dr = hr + or;
      di = hi + oi;
    } else {
      const br = at(bridge, i);
      const bi = at(bridge, i + 1);
      nr = br * sr - bi * si;
      ni = br * si + bi * sr;
      const tr = hr + or;
      const ti = hi + oi;
      dr = hr * or - hi * oi + (br * tr - bi * ti);
      di = hr * oi + hi * or + (br * ti + bi * tr);
    }
    const dn = dr * dr + di * di;
    put(gain, i, (nr * dr + ni * di) / dn);
    put(gain, i + 1, (ni * dr - nr * di) / dn);
  }
}

/**
 * output = G·Σ_u w_u·P_u per bin: the `count` sources (byte addresses in `sources`, i32) with their weights (f64)
 * added in order from 0, then the complex product by the gain.
 */
export function sumSources(sources: usize, weights: usize, count: i32, gain: usize, output: usize, length: i32): void {
  for (let k = 0; k < length; k += 2) {
    let re: f64 = 0;
    let im: f64 = 0;
    for (let u = 0; u < count; u++) {
      const product = <usize>whole(sources, u);
      const sign = at(weights, u);
      re += sign * at(product, k);
      im += sign * at(product, k + 1);
    }
    const gr = at(gain, k);
    const gi = at(gain, k + 1);
    put(output, k, re * gr - im * gi);
    put(output, k + 1, re * gi + im * gr);
  }
}
