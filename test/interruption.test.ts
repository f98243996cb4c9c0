/**
 * Kill tests: a 47-wiring render and `analyze --csv`, each run as a real
 * process and stopped by SIGINT or SIGKILL at random moments (seeded). After
 * every stop: no truncated or corrupt file (every WAV read back by the npm
 * package wavefile, every JSON parsed, the CSV whole or absent); after SIGINT
 * also no scratch folder and no temporary file, and the resume message.
 * Then the same command finishes the work, and its files are byte-identical
 * to an uninterrupted run's.
 *
 * Default (to keep `npm test` short): one moment per signal for the render;
 * the analyze runs only when COILBENCH_KILL_MOMENTS is set.
 * COILBENCH_KILL_MOMENTS=10 runs ten moments of each signal for both commands
 * (several minutes); COILBENCH_KILL_SEED changes the moments.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { WaveFile } from 'wavefile';
import { beforeAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { countFromEnvironment, seededRandom } from './support/seeded-random.js';
import { temporaryFolder } from './support/temporary-folder.js';

const MOMENTS = countFromEnvironment('COILBENCH_KILL_MOMENTS', 1);
const SEED = countFromEnvironment('COILBENCH_KILL_SEED', 7);
const GUITAR = join(import.meta.dirname, '..', 'samples', 'three-single-coil.json');
const REPOSITORY = join(import.meta.dirname, '..');
const CLI = join(REPOSITORY, 'src', 'cli.ts');
/** The render under test: all 47 wirings, through the fastest chain. */
const RENDER_OPTIONS = ['--chain', 'direct'];
const TIMEOUT_MS = 600_000;

const work = temporaryFolder('kill');

/** Every file under a folder, relative path → bytes. */
function filesOf(folder: string): Map<string, Buffer> {
  const out = new Map<string, Buffer>();
  const walk = (dir: string): void => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else out.set(relative(folder, path), readFileSync(path));
    }
  };
  if (existsSync(folder)) walk(folder);
  return out;
}

/** Faults of a folder a stopped run left: truncated WAVs, unreadable JSON. */
function corruptFiles(folder: string): string[] {
  const faults: string[] = [];
  for (const [name, bytes] of filesOf(folder)) {
    if (name.endsWith('.wav')) {
      try {
        const wav = new WaveFile(bytes);
        const data = (wav as unknown as { data: { chunkSize: number } }).data;
        if (data.chunkSize <= 0 || data.chunkSize + 44 > bytes.length) faults.push(`${name}: data chunk of ${data.chunkSize} bytes in a file of ${bytes.length}`);
      } catch (error) {
        faults.push(`${name}: ${String(error)}`);
      }
    }
    if (name.endsWith('.json')) {
      try {
        JSON.parse(bytes.toString('utf8'));
      } catch {
        faults.push(`${name}: not JSON`);
      }
    }
  }
  return faults;
}

function leftovers(folder: string): string[] {
  return [...filesOf(folder).keys()].filter((name) => name.startsWith('.scratch') || /\.coilbench-\d+-[0-9a-f]+\.tmp$/u.test(name));
}

