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
  retuneCircuit,
  solveTransfers,
} from '../circuit/index.js';
import { InputError } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import { type KernelHost, type RealFft, kernelHost, realFft } from '../math/index.js';
import { coilFrame, computeCoilSpectra } from '../pickup/index.js';
import { type Phrase, type StringOptions, renderPhrase } from '../string/index.js';
import type { Network } from '../wiring/index.js';
import { SPECTRUM_KERNEL_MAX_BYTES, createSpectrumKernel, spectrumKernelBytes } from './synthesis-kernel.js';
import { type WiringSpectrum, javascriptSpectrum } from './wiring-spectrum.js';

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
  /**
   * The same performance with other knobs, cable or tone capacitor: `guitar`
   * shares this guitar's coils array (only its controls differ), `overrides`
   * are the new what-ifs. Shares the coil spectra, the FFT and the coils'
   * Thevenin pairs (circuit/prepare-circuit.ts, retuneCircuit), so a knob
   * move costs the load alone. The two syntheses share buffers: use one at a time.
   */
  retune(guitar: Guitar, overrides: CircuitOverrides): WiringSynthesis;
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
  const { delay, fftSize } = coilFrame(guitar, strings);
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
 * signals it carries, `coilSpectraOfSignals`). `host` picks the form of the
 * per-bin passes (wiring-spectrum.ts; tests): WebAssembly where the host
 * compiles it, the same bits either way.
 */
export function createWiringSynthesis(guitar: Guitar, coils: CoilSpectra, overrides: CircuitOverrides, host: KernelHost = kernelHost()): WiringSynthesis {
  const fft = realFft(coils.fftSize);
  const binsHz = new Float64Array(fft.bins);
  for (let k = 0; k < fft.bins; k += 1) binsHz[k] = (k * coils.sampleRateHz) / coils.fftSize;
  const parts = createSharedParts(guitar, coils, fft, host);
  return synthesisOn(parts, guitar, prepareCircuit(guitar, binsHz, overrides), overrides);
}

/**
 * What every knob setting of one guitar's synthesis shares: the coil spectra,
 * the FFT and its buffers, and the wirings' output spectra with the
 * open-circuit products of the last wiring shape (wiring-spectrum.ts), so a
 * knob move costs the load's gain G, the signed sum and one inverse FFT.
 */
interface SharedParts {
  readonly coils: CoilSpectra;
  readonly fft: RealFft;
  readonly time: Float64Array;
  readonly signs: Float64Array;
  readonly spectrum: WiringSpectrum;
}

function createSharedParts(guitar: Guitar, coils: CoilSpectra, fft: RealFft, host: KernelHost): SharedParts {
  return {
    coils,
    fft,
    time: new Float64Array(coils.fftSize),
    signs: new Float64Array(guitar.coils.length),
    spectrum: createWiringSpectrum(guitar, coils, fft.bins, host),
  };
}

/**
 * The output spectra of `guitar`'s wirings, in the form `host` runs; in JavaScript, the same bits, when a render so
 * long would need more kernel memory than SPECTRUM_KERNEL_MAX_BYTES (a phrase of minutes at a high rate).
 */
function createWiringSpectrum(guitar: Guitar, coils: CoilSpectra, bins: number, host: KernelHost): WiringSpectrum {
  if (host === 'javascript' || spectrumKernelBytes(guitar.coils.length, bins) > SPECTRUM_KERNEL_MAX_BYTES) return javascriptSpectrum(guitar, coils.spectra, bins);
  const kernel = createSpectrumKernel(guitar, coils.spectra, bins);
  if (kernel === null) throw new Error('this host cannot compile WebAssembly');
  return kernel;
}

/** The synthesis of `guitar` on `circuit` (prepared for `overrides`), sharing `parts` with the guitar's other knob settings. */
function synthesisOn(parts: SharedParts, guitar: Guitar, circuit: PreparedCircuit, overrides: CircuitOverrides): WiringSynthesis {
  const { coils, fft, time, signs, spectrum } = parts;
  const { length, fftSize, sampleRateHz } = coils;

  const synthesize = (network: Network, out = new Float32Array(length)): Float32Array => {
    // A wiring's phases only flip the signs of its coils' transfers (T_i carries p_i; coupled coils keep their
    // relative phase, circuit/phase-class.ts): each phase pattern of a class costs a signed sum and one inverse FFT.
    const shape = phaseClassKey(guitar, network);
    phaseClassSigns(guitar, network, signs);
    spectrum.prepare(circuit, phaseClassNetwork(guitar, network), shape);
    // Y(f) = G(f)·Σ_i p_i·S_i(f)·E_i(f): the sources summed, then the load (T_i = S_i·G).
    fft.inverse(spectrum.sum(signs), time);
    // The pickup spectra are delayed by `delay` samples so that every coil stays causal; sample n is time (n − delay)/fs of the phrase.
    // Rounded to float32 by the copy (TypedArray set converts each element as an assignment would).
    out.set(time.subarray(0, length));
    return out;
  };

  const humCircuit = new Map<number, { prepared: PreparedCircuit; transfers: Float64Array[] }>();
  const synthesizeHum = (network: Network, mainsHz: number, emfVolts: number, out = new Float32Array(length)): Float32Array => {
    let probe = humCircuit.get(mainsHz);
    if (!probe) {
      const frequencies = Float64Array.from(HUM_HARMONICS.map(([harmonic]) => harmonic * mainsHz));
      const prepared = prepareCircuit(guitar, frequencies, overrides);
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
      const omega = (2 * Math.PI * harmonic * mainsHz) / sampleRateHz;
      const phase = Math.atan2(im, re);
      const peak = emfVolts * amplitude * Math.hypot(re, im);
      for (let n = 0; n < length; n += 1) out[n] = (out[n] as number) + peak * Math.sin(omega * n + phase);
    });
    return out;
  };

  return {
    guitar,
    sampleRateHz,
    length,
    fftSize,
    circuit,
    silent: circuit.load.silent,
    synthesize,
    synthesizeHum,
    retune: (retunedGuitar, retunedOverrides) => synthesisOn(parts, retunedGuitar, retuneCircuit(circuit, retunedGuitar, retunedOverrides), retunedOverrides),
  };
}

/** Refuse to render a guitar whose output is shorted (volume at 0): every file would be silence. */
export function assertAudible(synthesis: { readonly silent: boolean }, volumePath: string): void {
  if (synthesis.silent) {
    throw InputError.at(volumePath, 'a volume setting above 0 (at 0 the wiper shorts the output and every wiring is silent)', 0);
  }
}
