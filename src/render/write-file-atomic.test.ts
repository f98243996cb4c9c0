import { spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { WorkError } from '../errors/index.js';
import {
  STALE_TEMP_FILE_AGE_MS,
  TEMP_FILE_PREFIX,
  createDeferredSync,
  removeStaleTempFiles,
  writeFileAtomic,
  writeFileAtomicSync,
} from './write-file-atomic.js';

const WRITER = join(import.meta.dirname, '..', '..', 'test', 'support', 'atomic-writer.ts');

/** A process id that is certainly not running: one of a process that has exited. */
function deadPid(): number {
  const child = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
  return Number(child.stdout);
}

describe('writeFileAtomic', () => {
  let folder = '';
  beforeEach(() => {
    folder = mkdtempSync(join(tmpdir(), 'coilbench-atomic-'));
  });
  afterEach(() => rmSync(folder, { recursive: true, force: true }));

  it('writes bytes and text, replaces an existing file, and leaves no temporary file', async () => {
    const path = join(folder, 'report.json');
    await writeFileAtomic(path, '{"old":true}');
    await writeFileAtomic(path, 'ünïcode text');
    expect(readFileSync(path, 'utf8')).toBe('ünïcode text');
    writeFileAtomicSync(join(folder, 'w1.wav'), Uint8Array.from([1, 2, 3]));
    expect(Array.from(readFileSync(join(folder, 'w1.wav')))).toEqual([1, 2, 3]);
    expect(readdirSync(folder).sort()).toEqual(['report.json', 'w1.wav']);
  });

  it('with a deferred sync: whole files under their names at once, each folder counted, flush empties the list', async () => {
    const deferred = createDeferredSync();
    mkdirSync(join(folder, 'netlists'));
    await writeFileAtomic(join(folder, 'a.cir'), 'first', deferred);
    await writeFileAtomic(join(folder, 'a.cir'), 'second', deferred);
    await writeFileAtomic(join(folder, 'netlists', 'b.cir'), Uint8Array.from([7, 8]), deferred);
    // The synchronous writer (many small files one after another) takes the same deferral.
    writeFileAtomicSync(join(folder, 'netlists', 'd.cir'), 'fourth', deferred);
    expect(readFileSync(join(folder, 'a.cir'), 'utf8')).toBe('second');
    expect(Array.from(readFileSync(join(folder, 'netlists', 'b.cir')))).toEqual([7, 8]);
    expect(readFileSync(join(folder, 'netlists', 'd.cir'), 'utf8')).toBe('fourth');
    expect(deferred.waiting).toBe(4);
    await deferred.flush();
    expect(deferred.waiting).toBe(0);
    expect(readdirSync(folder).sort()).toEqual(['a.cir', 'netlists']);
    expect(readdirSync(join(folder, 'netlists')).sort()).toEqual(['b.cir', 'd.cir']);
    // A folder that has gone by the time of the flush is a WorkError naming it.
    await writeFileAtomic(join(folder, 'netlists', 'c.cir'), 'x', deferred);
    rmSync(join(folder, 'netlists'), { recursive: true });
    await expect(deferred.flush()).rejects.toThrow(/could not sync .*netlists/u);
  });

  it('fails with WorkError, leaves the destination alone and removes its temporary file', async () => {
    const taken = join(folder, 'taken');
    mkdirSync(taken);
    writeFileSync(join(taken, 'inside'), 'keep');
    await expect(writeFileAtomic(taken, 'x')).rejects.toThrow(WorkError);
    await expect(writeFileAtomic(taken, 'x')).rejects.toThrow(/could not write .*taken: .*\(E[A-Z]+\)/u);
    expect(() => writeFileAtomicSync(taken, 'x')).toThrow(WorkError);
    expect(readdirSync(folder)).toEqual(['taken']);
    expect(readFileSync(join(taken, 'inside'), 'utf8')).toBe('keep');
    await expect(writeFileAtomic(join(folder, 'missing', 'file'), 'x')).rejects.toThrow(/ENOENT/u);
  });

  it('leaves either the old or the whole new file when the writer is killed mid-write', async () => {
    const path = join(folder, 'big.wav');
    const megabytes = 8;
    const child = spawn(process.execPath, ['--import', 'tsx', WRITER, path, String(megabytes)], { stdio: ['ignore', 'pipe', 'pipe'] });
    let errors = '';
    child.stderr.on('data', (chunk: Buffer) => {
      errors += chunk.toString();
    });
    // Once two writes are complete and the third is starting, kill without warning: mid-write, most runs.
    await new Promise<void>((resolve, reject) => {
      let output = '';
      child.stdout.on('data', (chunk: Buffer) => {
        output += chunk.toString();
        if (output.includes('writing 3')) resolve();
      });
      child.on('exit', () => reject(new Error(`writer exited early: ${errors}`)));
    });
    await new Promise((resolve) => setTimeout(resolve, 5)); // an 8 MB write with fsync takes ≈ 15 ms here
    child.kill('SIGKILL');
    await new Promise((resolve) => child.on('close', resolve));

    const bytes = readFileSync(path);
    expect(bytes.length).toBe(megabytes * 1024 * 1024);
    const value = bytes[0] ?? 0;
    expect(value).toBeGreaterThanOrEqual(2);
    expect(bytes.every((byte) => byte === value)).toBe(true);
    // Any temporary file left by the killed writer is removed by the stale-file sweep.
    await removeStaleTempFiles(folder);
    expect(readdirSync(folder)).toEqual(['big.wav']);
  });
});

describe('removeStaleTempFiles', () => {
  let folder = '';
  beforeEach(() => {
    folder = mkdtempSync(join(tmpdir(), 'coilbench-stale-'));
  });
  afterEach(() => rmSync(folder, { recursive: true, force: true }));

  it('removes temporary files of dead processes and old ones, keeps live ones and other files', async () => {
    const dead = `${TEMP_FILE_PREFIX}${deadPid()}-0123456789ab.tmp`;
    const liveOld = `${TEMP_FILE_PREFIX}${process.ppid}-00000000000a.tmp`;
    const liveNew = `${TEMP_FILE_PREFIX}${process.ppid}-00000000000b.tmp`;
    const others = ['w1.wav', '.coilbench-notes.txt', 'report.tmp'];
    for (const name of [dead, liveOld, liveNew, ...others]) writeFileSync(join(folder, name), 'x');
    const old = new Date(Date.now() - 2 * STALE_TEMP_FILE_AGE_MS);
    utimesSync(join(folder, liveOld), old, old);

    const removed = await removeStaleTempFiles(folder);
    expect(removed.map((path) => path.slice(folder.length + 1)).sort()).toEqual([dead, liveOld].sort());
    expect(readdirSync(folder).sort()).toEqual([liveNew, ...others].sort());
    expect(await removeStaleTempFiles(join(folder, 'missing'))).toEqual([]);
  });
});
