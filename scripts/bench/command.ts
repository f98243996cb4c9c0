/**
 * What users run, timed as they wait for it: each case is a fresh process
 * running the built command as an executable (`dist/cli.js render …`, `… analyze …`),
 * timed from start to exit, with the peak memory of that process (GNU time's
 * maximum resident set size, which covers its worker threads). At least three
 * runs per case: median and range.
 *
 * The five-coil cases (9,997 wirings: analyze --json, analyze --csv, render
 * --no-wav, and a render of every WAV file) run only with BENCH_BIG=1; every
 * case prints its peak memory.
 *
 * Ratios against a reference computation in this process make figures taken
 * on a busy machine comparable: the reference (inverse FFTs of 2^17 points,
 * the per-wiring floor of a render) is timed just before each case, and each
 * case is also given in "reference units" (its wall time ÷ the reference's).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import FFT from 'fft.js';
import { heading, line, medianMs } from './timing.js';
import { fiveCoilGuitarJson } from './guitars.js';
import { maxOf, minOf } from '../../src/math/index.js';

const ROOT = join(import.meta.dirname, '..', '..');
/** The built command to time (BENCH_CLI: another build, e.g. of an older commit, for before/after figures). */
const CLI = process.env.BENCH_CLI ?? join(ROOT, 'dist', 'cli.js');
/**
 * BENCH_BASE: a second build's cli.js (an executable) to compare with, run by turns with CLI (base, this, base,
 * this …), so that both see the same hours of the machine: its speed drifts by 2× within an hour, more than most
 * changes move a command.
 */
const BASE = process.env.BENCH_BASE;
const GNU_TIME = '/usr/bin/time';
/** Runs per case (the minimum for a median and range). */
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
/** Reference computation: this many inverse FFTs of REFERENCE_SIZE points. */
const REFERENCE_FFTS = 20;
const REFERENCE_SIZE = 2 ** 17;
const KILOBYTES_PER_MEGABYTE = 1024;

interface Run {
  readonly seconds: number;
  readonly peakMb: number;
}

/**
 * Wall time of the reference computation, ms (median of 5): REFERENCE_FFTS
 * inverse real FFTs of REFERENCE_SIZE points done the way src/math/real-fft.ts
 * did them when the first figures in ref units were taken (the standard
 * packing into one complex transform of half the size, fft.js's own
 * inverseTransform with its division pass, a copy out). Written out here
 * rather than called, so that speeding up the project's own FFT does not move
 * the unit it is measured in.
 */
export function referenceMs(): number {
  const half = REFERENCE_SIZE / 2;
  const engine = new FFT(half);
  const spectrum = new Float64Array(REFERENCE_SIZE + 2).map((_, index) => Math.sin(index));
  const packed = new Float64Array(REFERENCE_SIZE);
  const time = new Float64Array(REFERENCE_SIZE);
  const out = new Float64Array(REFERENCE_SIZE);
  const cosines = Float64Array.from({ length: half }, (_, k) => Math.cos((Math.PI * 2 * k) / REFERENCE_SIZE));
  const sines = Float64Array.from({ length: half }, (_, k) => Math.sin((Math.PI * 2 * k) / REFERENCE_SIZE));
  return medianMs(() => {
    for (let i = 0; i < REFERENCE_FFTS; i += 1) {
      for (let k = 0; k < half; k += 1) {
        const ar = spectrum[2 * k] as number;
        const ai = spectrum[2 * k + 1] as number;
        const br = spectrum[2 * (half - k)] as number;
        const bi = -(spectrum[2 * (half - k) + 1] as number);
        const dr = (ar - br) / 2;
        const di = (ai - bi) / 2;
        const wr = cosines[k] as number;
        const wi = sines[k] as number;
        packed[2 * k] = (ar + br) / 2 - (dr * wi + di * wr);
        packed[2 * k + 1] = (ai + bi) / 2 + (dr * wr - di * wi);
      }
      engine.inverseTransform(time, packed);
      out.set(time);
    }
  });
}

/** One fresh process: `dist/cli.js …args` run as the executable users run (its first line starts Node, src/cli.ts), under GNU time. */
function runOnce(args: readonly string[], cli = CLI): Run {
  const child = spawnSync(GNU_TIME, ['-f', '%e %M', cli, ...args], { encoding: 'utf8', maxBuffer: 1 << 28 });
  if (child.status !== 0) throw new Error(`bench: coilbench ${args.join(' ')} failed (${child.status}): ${child.stderr.slice(-2000)}`);
  const [seconds, kilobytes] = (child.stderr.trim().split('\n').at(-1) ?? '').split(' ').map(Number);
  return { seconds: seconds ?? Number.NaN, peakMb: (kilobytes ?? Number.NaN) / KILOBYTES_PER_MEGABYTE };
}

const median = (values: readonly number[]): number => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)] ?? Number.NaN;

interface Case {
  readonly label: string;
  readonly args: (folder: string) => string[];
  /** Seconds of audio the case writes (null: not a render). */
  readonly audioSeconds: (folder: string) => number | null;
}

