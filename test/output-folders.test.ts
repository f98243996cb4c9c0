/**
 * Render folders that cannot be mixed, clobbered or trusted blindly:
 * - clobber: a folder coilbench did not make is refused and left byte for
 *   byte as it was; `--force` replaces only coilbench's own files;
 * - refuse before writing: every refusal comes before the first file or
 *   folder, and a run that fails part-way removes what it made;
 * - concurrency: several renders started at the same instant into one folder
 *   (separate processes, same or different options): exactly one runs, the
 *   others exit 2 naming the lock, and the folder matches one report;
 * - resume: files of a finished render cut short, corrupted or deleted at
 *   random are made again, byte-identical, and no other file is touched.
 * Rounds: COILBENCH_FOLDER_ROUNDS=10 runs the full count of the concurrency
 * and resume checks (20 resume rounds); the default run does a few of each.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { createRandom } from '../src/math/index.js';
import type { ListeningReport } from '../src/report/index.js';

const FULL_ROUNDS = Number(process.env.COILBENCH_FOLDER_ROUNDS ?? 0) >= 10;
const CONCURRENCY_ROUNDS = FULL_ROUNDS ? 10 : 1;
const RESUME_ROUNDS = FULL_ROUNDS ? 20 : 5;
const CLI_ON_SIGNAL = join(import.meta.dirname, 'support', 'run-cli-on-signal.ts');
/** tsx's loader by its full address: the children run in a temporary folder, where `--import tsx` would not be found. */
const TSX_LOADER = import.meta.resolve('tsx');

/** An invented two-coil guitar (6 wirings), quick to render. */
const GUITAR = {
  name: 'Folder test guitar (invented values)',
  scale: '648mm',
  coils: [
    { id: 'neck', position: '160mm', resistance: '6k', inductance: '2.4H', winding: 'cw', magnet: 'north' },
    { id: 'bridge', position: '45mm', resistance: '6.5k', inductance: '2.6H', winding: 'ccw', magnet: 'south' },
  ],
};

