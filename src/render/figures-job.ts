/**
 * What the audio-figures thread (figures-worker.ts) is given and posts back:
 * kept apart from the worker's entry module, which starts working as soon as
 * it is imported in a thread.
 */
import type { SpectralBasis } from '../analysis/index.js';
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import type { WorkerFailure } from './worker-failure.js';

/** The thread's workerData: known before the strings are rendered, so the thread loads its code meanwhile. */
export interface FiguresJob {
  readonly guitar: Guitar;
  readonly overrides: CircuitOverrides;
  readonly networks: readonly Network[];
}

/**
 * The message that starts the work: the parent's spectral basis of the
 * reference performance (measureSpectralBasis with its defaults), whose coil
 * spectra give the coil signals the figures are measured from
 * (referenceCoilsOf), so the thread does not render the strings again.
 */
export interface FiguresStart {
  readonly basis: SpectralBasis;
}

/** Numbers per wiring in the result: energy, loudnessLufs, centroidHz. */
export const FIGURES_PER_WIRING = 3;

export type FiguresMessage =
  | { readonly kind: 'step'; readonly done: number; readonly total: number }
  | { readonly kind: 'done'; readonly figures: Float64Array }
  | WorkerFailure;
