/**
 * A render's analysis (render-analysis.ts) on a thread of its own, started
 * before the strings are rendered so that it loads its code while the render
 * measures the spectral basis, then runs beside the audio. On a machine of
 * one core it runs in this thread when asked for.
 */
import { fileURLToPath } from 'node:url';
import type { Worker } from 'node:worker_threads';
import type { SpectralBasis } from '../analysis/index.js';
import { InputError, WorkError } from '../errors/index.js';
import { type RenderAnalysis, type RenderAnalysisJob, measureRenderAnalysis } from './render-analysis.js';
import type { Network } from '../wiring/index.js';
import { startWorkerModule } from './worker-threads.js';

/** The worker's answer: the analysis without its basis (the parent has it), or its failure as data. */
export type RenderAnalysisMessage =
  | { readonly kind: 'done'; readonly analysis: Omit<RenderAnalysis, 'distinct'> & { readonly distinct: Omit<RenderAnalysis['distinct'], 'spectra'> & { readonly spectra: Omit<RenderAnalysis['distinct']['spectra'], 'basis'> & { readonly basis: undefined } } } }
  | { readonly kind: 'failed'; readonly message: string; readonly problems?: InputError['problems'] };

export interface PendingAnalysis {
  /** Does the analysis run on a thread of its own (beside the caller's work)? */
  readonly onThread: boolean;
  /** Hand over the reference performance's spectral basis (and the wirings whose audio figures are wanted); the analysis starts. */
  start(basis: SpectralBasis, figures?: readonly Network[]): void;
  /** The analysis (after `start`). */
  result(): Promise<RenderAnalysis>;
  /** Stop the thread, if any (after a failure elsewhere). */
  cancel(): Promise<void>;
}

/** The analysis of `job`, on a worker thread when `thread` is true, else in this thread when its result is asked for. */
export function prepareRenderAnalysis(job: RenderAnalysisJob, thread: boolean): PendingAnalysis {
  if (!thread) {
    let basis: SpectralBasis | undefined;
    let wanted: readonly Network[] = [];
    return {
      onThread: false,
      start: (given, figures = []) => {
        basis = given;
        wanted = figures;
      },
      result: async () => {
        if (!basis) throw new Error('prepareRenderAnalysis: result() before start()');
        return measureRenderAnalysis(job, basis, wanted);
      },
      cancel: async () => undefined,
    };
  }
  const extension = fileURLToPath(import.meta.url).endsWith('.ts') ? 'ts' : 'js';
  const worker: Worker = startWorkerModule(new URL(`./render-analysis-worker.${extension}`, import.meta.url), job);
  let given: SpectralBasis | undefined;
  const answer = new Promise<RenderAnalysis>((resolve, reject) => {
    let settled = false;
    const settle = (action: () => void): void => {
      settled = true;
      action();
      void worker.terminate();
    };
    worker.on('message', (message: RenderAnalysisMessage) => {
      if (message.kind === 'done') {
        const { analysis } = message;
        settle(() => resolve({ ...analysis, distinct: { ...analysis.distinct, spectra: { ...analysis.distinct.spectra, basis: given as SpectralBasis } } }));
      } else settle(() => reject(message.problems ? new InputError(message.problems) : new WorkError(`analysis worker failed: ${message.message}`)));
    });
    worker.on('error', (error) => settle(() => reject(new WorkError(`analysis worker failed: ${error.message}`, { cause: error }))));
    worker.on('exit', (code) => {
      if (!settled) reject(new WorkError(`analysis worker stopped (exit code ${code})`));
    });
  });
  // Not awaited until `result`: a failure meanwhile must not be an unhandled rejection.
  answer.catch(() => undefined);
  return {
    onThread: true,
    start: (basis, figures = []) => {
      given = basis;
      // The coils' spectra serve only the audio figures (the groups and the coil drive read the band cross-spectra):
      // without figures to measure they stay here, megabytes the thread need not copy.
      worker.postMessage({ basis: figures.length > 0 ? basis : { ...basis, coilSpectra: [] }, figures });
    },
    result: () => answer,
    cancel: async () => {
      await worker.terminate();
    },
  };
}
