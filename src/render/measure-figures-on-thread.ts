/**
 * The audio figures of many wirings on a worker thread, started before the
 * caller renders the strings (so the thread loads its code meanwhile) and
 * given the caller's spectral basis when it has one; it then measures while
 * the caller computes the circuit figures and groups, so both cores are
 * busy. The figures are a pure function of the guitar, its settings and
 * each wiring, so they are the same numbers on any thread.
 */
import { type RawAudioFigures, type SpectralBasis, measureClassInto, phaseClassesOf } from '../analysis/index.js';
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Wiring } from '../wiring/index.js';
import { FIGURES_PER_WIRING, type FiguresJob, type FiguresMessage, type FiguresStart } from './figures-job.js';
import { type RawAudioMetrics, prepareReferenceFigures, referenceCoilsOf } from './measure-wiring-audio.js';
import { MEASURING_THREAD_LIMITS, defaultThreadCount, jobResult, startRenderWorker } from './worker-threads.js';

/**
 * Fewest wirings worth a thread of their own: a worker starts cold (its
 * code loaded and compiled afresh, its transforms run cold), and a wiring's
 * figures cost about 0.3–1 ms, while the circuit figures the caller computes
 * meanwhile cost about as much again (measured with `npm run bench --
 * commands`: four coils, 572 wirings, gain a little; three coils lose).
 */
export const FIGURES_THREAD_MIN_WIRINGS = 500;

/** Is a thread of its own worth it for `count` wirings on this machine? */
export function figuresThreadPays(count: number): boolean {
  return count >= FIGURES_THREAD_MIN_WIRINGS && defaultThreadCount() > 1;
}

/**
 * Fewest wirings still untaken for the caller to help (`help`): helping costs it the figures' preparation (the coil
 * signals' gating blocks and tables: 0.4–0.6 s, about as long as 500 wirings' figures) and some 20 MB, so it pays
 * only with well over that much work left. Our choice, from runs of `analyze` on the 2-core machine: four coils
 * (572 wirings) gained nothing and used 25 MB more; five coils (9,997 wirings) left about 4,000 wirings untaken when
 * the caller's own work was done, where it had waited 7 s.
 */
export const HELP_MIN_UNTAKEN_WIRINGS = 1000;

export interface PendingFigures {
  /** Hand over the reference performance's spectral basis (measureSpectralBasis with its defaults); the thread starts measuring. */
  start(basis: SpectralBasis): void;
  /**
   * Measure here, after `start`, the phase classes the thread has not taken yet, one after another until none is
   * left, awaiting `pause` after each; only when at least `minUntaken` wirings are untaken (HELP_MIN_UNTAKEN_WIRINGS
   * by default), else it returns at once. The figures are the same numbers on either thread.
   */
  help(basis: SpectralBasis, pause: () => Promise<void>, minUntaken?: number): Promise<void>;
  /** The raw figures by wiring id (after `start`, and after `help` when it was called). */
  result(): Promise<Map<string, RawAudioMetrics>>;
}

/**
 * Start a thread for the audio figures of `wirings`; it waits for `start`.
 * Until then it does not keep the process alive (a caller that fails before
 * handing over its basis still exits). `onStep` is told after each phase
 * class, measured by either thread (while the caller waits or helps).
 */
export function measureFiguresOnThread(
  guitar: Guitar,
  wirings: readonly Wiring[],
  overrides: CircuitOverrides,
  onStep?: (done: number, total: number) => void,
): PendingFigures {
  const networks = wirings.map((wiring) => wiring.network);
  const claims = new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT);
  const job: FiguresJob = { guitar, overrides, networks, claims };
  const worker = startRenderWorker('figures-worker', job, MEASURING_THREAD_LIMITS);
  let doneThere = 0;
  let doneHere = 0;
  const answer = jobResult<FiguresMessage, Float64Array>(worker, 'figures worker', (message) => {
    if (message.kind === 'step') {
      doneThere = message.done;
      onStep?.(doneThere + doneHere, wirings.length);
      return undefined;
    }
    return message.figures;
  });
  // Not awaited until `result`: a failure meanwhile must not be an unhandled rejection.
  answer.catch(() => undefined);
  // After jobResult's listeners: adding a 'message' listener refs the worker again.
  worker.unref();
  // The figures of the classes this thread measured (`help`), at their wirings' indices.
  const here: RawAudioFigures[] = [];
  let helping: Promise<void> = Promise.resolve();
  const helpWith = async (basis: SpectralBasis, pause: () => Promise<void>, minUntaken: number): Promise<void> => {
    const classes = phaseClassesOf(guitar, networks);
    const counter = new Int32Array(claims);
    const untaken = classes.slice(Atomics.load(counter, 0)).reduce((sum, members) => sum + members.length, 0);
    if (untaken < minUntaken) return;
    const meter = prepareReferenceFigures(guitar, overrides, referenceCoilsOf(guitar, basis));
    for (let next = Atomics.add(counter, 0, 1); next < classes.length; next = Atomics.add(counter, 0, 1)) {
      const members = classes[next] as number[];
      measureClassInto(meter, networks, members, here);
      doneHere += members.length;
      onStep?.(doneThere + doneHere, wirings.length);
      await pause();
    }
  };
  return {
    start: (basis) => {
      worker.ref();
      worker.postMessage({ basis } satisfies FiguresStart);
    },
    help: (basis, pause, minUntaken = HELP_MIN_UNTAKEN_WIRINGS) => {
      helping = helpWith(basis, pause, minUntaken);
      return helping;
    },
    result: async () => {
      const figures = await answer;
      await helping;
      const byIndex = (index: number): RawAudioMetrics => {
        const own = here[index];
        if (own) return own;
        const at = FIGURES_PER_WIRING * index;
        return { energy: figures[at] as number, loudnessLufs: figures[at + 1] as number, centroidHz: figures[at + 2] as number };
      };
      return new Map(wirings.map((wiring, index) => [wiring.id, byIndex(index)]));
    },
  };
}
