/**
 * Real-signal FFT over fft.js (radix-4, MIT). Spectra are interleaved
 * complex arrays of the non-negative bins 0 … N/2 (length 2·(N/2 + 1)):
 * X[k] = Σ_n x[n]·e^(−j2πkn/N), no scaling forward; the inverse divides by N,
 * so inverse(forward(x)) = x.
 */
import FFT from 'fft.js';

export interface RealFft {
  readonly size: number;
  /** Number of non-negative-frequency bins, N/2 + 1. */
  readonly bins: number;
  /** Forward transform of `input` (length ≤ N, zero padded) into a new or given half spectrum. */
  forward(input: ArrayLike<number>, out?: Float64Array): Float64Array;
  /** Inverse transform of a half spectrum (Hermitian symmetry assumed) into a new or given real signal of length N. */
  inverse(halfSpectrum: Float64Array, out?: Float64Array): Float64Array;
}

const cache = new Map<number, RealFft>();

/** Smallest power of two ≥ n (and ≥ 4, the smallest size fft.js takes). */
export function nextPowerOfTwo(n: number): number {
  let size = 4;
  while (size < n) size *= 2;
  return size;
}

/** The FFT for size N (a power of two ≥ 4), built once and reused. */
export function realFft(size: number): RealFft {
  const cached = cache.get(size);
  if (cached) return cached;
  if (!Number.isInteger(Math.log2(size)) || size < 4) throw new RangeError(`FFT size must be a power of two ≥ 4, got ${size}`);
  const engine = new FFT(size);
  const bins = size / 2 + 1;
  const padded = new Float64Array(size);
  const full = new Float64Array(2 * size);
  const time = new Float64Array(2 * size);
  const made: RealFft = {
    size,
    bins,
    forward(input, out = new Float64Array(2 * bins)) {
      padded.fill(0);
      const count = Math.min(input.length, size);
      for (let i = 0; i < count; i += 1) padded[i] = input[i] as number;
      engine.realTransform(full, padded);
      out.set(full.subarray(0, 2 * bins));
      return out;
    },
    inverse(halfSpectrum, out = new Float64Array(size)) {
      full.set(halfSpectrum.subarray(0, 2 * bins));
      // Hermitian symmetry: X[N−k] = conj(X[k]).
      for (let k = 1; k < size / 2; k += 1) {
        full[2 * (size - k)] = halfSpectrum[2 * k] as number;
        full[2 * (size - k) + 1] = -(halfSpectrum[2 * k + 1] as number);
      }
      engine.inverseTransform(time, full);
      for (let i = 0; i < size; i += 1) out[i] = time[2 * i] as number;
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
