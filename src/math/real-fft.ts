/**
 * Real-signal FFT over fft.js's radix-4 kernels (MIT; run as WebAssembly,
 * src/math/fft-kernels.ts, to the same bits). Spectra are interleaved
 * complex arrays of the non-negative bins 0 … N/2 (length 2·(N/2 + 1)):
 * X[k] = Σ_n x[n]·e^(−j2πkn/N), no scaling forward; the inverse divides by N,
 * so inverse(forward(x)) = x.
 */
import { type FftKernel, createFftKernel } from './fft-kernels.js';

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
 * fft.js's twiddle table for `size` complex points: entry k < size holds
 * cos(π·2k/size) and −sin(π·2k/size) at 2k and 2k + 1, the very numbers its
 * constructor computes (the same angle expression, so the same bits).
 */
function twiddleTable(size: number): Float64Array {
  const table = new Float64Array(2 * size);
  for (let i = 0; i < table.length; i += 2) {
    const angle = (Math.PI * i) / size;
    table[i] = Math.cos(angle);
    table[i + 1] = -Math.sin(angle);
  }
  return table;
}

/**
 * Every second entry of a twiddle table: the table for half the size, to
 * the last bit (π·2(2k)/N = π·2k/(N/2) exactly, since scaling by two is exact).
 */
function halveTwiddleTable(table: Float64Array): Float64Array {
  const half = new Float64Array(table.length / 2);
  for (let k = 0; 2 * k < half.length; k += 1) {
    half[2 * k] = table[4 * k] as number;
    half[2 * k + 1] = table[4 * k + 1] as number;
  }
  return half;
}

/*
 * The transforms' loops, each a function of its own: V8 compiles a long loop
 * while it runs (on-stack replacement), and code after the loop that had not
 * yet run when it did (the engine call) made that compiled code bail out on
 * every later call, leaving the rest of the transform to the interpreter (seen
 * with node --trace-deopt: once per wiring). A function that is only its loop
 * has nothing after it to bail out on.
 */

/** target[n] = input[n]·window[n] (or input[n]) for n < min(input length, target length), zeros after. */
function copyPadded(input: ArrayLike<number>, target: Float64Array, window?: ArrayLike<number>): void {
  const count = Math.min(input.length, target.length);
  target.fill(0, count);
  if (window) for (let n = 0; n < count; n += 1) target[n] = (input[n] as number) * (window[n] as number);
  else for (let n = 0; n < count; n += 1) target[n] = input[n] as number;
}

/**
 * The half spectrum of a real signal from Z = DFT_M(z), z[m] = x[2m] + j·x[2m+1], M = N/2; with Z[M] = Z[0]
 * E[k] = (Z[k] + conj(Z[M−k]))/2, O[k] = (Z[k] − conj(Z[M−k]))/(2j),
 * X[k] = E[k] + W^k·O[k], W = e^{−j2π/N}, k = 0 … M (Numerical Recipes, 3rd ed., §12.3).
 */
function unpackForward(packed: Float64Array, twiddles: Float64Array, half: number, out: Float64Array): void {
  for (let k = 0; k <= half; k += 1) {
    const a = k % half;
    const b = (half - k) % half;
    const zr = packed[2 * a] as number;
    const zi = packed[2 * a + 1] as number;
    const cr = packed[2 * b] as number; // conj(Z[M−k])
    const ci = -(packed[2 * b + 1] as number);
    const er = (zr + cr) / 2;
    const ei = (zi + ci) / 2;
    const or = (zi - ci) / 2; // (Z − conj Z_{M−k}) / (2j)
    const oi = -(zr - cr) / 2;
    const wr = k < half ? (twiddles[2 * k] as number) : -1;
    const wi = k < half ? (twiddles[2 * k + 1] as number) : 0;
    out[2 * k] = er + wr * or - wi * oi;
    out[2 * k + 1] = ei + wr * oi + wi * or;
  }
}

