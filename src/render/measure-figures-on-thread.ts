/**
 * The audio figures of many wirings on a worker thread, started before the
 * caller renders the strings (so the thread loads its code meanwhile) and
 * given the caller's spectral basis when it has one; it then measures while
 * the caller computes the circuit figures and groups, so both cores are
 * busy. The figures are a pure function of the guitar, its settings and
 * each wiring, so they are the same numbers on any thread.
 */
import type { SpectralBasis } from '../analysis/index.js';
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Wiring } from '../wiring/index.js';
import { FIGURES_PER_WIRING, type FiguresJob, type FiguresMessage, type FiguresStart } from './figures-job.js';
import type { RawAudioMetrics } from './measure-wiring-audio.js';
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

export interface PendingFigures {
  /** Hand over the reference performance's spectral basis (measureSpectralBasis with its defaults); the thread starts measuring. */
  start(basis: SpectralBasis): void;
  /** The raw figures by wiring id (after `start`). */
  result(): Promise<Map<string, RawAudioMetrics>>;
}

/**
 * Start a thread for the audio figures of `wirings`; it waits for `start`.
 * Until then it does not keep the process alive (a caller that fails before
 * handing over its basis still exits). `onStep` is told after each phase
 * class (while the caller waits for the result).
 */
export function measureFiguresOnThread(
  guitar: Guitar,
  wirings: readonly Wiring[],
  overrides: CircuitOverrides,
  onStep?: (done: number, total: number) => void,
): PendingFigures {
  const job: FiguresJob = { guitar, overrides, networks: wirings.map((wiring) => wiring.network) };
  const worker = startRenderWorker('figures-worker', job, MEASURING_THREAD_LIMITS);
  const answer = jobResult<FiguresMessage, Map<string, RawAudioMetrics>>(worker, 'figures worker', (message) => {
    if (message.kind === 'step') {
      onStep?.(message.done, message.total);
      return undefined;
    }
    const figures = message.figures;
    return new Map(
      wirings.map((wiring, index) => {
        const at = FIGURES_PER_WIRING * index;
        return [wiring.id, { energy: figures[at] as number, loudnessLufs: figures[at + 1] as number, centroidHz: figures[at + 2] as number }];
      }),
    );
  });
  // Not awaited until `result`: a failure meanwhile must not be an unhandled rejection.
  answer.catch(() => undefined);
  // After jobResult's listeners: adding a 'message' listener refs the worker again.
  worker.unref();
  return {
    start: (basis) => {
      worker.ref();
      worker.postMessage({ basis } satisfies FiguresStart);
    },
    result: () => answer,
  };
}
