/**
 * Spectral centroid of a whole render, Hz:
 *
 *   SC = Σ_k f_k·|X_k| / Σ_k |X_k|   over the bins with lowHz ≤ f_k ≤ highHz
 *
 * the magnitude-weighted mean frequency (librosa `spectral_centroid`, after
 * A. Klapuri, M. Davy, *Signal Processing Methods for Music Transcription*,
 * 2007; G. Peeters, IRCAM feature set, 2004). X is one FFT of the whole
 * signal times a Hann window as long as the signal, zero padded to the next
 * power of two N; f_k = k·fs/N.
 *
 * Window: symmetric Hann by default, w[n] = 0.5 − 0.5·cos(2πn/(L − 1)),
 * n = 0 … L − 1 (F. J. Harris, "On the use of windows for harmonic
 * analysis with the discrete Fourier transform", Proc. IEEE 66(1), 1978),
 * zero at both ends of the render. It is also the window meyda uses, so
 * frames compare one to one. `window: 'periodic'` gives Harris's DFT-even
 * form 0.5 − 0.5·cos(2πn/L).
 *
 * Weighting is by magnitude, not power: for 10 harmonics with amplitudes 1/n
 * the centroid is 10/H_10·f1 = 3.4142·f1 (H_10 the 10th harmonic number).
 *
 * Silence (no magnitude in the band) has no centroid; it reads
 * SILENCE_CENTROID_HZ (0 Hz, outside every band), never NaN.
 */
import { InputError } from '../errors/index.js';
import { nextPowerOfTwo, realFft } from '../math/index.js';

export type HannWindowKind = 'symmetric' | 'periodic';

export interface CentroidOptions {
  /** Lowest frequency counted, Hz; finite, ≥ 0, below highHz. Default 20 Hz (the band of docs/design.md's centroidHz). */
  readonly lowHz: number;
  /** Highest frequency counted, Hz; finite, above lowHz. The band also ends at Nyquist (fs/2). Default 20 kHz. */
  readonly highHz: number;
  /** Hann window form: 'symmetric' (default) or 'periodic' (see the file comment). */
  readonly window: HannWindowKind;
}

/** The audible band, 20 Hz–20 kHz (common practice), as docs/design.md defines centroidHz. */
export const DEFAULT_CENTROID_OPTIONS: CentroidOptions = Object.freeze({ lowHz: 20, highHz: 20_000, window: 'symmetric' });

/** What a silent signal reads, Hz (no centroid exists; 0 lies outside every band). */
export const SILENCE_CENTROID_HZ = 0;

const WINDOW_KINDS: readonly HannWindowKind[] = ['symmetric', 'periodic'];

function resolveOptions(options: Partial<CentroidOptions>): CentroidOptions {
  const merged: CentroidOptions = {
    lowHz: options.lowHz ?? DEFAULT_CENTROID_OPTIONS.lowHz,
    highHz: options.highHz ?? DEFAULT_CENTROID_OPTIONS.highHz,
    window: options.window ?? DEFAULT_CENTROID_OPTIONS.window,
  };
  if (!Number.isFinite(merged.lowHz) || merged.lowHz < 0) throw InputError.at('lowHz', 'a frequency ≥ 0 Hz', merged.lowHz);
  if (!Number.isFinite(merged.highHz) || merged.highHz <= merged.lowHz) {
    throw InputError.at('highHz', `a frequency above lowHz (${merged.lowHz} Hz)`, merged.highHz);
  }
  if (!WINDOW_KINDS.includes(merged.window)) throw InputError.at('window', `one of ${WINDOW_KINDS.join(', ')}`, merged.window);
  return merged;
}

let cachedWindow: { length: number; kind: HannWindowKind; values: Float64Array } | null = null;

/** Hann window of `length` samples (a single sample is 1). Every render of a run has the same length, so the last one is kept. */
function hannWindow(length: number, kind: HannWindowKind): Float64Array {
  if (cachedWindow && cachedWindow.length === length && cachedWindow.kind === kind) return cachedWindow.values;
  const values = new Float64Array(length);
  const period = kind === 'symmetric' ? length - 1 : length;
  for (let n = 0; n < length; n += 1) values[n] = period > 0 ? (1 - Math.cos((2 * Math.PI * n) / period)) / 2 : 1;
  cachedWindow = { length, kind, values };
  return values;
}

let spectrumBuffer = new Float64Array(0);

/** Spectral centroid of `samples` at `sampleRateHz`, Hz; see the file comment. */
export function measureCentroid(samples: ArrayLike<number>, sampleRateHz: number, options: Partial<CentroidOptions> = {}): number {
  const { lowHz, highHz, window } = resolveOptions(options);
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) throw InputError.at('sampleRateHz', 'a positive sample rate in Hz', sampleRateHz);
  const length = samples.length;
  if (length === 0) return SILENCE_CENTROID_HZ;
  const size = nextPowerOfTwo(length);
  const fft = realFft(size);
  const taper = hannWindow(length, window);
  // One complex FFT of N/2 points into a kept buffer (every render of a run has one length).
  if (spectrumBuffer.length !== 2 * fft.bins) spectrumBuffer = new Float64Array(2 * fft.bins);
  const spectrum = fft.forwardPacked(samples, spectrumBuffer, taper);

  const binHz = sampleRateHz / size;
  const firstBin = Math.ceil(lowHz / binHz);
  const lastBin = Math.min(Math.floor(highHz / binHz), fft.bins - 1);
  let weightedSum = 0;
  let magnitudeSum = 0;
  for (let k = firstBin; k <= lastBin; k += 1) {
    const re = spectrum[2 * k] as number;
    const im = spectrum[2 * k + 1] as number;
    const magnitude = Math.sqrt(re * re + im * im);
    weightedSum += k * magnitude;
    magnitudeSum += magnitude;
  }
  if (!Number.isFinite(weightedSum) || !Number.isFinite(magnitudeSum)) {
    throw new InputError([{ path: 'samples', expected: 'finite samples', got: 'NaN or an infinite sample' }]);
  }
  return magnitudeSum > 0 ? (weightedSum / magnitudeSum) * binHz : SILENCE_CENTROID_HZ;
}