const folders: string[] = [];
function scratchFolder(): string {
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-folders-'));
  folders.push(folder);
  writeFileSync(join(folder, 'guitar.json'), JSON.stringify(GUITAR));
  return folder;
}
afterAll(() => {
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

async function run(cwd: string, ...argv: string[]) {
  const io = captureIo(cwd);
  const status = await main(argv, io);
  return { status, out: io.out(), err: io.err() };
}

/** Every file under `root` with its bytes, inode and change time, by relative path. */
function snapshot(root: string): Map<string, { bytes: Buffer; inode: number; changedMs: number }> {
  const found = new Map<string, { bytes: Buffer; inode: number; changedMs: number }>();
  const walk = (folder: string): void => {
    for (const entry of readdirSync(folder, { withFileTypes: true })) {
      const path = join(folder, entry.name);
      if (entry.isDirectory()) walk(path);
      else {
        const info = statSync(path);
        found.set(relative(root, path), { bytes: readFileSync(path), inode: info.ino, changedMs: info.ctimeMs });
      }
    }
  };
  if (existsSync(root)) walk(root);
  return found;
}

/** The folder holds what its report lists, and nothing left by another run. */
function expectFolderMatchesReport(root: string): ListeningReport {
  const report = JSON.parse(readFileSync(join(root, 'report.json'), 'utf8')) as ListeningReport;
  const wavs = readdirSync(join(root, 'wav')).filter((name) => name.endsWith('.wav')).sort();
  expect(wavs).toEqual(report.wirings.map((wiring) => (wiring.wav ?? '').replace(/^wav\//u, '')).sort());
  const netlists = readdirSync(join(root, 'netlists')).sort();
  expect(netlists).toEqual(wavs.map((name) => name.replace(/\.wav$/u, '.cir')));
  const manifest = JSON.parse(readFileSync(join(root, '.coilbench-manifest.json'), 'utf8')) as { entries: Record<string, { file?: string; audio?: { frames: number } }> };
  for (const wiring of report.wirings) {
    const entry = manifest.entries[wiring.expression];
    expect(entry?.file).toBe((wiring.wav ?? '').replace(/^wav\//u, ''));
    // The WAV holds the frames the manifest recorded for this report's settings (24-bit mono after a 44-byte header, or more with INFO).
    expect(statSync(join(root, wiring.wav ?? '')).size).toBeGreaterThan((entry?.audio?.frames ?? 0) * 3);
  }
  const marker = JSON.parse(readFileSync(join(root, '.coilbench-folder.json'), 'utf8')) as { settings: { chain: string; wirings: number } };
  expect(marker.settings.chain).toBe(report.render.chain);
  expect(marker.settings.wirings).toBe(report.wirings.length);
  expect(existsSync(join(root, '.scratch'))).toBe(false);
  expect(existsSync(join(root, '.coilbench.lock'))).toBe(false);
  return report;
}

describe('a folder coilbench did not make', () => {
  it('is refused and left byte-identical; --force replaces only coilbench\'s files', async () => {
    const cwd = scratchFolder();
    const target = join(cwd, 'mine');
    mkdirSync(join(target, 'photos'), { recursive: true });
    writeFileSync(join(target, 'index.html'), '<p>my own page</p>\n');
    writeFileSync(join(target, 'notes.txt'), 'pickup heights, neck 2.5 mm\n');
    writeFileSync(join(target, 'photos', 'cavity.jpg'), Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3]));
    const before = snapshot(target);

    const refused = await run(cwd, 'render', 'guitar.json', '--only', 'w1', '--chain', 'direct', '-o', 'mine');
    expect(refused.status).toBe(2);
    expect(refused.err).toMatch(/^coilbench: --output: expected a new or empty folder, or one coilbench made .*--force.*got "mine", which holds index\.html, notes\.txt, photos\n$/u);
    expect(snapshot(target)).toEqual(before);

    const forced = await run(cwd, 'render', 'guitar.json', '--only', 'w1', '--chain', 'direct', '-o', 'mine', '--force');
    expect(forced.status).toBe(0);
    expect(forced.err).toContain('--force: taking over mine, which coilbench did not make: replacing index.html');
    expect(forced.err).toContain('leaving notes.txt, photos as they are');
    const after = snapshot(target);
    for (const path of ['notes.txt', join('photos', 'cavity.jpg')]) expect(after.get(path)).toEqual(before.get(path));
    expect(after.get('index.html')?.bytes.toString()).toContain('<!doctype html>');
    expectFolderMatchesReport(target);

    // Now it is coilbench's folder: a second render goes ahead without --force.
    const again = await run(cwd, 'render', 'guitar.json', '--only', 'w2', '--chain', 'direct', '-o', 'mine');
    expect(again.status).toBe(0);
    expect(expectFolderMatchesReport(target).wirings.map((wiring) => wiring.id)).toEqual(['w2']);
    expect(snapshot(target).get('notes.txt')).toEqual(before.get('notes.txt'));
  });

  it('-o "" is refused; -o . is the working folder, refused when it holds other files', async () => {
    const cwd = scratchFolder();
    const empty = await run(cwd, 'render', 'guitar.json', '-o', '');
    expect(empty.status).toBe(2);
    expect(empty.err).toContain('--output: expected a folder name (-o . is the working folder), got ""');
    const dot = await run(cwd, 'render', 'guitar.json', '-o', '.');
    expect(dot.status).toBe(2);
    expect(dot.err).toContain('got ".", which holds guitar.json');
    expect(readdirSync(cwd)).toEqual(['guitar.json']);
  });

  it('a folder named after another guitar is not reused for this one', async () => {
    const cwd = scratchFolder();
    const first = await run(cwd, 'render', 'guitar.json', '--only', 'w1', '--chain', 'direct');
    expect(first.status).toBe(0);
    const [folder] = readdirSync(join(cwd, 'renders'));
    writeFileSync(join(cwd, 'other.json'), JSON.stringify({ ...GUITAR, name: 'Folder test guitar: invented values' }));
    // Both names give the same readable folder name; the marker tells them apart.
    const second = await run(cwd, 'render', 'other.json', '--only', 'w1', '--chain', 'direct');
    expect(second.status).toBe(2);
    expect(second.err).toContain(`which holds the renders of "${GUITAR.name}"`);
    expect(readdirSync(join(cwd, 'renders'))).toEqual([folder]);
  });
});

describe('refusals come before the first file', () => {
  const cases: Array<{ about: string; argv: string[]; contains: string }> = [
    { about: 'volume 0', argv: ['--volume', '0'], contains: '--volume: expected a volume setting above 0' },
    { about: 'a pluck beyond the string', argv: ['--phrase', 'far.json'], contains: 'notes[0].pluck: expected a pluck between the bridge and the fret' },
    { about: 'a cable above the accepted capacitance', argv: ['--cable', '30n'], contains: '--cable: expected a total cable capacitance between 1 pF and 20 nF' },
    { about: 'a bad option', argv: ['--chain', 'loud'], contains: '--chain: expected one of' },
  ];
  for (const { about, argv, contains } of cases) {
    it(`${about}: exit 2, nothing made`, async () => {
      const cwd = scratchFolder();
      writeFileSync(join(cwd, 'far.json'), JSON.stringify({ notes: [{ time: 0, string: 1, fret: 12, velocity: 1, pluck: '400mm' }] }));
      const result = await run(cwd, 'render', 'guitar.json', '-o', join('deep', 'out'), ...argv);
      expect(result.status).toBe(2);
      expect(result.err).toContain(contains);
      expect(result.err).not.toMatch(/cableCapacitanceF|referenceEnergy|internal error/u);
      expect(readdirSync(cwd).sort()).toEqual(['far.json', 'guitar.json']);
    });
  }

  it('a run that fails part-way removes what it made and keeps what was there', async () => {
    const cwd = scratchFolder();
    const target = join(cwd, 'out');
    const argv = ['render', 'guitar.json', '--only', 'w1', '--only', 'w2', '--only', 'w3', '--chain', 'direct', '-o', 'out'];
    expect((await run(cwd, ...argv)).status).toBe(0);
    // A WAV's name taken by a folder: the next run fails late, after checking and rewriting other files.
    rmSync(join(target, 'wav', 'w3-neck-and-bridge-in-series.wav'));
    mkdirSync(join(target, 'wav', 'w3-neck-and-bridge-in-series.wav'));
    const before = snapshot(target);
    const result = await run(cwd, ...argv);
    expect(result.status).toBe(1);
    const after = snapshot(target);
    expect([...after.keys()].sort()).toEqual([...before.keys()].sort());
    for (const [path, file] of before) expect(after.get(path)?.bytes.equals(file.bytes), path).toBe(true);
    expect(existsSync(join(target, '.scratch'))).toBe(false);
    expect(existsSync(join(target, '.coilbench.lock'))).toBe(false);

    // A new folder: a failure part-way leaves nothing at all.
    mkdirSync(join(cwd, 'trap'));
    writeFileSync(join(cwd, 'trap', 'new'), 'a file where the folder should go\n');
    const nested = await run(cwd, 'render', 'guitar.json', '--only', 'w1', '--chain', 'direct', '-o', join('trap', 'new', 'out'));
    expect(nested.status).not.toBe(0);
    expect(readdirSync(join(cwd, 'trap'))).toEqual(['new']);
  });
});

describe('a lock keeps a second run out', () => {
  it('a lock of a running process refuses the run (exit 2, naming the lock); a stale one is taken over, saying so, and the lock files its dead runs left are removed', async () => {
    const cwd = scratchFolder();
    const target = join(cwd, 'out');
    mkdirSync(target);
    // A process that is running: this test's parent.
    writeFileSync(join(target, '.coilbench.lock'), JSON.stringify({ pid: process.ppid, started: 'earlier' }));
    const locked = await run(cwd, 'render', 'guitar.json', '--only', 'w1', '--chain', 'direct', '-o', 'out');
    expect(locked.status).toBe(2);
    expect(locked.err).toContain(`locked by process ${process.ppid} since earlier (${join(target, '.coilbench.lock')})`);
    expect(readdirSync(target)).toEqual(['.coilbench.lock']);

    // A process that has ended.
    const ended = spawn(process.execPath, ['-e', '']);
    const deadPid = ended.pid as number;
    await new Promise((resolve) => ended.on('exit', resolve));
    writeFileSync(join(target, '.coilbench.lock'), JSON.stringify({ pid: deadPid, started: 'earlier' }));
    // What a run killed while taking or breaking a lock leaves: its temporary lock file and its breaker.
    writeFileSync(join(target, `.coilbench.lock.${deadPid}.c477e739f077`), JSON.stringify({ pid: deadPid, started: 'earlier' }));
    writeFileSync(join(target, '.coilbench.lock.break'), String(deadPid));
    const taken = await run(cwd, 'render', 'guitar.json', '--only', 'w1', '--chain', 'direct', '-o', 'out');
    expect(taken.status).toBe(0);
    expect(taken.err).toContain(`taking over the lock of process ${deadPid} (since earlier), which is no longer running`);
    expect(readdirSync(target).filter((name) => name.startsWith('.coilbench.lock'))).toEqual([]);
    expectFolderMatchesReport(target);
  });
});

/** Start one CLI run per argument list, all at the same instant; resolves to each one's status and error output. */
async function runTogether(cwd: string, argvs: readonly string[][]): Promise<Array<{ status: number; err: string }>> {
  const go = join(cwd, `go-${Date.now()}`);
  const children = argvs.map((argv, index) => {
    const ready = join(cwd, `ready-${index}-${Date.now()}`);
    const child = spawn(process.execPath, ['--import', TSX_LOADER, CLI_ON_SIGNAL, ready, go, ...argv], { cwd, stdio: ['ignore', 'ignore', 'pipe'] });
    let err = '';
    child.stderr.on('data', (chunk: Buffer) => {
      err += chunk.toString();
    });
    let exited = false;
    const done = new Promise<{ status: number; err: string }>((resolve) =>
      child.on('exit', (code) => {
        exited = true;
        resolve({ status: code ?? -1, err });
      }),
    );
    return { ready, done, exited: () => exited };
  });
  while (!children.every((child) => existsSync(child.ready))) {
    const early = children.find((child) => child.exited() && !existsSync(child.ready));
    if (early) throw new Error(`a run ended before it was ready: ${(await early.done).err}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  writeFileSync(go, '');
  const results = await Promise.all(children.map((child) => child.done));
  rmSync(go, { force: true });
  for (const child of children) rmSync(child.ready, { force: true });
  return results;
}

describe('renders started together into one folder', () => {
  const variants: Array<{ about: string; argvs: string[][] }> = [
    { about: 'two, same options', argvs: [['--only', 'w1', '--only', 'w3'], ['--only', 'w1', '--only', 'w3']] },
    { about: 'three, different options', argvs: [['--only', 'w1', '--only', 'w3'], ['--only', 'w2', '--chain', 'clean'], ['--only', 'w1', '--only', 'w4', '--level', 'matched']] },
  ];
  for (const { about, argvs } of variants) {
    it(`${about}: exactly one runs, the others exit 2 naming the lock, the folder matches one report (${CONCURRENCY_ROUNDS} round${CONCURRENCY_ROUNDS > 1 ? 's' : ''})`, async () => {
      const cwd = scratchFolder();
      for (let round = 0; round < CONCURRENCY_ROUNDS; round += 1) {
        // Even rounds into a new folder, odd ones into the folder of the round before.
        const target = round % 2 === 0 ? `out-${round}` : `out-${round - 1}`;
        const results = await runTogether(
          cwd,
          argvs.map((argv) => ['render', 'guitar.json', '-o', target, '--chain', 'direct', ...argv]),
        );
        const winners = results.filter((result) => result.status === 0);
        expect(winners, results.map((result) => `${result.status}: ${result.err}`).join('\n')).toHaveLength(1);
        for (const loser of results.filter((result) => result.status !== 0)) {
          expect(loser.status).toBe(2);
          expect(loser.err).toMatch(/--output: expected a folder no other coilbench run is writing .*locked by process \d+ since .*\.coilbench\.lock\)\n$/u);
        }
        const winner = argvs[results.findIndex((result) => result.status === 0)] as string[];
        const report = expectFolderMatchesReport(join(cwd, target));
        const only = winner.filter((_, index) => winner[index - 1] === '--only');
        expect(report.wirings.map((wiring) => wiring.id)).toEqual(only);
      }
    }, 300_000);
  }
});

describe('a re-run checks the files, not only the manifest', () => {
  let cwd = '';
  let original = new Map<string, { bytes: Buffer; inode: number; changedMs: number }>();
  beforeAll(async () => {
    cwd = scratchFolder();
    const first = await run(cwd, 'render', 'guitar.json', '--chain', 'direct', '-o', 'out');
    expect(first.status).toBe(0);
    original = snapshot(join(cwd, 'out'));
  });

  it(`files cut short, corrupted or deleted at random are made again, byte-identical, and only they (${RESUME_ROUNDS} rounds)`, async () => {
    const target = join(cwd, 'out');
    const random = createRandom(16);
    const candidates = [...original.keys()].filter((path) => /^(wav|netlists)\//u.test(path)).sort();
    for (let round = 0; round < RESUME_ROUNDS; round += 1) {
      const damaged = new Set<string>();
      const count = 1 + Math.floor(random() * 3);
      while (damaged.size < count) damaged.add(candidates[Math.floor(random() * candidates.length)] as string);
      const before = snapshot(target);
      for (const path of damaged) {
        const full = join(target, path);
        const size = statSync(full).size;
        const kind = Math.floor(random() * 3);
        if (kind === 0) truncateSync(full, Math.floor(random() * size));
        else if (kind === 1) {
          const bytes = readFileSync(full);
          const at = Math.floor(random() * size);
          bytes[at] = (bytes[at] as number) ^ 0x5a;
          writeFileSync(full, bytes);
        } else rmSync(full);
      }
      const rerun = await run(cwd, 'render', 'guitar.json', '--chain', 'direct', '-o', 'out');
      expect(rerun.status).toBe(0);
      const after = snapshot(target);
      const wavsDamaged = new Set([...damaged].filter((path) => path.startsWith('wav/')).map((path) => path.replace(/\.js$/u, '')));
      expect(rerun.err).toContain(`${wavsDamaged.size} written, ${6 - wavsDamaged.size} unchanged`);
      for (const path of candidates) {
        expect(after.get(path)?.bytes.equals(original.get(path)?.bytes as Buffer), `${path} after damaging ${[...damaged].join(', ')}`).toBe(true);
        // Untouched: the same file, not rewritten (a WAV and its page copy are written together).
        const rewritten = damaged.has(path) || wavsDamaged.has(path.replace(/\.js$/u, ''));
        if (!rewritten) expect(after.get(path)?.inode, path).toBe(before.get(path)?.inode);
      }
    }
  }, 300_000);
});
