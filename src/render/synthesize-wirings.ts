/**
 * The same performance through every wiring. Everything after the strings is
 * linear, so the strings are rendered once and each coil's EMF spectrum E_i(f)
 * is computed once; a wiring then costs its transfers T_i(f) at every FFT bin,
 * the sum Y(f) = Σ_i T_i(f)·E_i(f) and one inverse FFT (docs/design.md, data flow).
 *
 * Output samples are volts at the amplifier input: the coils' string EMF is
 * string velocity (m/s, from src/pickup) times COIL_VOLTS_PER_METRE_PER_SECOND.
 */
import {
  type CircuitOverrides,
  type PreparedCircuit,
  humFieldWeights,
  phaseClassKey,
  phaseClassNetwork,
  phaseClassSigns,
  prepareCircuit,
  solveTransfers,
} from '../circuit/index.js';
import { InputError } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import { nextPowerOfTwo, realFft } from '../math/index.js';
import { computeCoilSpectra, pickupDelaySamples } from '../pickup/index.js';
import { type Phrase, type StringOptions, renderPhrase } from '../string/index.js';
import type { Network } from '../wiring/index.js';

/**
 * EMF a coil of relative sensitivity 1 gives per m/s of string velocity
 * sensed, volts (from memory: chosen so a firm strum gives open-circuit peaks
 * of a few hundred millivolts, the 100–300 mV typical of single coils quoted
 * in docs/physics.md §1.3).
 */
export const COIL_VOLTS_PER_METRE_PER_SECOND = 0.02;

/** Hum harmonics mixed into renders: mains fundamental and its third harmonic, relative amplitudes (common practice: lamp dimmers and transformers make hum rich in odd harmonics). */
export const HUM_HARMONICS: readonly (readonly [number, number])[] = Object.freeze([
  [1, 1],
  [3, 0.5],
]);

export interface SynthesisOptions {
  readonly sampleRateHz: number;
  readonly seed: number;
  readonly overrides: CircuitOverrides;
  /** Extra string options (t60, brightness …). */
  readonly strings: Partial<StringOptions>;
}

export interface WiringSynthesis {
  readonly guitar: Guitar;
  readonly sampleRateHz: number;
  /** Samples in every rendered wiring. */
  readonly length: number;
  readonly fftSize: number;
  readonly circuit: PreparedCircuit;
  /** Is the output shorted (volume at 0)? */
  readonly silent: boolean;
  /** Direct-chain output of a wiring, volts at the amplifier input. */
  synthesize(network: Network, out?: Float32Array): Float32Array;
  /** Hum the wiring adds for a mains field inducing `emfVolts` (peak) in a nominal coil, as samples to add to its output. */
  synthesizeHum(network: Network, mainsHz: number, emfVolts: number, out?: Float32Array): Float32Array;
}

/**
 * Each coil's EMF for a performance as a time signal, the form the listening
 * page carries: e_i(n) = IFFT(E_i)(n) for n < storedLength (the rest of the
 * FFT frame is silence: the strings fade to zero at the end of the render and
 * the pickup's centred response reaches at most 2·delay samples past it).
 */
export interface CoilSignals {
  readonly sampleRateHz: number;
  /** Samples in every wiring's output: the phrase plus `delay` samples of lead-in before its t = 0. */
  readonly length: number;
  /** Samples by which every coil signal is delayed so that each stays causal (`pickupDelaySamples`). */
  readonly delay: number;
  readonly fftSize: number;
  /** One signal per coil (guitar.coils order), volts, `storedLength` samples each. */
  readonly signals: readonly Float32Array[];
}

/** Render the strings and each coil's EMF spectrum (volts) for a phrase: the expensive part, done once. */
export function renderCoilSpectra(
  guitar: Guitar,
  phrase: Phrase,
  options: Pick<SynthesisOptions, 'sampleRateHz' | 'seed' | 'strings'>,
): { spectra: Float64Array[]; length: number; delay: number; fftSize: number } {
  const strings = renderPhrase(guitar, phrase, { ...options.strings, sampleRateHz: options.sampleRateHz, seed: options.seed });
  const delay = pickupDelaySamples(guitar, strings);
  const fftSize = nextPowerOfTwo(strings.length + delay);
  const spectra = computeCoilSpectra(guitar, strings, fftSize);
  for (const spectrum of spectra) for (let k = 0; k < spectrum.length; k += 1) spectrum[k] = (spectrum[k] as number) * COIL_VOLTS_PER_METRE_PER_SECOND;
  // The centred pickup response (src/pickup/compute-coil-spectra.ts) of a note at t = 0 starts up to
  // `delay` samples before it. Every render keeps those samples: it starts `delay` samples before the
  // phrase's t = 0 (the same lead-in, D/fs ≈ 1–2 ms, for every wiring), so no attack is cut.
  return { spectra, length: strings.length + delay, delay, fftSize };
}

