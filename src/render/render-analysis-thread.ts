/**
 * A render's analysis (render-analysis.ts) on a thread of its own, started
 * before the strings are rendered so that it loads its code while the render
 * measures the spectral basis, then runs beside the audio. On a machine of
 * one core it runs in this thread when asked for.
 *
 * Once its analysis is done the thread is idle, and the render still has its
 * WAV files to write: so it also makes the listening page's bytes from the
 * report the render builds out of that analysis (`renderPage`), beside the
 * WAV files instead of after them. Measured on the 2-core machine, three
 * coils, 47 wirings direct: the page took 55–70 ms of the render's own
 * thread, after the WAVs' 85–100 ms.
 */
import type { Worker } from 'node:worker_threads';
import type { SpectralBasis } from '../analysis/index.js';
import { type RenderAnalysis, type RenderAnalysisJob, measureRenderAnalysis } from './render-analysis.js';
import type { Network } from '../wiring/index.js';
import { MEASURING_THREAD_LIMITS, jobResult, startRenderWorker } from './worker-threads.js';
import { encodeThreadPays } from './encode-thread.js';
import type { WorkerFailure } from './worker-failure.js';
import type { CoilSignals } from './synthesize-wirings.js';
import type { ListeningReport } from '../report/index.js';
import { type PageSettings, renderPageBytes } from './write-listening-page.js';

/** The worker's answer: the analysis without its basis (the parent has it), or its failure as data. */
export type RenderAnalysisMessage =
  | {
      readonly kind: 'done';
      readonly analysis: Omit<RenderAnalysis, 'distinct'> & {
        readonly distinct: Omit<RenderAnalysis['distinct'], 'spectra'> & { readonly spectra: Omit<RenderAnalysis['distinct']['spectra'], 'basis'> & { readonly basis: undefined } };
      };
    }
  | { readonly kind: 'page'; readonly bytes: Uint8Array }
  | WorkerFailure;

/** The thread's second job: the listening page for this report. */
export interface PageJob {
  readonly report: ListeningReport;
  readonly settings: PageSettings;
}

/**
 * Renders whose page is made on the analysis thread: those whose files take no
 * encoding thread (encodeThreadPays, encode-thread.ts), so the second core is
 * otherwise idle while the files are written. With an encoding thread, it has
 * that core, and a kept analysis thread would only hold its memory beside the
 * render's worker (572 wirings: 232 → 283 MB peak when it was kept).
 */
export function pageOnThread(renderedWirings: number): boolean {
  return !encodeThreadPays(renderedWirings);
}

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
  /**
   * The listening page's bytes (write-listening-page.ts) for `report`, made on the analysis thread after its analysis
   * (once `result` is settled) when it has one and `pageOnThread` of the rendered wirings, else on this thread: the
   * same bytes either way.
   */
  renderPage(report: ListeningReport, settings: PageSettings): Promise<Uint8Array>;
  /** Stop the thread, if any (after a failure elsewhere, or when no page was asked for). */
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
      renderPage: async (report, settings) => renderPageBytes(report, settings),
      cancel: async () => undefined,
    };
  }
  const worker: Worker = startRenderWorker('render-analysis-worker', job, MEASURING_THREAD_LIMITS);
  let given: SpectralBasis | undefined;
  // The thread is kept after its analysis for the page (the caller stops it with cancel), unless the page will be made
  // here: then it stops with its answer, and its memory is free for the rest of the render.
  const pageThere = pageOnThread(job.selected.length);
  const answer = jobResult<RenderAnalysisMessage, RenderAnalysis>(
    worker,
    'analysis worker',
    (message) =>
      message.kind === 'done'
        ? { ...message.analysis, distinct: { ...message.analysis.distinct, spectra: { ...message.analysis.distinct.spectra, basis: given as SpectralBasis } } }
        : undefined,
    pageThere ? 'keep' : 'stop',
  );
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
    renderPage: async (report, settings) => {
      if (!pageThere) return renderPageBytes(report, settings);
      // Only after the analysis: the thread takes its second job once its first answer is out.
      await answer;
      const page = jobResult<RenderAnalysisMessage, Uint8Array>(worker, 'analysis worker (listening page)', (message) => (message.kind === 'page' ? message.bytes : undefined));
      worker.postMessage({ report, settings } satisfies PageJob);
      return page;
    },
    cancel: async () => {
      await worker.terminate();
    },
  };
}
