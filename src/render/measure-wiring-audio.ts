/**
 * The audio metrics of docs/design.md, for each wiring's render of the
 * reference phrase through the direct chain: levelDb (energy relative to the
 * mean of the single-element wirings), loudnessLufs (ITU-R BS.1770 integrated)
 * and centroidHz (Σ f·|X| / Σ |X| over 20 Hz–20 kHz of the Hann-windowed
 * render). They are fixed by the guitar and its settings alone: the reference
 * render always uses the `strum` phrase at 48 kHz with one seed, whatever
 * phrase, rate or chain the audio files use.
 *
 * They come from the coils' signals and cross-spectra (src/analysis/
 * measure-audio-figures.ts), with no render per wiring; measureRawAudio
 * measures a render itself, the check those figures are held to.
 */
import type { CircuitGraph, CircuitOverrides } from '../circuit/index.js';
import { type AudioFigureMeter, type RawAudioFigures, type SpectralBasis, measureFiguresByClass, measureCentroid, measureEnergy, measureLevelDb, measureLoudness, prepareAudioFigures } from '../analysis/index.js';
import type { Guitar } from '../guitar/index.js';
import { builtInPhrase } from '../string/index.js';
import type { Wiring } from '../wiring/index.js';
import {
  type CoilSignals,
  type WiringSynthesis,
  COIL_VOLTS_PER_METRE_PER_SECOND,
  coilSpectraOfSignals,
  createWiringSynthesis,
  renderCoilSignals,
  storedCoilSamples,
} from './synthesize-wirings.js';
import { realFft } from '../math/index.js';

/** The reference performance for metrics (docs/design.md, phrases). */
export const REFERENCE_PHRASE = 'strum';
/** Sample rate of the reference render, Hz (the default rate of written files). */
export const REFERENCE_SAMPLE_RATE_HZ = 48_000;
/** Seed of the reference render's pluck noise. */
export const REFERENCE_SEED = 1;
/**
 * Version of the figures' method, recorded with each wiring's figures in a
 * render's manifest: figures kept from a run with another method are measured
 * again. 2: from the coils' cross-spectra (src/analysis/measure-audio-figures.ts).
 */
export const REFERENCE_FIGURES_VERSION = 2;
/** Ring-out after the last note of a render, seconds (long enough to hear the decay; short enough that a strum fits a 2^17-point FFT at 48 kHz). */
export const RENDER_TAIL_S = 2.5;

/** What one wiring's reference render measures, before levels are referred to the single coils. */
export type RawAudioMetrics = RawAudioFigures;

export interface AudioMetrics {
  readonly levelDb: number;
  readonly loudnessLufs: number;
  readonly centroidHz: number;
}

/** Measure one rendered signal (time samples: the figures' definition applied to a render, for checks). */
export function measureRawAudio(samples: Float32Array, sampleRateHz: number): RawAudioMetrics {
  return {
    energy: measureEnergy(samples),
    loudnessLufs: measureLoudness([samples], sampleRateHz),
    centroidHz: measureCentroid(samples, sampleRateHz),
  };
}

/** The coils' signals for the reference phrase (the strings rendered once; shared by the figures and the reference synthesis). */
export function renderReferenceCoils(guitar: Guitar): CoilSignals {
  return renderCoilSignals(guitar, builtInPhrase(REFERENCE_PHRASE, guitar.strings.length), {
    sampleRateHz: REFERENCE_SAMPLE_RATE_HZ,
    seed: REFERENCE_SEED,
    strings: { tailS: RENDER_TAIL_S },
  });
}

/**
 * The same coil signals from a spectral basis of the reference performance
 * (measureSpectralBasis with its defaults renders the very same strings and
 * coil spectra), so a command that needs both renders the strings once.
 * Another basis is not reused: the strings are rendered.
 */
export function referenceCoilsOf(guitar: Guitar, basis: SpectralBasis | undefined): CoilSignals {
  if (!basis?.reference || basis.sampleRateHz !== REFERENCE_SAMPLE_RATE_HZ || basis.phraseName !== REFERENCE_PHRASE) return renderReferenceCoils(guitar);
  // The inverse FFT of each E_i in volts (renderCoilSpectra's scaling, applied as the spectrum is read:
  // the same numbers as coilSignalsOfSpectra of scaled copies), rounded to float32.
  const { fftSize, pickupDelay: delay, sampleRateHz } = basis;
  const length = basis.phraseSamples + delay;
  const fft = realFft(fftSize);
  const time = new Float64Array(fftSize);
  const stored = storedCoilSamples(length, delay, fftSize);
  const signals = basis.coilSpectra.map((spectrum) => new Float32Array(fft.inverse(spectrum, time, COIL_VOLTS_PER_METRE_PER_SECOND).subarray(0, stored)));
  return { sampleRateHz, length, delay, fftSize, signals };
}

