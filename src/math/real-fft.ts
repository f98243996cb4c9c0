/**
 * Real-signal FFT over fft.js's radix-4 kernels (MIT; run as WebAssembly,
 * src/math/fft-kernels.ts, to the same bits). Spectra are interleaved
 * complex arrays of the non-negative bins 0 … N/2 (length 2·(N/2 + 1)):
 * X[k] = Σ_n x[n]·e^(−j2πkn/N), no scaling forward; the inverse divides by N,
 * so inverse(forward(x)) = x.
 */
import { createRealFftKernels } from './fft-kernels.js';

export interface RealFft {
  readonly size: number;
  /** Number of non-negative-frequency bins, N/2 + 1. */
  readonly bins: number;
  /** Forward transform of `input` (length ≤ N, zero padded) into a new or given half spectrum. */
  forward(input: ArrayLike<number>, out?: Float64Array): Float64Array;
  /**
   * The same transform by one complex FFT of length N/2 (the packing of
   * `inverse`, run forwards): about three times faster than `forward`, equal
   * to it within rounding (relative 1e-14), not to the last bit. `input` is
   * read as x[n]·window[n] when a window is given.
   */
  forwardPacked(input: ArrayLike<number>, out: Float64Array, window?: ArrayLike<number>): Float64Array;
  /**
   * Inverse transform of a half spectrum (Hermitian symmetry assumed) into a
   * new or given real signal of length N. With `scale`, the spectrum is read
   * as halfSpectrum[i]·scale (the same numbers as scaling a copy first).
   */
  inverse(halfSpectrum: Float64Array, out?: Float64Array, scale?: number): Float64Array;
}

const cache = new Map<number, RealFft>();

/** Smallest power of two ≥ n (and ≥ 4, the smallest size fft.js takes). */
export function nextPowerOfTwo(n: number): number {
  let size = 4;
  while (size < n) size *= 2;
  return size;
}

/**
 * target[n] = input[n]·window[n] (or input[n]) for n < min(input length, target length), zeros after. A typed array
 * without a window is copied by TypedArray.prototype.set (each element converted as an assignment would: the same
 * numbers). The windowed loop is a function of its own: V8 compiles a long loop while it runs (on-stack replacement),
 * and code after the loop that had not yet run when it did made that compiled code bail out on every later call
 * (seen with node --trace-deopt).
 */
function copyPadded(input: ArrayLike<number>, target: Float64Array, window?: ArrayLike<number>): void {
  const count = Math.min(input.length, target.length);
  target.fill(0, count);
  if (window) copyWindowed(input, window, target, count);
  else if (ArrayBuffer.isView(input)) target.set((input as Float64Array).subarray(0, count));
  else for (let n = 0; n < count; n += 1) target[n] = input[n] as number;
}

function copyWindowed(input: ArrayLike<number>, window: ArrayLike<number>, target: Float64Array, count: number): void {
  for (let n = 0; n < count; n += 1) target[n] = (input[n] as number) * (window[n] as number);
}

/** The FFT for size N (a power of two ≥ 4), built once and reused; the full-size complex kernel only on the first `forward`. */
export function realFft(size: number): RealFft {
  const cached = cache.get(size);
  if (cached) return cached;
  if (!Number.isInteger(Math.log2(size)) || size < 4) throw new RangeError(`FFT size must be a power of two ≥ 4, got ${size}`);
  const half = size / 2;
  const kernels = createRealFftKernels(size);
  const bins = half + 1;
  const made: RealFft = {
    size,
    bins,
    forward(input, out = new Float64Array(2 * bins)) {
      copyPadded(input, kernels.forwardInput());
      kernels.forward(out);
      return out;
    },
    forwardPacked(input, out, window) {
      copyPadded(input, kernels.packedInput(), window);
      kernels.forwardPacked(out);
      return out;
    },
    inverse(halfSpectrum, out = new Float64Array(size), scale = 1) {
      // fft.js's inverseTransform divides its M = N/2 outputs by M in a pass of its own; M is a power of two, so
      // reading the spectrum times scale/M instead gives the same bits (scaling by a power of two is exact and
      // commutes with every rounding of the transform, away from underflow) and saves that pass over the frame.
      if (out.length < size) throw new RangeError(`realFft.inverse: out must hold ${size} numbers, got ${out.length}`);
      if (halfSpectrum.length < 2 * bins) throw new RangeError(`realFft.inverse: the spectrum must hold ${2 * bins} numbers (bins 0 … ${half}), got ${halfSpectrum.length}`);
      // The packing reads the whole spectrum before the transform writes, so `out` may even be the spectrum's own array.
      out.set(kernels.inverse(halfSpectrum, scale / half));
      return out;
    },
  };
  cache.set(size, made);
  return made;
}

/** Frequency in Hz of bin k for an N-point transform at `sampleRateHz`. */
export function binFrequencyHz(bin: number, size: number, sampleRateHz: number): number {
  return (bin * sampleRateHz) / size;
}
