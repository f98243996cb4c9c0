/**
 * Measurements on steady test tones, for the effects-chain tests: the
 * amplitude of one sinusoid by least squares, harmonic distortion, and the
 * share of energy away from the harmonics (aliasing) from a windowed FFT.
 */
import { realFft } from '../../src/math/index.js';

/** A sine of `amplitude` at `frequencyHz`, `seconds` long. */
export function makeSine(frequencyHz: number, amplitude: number, seconds: number, sampleRateHz: number): Float32Array {
  const frames = Math.round(seconds * sampleRateHz);
  const signal = new Float32Array(frames);
  for (let i = 0; i < frames; i += 1) signal[i] = amplitude * Math.sin((2 * Math.PI * frequencyHz * i) / sampleRateHz);
  return signal;
}

/** End of the longest stretch from `from` (before `end`) holding a whole number of periods of `frequencyHz`. */
function wholePeriodsEnd(frequencyHz: number, sampleRateHz: number, from: number, end: number): number {
  const periods = Math.floor(((end - from) * frequencyHz) / sampleRateHz);
  return from + Math.round((periods * sampleRateHz) / frequencyHz);
}

/** Amplitude at `frequencyHz` by correlation with cos and sin over signal[from…to). */
function correlate(signal: Float32Array, frequencyHz: number, sampleRateHz: number, from: number, to: number): number {
  let inPhase = 0;
  let quadrature = 0;
  for (let i = from; i < to; i += 1) {
    const phase = (2 * Math.PI * frequencyHz * i) / sampleRateHz;
    const value = signal[i] ?? 0;
    inPhase += value * Math.cos(phase);
    quadrature += value * Math.sin(phase);
  }
  return (2 * Math.hypot(inPhase, quadrature)) / (to - from);
}

/**
 * Amplitude of the sinusoid at `frequencyHz` in `signal[from…end)`, by
 * correlation with cos and sin over a whole number of its periods (the
 * least-squares fit of a sinusoid of known frequency, IEEE Std 1057-2017
 * three-parameter sine fit; over whole periods the terms separate).
 */
export function measureSineAmplitude(signal: Float32Array, frequencyHz: number, sampleRateHz: number, from: number, end = signal.length): number {
  return correlate(signal, frequencyHz, sampleRateHz, from, wholePeriodsEnd(frequencyHz, sampleRateHz, from, end));
}

/**
 * Total harmonic distortion, THD_F = √(Σ_{n≥2} A_n²) / A_1, over harmonics below
 * the Nyquist frequency (IEC 60268-3 definition relative to the fundamental).
 * Every harmonic is measured over the same whole number of fundamental
 * periods, so the fundamental does not leak into them.
 */
export function measureThd(signal: Float32Array, fundamentalHz: number, sampleRateHz: number, from: number, end = signal.length): number {
  const to = wholePeriodsEnd(fundamentalHz, sampleRateHz, from, end);
  const fundamental = correlate(signal, fundamentalHz, sampleRateHz, from, to);
  let harmonicPower = 0;
  for (let n = 2; n * fundamentalHz < sampleRateHz / 2; n += 1) {
    harmonicPower += correlate(signal, n * fundamentalHz, sampleRateHz, from, to) ** 2;
  }
  return Math.sqrt(harmonicPower) / fundamental;
}

/** 4-term Blackman–Harris window (F. J. Harris, Proc. IEEE 66(1), 1978): sidelobes below −92 dB. */
const BLACKMAN_HARRIS = [0.35875, 0.48829, 0.14128, 0.01168] as const;
/** Main-lobe half-width of that window, bins (Harris 1978: 4 bins), with a margin. */
const LOBE_HALF_WIDTH_BINS = 6;

/**
 * Energy away from the harmonics of `fundamentalHz` (and from DC), relative to
 * the energy on them, in dB, from one Blackman–Harris windowed FFT of
 * `size` frames starting at `from`. Aliased partials of a driven tone land
 * between the harmonics; a clean nonlinearity leaves that region empty.
 */
