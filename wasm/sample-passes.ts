/**
 * The passes over a render's float32 samples that every wiring's file takes
 * (src/render/sample-passes.ts): the check that every sample is finite, the
 * peak, the file's gain and the mono 24-bit PCM of a WAV file. Written in AssemblyScript and compiled to WebAssembly
 * (scripts/build-wasm.mjs): each does the operations of its JavaScript
 * namesake in src/render/sample-passes.ts in the same order, so the same numbers and bytes: a float32 sample is read as
 * the binary64 number it is, and a product stored into a float32 array is
 * rounded to nearest as JavaScript's store rounds it.
 *
 * Every array is a byte address in this module's memory, laid out by
 * src/render/sample-passes.ts: `samples` count f32, `bytes` 3·count + 1 bytes.
 */

/** Σ x·0 in two running sums (even and odd samples), added: a zero when every sample is finite, NaN otherwise. */
export function finiteSum(samples: usize, count: i32): f64 {
  let even: f64 = 0;
  let odd: f64 = 0;
  const pairs = count - (count % 2);
  for (let n = 0; n < pairs; n += 2) {
    even += <f64>load<f32>(samples + ((<usize>n) << 2)) * 0;
    odd += <f64>load<f32>(samples + ((<usize>(n + 1)) << 2)) * 0;
  }
  if (pairs < count) even += <f64>load<f32>(samples + ((<usize>pairs) << 2)) * 0;
  return even + odd;
}

/** Largest |x| over the samples (a NaN sample is passed over, as `>` is false for it). */
export function peak(samples: usize, count: i32): f64 {
  let largest: f64 = 0;
  for (let n = 0; n < count; n++) {
    const magnitude = Math.abs(<f64>load<f32>(samples + ((<usize>n) << 2)));
    if (magnitude > largest) largest = magnitude;
  }
  return largest;
}

/** x ← x·gain, rounded to float32. */
export function scale(samples: usize, count: i32, gain: f64): void {
  for (let n = 0; n < count; n++) {
    const at = samples + ((<usize>n) << 2);
    store<f32>(at, <f32>(<f64>load<f32>(at) * gain));
  }
}

/**
 * Mono 24-bit PCM of the first `count` samples, little-endian, each as one 32-bit store whose top byte the next
 * sample's store overwrites (so `bytes` holds 3·count + 1 bytes). Each sample is clipped to ±1, scaled by
 * `fullScale` and rounded half away from zero: m = trunc(|x| + 0.5), s = trunc(x − 1) >> 31 (−1 for x < 0),
 * value (m ^ s) − s. A NaN gives 0 (a saturating truncation, as JavaScript's `| 0`). Returns Σ (x − x): NaN when
 * a sample is not finite.
 */
export function writeMonoPcm24(samples: usize, count: i32, bytes: usize, fullScale: f64): f64 {
  let unfinite: f64 = 0;
  for (let n = 0; n < count; n++) {
    const sample = <f64>load<f32>(samples + ((<usize>n) << 2));
    unfinite += sample - sample;
    const scaled = (sample > 1 ? 1 : sample < -1 ? -1 : sample) * fullScale;
    const magnitude = <i32>(Math.abs(scaled) + 0.5);
    const negative = <i32>(scaled - 1) >> 31;
    store<i32>(bytes + <usize>n * 3, (magnitude ^ negative) - negative);
  }
  return unfinite;
}