function start(argv: string[]): { child: ChildProcess; stderr: () => string; exited: Promise<number | null> } {
  const child = spawn(process.execPath, ['--import', 'tsx', CLI, ...argv], { cwd: REPOSITORY, stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => {
    stderr += chunk.toString('utf8');
  });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  return { child, stderr: () => stderr, exited };
}

describe('interruption at random moments', () => {
  // Same folder name everywhere: the report records it (its slug).
  const reference = join(work, 'reference', 'out');
  let referenceCsv: Buffer;
  /** How long an uninterrupted child run takes, ms (the range the moments are drawn from). */
  let renderMs = 0;
  let analyzeMs = 0;

  beforeAll(async () => {
    let began = performance.now();
    const run = start(['render', GUITAR, '-o', reference, ...RENDER_OPTIONS]);
    expect(await run.exited, run.stderr()).toBe(0);
    renderMs = performance.now() - began;
    if (process.env.COILBENCH_KILL_MOMENTS === undefined) return;
    began = performance.now();
    const csv = start(['analyze', GUITAR, '--csv', join(work, 'reference.csv')]);
    expect(await csv.exited, csv.stderr()).toBe(0);
    analyzeMs = performance.now() - began;
    referenceCsv = readFileSync(join(work, 'reference.csv'));
  }, TIMEOUT_MS);

  for (const signal of ['SIGINT', 'SIGKILL'] as const) {
    it(`render: ${MOMENTS} × ${signal}, no corrupt file, then the re-run matches an uninterrupted render byte for byte`, async () => {
      const random = seededRandom(SEED + (signal === 'SIGINT' ? 0 : 1));
      const expected = filesOf(reference);
      for (let moment = 0; moment < MOMENTS; moment += 1) {
        const target = join(work, `render-${signal}-${moment}`, 'out');
        const run = start(['render', GUITAR, '-o', target, ...RENDER_OPTIONS]);
        const delayMs = random.between(0.05, 0.95) * renderMs;
        await new Promise((resolve) => setTimeout(resolve, delayMs));
        run.child.kill(signal);
        const status = await run.exited;
        const at = `${signal} after ${Math.round(delayMs)} ms`;
        expect(corruptFiles(target), at).toEqual([]);
        if (signal === 'SIGINT' && status === null) {
          // Stopped before its handlers were installed (while Node loads the code): nothing was written yet.
          expect(existsSync(target), at).toBe(false);
        } else if (signal === 'SIGINT' && status !== 0) {
          expect(status, at).toBe(130);
          expect(leftovers(target), at).toEqual([]);
          expect(run.stderr(), at).toMatch(/interrupted; no partial file is left\. Run the same command again to finish/u);
          expect(run.stderr(), at).not.toMatch(/\n\s+at /u);
        }
        const io = captureIo(work);
        expect(await main(['render', GUITAR, '-o', target, ...RENDER_OPTIONS], io), `${at}: ${io.err()}`).toBe(0);
        expect(leftovers(target), at).toEqual([]);
        const got = filesOf(target);
        expect([...got.keys()].sort(), at).toEqual([...expected.keys()].sort());
        const differing = [...expected].filter(([name, bytes]) => !got.get(name)?.equals(bytes)).map(([name]) => name);
        expect(differing, at).toEqual([]);
      }
    }, TIMEOUT_MS);

    it.runIf(process.env.COILBENCH_KILL_MOMENTS !== undefined)(`analyze --csv: ${MOMENTS} × ${signal}, the CSV whole or absent, then the re-run matches`, async () => {
      const random = seededRandom(SEED + (signal === 'SIGINT' ? 10 : 11));
      for (let moment = 0; moment < MOMENTS; moment += 1) {
        const folder = join(work, `analyze-${signal}-${moment}`);
        mkdirSync(folder, { recursive: true });
        const run = start(['analyze', GUITAR, '--csv', join(folder, 'out.csv')]);
        const delayMs = random.between(0.05, 1) * analyzeMs;
        await new Promise((resolve) => setTimeout(resolve, delayMs));
        run.child.kill(signal);
        const status = await run.exited;
        const at = `${signal} after ${Math.round(delayMs)} ms`;
        const csv = join(folder, 'out.csv');
        if (existsSync(csv)) expect(readFileSync(csv).equals(referenceCsv), at).toBe(true);
        if (signal === 'SIGINT' && status !== 0) {
          if (status !== null) expect(status, at).toBe(130); // null: stopped while Node was still loading the code
          expect(leftovers(folder), at).toEqual([]);
        }
        const io = captureIo(folder);
        expect(await main(['analyze', GUITAR, '--csv', 'out.csv'], io), io.err()).toBe(0);
        expect(readFileSync(csv).equals(referenceCsv), at).toBe(true);
        expect(leftovers(folder), at).toEqual([]);
      }
    }, TIMEOUT_MS);
  }
});
