/**
 * Long computations let Ctrl-C in. Node runs a signal handler only between
 * tasks of its event loop, so a loop that never returns to it would hold a
 * Ctrl-C or SIGTERM until the whole step ends (minutes for a big analyze).
 * Work that can take long calls `pause()` between small pieces: once
 * PAUSE_INTERVAL_MS has passed since the last pause it waits for the next
 * turn of the event loop (setImmediate runs after the poll phase, where the
 * signal is read), so src/cli/interrupt.ts's handler runs within about that
 * time. The same turn lets a worker's answer in during a render pass that
 * never waits on anything (run-render-pass.ts, the hand-off).
 */

import type { Steps } from '../math/index.js';

/** Most time between two turns of the event loop during long work, ms (judgement: an interrupt answered within a tenth of a second feels at once). */
export const PAUSE_INTERVAL_MS = 50;

export type Pause = () => Promise<void>;

/** A pause function: resolves at once until `intervalMs` has passed, then on the next turn of the event loop. */
export function createPause(intervalMs: number = PAUSE_INTERVAL_MS, now: () => number = () => performance.now()): Pause {
  let last = now();
  return async () => {
    if (now() - last < intervalMs) return;
    await new Promise<void>((resolve) => setImmediate(resolve));
    last = now();
  };
}

/** Run core work written as steps (src/math/run-steps.ts) to its end, pausing between steps. */
export async function runStepsPausing<T>(steps: Steps<T>, pause: Pause): Promise<T> {
  for (;;) {
    const next = steps.next();
    if (next.done === true) return next.value;
    await pause();
  }
}
