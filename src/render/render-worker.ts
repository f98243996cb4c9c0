/**
 * Worker-thread entry for the first pass of a render (render-pass.ts): takes
 * one job from its parent, posts a message per finished wiring, then the
 * results. Errors are posted back as data so the parent can rethrow them with
 * their class (InputError, WorkError).
 */
import { parentPort, workerData } from 'node:worker_threads';
import { type WorkerFailure, failureOf } from './worker-failure.js';
import { transferablesOf } from './transferables.js';
import { type AudioSettings, type PassItem, runRenderPass } from './render-pass.js';

export interface WorkerJob {
  readonly settings: AudioSettings;
  readonly items: readonly PassItem[];
  readonly scratchFolder: string;
}

export type WorkerMessage =
  | { readonly kind: 'step' }
  | { readonly kind: 'done'; readonly results: Awaited<ReturnType<typeof runRenderPass>> }
  | WorkerFailure;

const port = parentPort;
if (port) {
  const job = workerData as WorkerJob;
  try {
    const results = await runRenderPass(job.settings, job.items, job.scratchFolder, () => port.postMessage({ kind: 'step' } satisfies WorkerMessage));
    // Audio held in memory moves to the parent without a copy.
    port.postMessage({ kind: 'done', results } satisfies WorkerMessage, transferablesOf(results));
  } catch (error) {
    port.postMessage(failureOf(error) satisfies WorkerMessage);
  }
}
