/**
 * Long work in the core is written as a generator that yields between small
 * pieces (a shape, a wiring, a row of comparisons) and returns its result.
 * The core stays pure and synchronous: runSteps runs such work to its end at
 * once; the command line runs the same generator with pauses in between, so
 * a Ctrl-C is answered during the work (src/render/pause-for-signals.ts).
 */

/** Work that yields between pieces and returns a T. */
export type Steps<T> = Generator<unknown, T, undefined>;

/** Run `steps` to its end and return its result. */
export function runSteps<T>(steps: Steps<T>): T {
  for (;;) {
    const next = steps.next();
    if (next.done === true) return next.value;
  }
}
