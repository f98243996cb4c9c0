/**
 * Kill tests: a 47-wiring render and `analyze --csv`, each run as a real
 * process and stopped by SIGINT or SIGKILL at 10 random moments (seeded).
 * After every stop: no truncated or corrupt file (every WAV read back by the
 * npm package wavefile, every JSON parsed, the CSV whole or absent); after
 * SIGINT also no scratch folder and no temporary file, and the resume
 * message. Then the same command finishes the work, and its files are
 * byte-identical to an uninterrupted run's.
 *
 * The render is one render resumed again and again: the 10 moments are
 * sorted random fractions of an uninterrupted render's time, and each run
 * is stopped after the next fraction's share (plus its start-up), so the
 * stops fall across the whole render and every run resumes what the last
 * one left (SIGKILL leaves its scratch, lock and temporary files for the
 * next run to clear). `analyze --csv` writes its file at the end, whole or
 * not at all: each of its runs is stopped at a random moment of a whole
 * run, and one re-run at the end must give the reference bytes.
 *
 * The children run the command line bundled here from the sources, as
 * `npm run build` bundles it (scripts/build-cli.mjs: the same code, about a
 * second less start-up than the TypeScript loader on a busy machine), with
 * the render's worker entries bundled beside it (a 47-wiring direct render
 * keeps its audio on one thread, but measures its groups and circuit figures
 * on a second). COILBENCH_KILL_MOMENTS changes the number of moments
 * (default 10), COILBENCH_KILL_SEED the moments.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { WaveFile } from 'wavefile';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { bundleCommandLine } from '../scripts/build-cli.mjs';
import { countFromEnvironment, seededRandom } from './support/seeded-random.js';
import { temporaryFolder } from './support/temporary-folder.js';

const MOMENTS = countFromEnvironment('COILBENCH_KILL_MOMENTS', 10);
const SEED = countFromEnvironment('COILBENCH_KILL_SEED', 7);
const GUITAR = join(import.meta.dirname, '..', 'samples', 'three-single-coil.json');
const REPOSITORY = join(import.meta.dirname, '..');
/** Inside the repository, so the bundle finds the package folder (samples, dist/page.js) as the real CLI does. */
const BUNDLE_FOLDER = join(REPOSITORY, 'test-output', `kill-cli-${process.pid}`);
const BUNDLE = join(BUNDLE_FOLDER, 'cli.js');
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
  // Run as `coilbench` runs: the bundle as an executable, its first line starting Node (src/cli.ts).
  const child = spawn(BUNDLE, argv, { cwd: REPOSITORY, stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => {
    stderr += chunk.toString('utf8');
  });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  return { child, stderr: () => stderr, exited };
}

/** A JSON value with every object's keys in order. */
function sortedKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortedKeys);
  if (value === null || typeof value !== 'object') return value;
  return Object.fromEntries(Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([key, item]) => [key, sortedKeys(item)]));
}

/** Wait `ms` or until the run exits, whichever comes first. */
function waitOrExit(ms: number, exited: Promise<number | null>): Promise<void> {
  return Promise.race([new Promise<void>((resolve) => setTimeout(resolve, ms)), exited.then(() => undefined)]);
}

