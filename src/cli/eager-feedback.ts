/**
 * V8 setting for the command line: every function gets its type-feedback
 * store on its first call (`--no-lazy-feedback-allocation`), not once it
 * has run for a while.
 *
 * Why: a long loop is compiled while its first call runs (on-stack
 * replacement). With the store allocated lazily, that call's code before
 * the loop ran with no store to record into, so the compiled code had no
 * feedback for it; the next call bailed out there, and from then on every
 * call entered the loop's early compiled code and bailed out again where
 * the loop ended (node --trace-deopt: 273–329 bailouts of `renderBiquad` in
 * a render of 47 wirings through the clean chain, one per call, in two runs
 * of three; each such call ran its loop three to four times slower). With
 * the store allocated at the first call, there were 2–3 bailouts in each of
 * thirteen runs.
 *
 * Measured on the 2-core machine (the three-single-coil sample, the
 * executable against the build before, alternating runs, medians): clean
 * render 2.9 → 2.55 s and direct 2.30 → 2.19 s (eight runs each),
 * `analyze` 1.83 → 1.42 s (five); the drive chain and peak memory moved
 * within the noise (DEVELOPERS.md, bench section).
 *
 * The biquads now run as WebAssembly where the host compiles it
 * (src/render/linear-stages.ts); the flag still serves every JavaScript loop,
 * and the biquads of a host without WebAssembly (the test beside this file
 * renders so).
 *
 * The flag is V8's own, set before any work starts, and holds for every
 * thread the process starts later (V8's flags are per process). It changes
 * when V8 keeps its notes on the code, never what the code computes: the
 * output is the same bytes either way. Node 20's V8 (11.3) has it; a V8
 * without it would print "unrecognized flag" on stderr at every run (V8
 * prints that itself, setFlagsFromString does not throw), which the test
 * beside this file looks for.
 */
import { setFlagsFromString } from 'node:v8';

/** V8 flag: allocate each function's feedback vector on its first call. */
export const EAGER_FEEDBACK_FLAG = '--no-lazy-feedback-allocation';

/** Set EAGER_FEEDBACK_FLAG for this process (and the threads it starts from now on). */
export function allocateFeedbackEagerly(): void {
  setFlagsFromString(EAGER_FEEDBACK_FLAG);
}