/** The synthesis of the reference phrase for a guitar and its settings (prepareWiringSynthesis of `strum`). */
export function prepareReferenceSynthesis(guitar: Guitar, overrides: CircuitOverrides, coils: CoilSignals = renderReferenceCoils(guitar)): WiringSynthesis {
  return createWiringSynthesis(guitar, { ...coils, spectra: coilSpectraOfSignals(coils) }, overrides);
}

/** The audio figures of the reference phrase for a guitar and its settings. */
export function prepareReferenceFigures(guitar: Guitar, overrides: CircuitOverrides, coils: CoilSignals = renderReferenceCoils(guitar)): AudioFigureMeter {
  return prepareAudioFigures(guitar, coils, overrides);
}

/**
 * levelDb for each wiring: 10·log10(E / mean of the single-element wirings'
 * energies). `raw` must hold every single-element wiring of `all`.
 */
export function referLevels(
  all: readonly Wiring[],
  raw: ReadonlyMap<string, RawAudioMetrics>,
): Map<string, AudioMetrics> {
  const singles = all.filter((wiring) => wiring.elements.length === 1);
  const energies = singles.map((wiring) => raw.get(wiring.id)?.energy);
  if (energies.some((energy) => energy === undefined)) throw new Error('referLevels: every single-element wiring must be measured');
  const reference = (energies as number[]).reduce((sum, energy) => sum + energy, 0) / singles.length;
  const result = new Map<string, AudioMetrics>();
  for (const [id, metrics] of raw) {
    result.set(id, { levelDb: measureLevelDb(metrics.energy, reference), loudnessLufs: metrics.loudnessLufs, centroidHz: metrics.centroidHz });
  }
  return result;
}

/**
 * Audio metrics for `wanted` (plus the single-element wirings, which levels
 * refer to), from the coils' cross-spectra, nothing rendered or written.
 * `onProgress` is told after each phase class; `basis`, a spectral basis of
 * the reference performance the caller already has, saves rendering the
 * strings again.
 */
export function measureWiringAudio(
  guitar: Guitar,
  all: readonly Wiring[],
  wanted: readonly Wiring[],
  overrides: CircuitOverrides,
  onProgress?: (done: number, total: number) => void,
  basis?: SpectralBasis,
): Map<string, AudioMetrics> {
  const todo = new Map<string, Wiring>();
  for (const wiring of all) if (wiring.elements.length === 1) todo.set(wiring.id, wiring);
  for (const wiring of wanted) todo.set(wiring.id, wiring);
  const meter = prepareReferenceFigures(guitar, overrides, referenceCoilsOf(guitar, basis));
  return referLevels(all, measureReferenceFigures(guitar, [...todo.values()], overrides, onProgress, meter));
}

/** Raw figures of `wirings` (taken phase class by phase class, which share their transfers), by wiring id. */
export function measureReferenceFigures(
  guitar: Guitar,
  wirings: readonly Wiring[],
  overrides: CircuitOverrides,
  onProgress?: (done: number, total: number) => void,
  meter: AudioFigureMeter = prepareReferenceFigures(guitar, overrides),
): Map<string, RawAudioMetrics> {
  const figures = measureFiguresByClass(
    guitar,
    meter,
    wirings.map((wiring) => wiring.network),
    onProgress,
  );
  return new Map(wirings.map((wiring, index) => [wiring.id, figures[index] as RawAudioMetrics]));
}

/**
 * Audio metrics of connections of coil leads (`graphs`, e.g. bridge networks
 * from `analyze --network`), their transfers from the nodal solver; levels
 * refer to the single-element wirings of `all` as every wiring's do.
 */
export function measureGraphAudio(
  guitar: Guitar,
  all: readonly Wiring[],
  graphs: readonly CircuitGraph[],
  overrides: CircuitOverrides,
  basis?: SpectralBasis,
): AudioMetrics[] {
  const meter = prepareReferenceFigures(guitar, overrides, referenceCoilsOf(guitar, basis));
  const singles = all.filter((wiring) => wiring.elements.length === 1);
  const raw = measureReferenceFigures(guitar, singles, overrides, undefined, meter);
  const keys = graphs.map((_, index) => `graph ${index}`);
  graphs.forEach((graph, index) => raw.set(keys[index] as string, meter.measureGraph(graph)));
  const referred = referLevels(singles, raw);
  return keys.map((key) => referred.get(key) as AudioMetrics);
}
