/**
 * Progress on standard error: a bar redrawn in place when standard error is a
 * terminal, nothing otherwise (a summary line follows the work either way).
 */
import type { Io } from './io.js';

/** Least time between redraws, milliseconds (smooth enough, cheap). */
const REDRAW_INTERVAL_MS = 100;
/** Width of the bar in characters. */
const BAR_WIDTH = 30;

export interface Progress {
  stage(name: string, total: number): void;
  step(done: number, total: number): void;
  finish(): void;
}

/** Fraction of the work between plain progress lines when standard error is not a terminal. */
const PLAIN_LINE_FRACTION = 0.1;
/** Least work done before time left is shown (earlier guesses swing too much). */
const MIN_FRACTION_FOR_TIME_LEFT = 0.02;

/**
 * Where a stage's rate is measured from: the first count reported in it and when. A stage may begin with work
 * already done (a thread that started measuring earlier), so the rate is the work done since then over the time
 * since then, not the whole count over the stage's time.
 */
interface RateBase {
  readonly ms: number;
  readonly done: number;
}

/** "3 min 20 s left", "12 s left": the rest of the work at the rate since `base`. */
function timeLeft(base: RateBase | undefined, nowMs: number, done: number, total: number): string {
  if (base === undefined || total <= 0) return '';
  const progressed = done - base.done;
  if (progressed / total < MIN_FRACTION_FOR_TIME_LEFT) return '';
  const seconds = ((nowMs - base.ms) / 1000) * ((total - done) / progressed);
  if (seconds >= 60) return ` ${Math.floor(seconds / 60)} min ${Math.round(seconds % 60)} s left`;
  return ` ${Math.round(seconds)} s left`;
}

/**
 * A bar with the time left on a terminal; with `plainLines` (big work), a
 * plain line every tenth of the work when standard error is not a terminal.
 */
export function createProgress(io: Io, now: () => number = () => performance.now(), options: { plainLines?: boolean } = {}): Progress {
  if (!io.stderrIsTerminal) {
    if (!options.plainLines) return { stage() {}, step() {}, finish() {} };
    let plainName = '';
    let plainBase: RateBase | undefined = { ms: now(), done: 0 };
    let nextLine = 0;
    return {
      stage(stageName, total) {
        plainName = stageName;
        plainBase = undefined;
        nextLine = Math.max(1, Math.ceil(total * PLAIN_LINE_FRACTION));
      },
      step(done, total) {
        plainBase ??= { ms: now(), done };
        if (done < nextLine) return;
        nextLine = done + Math.max(1, Math.ceil(total * PLAIN_LINE_FRACTION));
        io.stderr(`coilbench: ${plainName} ${done}/${total}${timeLeft(plainBase, now(), done, total)}\n`);
      },
      finish() {},
    };
  }
  let name = '';
  let last = Number.NEGATIVE_INFINITY;
  let base: RateBase | undefined = { ms: now(), done: 0 };
  let drawn = false;
  const draw = (done: number, total: number): void => {
    const filled = total > 0 ? Math.round((done / total) * BAR_WIDTH) : BAR_WIDTH;
    io.stderr(`\r\u001b[2K${name.padEnd(10)} [${'#'.repeat(filled)}${'.'.repeat(BAR_WIDTH - filled)}] ${done}/${total}${timeLeft(base, now(), done, total)}`);
    drawn = true;
  };
  return {
    stage(stageName, total) {
      name = stageName;
      last = now();
      base = undefined;
      draw(0, total);
    },
    step(done, total) {
      const time = now();
      base ??= { ms: time, done };
      if (done < total && time - last < REDRAW_INTERVAL_MS) return;
      last = time;
      draw(done, total);
    },
    finish() {
      if (drawn) io.stderr('\r\u001b[2K');
      drawn = false;
    },
  };
}
