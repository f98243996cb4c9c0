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

export function createProgress(io: Io, now: () => number = () => performance.now()): Progress {
  if (!io.stderrIsTerminal) return { stage() {}, step() {}, finish() {} };
  let name = '';
  let last = Number.NEGATIVE_INFINITY;
  let drawn = false;
  const draw = (done: number, total: number): void => {
    const filled = total > 0 ? Math.round((done / total) * BAR_WIDTH) : BAR_WIDTH;
    io.stderr(`\r${name.padEnd(10)} [${'#'.repeat(filled)}${'.'.repeat(BAR_WIDTH - filled)}] ${done}/${total}`);
    drawn = true;
  };
  return {
    stage(stageName, total) {
      name = stageName;
      last = now();
      draw(0, total);
    },
    step(done, total) {
      const time = now();
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
