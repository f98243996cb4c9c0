/**
 * Worker-thread entry for a render's analysis (render-analysis.ts): takes
 * the job from its parent as workerData, waits for the spectral basis the
 * parent measures meanwhile, then posts the analysis. Errors are posted back
 * as data so the parent can rethrow them with their class. Load it only as a
 * thread's entry: at import it takes the thread's workerData as its job.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { SpectralBasis } from '../analysis/index.js';
import { InputError } from '../errors/index.js';
import { type RenderAnalysisJob, measureRenderAnalysis } from './render-analysis.js';
import type { RenderAnalysisMessage } from './render-analysis-thread.js';

const port = parentPort;
if (port) {
  const job = workerData as RenderAnalysisJob;
  port.once('message', (basis: SpectralBasis) => {
    try {
      const analysis = measureRenderAnalysis(job, basis);
      // The basis is the parent's own: it is not sent back.
      const distinct = { ...analysis.distinct, spectra: { ...analysis.distinct.spectra, basis: undefined } };
      port.postMessage({ kind: 'done', analysis: { ...analysis, distinct } } satisfies RenderAnalysisMessage);
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      port.postMessage({ kind: 'failed', message, ...(error instanceof InputError ? { problems: error.problems } : {}) } satisfies RenderAnalysisMessage);
    }
    port.close();
  });
}