/** One run of `item` by `cli` in a fresh folder (removed after), with the seconds of audio it wrote. */
function runInFreshFolder(item: Case, cli = CLI): Run & { readonly audio: number | null } {
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-bench-'));
  try {
    const run = runOnce(item.args(join(folder, 'out')), cli);
    return { ...run, audio: item.audioSeconds(join(folder, 'out')) };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

function runCase(item: Case): void {
  const reference = referenceMs();
  const runs: Run[] = [];
  let audio: number | null = null;
  for (let i = 0; i < RUNS; i += 1) {
    const run = runInFreshFolder(item);
    runs.push(run);
    audio = run.audio;
  }
  const seconds = runs.map((run) => run.seconds);
  const low = minOf(seconds);
  const high = maxOf(seconds);
  const mid = median(seconds);
  const peaks = runs.map((run) => run.peakMb);
  const rate = audio === null ? '' : `, ${(audio / mid).toFixed(0)}× real time (${(audio / high).toFixed(0)}–${(audio / low).toFixed(0)}×)`;
  line(
    item.label,
    `${mid.toFixed(2)} s (${low.toFixed(2)}–${high.toFixed(2)})${rate}; ${((mid * 1000) / reference).toFixed(1)} ref; peak ${median(peaks).toFixed(0)} MB (${minOf(peaks).toFixed(0)}–${maxOf(peaks).toFixed(0)})`,
  );
}

/**
 * One case with BENCH_BASE: RUNS pairs in fresh folders, the base build first in every other pair (a run that
 * follows a render may pay for the disk still writing that render's files out: with the base always first, a
 * 572-wiring render read 1.03–1.10 in three benches, by turns 1.01); prints each build's median and the median
 * (and range) of the pairs' ratios, this build's time over the base's (below 1: this build is faster).
 */
function runPairedCase(item: Case, base: string): void {
  const pairs: { base: Run; build: Run }[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    if (i % 2 === 0) {
      const baseRun = runInFreshFolder(item, base);
      pairs.push({ base: baseRun, build: runInFreshFolder(item) });
    } else {
      const buildRun = runInFreshFolder(item);
      pairs.push({ base: runInFreshFolder(item, base), build: buildRun });
    }
  }
  const ratios = pairs.map((pair) => pair.build.seconds / pair.base.seconds);
  line(
    item.label,
    `base ${median(pairs.map((pair) => pair.base.seconds)).toFixed(2)} s, this ${median(pairs.map((pair) => pair.build.seconds)).toFixed(2)} s; ratio ${median(ratios).toFixed(2)} (${minOf(ratios).toFixed(2)}–${maxOf(ratios).toFixed(2)}); peak ${median(pairs.map((pair) => pair.base.peakMb)).toFixed(0)} → ${median(pairs.map((pair) => pair.build.peakMb)).toFixed(0)} MB`,
  );
}

/** Seconds of audio in a render folder: its report's duration × its wirings. */
function renderedSeconds(folder: string): number {
  const report = JSON.parse(readFileSync(join(folder, 'report.json'), 'utf8')) as { render: { durationS: number }; wirings: unknown[] };
  return report.render.durationS * report.wirings.length;
}

export function benchCommands(): void {
  if (!existsSync(GNU_TIME)) {
    heading(`Commands as users run them: skipped (needs GNU time at ${GNU_TIME}: apt-get install time)`);
    return;
  }
  const reference = referenceMs();
  heading(
    BASE === undefined
      ? `Commands as users run them: fresh process \`dist/cli.js …\` (the executable, as \`coilbench\` runs), start to exit, ${RUNS} runs: median (range)`
      : `Commands as users run them, this build against ${BASE}: ${RUNS} pairs run by turns, each build's median and the pairs' ratio (this ÷ base)`,
  );
  console.log(`  reference computation in this process: ${REFERENCE_FFTS} inverse FFTs of ${REFERENCE_SIZE} points = ${reference.toFixed(1)} ms ("ref")`);
  const scratch = mkdtempSync(join(tmpdir(), 'coilbench-bench-guitar-'));
  const five = join(scratch, 'five-coil.json');
  writeFileSync(five, fiveCoilGuitarJson());
  const three = join(ROOT, 'samples', 'three-single-coil.json');
  const four = join(ROOT, 'samples', 'humbucker-two-single-coil.json');
  const render = (guitar: string, chain: string): Case['args'] => (folder) => ['render', guitar, '--chain', chain, '-o', folder];
  const cases: Case[] = [
    { label: '47 wirings, render direct', args: render(three, 'direct'), audioSeconds: renderedSeconds },
    { label: '47 wirings, render clean', args: render(three, 'clean'), audioSeconds: renderedSeconds },
    { label: '47 wirings, render drive', args: render(three, 'drive'), audioSeconds: renderedSeconds },
    { label: '572 wirings, render direct (2 threads)', args: render(four, 'direct'), audioSeconds: renderedSeconds },
    { label: '47 wirings, analyze (audio figures included)', args: () => ['analyze', three, '--json'], audioSeconds: () => null },
    { label: '572 wirings, analyze', args: () => ['analyze', four, '--json'], audioSeconds: () => null },
  ];
  // Five coils: only when asked for (BENCH_BIG=1).
  if (process.env.BENCH_BIG === '1') {
    cases.push({ label: '9,997 wirings, analyze', args: () => ['analyze', five, '--json', '--yes'], audioSeconds: () => null });
    cases.push({ label: '9,997 wirings, analyze --csv', args: (folder) => ['analyze', five, '--csv', `${folder}.csv`, '--yes'], audioSeconds: () => null });
    cases.push({ label: '9,997 wirings, render --no-wav (page and reports)', args: (folder) => ['render', five, '--no-wav', '--yes', '-o', folder], audioSeconds: () => null });
    // Every file too (about 100 s and 3.4 GB of WAVs a run): the memory bound is for any render.
    cases.push({ label: '9,997 wirings, render direct (WAV files)', args: (folder) => ['render', five, '--chain', 'direct', '--yes', '-o', folder], audioSeconds: renderedSeconds });
  }
  // BENCH_CASES: a regular expression choosing cases by label (e.g. "47 wirings").
  const only = process.env.BENCH_CASES ? new RegExp(process.env.BENCH_CASES, 'u') : null;
  try {
    for (const item of cases) if (!only || only.test(item.label)) (BASE === undefined ? runCase(item) : runPairedCase(item, BASE));
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}
