/**
 * Atomic file writes: the bytes go to a temporary file in the destination's
 * own folder (so the rename never crosses file systems), are flushed to disk
 * with fsync, and the temporary file is then renamed over the destination.
 * rename(2) replaces a name atomically (POSIX.1-2017, rename()), so a reader,
 * a Ctrl-C or a kill at any moment sees either the old file or the whole new
 * one, never a truncated one. The temporary file is removed when the write
 * fails.
 *
 * A process killed mid-write (SIGKILL, power loss) can leave its temporary
 * file behind: it is hidden (`.coilbench-<pid>-<random>.tmp`), ignored by
 * git, and removeStaleTempFiles() deletes it on the next run. A command that
 * handles SIGINT itself can call removePendingTempFilesSync() before exiting.
 *
 * Folders are not created here: the caller makes them first.
 *
 * Many files at once (a render's WAVs and netlists): fsync costs a few
 * milliseconds a file (measured on this project's ext4 machine: 4 ms with,
 * 0.7 ms without), so 10,000 netlists would spend most of a render waiting
 * for the disk. A writer may pass a DeferredSync instead: each file is then
 * written and renamed without its own fsync, and flush() at the end fsyncs
 * each folder written into once (fsync(2) on the directory makes the
 * renames durable). The atomicity is unchanged: rename(2) still swaps the
 * name in one step, so an interrupted or killed process leaves each file
 * whole or absent (test/interruption.test.ts). What a power cut shortly after
 * such a write may lose is the newest files' contents; a render's manifest
 * records each file's size and SHA-256, and a re-run rewrites any file that
 * does not match.
 */
import { randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { type FileHandle, open, readdir, rename, rm, stat } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { WorkError, describeFileSystemCode, fileSystemCodeOf } from '../errors/index.js';

/** Every temporary file starts with this (hidden, and listed in .gitignore). */
export const TEMP_FILE_PREFIX = '.coilbench-';
const TEMP_FILE_SUFFIX = '.tmp';
const RANDOM_BYTES = 6;
const TEMP_FILE_PATTERN = /^\.coilbench-(\d+)-[0-9a-f]{12}\.tmp$/u;

/** A temporary file older than this is stale even if its process id is in use again, ms (judgement: no write takes an hour). */
export const STALE_TEMP_FILE_AGE_MS = 60 * 60 * 1000;

/** Temporary files this process is writing now. */
const pending = new Set<string>();

function temporaryPathFor(path: string): string {
  return join(dirname(path), `${TEMP_FILE_PREFIX}${process.pid}-${randomBytes(RANDOM_BYTES).toString('hex')}${TEMP_FILE_SUFFIX}`);
}

function reason(error: unknown): string {
  const code = fileSystemCodeOf(error);
  if (code !== undefined) return describeFileSystemCode(code);
  return error instanceof Error ? error.message : String(error);
}

function failure(path: string, error: unknown): WorkError {
  return new WorkError(`could not write ${path}: ${reason(error)}`, { cause: error });
}

/**
 * Set once an interrupt is being handled: no new asynchronous write starts
 * and those in flight remove their temporary file at their next step (see
 * settleAtomicWrites).
 */
let stopping = false;
/** One promise per asynchronous write in flight, resolved once its temporary file is gone or renamed. */
const unsettled = new Set<Promise<void>>();
/** What a write returns once writing has stopped: the process is about to exit, so nothing after it runs. */
const NEVER = new Promise<never>(() => undefined);

/**
 * Stop asynchronous atomic writes for an interrupt and wait until none has
 * a temporary file being created: the interrupt handler removes the pending
 * temporary files, and a file the thread pool was still opening could
 * otherwise appear just after that removal (seen under load by the kill
 * tests). Writes started later never begin.
 */
export async function settleAtomicWrites(): Promise<void> {
  stopping = true;
  await Promise.allSettled([...unsettled]);
}

/** Folders whose fsync is put off until flush() (see the file comment). */
export interface DeferredSync {
  /** Files renamed into place and not yet made durable. */
  readonly waiting: number;
  /** Remember that `path` was renamed into place without its own fsync. */
  note(path: string): void;
  /** fsync each folder noted since the last flush, once. Throws WorkError when a folder cannot be synced. */
  flush(): Promise<void>;
}

export function createDeferredSync(): DeferredSync {
  const folders = new Set<string>();
  let waiting = 0;
  return {
    get waiting() {
      return waiting;
    },
    note(path) {
      folders.add(dirname(path));
      waiting += 1;
    },
    async flush() {
      const now = [...folders];
      folders.clear();
      waiting = 0;
      for (const folder of now) {
        let handle: FileHandle | null = null;
        try {
          handle = await open(folder, 'r');
          await handle.sync();
        } catch (error) {
          throw new WorkError(`could not sync ${folder}: ${reason(error)}`, { cause: error });
        } finally {
          await handle?.close().catch(() => undefined);
        }
      }
    },
  };
}

/**
 * Write `data` (bytes, or text as UTF-8) to `path` atomically. Throws
 * WorkError on failure, leaving no temporary file. With `deferred`, the file
 * is not fsynced before its rename; `deferred.flush()` syncs its folder later.
 */
export async function writeFileAtomic(path: string, data: Uint8Array | string, deferred?: DeferredSync): Promise<void> {
  if (stopping) return NEVER;
  const temporary = temporaryPathFor(path);
  pending.add(temporary);
  let markSettled: () => void = () => undefined;
  const settled = new Promise<void>((resolve) => {
    markSettled = resolve;
  });
  unsettled.add(settled);
  let handle: FileHandle | null = null;
  let stopped = false;
  const checkStopping = (): void => {
    if (stopping) {
      stopped = true;
      throw new Error('interrupted');
    }
  };
  try {
    handle = await open(temporary, 'wx');
    checkStopping();
    await handle.writeFile(data);
    checkStopping();
    if (!deferred) await handle.sync();
    await handle.close();
    handle = null;
    checkStopping();
    await rename(temporary, path);
    deferred?.note(path);
  } catch (error) {
    await handle?.close().catch(() => undefined);
    await rm(temporary, { force: true }).catch(() => undefined);
    if (stopped || stopping) return NEVER;
    throw failure(path, error);
  } finally {
    pending.delete(temporary);
    unsettled.delete(settled);
    markSettled();
  }
}

/**
 * Has an interrupt stopped atomic writes (settleAtomicWrites)? A writer of
 * many files with writeFileAtomicSync checks it between files and starts no
 * new one: the process is about to exit.
 */
export function atomicWritesStopped(): boolean {
  return stopping;
}

/**
 * The same, synchronously, for writers that cannot await, and for many small
 * files: no trip through the thread pool per step (measured on this project's
 * ext4 machine, 9,997 files of 2 kB with `deferred`, six interleaved rounds:
 * one after another was the faster every time, 0.5–4.4 s against 1.3–7.7 s
 * four at a time with the asynchronous writer; the file system's own speed
 * swings that much between rounds). With
 * `deferred`, the file is not fsynced before its rename; `deferred.flush()`
 * syncs its folder later.
 */
export function writeFileAtomicSync(path: string, data: Uint8Array | string, deferred?: DeferredSync): void {
  const temporary = temporaryPathFor(path);
  pending.add(temporary);
  let descriptor: number | null = null;
  try {
    descriptor = openSync(temporary, 'wx');
    const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
    for (let written = 0; written < bytes.length; ) written += writeSync(descriptor, bytes, written, bytes.length - written);
    if (!deferred) fsyncSync(descriptor);
    closeSync(descriptor);
    descriptor = null;
    renameSync(temporary, path);
    deferred?.note(path);
  } catch (error) {
    if (descriptor !== null) {
      try {
        closeSync(descriptor);
      } catch {
        // already failing; the original error is the one to report
      }
    }
    rmSync(temporary, { force: true });
    throw failure(path, error);
  } finally {
    pending.delete(temporary);
  }
}

/** A file written piece by piece under a temporary name, renamed into place by `commit`. */
export interface AtomicFileStream {
  /** Append text (UTF-8); gathered and written in chunks. */
  readonly write: (text: string) => void;
  /** Flush, fsync and rename over the destination. Throws WorkError on failure, leaving no temporary file. */
  readonly commit: () => void;
  /** Remove the temporary file (after a failure or an interruption); never throws. */
  readonly abandon: () => void;
}

/** Characters gathered before each write of an AtomicFileStream. */
const STREAM_CHUNK_CHARACTERS = 1 << 16;

/**
 * Open `path` for writing piece by piece, atomically: the pieces go to a
 * temporary file in the same folder (removed by removePendingTempFilesSync
 * on Ctrl-C, by removeStaleTempFiles after a kill), and only `commit` puts
 * the whole file in place. For outputs too big to hold as one string.
 */
export function openFileAtomicSync(path: string): AtomicFileStream {
  const temporary = temporaryPathFor(path);
  pending.add(temporary);
  let descriptor: number | null = null;
  let chunk = '';
  const fail = (error: unknown): WorkError => {
    if (descriptor !== null) {
      try {
        closeSync(descriptor);
      } catch {
        // already failing; the original error is the one to report
      }
      descriptor = null;
    }
    rmSync(temporary, { force: true });
    pending.delete(temporary);
    return failure(path, error);
  };
  const flush = (): void => {
    if (descriptor === null) throw new Error(`openFileAtomicSync: ${path} is already committed or abandoned`);
    const bytes = Buffer.from(chunk, 'utf8');
    chunk = '';
    for (let written = 0; written < bytes.length; ) written += writeSync(descriptor, bytes, written, bytes.length - written);
  };
  try {
    descriptor = openSync(temporary, 'wx');
  } catch (error) {
    throw fail(error);
  }
  return {
    write: (text) => {
      chunk += text;
      if (chunk.length < STREAM_CHUNK_CHARACTERS) return;
      try {
        flush();
      } catch (error) {
        throw fail(error);
      }
    },
    commit: () => {
      try {
        flush();
        fsyncSync(descriptor as number);
        closeSync(descriptor as number);
        descriptor = null;
        renameSync(temporary, path);
        pending.delete(temporary);
      } catch (error) {
        throw fail(error);
      }
    },
    abandon: () => {
      fail(undefined);
    },
  };
}

/** Remove the temporary files of writes still in progress in this process (for a SIGINT handler). Returns how many. */
export function removePendingTempFilesSync(): number {
  let removed = 0;
  for (const temporary of pending) {
    try {
      rmSync(temporary, { force: true });
      removed += 1;
    } catch {
      // best effort while exiting
    }
  }
  pending.clear();
  return removed;
}

function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0); // signal 0: existence check only
    return true;
  } catch (error) {
    return error instanceof Error && 'code' in error && error.code === 'EPERM'; // exists, owned by someone else
  }
}

/**
 * Delete temporary files left in `folder` by killed writers: those whose
 * process is gone, or older than STALE_TEMP_FILE_AGE_MS. Files of writes in
 * progress (here or in another live process) are kept. A missing folder has
 * nothing to clean. Returns the paths removed.
 */
export async function removeStaleTempFiles(folder: string, nowMs: number = Date.now()): Promise<string[]> {
  let names: string[];
  try {
    names = await readdir(folder);
  } catch (error) {
    if (error instanceof Error && 'code' in error && error.code === 'ENOENT') return [];
    throw new WorkError(`could not read ${folder}: ${reason(error)}`, { cause: error });
  }
  const removed: string[] = [];
  for (const name of names) {
    const match = TEMP_FILE_PATTERN.exec(name);
    if (!match) continue;
    const path = join(folder, name);
    if (pending.has(path)) continue;
    const pid = Number(match[1]);
    let stale = pid === process.pid || !processIsAlive(pid);
    if (!stale) {
      const info = await stat(path).catch(() => null);
      stale = info !== null && nowMs - info.mtimeMs > STALE_TEMP_FILE_AGE_MS;
    }
    if (!stale) continue;
    await rm(path, { force: true });
    removed.push(path);
  }
  return removed;
}
