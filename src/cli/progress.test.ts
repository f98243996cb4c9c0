import { describe, expect, it } from 'vitest';
import type { Io } from './io.js';
import { createProgress } from './progress.js';

/** An Io whose standard error is kept, as a terminal or not. */
function keptIo(terminal: boolean): { io: Io; lines: string[] } {
  const lines: string[] = [];
  return { io: { stdout: () => undefined, stderr: (text) => lines.push(text), stderrIsTerminal: terminal, cwd: '.' }, lines };
}

describe('createProgress', () => {
  it('reckons the time left from the work done since the stage began, when the stage begins with work already done', () => {
    // A thread that had measured 5,000 of 9,997 wirings when the stage was named, then 1,000 more in one second:
    // 3,997 left at 1,000 a second is 4 s, not the 1 s that 6,000 done in the stage's one second would give.
    const { io, lines } = keptIo(false);
    let clock = 0;
    const progress = createProgress(io, () => clock, { plainLines: true });
    progress.stage('measuring', 9997);
    progress.step(5000, 9997);
    clock = 1000;
    progress.step(6000, 9997);
    clock = 2000;
    progress.step(7000, 9997);
    expect(lines).toEqual(['coilbench: measuring 5000/9997\n', 'coilbench: measuring 6000/9997 4 s left\n', 'coilbench: measuring 7000/9997 3 s left\n']);
  });

  it('draws a bar on a terminal with the same reckoning', () => {
    const { io, lines } = keptIo(true);
    let clock = 0;
    const progress = createProgress(io, () => clock);
    progress.stage('rendering', 100);
    progress.step(10, 100);
    clock = 2000;
    progress.step(30, 100);
    // 20 in 2 s, 70 left: 7 s.
    expect(lines.at(-1)).toBe(`\r\u001b[2K${'rendering'.padEnd(10)} [#########.....................] 30/100 7 s left`);
    progress.finish();
    expect(lines.at(-1)).toBe('\r\u001b[2K');
  });
});
