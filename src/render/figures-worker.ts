/**
 * Worker-thread entry for the audio figures of many wirings
 * (measure-figures-on-thread.ts): takes the guitar, its settings and the
 * wirings' networks as workerData, waits for the parent's spectral basis
 * (FiguresStart), then measures phase class after phase class, each taken
 * from the counter it shares with the parent (FiguresJob.claims), posting a
 * message after each, and last the figures as one Float64Array (energy,
 * loudness, centroid per wiring, in the order given; zeros for the classes
 * the parent took). Errors are posted back as data so the parent can rethrow
 * them with their class. Load it only as a thread's entry: at import it
 * takes the thread's workerData as its job (its types live in figures-job.ts).
 */
import { parentPort, workerData } from 'node:worker_threads';
import { type RawAudioFigures, measureClassInto, phaseClassesOf } from '../analysis/index.js';
import { prepareReferenceFigures, referenceCoilsOf } from './measure-wiring-audio.js';
import { FIGURES_PER_WIRING, type FiguresJob, type FiguresMessage, type FiguresStart } from './figures-job.js';
import { failureOf } from './worker-failure.js';

const port = parentPort;
if (port) {
  const job = workerData as FiguresJob;
  port.once('message', ({ basis }: FiguresStart) => {
    try {
      const meter = prepareReferenceFigures(job.guitar, job.overrides, referenceCoilsOf(job.guitar, basis));
      const classes = phaseClassesOf(job.guitar, job.networks);
      const claims = new Int32Array(job.claims);
      const results = new Array<RawAudioFigures>(job.networks.length);
      let done = 0;
      for (let taken = Atomics.add(claims, 0, 1); taken < classes.length; taken = Atomics.add(claims, 0, 1)) {
        const members = classes[taken] as number[];
        measureClassInto(meter, job.networks, members, results);
        done += members.length;
        port.postMessage({ kind: 'step', done } satisfies FiguresMessage);
      }
      const figures = new Float64Array(FIGURES_PER_WIRING * results.length);
      results.forEach((result, index) => figures.set([result.energy, result.loudnessLufs, result.centroidHz], FIGURES_PER_WIRING * index));
      port.postMessage({ kind: 'done', figures } satisfies FiguresMessage, [figures.buffer]);
    } catch (error) {
      port.postMessage(failureOf(error) satisfies FiguresMessage);
    }
    port.close();
  });
}