export function measureNonHarmonicDb(signal: Float32Array, fundamentalHz: number, sampleRateHz: number, from: number, size: number): number {
  const frame = new Float64Array(size);
  for (let i = 0; i < size; i += 1) {
    const x = (2 * Math.PI * i) / (size - 1);
    const [a0, a1, a2, a3] = BLACKMAN_HARRIS;
    frame[i] = (signal[from + i] ?? 0) * (a0 - a1 * Math.cos(x) + a2 * Math.cos(2 * x) - a3 * Math.cos(3 * x));
  }
  const fft = realFft(size);
  const spectrum = fft.forward(frame);
  const binHz = sampleRateHz / size;
  let onHarmonics = 0;
  let between = 0;
  for (let k = 0; k < fft.bins; k += 1) {
    const power = (spectrum[2 * k] ?? 0) ** 2 + (spectrum[2 * k + 1] ?? 0) ** 2;
    const frequencyHz = k * binHz;
    const nearest = Math.round(frequencyHz / fundamentalHz);
    const nearHarmonic = Math.abs(frequencyHz - nearest * fundamentalHz) <= LOBE_HALF_WIDTH_BINS * binHz;
    if (nearHarmonic && nearest === 0) continue; // DC
    if (nearHarmonic) onHarmonics += power;
    else between += power;
  }
  return 10 * Math.log10(between / onHarmonics);
}

/**
 * A plucked-string-like test tone: harmonics of `fundamentalHz` below
 * `topHz` with amplitude 1/n, each decaying exponentially (higher ones
 * faster), scaled to `peak`. Deterministic; not a string model, only a
 * realistic envelope and spectrum for level and timing checks.
 */
export function makePluck(fundamentalHz: number, peak: number, seconds: number, sampleRateHz: number, topHz = 8000): Float32Array {
  const frames = Math.round(seconds * sampleRateHz);
  const sum = new Float64Array(frames);
  const baseDecayS = 1.5;
  const decayPerHarmonic = 0.5;
  for (let n = 1; n * fundamentalHz < topHz; n += 1) {
    const decayS = baseDecayS / (1 + n * decayPerHarmonic);
    for (let i = 0; i < frames; i += 1) {
      const t = i / sampleRateHz;
      sum[i] = (sum[i] ?? 0) + (Math.sin(2 * Math.PI * n * fundamentalHz * t + n) * Math.exp(-t / decayS)) / n;
    }
  }
  let largest = 0;
  for (const value of sum) largest = Math.max(largest, Math.abs(value));
  return Float32Array.from(sum, (value) => (value * peak) / largest);
}

/** Largest |sample| in `signal[from…end)`. */
export function measurePeak(signal: ArrayLike<number>, from = 0, end = signal.length): number {
  let largest = 0;
  for (let i = from; i < end; i += 1) largest = Math.max(largest, Math.abs(signal[i] ?? 0));
  return largest;
}

/** Normalised biquad coefficients (a0 = 1). */
export interface Coefficients {
  readonly b0: number;
  readonly b1: number;
  readonly b2: number;
  readonly a1: number;
  readonly a2: number;
}

/**
 * Filter `input` in float64 through a cascade of biquads, each by the direct
 * form I difference equation y[n] = b0·x[n] + b1·x[n−1] + b2·x[n−2] − a1·y[n−1] − a2·y[n−2]
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, §6.3): an
 * implementation independent of the Web Audio engine's.
 */
export function filterCascade(input: ArrayLike<number>, sections: readonly Coefficients[], gain = 1): Float64Array {
  let signal = Float64Array.from(input, (value) => value * gain);
  for (const { b0, b1, b2, a1, a2 } of sections) {
    const out = new Float64Array(signal.length);
    let x1 = 0;
    let x2 = 0;
    let y1 = 0;
    let y2 = 0;
    for (let i = 0; i < signal.length; i += 1) {
      const x0 = signal[i] ?? 0;
      const y0 = b0 * x0 + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
      x2 = x1;
      x1 = x0;
      y2 = y1;
      y1 = y0;
      out[i] = y0;
    }
    signal = out;
  }
  return signal;
}

/** Energy of `other − reference` relative to the energy of `reference`, dB (how far a second host's render is from the first's). */
export function residualDb(reference: Float32Array, other: Float32Array): number {
  let signal = 0;
  let error = 0;
  for (let n = 0; n < reference.length; n += 1) {
    signal += (reference[n] as number) ** 2;
    error += ((reference[n] as number) - (other[n] ?? 0)) ** 2;
  }
  return 10 * Math.log10(error / signal);
}

/**
 * The compressor's static curve, written out from its source (D. Giannoulis, M. Massberg, J. D. Reiss, J. Audio Eng.
 * Soc. 60(6), 2012, eq. 4, knee from T to T + W, centred on T' = T + W/2): output level for a steady input level, dB.
 */
export function compressorStaticCurveDb(inputDb: number, threshold: number, knee: number, ratio: number): number {
  const centre = threshold + knee / 2;
  if (inputDb <= threshold) return inputDb;
  if (inputDb < threshold + knee) return inputDb + ((1 / ratio - 1) * (inputDb - threshold) ** 2) / (2 * knee);
  return centre + (inputDb - centre) / ratio;
}
