/**
 * The audio figures of many wirings on a worker thread, started before the
 * caller's own work (circuit figures, groups) so that both cores are busy:
 * the figures are a pure function of the guitar, its settings and each
 * wiring, so they are the same numbers on any thread.
 */
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Wiring } from '../wiring/index.js';
import { FIGURES_PER_WIRING, type FiguresJob, type FiguresMessage } from './figures-job.js';
import type { RawAudioMetrics } from './measure-wiring-audio.js';
import { MEASURING_THREAD_LIMITS, defaultThreadCount, jobResult, startRenderWorker } from './worker-threads.js';

/**
 * Fewest wirings worth a thread of their own: a worker starts cold (loading
 * the code and rendering the strings again, about 0.3–0.5 s), and a wiring's
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
 * Start measuring `wirings` on a worker thread; the promise gives their raw
 * figures by wiring id. `onStep` is told after each phase class (while the
 * caller waits for the promise).
 */
export function measureFiguresOnThread(
  guitar: Guitar,
  wirings: readonly Wiring[],
  overrides: CircuitOverrides,
  onStep?: (done: number, total: number) => void,
): Promise<Map<string, RawAudioMetrics>> {
  const job: FiguresJob = { guitar, overrides, networks: wirings.map((wiring) => wiring.network) };
  const worker = startRenderWorker('figures-worker', job, MEASURING_THREAD_LIMITS);
  return jobResult<FiguresMessage, Map<string, RawAudioMetrics>>(worker, 'figures worker', (message) => {
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
}