describe('interruption at random moments', () => {
  // Same folder name everywhere: the report records it (its slug).
  const reference = join(work, 'reference', 'out');
  let referenceCsv: Buffer;
  /** How long an uninterrupted child run takes from its start, ms (the range the moments are drawn from). */
  let renderMs = 0;
  let analyzeMs = 0;
  /** A child's start-up until it works (a `check`), ms. */
  let startMs = 0;

  beforeAll(async () => {
    mkdirSync(dirname(BUNDLE), { recursive: true });
    await bundleCommandLine(BUNDLE_FOLDER, REPOSITORY);
    let began = performance.now();
    const check = start(['check', GUITAR]);
    expect(await check.exited, check.stderr()).toBe(0);
    startMs = performance.now() - began;
    began = performance.now();
    const run = start(['render', GUITAR, '-o', reference, ...RENDER_OPTIONS]);
    expect(await run.exited, run.stderr()).toBe(0);
    renderMs = performance.now() - began;
    began = performance.now();
    const csv = start(['analyze', GUITAR, '--csv', join(work, 'reference.csv')]);
    expect(await csv.exited, csv.stderr()).toBe(0);
    analyzeMs = performance.now() - began;
    referenceCsv = readFileSync(join(work, 'reference.csv'));
  }, TIMEOUT_MS);
  afterAll(() => rmSync(BUNDLE_FOLDER, { recursive: true, force: true }));

  /** The checks after a stopped run: no corrupt file; after a handled SIGINT no leftovers and the message. */
  function expectStoppedCleanly(signal: 'SIGINT' | 'SIGKILL', status: number | null, stderr: string, folder: string, at: string): void {
    expect(corruptFiles(folder), at).toEqual([]);
    if (signal !== 'SIGINT' || status === 0) return; // SIGKILL leaves scratch for the next run; 0: finished before the signal
    if (status === null) return; // stopped before its handlers were installed (while Node loads the code): nothing written yet
    expect(status, at).toBe(130);
    expect(leftovers(folder), at).toEqual([]);
    expect(stderr, at).toMatch(/interrupted; no partial file is left\. Run the same command again to finish/u);
    expect(stderr, at).not.toMatch(/\n\s+at /u);
  }

  for (const signal of ['SIGINT', 'SIGKILL'] as const) {
    it(`render: ${MOMENTS} × ${signal} across one render resumed each time, no corrupt file, then the re-run matches an uninterrupted render byte for byte`, async () => {
      const random = seededRandom(SEED + (signal === 'SIGINT' ? 0 : 1));
      const moments = Array.from({ length: MOMENTS }, () => random.next()).sort((a, b) => a - b);
      const target = join(work, `render-${signal}`, 'out');
      const stops: string[] = [];
      let previous = 0;
      for (const moment of moments) {
        const run = start(['render', GUITAR, '-o', target, ...RENDER_OPTIONS]);
        const delayMs = startMs + (moment - previous) * renderMs;
        previous = moment;
        await waitOrExit(delayMs, run.exited);
        run.child.kill(signal);
        const status = await run.exited;
        const at = `${signal} after ${Math.round(delayMs)} ms (moment ${moment.toFixed(3)} of the render)`;
        stops.push(`${Math.round(delayMs)} ms → ${status ?? 'killed'}`);
        expectStoppedCleanly(signal, status, run.stderr(), target, at);
      }
      const io = captureIo(work);
      expect(await main(['render', GUITAR, '-o', target, ...RENDER_OPTIONS], io), `${stops.join(', ')}: ${io.err()}`).toBe(0);
      expect(leftovers(target), stops.join(', ')).toEqual([]);
      const expected = filesOf(reference);
      const got = filesOf(target);
      expect([...got.keys()].sort()).toEqual([...expected.keys()].sort());
      // The manifest is bookkeeping: the order its fields were recorded in may differ after resumes, so it is compared by content.
      const sameContent = (name: string, bytes: Buffer): boolean =>
        name === '.coilbench-manifest.json' && JSON.stringify(sortedKeys(JSON.parse(got.get(name)?.toString('utf8') ?? 'null'))) === JSON.stringify(sortedKeys(JSON.parse(bytes.toString('utf8'))));
      const differing = [...expected]
        .filter(([name, bytes]) => !got.get(name)?.equals(bytes) && !sameContent(name, bytes))
        .map(([name, bytes]) => (name.endsWith('.json') ? `${name} (${String(got.get(name)?.toString('utf8') === bytes.toString('utf8'))}): ${got.get(name)?.toString('utf8').slice(0, 400)} versus ${bytes.toString('utf8').slice(0, 400)}` : name));
      expect(differing, stops.join(', ')).toEqual([]);
    }, TIMEOUT_MS);

    it(`analyze --csv: ${MOMENTS} × ${signal}, the CSV whole or absent each time, then the re-run matches`, async () => {
      const random = seededRandom(SEED + (signal === 'SIGINT' ? 10 : 11));
      const folder = join(work, `analyze-${signal}`);
      mkdirSync(folder, { recursive: true });
      const csv = join(folder, 'out.csv');
      for (let moment = 0; moment < MOMENTS; moment += 1) {
        rmSync(csv, { force: true });
        const run = start(['analyze', GUITAR, '--csv', csv]);
        const delayMs = random.between(0.05, 1) * analyzeMs;
        await waitOrExit(delayMs, run.exited);
        run.child.kill(signal);
        const status = await run.exited;
        const at = `${signal} after ${Math.round(delayMs)} ms`;
        if (existsSync(csv)) expect(readFileSync(csv).equals(referenceCsv), at).toBe(true);
        expectStoppedCleanly(signal, status, run.stderr(), folder, at);
      }
      rmSync(csv, { force: true });
      const io = captureIo(folder);
      expect(await main(['analyze', GUITAR, '--csv', 'out.csv'], io), io.err()).toBe(0);
      expect(readFileSync(csv).equals(referenceCsv)).toBe(true);
      expect(leftovers(folder)).toEqual([]);
    }, TIMEOUT_MS);
  }
});