/** Samples of a coil signal worth keeping: the render (lead-in included) and the pickup response's reach after it. */
export function storedCoilSamples(length: number, delay: number, fftSize: number): number {
  return Math.min(fftSize, length + delay);
}

/** The coil signals of a performance (for the listening page): the inverse FFT of each E_i, rounded to float32. */
export function renderCoilSignals(guitar: Guitar, phrase: Phrase, options: Pick<SynthesisOptions, 'sampleRateHz' | 'seed' | 'strings'>): CoilSignals {
  const { spectra, length, delay, fftSize } = renderCoilSpectra(guitar, phrase, options);
  return coilSignalsOfSpectra(spectra, length, delay, fftSize, options.sampleRateHz);
}

/** The coil signals from the coils' EMF spectra (volts, `renderCoilSpectra`): the inverse FFT of each E_i, rounded to float32. */
export function coilSignalsOfSpectra(spectra: readonly Float64Array[], length: number, delay: number, fftSize: number, sampleRateHz: number): CoilSignals {
  const fft = realFft(fftSize);
  const time = new Float64Array(fftSize);
  const stored = storedCoilSamples(length, delay, fftSize);
  const signals = spectra.map((spectrum) => {
    fft.inverse(spectrum, time);
    return Float32Array.from(time.subarray(0, stored));
  });
  return { sampleRateHz, length, delay, fftSize, signals };
}

/** Each coil's spectrum E_i from its stored signal (zero-padded to the FFT frame): the page's way back to the synthesis. */
export function coilSpectraOfSignals(coils: CoilSignals): Float64Array[] {
  const fft = realFft(coils.fftSize);
  const time = new Float64Array(coils.fftSize);
  return coils.signals.map((signal) => {
    time.fill(0);
    for (let n = 0; n < signal.length && n < time.length; n += 1) time[n] = signal[n] as number;
    return Float64Array.from(fft.forward(time));
  });
}

/**
 * Render the strings and coil spectra once; return a function that renders
 * any wiring. The spectra are taken from the float32 coil signals the
 * listening page carries (`renderCoilSignals`), so the command line and the
 * page synthesise from the very same numbers: float32 rounding of a coil
 * signal is −144 dB of it, but a wiring whose coils cancel deeply (out of
 * phase) would expose it at about −76 dB of its own output, so both hosts
 * use the rounded signals.
 */
export function prepareWiringSynthesis(guitar: Guitar, phrase: Phrase, options: SynthesisOptions): WiringSynthesis {
  const coils = renderCoilSignals(guitar, phrase, options);
  return createWiringSynthesis(guitar, { ...coils, spectra: coilSpectraOfSignals(coils) }, options.overrides);
}

/** The coil spectra a synthesis sums, and where its output sits in the FFT frame. */
export interface CoilSpectra {
  readonly spectra: readonly Float64Array[];
  readonly length: number;
  readonly delay: number;
  readonly fftSize: number;
  readonly sampleRateHz: number;
}

/**
 * A synthesis from coil spectra already computed: the part the command line
 * and the listening page share (the page computes the spectra from the coil
 * signals it carries, `coilSpectraOfSignals`).
 */