/**
 * The packing of a real signal's inverse transform into one complex inverse FFT of length M = N/2 (the standard
 * packing; e.g. Numerical Recipes, 3rd ed., §12.3): E[k] = (X[k] + conj(X[M−k]))/2 is the spectrum of the even
 * samples and O[k] = (X[k] − conj(X[M−k]))/(2·W^k) that of the odd ones (W = e^{−j2π/N}); z = IDFT_M(E + jO)
 * gives x[2m] = Re z[m], x[2m+1] = Im z[m]. The spectrum is read as halfSpectrum[i]·scale.
 */
function packInverse(halfSpectrum: Float64Array, twiddles: Float64Array, half: number, scale: number, packed: Float64Array): void {
  for (let k = 0; k < half; k += 1) {
    // x·(s/M) rounds as x·s does, scaled exactly by the power of two 1/M (inverse's scale, see there)
    const ar = (halfSpectrum[2 * k] as number) * scale;
    const ai = (halfSpectrum[2 * k + 1] as number) * scale;
    const br = (halfSpectrum[2 * (half - k)] as number) * scale; // X[M−k], conjugated below
    const bi = -((halfSpectrum[2 * (half - k) + 1] as number) * scale);
    const er = (ar + br) / 2;
    const ei = (ai + bi) / 2;
    const dr = (ar - br) / 2;
    const di = (ai - bi) / 2;
    // O = D / W^k = D · conj(W^k)
    const wr = twiddles[2 * k] as number;
    const wi = -(twiddles[2 * k + 1] as number);
    const or = dr * wr - di * wi;
    const oi = dr * wi + di * wr;
    packed[2 * k] = er - oi; // E + jO
    packed[2 * k + 1] = ei + or;
  }
}

/** The FFT for size N (a power of two ≥ 4), built once and reused; the full-size complex kernel only on the first `forward`. */
export function realFft(size: number): RealFft {
  const cached = cache.get(size);
  if (cached) return cached;
  if (!Number.isInteger(Math.log2(size)) || size < 4) throw new RangeError(`FFT size must be a power of two ≥ 4, got ${size}`);
  const half = size / 2;
  // One table of N twiddles W^k = e^{−j2πk/N}, interleaved (cos, −sin): fft.js's table for N points
  // (the full-size kernel, made on the first `forward` only), its first half the packing's twiddles,
  // every second entry the half-size kernel's table.
  const twiddles = twiddleTable(size);
  const halfKernel = createFftKernel(half, halveTwiddleTable(twiddles));
  let fullKernel: FftKernel | undefined;
  const bins = half + 1;
  const made: RealFft = {
    size,
    bins,
    forward(input, out = new Float64Array(2 * bins)) {
      fullKernel ??= createFftKernel(size, twiddles);
      copyPadded(input, fullKernel.input().subarray(0, size));
      fullKernel.realTransform();
      out.set(fullKernel.output().subarray(0, 2 * bins));
      return out;
    },
    forwardPacked(input, out, window) {
      copyPadded(input, halfKernel.input(), window);
      halfKernel.transform(false);
      unpackForward(halfKernel.output(), twiddles, half, out);
      return out;
    },
    inverse(halfSpectrum, out = new Float64Array(size), scale = 1) {
      // fft.js's inverseTransform divides its M = N/2 outputs by M in a pass of its own; M is a power of two, so
      // reading the spectrum times scale/M instead gives the same bits (scaling by a power of two is exact and
      // commutes with every rounding of the transform, away from underflow) and saves that pass over the frame.
      if (out.length < size) throw new RangeError(`realFft.inverse: out must hold ${size} numbers, got ${out.length}`);
      // The packing reads the whole spectrum before the transform runs, so `out` may even be the spectrum's own array.
      packInverse(halfSpectrum, twiddles, half, scale / half, halfKernel.input());
      halfKernel.transform(true);
      out.set(halfKernel.output());
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
