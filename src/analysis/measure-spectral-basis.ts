/**
 * The one-off part of comparing wirings: play the reference phrase on the
 * guitar's strings, turn it into each coil's EMF spectrum, and sum the
 * coils' cross-spectra into perceptual band segments. Every wiring of the
 * guitar is then a small quadratic form over these sums
 * (solve-wiring-spectra.ts), with no FFT per wiring.
 */
import type { Guitar } from '../guitar/index.js';
import { coilFrame, computeCoilSpectra } from '../pickup/index.js';
import { type Phrase, type StringOptions, builtInPhrase, planPhrase, renderPhrase } from '../string/index.js';
import { type BandLayout, type BandOptions, designBands } from './design-bands.js';
import { type CrossSpectra, measureCrossSpectra } from './measure-cross-spectra.js';

export interface SpectralBasisOptions {
  /** The phrase every wiring plays. Default: the built-in `strum`, the reference phrase for metrics (docs/design.md). */
  readonly phrase: Phrase | undefined;
  /** Name shown for the phrase. Default "strum". */
  readonly phraseName: string;
  /** String render options (sample rate, seed, …); default a REFERENCE_TAIL_S ring-out, the rest as `renderPhrase` (48 kHz, seed 1). */
  readonly strings: Partial<StringOptions>;
  /** Perceptual bands; defaults as `designBands` (one-ERB bands over 20 Hz–20 kHz, 4 segments each). */
  readonly bands: Partial<BandOptions>;
}

/**
 * Ring-out after the last note of the reference phrase, seconds: the render
 * pipeline's RENDER_TAIL_S (src/render/measure-wiring-audio.ts), so levels
 * and brightness here describe the same reference render as analyze's
 * levelDb and centroidHz (test/distinct-versus-render.test.ts checks both).
 */
export const REFERENCE_TAIL_S = 2.5;

export const DEFAULT_SPECTRAL_BASIS_OPTIONS: Readonly<SpectralBasisOptions> = Object.freeze({
  phrase: undefined,
  phraseName: 'strum',
  strings: Object.freeze({ tailS: REFERENCE_TAIL_S }),
  bands: Object.freeze({}),
});

export interface SpectralBasis {
  readonly phraseName: string;
  readonly sampleRateHz: number;
  /** Samples of the string render. */
  readonly phraseSamples: number;
  /** FFT size of the coil spectra: nextPowerOfTwo(phrase samples + pickup delay), so no render wraps around (coilFrame). */
  readonly fftSize: number;
  readonly layout: BandLayout;
  readonly cross: CrossSpectra;
  /** Each coil's spectrum (computeCoilSpectra: sensed string velocity, m/s, per bin of the fftSize transform), kept so other measures of the same performance need not render the strings again. */
  readonly coilSpectra: readonly Float64Array[];
  /** Samples by which the coil spectra are delayed to stay causal (pickupDelaySamples). */
  readonly pickupDelay: number;
  /** Made with every default (the `strum` reference phrase, its ring-out, 48 kHz, seed 1): the reference performance of docs/design.md's metrics. */
  readonly reference: boolean;
}

/**
 * The FFT size measureSpectralBasis will use, from the phrase's plan alone (planPhrase: no strings rendered), so a
 * thread can set up its transforms of that size before the basis arrives (render-analysis-worker.ts).
 */
export function spectralBasisFftSize(guitar: Guitar, options: Partial<Pick<SpectralBasisOptions, 'phrase' | 'strings'>> = {}): number {
  const phrase = options.phrase ?? builtInPhrase('strum', guitar.strings.length);
  const plan = planPhrase(guitar, phrase, { ...DEFAULT_SPECTRAL_BASIS_OPTIONS.strings, ...options.strings });
  return coilFrame(guitar, plan).fftSize;
}

/** Strings, coil spectra and band cross-spectra of `guitar` playing the phrase. Throws InputError for notes or options the guitar cannot take. */
export function measureSpectralBasis(guitar: Guitar, options: Partial<SpectralBasisOptions> = {}): SpectralBasis {
  const phrase = options.phrase ?? builtInPhrase('strum', guitar.strings.length);
  const phraseName = options.phraseName ?? DEFAULT_SPECTRAL_BASIS_OPTIONS.phraseName;
  const strings = renderPhrase(guitar, phrase, { ...DEFAULT_SPECTRAL_BASIS_OPTIONS.strings, ...options.strings });
  const { delay: pickupDelay, fftSize } = coilFrame(guitar, strings);
  const coilSpectra = computeCoilSpectra(guitar, strings, fftSize);
  const layout = designBands(strings.sampleRateHz, options.bands ?? {});
  const cross = measureCrossSpectra(coilSpectra, fftSize, layout);
  const reference = options.phrase === undefined && options.strings === undefined;
  return { phraseName, sampleRateHz: strings.sampleRateHz, phraseSamples: strings.length, fftSize, layout, cross, coilSpectra, pickupDelay, reference };
}
