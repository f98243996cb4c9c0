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
  /**
   * One Int32 shared with the caller: the next phase class (phaseClassesOf order) not yet taken. The thread and,
   * once its own work is done, the caller each take the next class with Atomics.add, so neither waits idle while
   * classes are left.
   */
  readonly claims: SharedArrayBuffer;
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

/** Numbers per wiring in the result: energy, loudnessLufs, centroidHz (zeros for the wirings of classes the caller took). */
export const FIGURES_PER_WIRING = 3;

export type FiguresMessage =
  /** After each class: wirings this thread has measured so far. */
  | { readonly kind: 'step'; readonly done: number }
  | { readonly kind: 'done'; readonly figures: Float64Array }
  | WorkerFailure;
