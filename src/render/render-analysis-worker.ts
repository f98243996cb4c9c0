/**
 * Worker-thread entry for a render's analysis (render-analysis.ts): takes
 * the job from its parent as workerData, waits for the spectral basis the
 * parent measures meanwhile (and the wirings whose audio figures it wants),
 * then posts the analysis. It then waits for one more job, the listening
 * page's bytes for the report the parent builds from that analysis
 * (render-analysis-thread.ts, `renderPage`): it is idle by then, while the
 * parent writes the WAV files. Errors are posted back as data so the parent
 * can rethrow them with their class. Load it only as a thread's entry: at
 * import it takes the thread's workerData as its job.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { type SpectralBasis, spectralBasisFftSize } from '../analysis/index.js';
import { realFft } from '../math/index.js';
import type { Network } from '../wiring/index.js';
import type { CoilSignals } from './synthesize-wirings.js';
import { failureOf } from './worker-failure.js';
import { transferablesOf } from './transferables.js';
import { type RenderAnalysisJob, measureRenderAnalysis } from './render-analysis.js';
import type { PageJob, RenderAnalysisMessage } from './render-analysis-thread.js';
import { renderPageBytes } from './write-listening-page.js';

const port = parentPort;
if (port) {
  const job = workerData as RenderAnalysisJob;
  // While the parent renders the strings: this thread's transforms of the basis's size (twiddle tables, kernels), which
  // the audio figures take first. A guitar whose phrase cannot be planned fails later, where its error is reported.
  try {
    realFft(spectralBasisFftSize(job.guitar));
  } catch {
    // reported by the parent's own basis
  }
  port.once('message', ({ basis, figures, coils }: { basis: SpectralBasis; figures: readonly Network[]; coils?: CoilSignals }) => {
    try {
      const analysis = measureRenderAnalysis(job, basis, figures, coils);
      // The basis is the parent's own: it is not sent back; nor are the per-wiring spectra and profiles, which the
      // parent does not read (DistinctGroups).
      const { thresholds, groups, spectra } = analysis.distinct;
      const distinct = { thresholds, groups, spectra: { count: spectra.count, basis: undefined } };
      const answer = { kind: 'done', analysis: { ...analysis, distinct } } satisfies RenderAnalysisMessage;
      // Its typed arrays (the groups' band spectra and profiles, the response curves) move to the parent without a copy.
      port.postMessage(answer, transferablesOf(answer));
    } catch (error) {
      port.postMessage(failureOf(error) satisfies RenderAnalysisMessage);
      port.close();
      return;
    }
    // The parent stops this thread when it asks for no page.
    port.once('message', ({ report, settings }: PageJob) => {
      try {
        const answer = { kind: 'page', bytes: renderPageBytes(report, settings) } satisfies RenderAnalysisMessage;
        port.postMessage(answer, transferablesOf(answer));
      } catch (error) {
        port.postMessage(failureOf(error) satisfies RenderAnalysisMessage);
      }
      port.close();
    });
  });
}