export function createWiringSynthesis(guitar: Guitar, coils: CoilSpectra, overrides: CircuitOverrides): WiringSynthesis {
  const { spectra, length, delay, fftSize, sampleRateHz } = coils;
  const options = { sampleRateHz, overrides };
  const fft = realFft(fftSize);
  const binsHz = new Float64Array(fft.bins);
  for (let k = 0; k < fft.bins; k += 1) binsHz[k] = (k * options.sampleRateHz) / fftSize;
  const circuit = prepareCircuit(guitar, binsHz, options.overrides);
  const transfers = guitar.coils.map(() => new Float64Array(2 * fft.bins));
  const output = new Float64Array(2 * fft.bins);
  const time = new Float64Array(fftSize);

  // A wiring's phases only flip the signs of its coils' transfers (T_i carries p_i; coupled
  // coils keep their relative phase, circuit/phase-class.ts), so the products T_i·E_i of the
  // class representative are kept for the last class rendered, and each phase pattern of that
  // class costs a signed sum and one inverse FFT.
  const products = guitar.coils.map(() => new Float64Array(2 * fft.bins));
  const used = new Uint8Array(guitar.coils.length);
  let cachedShape = '';
  const solveShape = (network: Network): void => {
    const shape = phaseClassKey(guitar, network);
    if (shape === cachedShape) return;
    solveTransfers(circuit, phaseClassNetwork(guitar, network), transfers);
    transfers.forEach((transfer, coil) => {
      const emf = spectra[coil] as Float64Array;
      const product = products[coil] as Float64Array;
      let any = 0;
      // P_i(f) = T_i(f)·E_i(f), complex product per bin.
      for (let k = 0; k < product.length; k += 2) {
        const tr = transfer[k] as number;
        const ti = transfer[k + 1] as number;
        const er = emf[k] as number;
        const ei = emf[k + 1] as number;
        product[k] = tr * er - ti * ei;
        product[k + 1] = tr * ei + ti * er;
        if (tr !== 0 || ti !== 0) any = 1;
      }
      used[coil] = any;
    });
    cachedShape = shape;
  };
  const signs = new Float64Array(guitar.coils.length);

  const synthesize = (network: Network, out = new Float32Array(length)): Float32Array => {
    solveShape(network);
    phaseClassSigns(guitar, network, signs);
    // Y(f) = Σ_i p_i·T_i(f)·E_i(f) with T_i of the unsigned network.
    output.fill(0);
    products.forEach((product, coil) => {
      if (!used[coil]) return;
      const sign = signs[coil] as number;
      for (let k = 0; k < output.length; k += 1) output[k] = (output[k] as number) + sign * (product[k] as number);
    });
    fft.inverse(output, time);
    // The pickup spectra are delayed by `delay` samples so that every coil stays causal; sample n is time (n − delay)/fs of the phrase.
    for (let n = 0; n < length; n += 1) out[n] = time[n] as number;
    return out;
  };

  const humCircuit = new Map<number, { prepared: PreparedCircuit; transfers: Float64Array[] }>();
  const synthesizeHum = (network: Network, mainsHz: number, emfVolts: number, out = new Float32Array(length)): Float32Array => {
    let probe = humCircuit.get(mainsHz);
    if (!probe) {
      const frequencies = Float64Array.from(HUM_HARMONICS.map(([harmonic]) => harmonic * mainsHz));
      const prepared = prepareCircuit(guitar, frequencies, options.overrides);
      probe = { prepared, transfers: guitar.coils.map(() => new Float64Array(2 * frequencies.length)) };
      humCircuit.set(mainsHz, probe);
    }
    solveTransfers(probe.prepared, network, probe.transfers);
    out.fill(0);
    HUM_HARMONICS.forEach(([harmonic, amplitude], index) => {
      // H(f) = Σ_i m_i·h_i·B(x_i)·T_i(f): the hum sign of a coil is p_i·m_i and T_i carries p_i (src/circuit/measure-hum.ts).
      const weights = humFieldWeights(guitar, probe.prepared.load);
      let re = 0;
      let im = 0;
      guitar.coils.forEach((_coil, c) => {
        const weight = weights[c] as number;
        const transfer = probe.transfers[c] as Float64Array;
        re += weight * (transfer[2 * index] as number);
        im += weight * (transfer[2 * index + 1] as number);
      });
      const omega = (2 * Math.PI * harmonic * mainsHz) / options.sampleRateHz;
      const phase = Math.atan2(im, re);
      const peak = emfVolts * amplitude * Math.hypot(re, im);
      for (let n = 0; n < length; n += 1) out[n] = (out[n] as number) + peak * Math.sin(omega * n + phase);
    });
    return out;
  };

  return {
    guitar,
    sampleRateHz: options.sampleRateHz,
    length,
    fftSize,
    circuit,
    silent: circuit.load.silent,
    synthesize,
    synthesizeHum,
  };
}


/** Refuse to render a guitar whose output is shorted (volume at 0): every file would be silence. */
export function assertAudible(synthesis: { readonly silent: boolean }, volumePath: string): void {
  if (synthesis.silent) {
    throw InputError.at(volumePath, 'a volume setting above 0 (at 0 the wiper shorts the output and every wiring is silent)', 0);
  }
}
