/**
 * Worker-thread entry for the audio figures of many wirings
 * (measure-figures-on-thread.ts): takes the guitar, its settings and the
 * wirings' networks, posts a message after each phase class, then the
 * figures as one Float64Array (energy, loudness, centroid per wiring, in the
 * order given). Errors are posted back as data so the parent can rethrow
 * them with their class.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { measureFiguresByClass } from '../analysis/index.js';
import type { CircuitOverrides } from '../circuit/index.js';
import { InputError } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { prepareReferenceFigures } from './measure-wiring-audio.js';

export interface FiguresJob {
  readonly guitar: Guitar;
  readonly overrides: CircuitOverrides;
  readonly networks: readonly Network[];
}

/** Numbers per wiring in the result: energy, loudnessLufs, centroidHz. */
export const FIGURES_PER_WIRING = 3;

export type FiguresMessage =
  | { readonly kind: 'step'; readonly done: number; readonly total: number }
  | { readonly kind: 'done'; readonly figures: Float64Array }
  | { readonly kind: 'failed'; readonly message: string; readonly problems?: InputError['problems'] };

const port = parentPort;
if (port) {
  const job = workerData as FiguresJob;
  try {
    const meter = prepareReferenceFigures(job.guitar, job.overrides);
    const results = measureFiguresByClass(job.guitar, meter, job.networks, (done, total) =>
      port.postMessage({ kind: 'step', done, total } satisfies FiguresMessage),
    );
    const figures = new Float64Array(FIGURES_PER_WIRING * results.length);
    results.forEach((result, index) => figures.set([result.energy, result.loudnessLufs, result.centroidHz], FIGURES_PER_WIRING * index));
    port.postMessage({ kind: 'done', figures } satisfies FiguresMessage, [figures.buffer]);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    port.postMessage({ kind: 'failed', message, ...(error instanceof InputError ? { problems: error.problems } : {}) } satisfies FiguresMessage);
  }
}
