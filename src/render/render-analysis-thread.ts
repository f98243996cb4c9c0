/**
 * A render's analysis (render-analysis.ts) on a thread of its own, started
 * before the strings are rendered so that it loads its code while the render
 * measures the spectral basis, then runs beside the audio. On a machine of
 * one core it runs in this thread when asked for.
 */
import type { Worker } from 'node:worker_threads';
import type { SpectralBasis } from '../analysis/index.js';
import { type RenderAnalysis, type RenderAnalysisJob, measureRenderAnalysis } from './render-analysis.js';
import type { Network } from '../wiring/index.js';
import { MEASURING_THREAD_LIMITS, jobResult, startRenderWorker } from './worker-threads.js';
import type { WorkerFailure } from './worker-failure.js';
import type { CoilSignals } from './synthesize-wirings.js';

/** The worker's answer: the analysis without its basis (the parent has it), or its failure as data. */
export type RenderAnalysisMessage =
  | {
      readonly kind: 'done';
      readonly analysis: Omit<RenderAnalysis, 'distinct'> & {
        readonly distinct: Omit<RenderAnalysis['distinct'], 'spectra'> & { readonly spectra: Omit<RenderAnalysis['distinct']['spectra'], 'basis'> & { readonly basis: undefined } };
      };
    }
  | WorkerFailure;

export interface PendingAnalysis {
  /** Does the analysis run on a thread of its own (beside the caller's work)? */
  readonly onThread: boolean;
  /**
   * Hand over the reference performance's spectral basis (and the wirings whose audio figures are wanted, with the
   * coil signals they are measured from when the caller has them); the analysis starts.
   */
  start(basis: SpectralBasis, figures?: readonly Network[], coils?: CoilSignals): void;
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
    let signals: CoilSignals | undefined;
    return {
      onThread: false,
      start: (given, figures = [], coils) => {
        basis = given;
        wanted = figures;
        signals = coils;
      },
      result: async () => {
        if (!basis) throw new Error('prepareRenderAnalysis: result() before start()');
        return measureRenderAnalysis(job, basis, wanted, signals);
      },
      cancel: async () => undefined,
    };
  }
  const worker: Worker = startRenderWorker('render-analysis-worker', job, MEASURING_THREAD_LIMITS);
  let given: SpectralBasis | undefined;
  const answer = jobResult<RenderAnalysisMessage, RenderAnalysis>(worker, 'analysis worker', ({ analysis }) => ({
    ...analysis,
    distinct: { ...analysis.distinct, spectra: { ...analysis.distinct.spectra, basis: given as SpectralBasis } },
  }));
  // Not awaited until `result`: a failure meanwhile must not be an unhandled rejection.
  answer.catch(() => undefined);
  return {
    onThread: true,
    start: (basis, figures = [], coils) => {
      given = basis;
      // The coils' spectra serve only the audio figures (the groups and the coil drive read the band cross-spectra):
      // they stay here when there are no figures to measure, or when the caller gave the coil signals the figures
      // are measured from (float32 samples, a quarter of the spectra's bytes), megabytes the thread need not hold.
      // The coil signals go only with figures to measure.
      const spectraNeeded = figures.length > 0 && coils === undefined;
      worker.postMessage({ basis: spectraNeeded ? basis : { ...basis, coilSpectra: [] }, figures, coils: figures.length > 0 ? coils : undefined });
    },
    result: () => answer,
    cancel: async () => {
      await worker.terminate();
    },
  };
}
