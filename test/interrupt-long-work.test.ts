/**
 * Ctrl-C and SIGTERM in the middle of a long computation (not only while
 * files are written): a six-element streamed `analyze --no-audio` (228,386
 * wirings, minutes of work), once printing JSON and once with its CSV
 * growing under a temporary name, each a real process stopped a moment
 * after its work began. (A five-coil analyze now takes seconds: its audio
 * figures come from cross-spectra.) Each must stop well before the
 * work could have finished, with status 130, the resume message and no
 * stack, and leave no CSV and no temporary file. Before the work paused for
 * signals, the handler ran only when the whole step ended (minutes later).
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { testFolder } from './support/temporary-folder.js';

const REPOSITORY = join(import.meta.dirname, '..');
const CLI = join(REPOSITORY, 'src', 'cli.ts');
const SAMPLES = join(REPOSITORY, 'samples');
/** After the work has begun (its estimate printed), wait this long before the signal, ms: deep inside the computation. */
const INTO_THE_WORK_MS = 1500;
/**
 * Most time from the signal to the exit, ms. Generous for a loaded machine
 * (a pause comes every 50 ms of work; one uninterruptible step, the
 * reference phrase's strings, takes a few seconds there); the work itself
 * takes minutes, so a handler that waited for it would miss this by far.
 */
const EXIT_WITHIN_MS = 20_000;

interface Stopped {
  readonly status: number | null;
  readonly stderr: string;
  readonly exitMs: number;
}

/** Start the CLI, wait for its estimate line (the work has begun), wait a little more, send `signal`, and time the exit. */
function stopDuringWork(argv: string[], signal: 'SIGINT' | 'SIGTERM'): Promise<Stopped> {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', CLI, ...argv], { cwd: REPOSITORY, stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  let signalledAt = 0;
  return new Promise((resolve) => {
    child.stderr?.on('data', (chunk: Buffer) => {
      stderr += chunk.toString('utf8');
      if (signalledAt === 0 && /wirings: about/u.test(stderr)) {
        signalledAt = -1;
        setTimeout(() => {
          signalledAt = performance.now();
          child.kill(signal);
        }, INTO_THE_WORK_MS);
      }
    });
    child.on('exit', (status) => resolve({ status, stderr, exitMs: signalledAt > 0 ? performance.now() - signalledAt : Number.NaN }));
  });
}

function expectStoppedCleanly(stopped: Stopped, folder: string): void {
  expect(stopped.exitMs, stopped.stderr).toBeLessThan(EXIT_WITHIN_MS);
  expect(stopped.status, stopped.stderr).toBe(130);
  expect(stopped.stderr).toMatch(/interrupted; no partial file is left\. Run the same command again to finish/u);
  expect(stopped.stderr).not.toMatch(/\n\s+at /u);
  expect(existsSync(join(folder, 'out.csv'))).toBe(false);
  expect(readdirSync(folder).filter((name) => name.endsWith('.tmp'))).toEqual([]);
}

describe('an interrupt during a long computation is answered promptly', () => {
  it('SIGINT during a six-element streamed analyze --no-audio --json and SIGTERM during one with --csv', async () => {
    const five = testFolder('interrupt-json');
    const six = testFolder('interrupt-six');
    const [fiveStopped, sixStopped] = await Promise.all([
      stopDuringWork(['analyze', join(SAMPLES, 'three-humbucker.json'), '--no-audio', '--json'], 'SIGINT'),
      stopDuringWork(['analyze', join(SAMPLES, 'three-humbucker.json'), '--no-audio', '--yes', '--csv', join(six, 'out.csv')], 'SIGTERM'),
    ]);
    expectStoppedCleanly(fiveStopped, five);
    expectStoppedCleanly(sixStopped, six);
  }, 120_000);
});
