/**
 * The audio metrics of docs/design.md, from each wiring's render of the reference
 * phrase through the direct chain: levelDb (energy relative to the mean of
 * the single-element wirings), loudnessLufs (ITU-R BS.1770 integrated) and
 * centroidHz (Σ f·|X| / Σ |X| over 20 Hz–20 kHz of one Hann-windowed FFT of
 * the whole render). They are fixed by the guitar and its settings alone: the
 * reference render always uses the `strum` phrase at 48 kHz with one seed,
 * whatever phrase, rate or chain the audio files use.
 */
import { type CircuitOverrides, phaseClassKey } from '../circuit/index.js';
import { measureCentroid, measureEnergy, measureLevelDb, measureLoudness } from '../analysis/index.js';
import type { Guitar } from '../guitar/index.js';
import { type Steps, runSteps } from '../math/index.js';
import { builtInPhrase } from '../string/index.js';
import type { Wiring } from '../wiring/index.js';
import { type WiringSynthesis, prepareWiringSynthesis } from './synthesize-wirings.js';

/** The reference performance for metrics (docs/design.md, phrases). */
export const REFERENCE_PHRASE = 'strum';
/** Sample rate of the reference render, Hz (the default rate of written files). */
export const REFERENCE_SAMPLE_RATE_HZ = 48_000;
/** Seed of the reference render's pluck noise. */
export const REFERENCE_SEED = 1;
/** Ring-out after the last note of a render, seconds (long enough to hear the decay; short enough that a strum fits a 2^17-point FFT at 48 kHz). */
export const RENDER_TAIL_S = 2.5;

/** What one wiring's reference render measures, before levels are referred to the single coils. */
export interface RawAudioMetrics {
  /** Σ x² of the render, V²·samples. */
  readonly energy: number;
  readonly loudnessLufs: number;
  readonly centroidHz: number;
}

export interface AudioMetrics {
  readonly levelDb: number;
  readonly loudnessLufs: number;
  readonly centroidHz: number;
}

/** Measure one rendered signal. */
export function measureRawAudio(samples: Float32Array, sampleRateHz: number): RawAudioMetrics {
  return {
    energy: measureEnergy(samples),
    loudnessLufs: measureLoudness([samples], sampleRateHz),
    centroidHz: measureCentroid(samples, sampleRateHz),
  };
}

/** The synthesis of the reference phrase for a guitar and its settings. */
export function prepareReferenceSynthesis(guitar: Guitar, overrides: CircuitOverrides): WiringSynthesis {
  return prepareWiringSynthesis(guitar, builtInPhrase(REFERENCE_PHRASE, guitar.strings.length), {
    sampleRateHz: REFERENCE_SAMPLE_RATE_HZ,
    seed: REFERENCE_SEED,
    overrides,
    strings: { tailS: RENDER_TAIL_S },
  });
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
 * refer to), computed in memory, nothing written. `onProgress` is told after
 * each wiring.
 */
export function measureWiringAudio(
  guitar: Guitar,
  all: readonly Wiring[],
  wanted: readonly Wiring[],
  overrides: CircuitOverrides,
  onProgress?: (done: number, total: number) => void,
): Map<string, AudioMetrics> {
  return runSteps(measureWiringAudioSteps(guitar, all, wanted, overrides, onProgress));
}

/** measureWiringAudio as steps (math/run-steps.ts): yields after each wiring's render. */
export function* measureWiringAudioSteps(
  guitar: Guitar,
  all: readonly Wiring[],
  wanted: readonly Wiring[],
  overrides: CircuitOverrides,
  onProgress?: (done: number, total: number) => void,
): Steps<Map<string, AudioMetrics>> {
  const synthesis = prepareReferenceSynthesis(guitar, overrides);
  yield;
  const todo = new Map<string, Wiring>();
  for (const wiring of all) if (wiring.elements.length === 1) todo.set(wiring.id, wiring);
  for (const wiring of wanted) todo.set(wiring.id, wiring);
  // Phase patterns of one shape share their transfers (see synthesize-wirings.ts; coupled coils: one phase class): take them together.
  const keyOf = (wiring: Wiring): string => phaseClassKey(guitar, wiring.network);
  const ordered = [...todo.values()].sort((a, b) => (keyOf(a) < keyOf(b) ? -1 : keyOf(a) > keyOf(b) ? 1 : 0));
  const raw = new Map<string, RawAudioMetrics>();
  const buffer = new Float32Array(synthesis.length);
  let done = 0;
  for (const wiring of ordered) {
    raw.set(wiring.id, measureRawAudio(synthesis.synthesize(wiring.network, buffer), synthesis.sampleRateHz));
    done += 1;
    onProgress?.(done, todo.size);
    yield;
  }
  return referLevels(all, raw);
}
