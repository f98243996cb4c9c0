/**
 * The linear stages of an effects chain that our code computes in place of
 * node-web-audio-api 1.0.9's audio graph (src/render/linear-stages.ts): a
 * GainNode with a constant gain and a BiquadFilterNode's running filter,
 * written in AssemblyScript and compiled to WebAssembly (scripts/build-wasm.mjs).
 * Each does the operations of its JavaScript namesake (src/render/float32-audio.ts
 * `renderGain`, src/render/biquad-filter.ts `renderBiquad`) in the same order,
 * subnormals flushed by hand where the library's thread flushes them, so the
 * same float32 samples: a float32 sample is read as the binary64 number it is,
 * and a binary64 result stored as float32 is rounded to nearest, as
 * JavaScript's Math.fround and float32 stores round it.
 *
 * `samples` is the byte address of `count` f32 in this module's memory, laid
 * out by src/render/linear-stages.ts; each stage writes over its input.
 */

/** Smallest normal float32, 2⁻¹²⁶, and float64, 2⁻¹⁰²² (IEEE 754-2019: emin = −126, −1022). */
const FLOAT32_MIN_NORMAL: f64 = 1.1754943508222875e-38;
const FLOAT64_MIN_NORMAL: f64 = 2.2250738585072014e-308;

@inline function sampleAt(samples: usize, n: i32): f64 {
  return <f64>load<f32>(samples + ((<usize>n) << 2));
}

@inline function setSample(samples: usize, n: i32, value: f64): void {
  store<f32>(samples + ((<usize>n) << 2), <f32>value);
}

/** float32-audio.ts `flushFloat32`: a zero of the value's sign (value·0) when below 2⁻¹²⁶ in size. */
@inline function flush32(value: f64): f64 {
  return Math.abs(value) < FLOAT32_MIN_NORMAL ? value * 0 : value;
}

/** float32-audio.ts `flushFloat64`. */
@inline function flush64(value: f64): f64 {
  return Math.abs(value) < FLOAT64_MIN_NORMAL ? value * 0 : value;
}

/** Math.fround: binary64 to the nearest float32, widened again. */
@inline function fround(value: f64): f64 {
  return <f64><f32>value;
}

/** biquad-filter.ts `isTiny`: non-zero and below 2⁻¹²⁶ in size. */
@inline function isTiny(value: f64): bool {
  return Math.abs(value) < FLOAT32_MIN_NORMAL && value != 0;
}

/** float32-audio.ts `renderGain`: y = fround(x·g), g already a float32 value; the flushed step when a zero or subnormal is read or made. */
export function gain(samples: usize, count: i32, g: f64): void {
  for (let n = 0; n < count; n++) {
    const x = sampleAt(samples, n);
    const product = fround(x * g);
    setSample(samples, n, Math.abs(product) < FLOAT32_MIN_NORMAL || Math.abs(x) < FLOAT32_MIN_NORMAL ? flush32(fround(flush32(x) * g)) : product);
  }
}

/**
 * biquad-filter.ts `renderBiquad`: direct form I with a float64 state, y = b0·x + b1·x1 + b2·x2 − a1·y1 − a2·y2
 * summed left to right, the output rounded to float32; while a tiny value is read or made, the step with every
 * product and sum flushed, until both outputs in the state are clean again.
 */
export function biquad(samples: usize, count: i32, b0: f64, b1: f64, b2: f64, a1: f64, a2: f64): void {
  let x1: f64 = 0;
  let x2: f64 = 0;
  let y1: f64 = 0;
  let y2: f64 = 0;
  let n = 0;
  while (n < count) {
    for (; n < count; n++) {
      const x = sampleAt(samples, n);
      const y = b0 * x + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
      if ((Math.abs(y) < FLOAT32_MIN_NORMAL || Math.abs(x) < FLOAT32_MIN_NORMAL) && (isTiny(x) || isTiny(y))) break;
      x2 = x1;
      x1 = x;
      y2 = y1;
      y1 = y;
      setSample(samples, n, y);
    }
    for (; n < count; n++) {
      const x = flush32(sampleAt(samples, n));
      let y = flush64(flush64(b0 * x) + flush64(b1 * x1));
      y = flush64(y + flush64(b2 * x2));
      y = flush64(y - flush64(a1 * y1));
      y = flush64(y - flush64(a2 * y2));
      x2 = x1;
      x1 = x;
      y2 = y1;
      y1 = y;
      setSample(samples, n, flush32(fround(y)));
      if (!isTiny(y1) && !isTiny(y2)) {
        n++;
        break;
      }
    }
  }
}
