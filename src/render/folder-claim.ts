/**
 * A render folder is coilbench's or it is left alone. coilbench writes only
 * into a new or empty folder, or one carrying its marker file (written by an
 * earlier run, with the guitar and settings it was made for); any other
 * folder is refused unless `--force` takes it over, and then only
 * coilbench's own file names are replaced. A lock file holding the process
 * id keeps a second run out while one is writing; a lock left by a process
 * that no longer runs is taken over, and the run says so.
 *
 * A claim is made after every input check has passed, so a refused run has
 * written nothing; a run that fails part-way calls `abandon`, which removes
 * what this run made and leaves what was there before.
 */
import { randomBytes } from 'node:crypto';
import {
  type Stats,
  linkSync,
  mkdirSync,
  readFileSync,
  readdirSync,
  rmSync,
  rmdirSync,
  statSync,
  unlinkSync,
  writeFileSync,
} from 'node:fs';
import { dirname, join, relative, sep } from 'node:path';
import { InputError, WorkError } from '../errors/index.js';
import { writeFileAtomicSync } from './write-file-atomic.js';

/** The marker file: this folder was made by coilbench, for this guitar and these settings. */
export const FOLDER_MARKER = '.coilbench-folder.json';
/** The lock file: a coilbench run is writing this folder (its process id inside). */
export const FOLDER_LOCK = '.coilbench.lock';
/** Added to the lock's name for the file that lets one run alone break a stale lock (breakStaleLock). */
const LOCK_BREAKER_SUFFIX = '.break';
/** The manifest of renders made before folders carried a marker; it marks the folder as coilbench's too. */
const LEGACY_MARKER = '.coilbench-manifest.json';
/** Version of the marker's layout. */
const MARKER_VERSION = 1;
/** Tries at taking the lock (each after clearing a stale lock or a lock that vanished while read). */
const LOCK_ATTEMPTS = 5;
/** Folder entries named in a refusal before "and N more". */
const NAMES_SHOWN = 4;

/** What a folder is made for: recorded in the marker, shown when the folder is refused. */
export interface FolderPurpose {
  /** Name of the guitar. */
  readonly guitar: string;
  /** Guitar file as given on the command line. */
  readonly guitarFile: string;
  /** The settings of the render (phrase, chain, rate, …), as plain data. */
  readonly settings: Readonly<Record<string, unknown>>;
  /** "coilbench 0.1.0". */
  readonly generator: string;
}

export interface ClaimRequest {
  /** The folder, absolute. */
  readonly root: string;
  /** How messages name it ("renders/demo"). */
  readonly shownAs: string;
  /** Take over a folder coilbench did not make (replacing only coilbench's own file names). */
  readonly force: boolean;
  readonly purpose: FolderPurpose;
  /** Names at the top of the folder that coilbench writes (files and folders); nothing else is touched. */
  readonly ownNames: readonly string[];
  /** The folder was named after the guitar (no -o): a folder made for another guitar is refused. */
  readonly namedAfterGuitar: boolean;
  /** Where notes go ("taking over a stale lock …"), one line each. */
  readonly note: (line: string) => void;
}

export interface FolderClaim {
  readonly root: string;
  /** The run failed: remove what it made (the folder itself if it made it), keep what was there before, release the lock. */
  abandon(): void;
  /** The run finished: record its files in the marker, remove files of earlier runs that are not among them, release the lock. */
  finish(files: readonly string[]): void;
}

interface Marker {
  readonly about: string;
  readonly version: number;
  readonly guitar: string;
  readonly guitarFile: string;
  readonly settings: Readonly<Record<string, unknown>>;
  readonly generator: string;
  /** Files of the last finished run, relative to the folder, "/"-separated. */
  readonly files: readonly string[];
}

interface LockHolder {
  readonly pid: number;
  readonly started: string;
}

/** A refused folder: `--output: expected …, got "<folder>", which …` (the folder shown in full, not cut short). */
function refusal(expected: string, got: string): InputError {
  return new InputError([{ path: '--output', expected, got }]);
}

/** Locks this process holds, so an interrupt handler can release them. */
const heldLocks = new Set<string>();

/** Release every lock this process holds (for a SIGINT handler). */
export function releaseFolderLocksSync(): void {
  for (const lock of heldLocks) removeOwnLock(lock);
  heldLocks.clear();
}

/** The names at the top of a render folder that coilbench writes: every path of `folder` that lies directly inside its root. */
export function ownNamesOf(folder: Readonly<Record<string, string>>): string[] {
  const root = folder.root ?? '';
  return Object.values(folder)
    .filter((path) => path !== root && dirname(path) === root)
    .map((path) => relative(root, path));
}

/** Claim `request.root` for a render; throws InputError (exit 2) when it is not coilbench's to write, or is in use. */
export function claimOutputFolder(request: ClaimRequest): FolderClaim {
  const { root, shownAs } = request;
  const lock = join(root, FOLDER_LOCK);
  const info = statOrNull(root);
  if (info !== null && !info.isDirectory()) {
    throw refusal('a folder to write the render into', `"${shownAs}", which is a file`);
  }
  const entries = info === null ? [] : readdirSync(root);
  // A live lock is named first, whatever else the folder holds: another run is writing it. (A lock and
  // its temporary file, `.coilbench.lock.<pid>.<hex>`, alone mean a run is just starting there.)
  if (entries.includes(FOLDER_LOCK)) refuseIfLocked(lock, shownAs);
  const marker = readMarker(join(root, FOLDER_MARKER));
  const ownBefore = marker !== null || entries.includes(LEGACY_MARKER) || (entries.length > 0 && entries.every((name) => name.startsWith(FOLDER_LOCK) || name === FOLDER_MARKER));
  if (entries.length > 0 && !ownBefore) refuseOrTakeOver(request, entries);
  if (marker !== null && request.namedAfterGuitar && marker.guitar !== request.purpose.guitar && !request.force) {
    throw refusal(
      `a folder for "${request.purpose.guitar}" (name another with -o, or add --force to replace its renders)`,
      `"${shownAs}", which holds the renders of "${marker.guitar}"`,
    );
  }

  const createdFolders = createFolder(root);
  try {
    takeLock(lock, shownAs, request.note);
  } catch (error) {
    removeEmptyFolders(createdFolders);
    throw error;
  }
  heldLocks.add(lock);
  removeStaleLockFiles(root);
  const ownNames = [...new Set([...request.ownNames, FOLDER_MARKER])];
  const before = createdFolders.length > 0 ? new Set<string>() : listOwnFiles(root, ownNames);
  // The reports, manifest and marker at the top as they were: a failed run puts them back (WAVs it
  // replaced stay, complete, and the manifest put back no longer vouches for them, so the next run redoes them).
  const topFiles = new Map<string, Buffer>();
  for (const name of ownNames) {
    const path = join(root, name);
    if (before.has(name) && statOrNull(path)?.isFile()) topFiles.set(path, readFileSync(path));
  }
  const previousFiles = marker?.files ?? [];
  writeMarker(root, request.purpose, previousFiles);

  const release = (): void => {
    removeOwnLock(lock);
    heldLocks.delete(lock);
  };
  return {
    root,
    abandon() {
      try {
        if (createdFolders.length > 0) {
          rmSync(root, { recursive: true, force: true });
          removeEmptyFolders(createdFolders.slice(1));
          return;
        }
        for (const path of listOwnFiles(root, ownNames)) {
          if (!before.has(path)) rmSync(join(root, path), { recursive: true, force: true });
        }
        for (const [path, bytes] of topFiles) {
          const now = statOrNull(path)?.isFile() ? readFileSync(path) : null;
          if (now === null || !now.equals(bytes)) writeFileAtomicSync(path, bytes);
        }
      } finally {
        release();
      }
    },
    finish(files) {
      try {
        const kept = new Set(files);
        // Files an earlier run made that this one did not: they belong to no report now.
        for (const path of previousFiles) {
          if (!kept.has(path) && isInside(root, join(root, path))) rmSync(join(root, path), { force: true });
        }
        writeMarker(root, request.purpose, [...kept].sort());
      } finally {
        release();
      }
    },
  };
}

function statOrNull(path: string): Stats | null {
  try {
    return statSync(path);
  } catch {
    return null;
  }
}

function isInside(root: string, path: string): boolean {
  const inner = relative(root, path);
  return inner !== '' && !inner.startsWith('..') && !inner.startsWith(sep);
}

function readMarker(path: string): Marker | null {
  try {
    const parsed = JSON.parse(readFileSync(path, 'utf8')) as Partial<Marker>;
    if (typeof parsed !== 'object' || parsed === null || typeof parsed.guitar !== 'string') return null;
    return { ...(parsed as Marker), files: Array.isArray(parsed.files) ? parsed.files.filter((file): file is string => typeof file === 'string') : [] };
  } catch {
    return null;
  }
}

function writeMarker(root: string, purpose: FolderPurpose, files: readonly string[]): void {
  const marker: Marker = {
    about:
      'This folder was written by coilbench, which may replace the files it lists and its own reports in it. Delete this file and coilbench will treat the folder as not its own.',
    version: MARKER_VERSION,
    guitar: purpose.guitar,
    guitarFile: purpose.guitarFile,
    settings: purpose.settings,
    generator: purpose.generator,
    files,
  };
  writeFileAtomicSync(join(root, FOLDER_MARKER), `${JSON.stringify(marker, null, 2)}\n`);
}

/** "index.html, notes.txt, photos and 3 more". */
function listNames(names: readonly string[]): string {
  const shown = names.slice(0, NAMES_SHOWN).join(', ');
  return names.length > NAMES_SHOWN ? `${shown} and ${names.length - NAMES_SHOWN} more` : shown;
}

/** A folder coilbench did not make: refused, or (with --force) taken over, saying what will be replaced. */
function refuseOrTakeOver(request: ClaimRequest, entries: readonly string[]): void {
  const sorted = [...entries].sort();
  if (!request.force) {
    throw refusal(
      'a new or empty folder, or one coilbench made (it holds .coilbench-folder.json); name another with -o, or add --force to replace only coilbench\'s own files in it',
      `"${request.shownAs}", which holds ${listNames(sorted)}`,
    );
  }
  const replaced = sorted.filter((name) => request.ownNames.includes(name));
  const kept = sorted.filter((name) => !request.ownNames.includes(name));
  request.note(
    `--force: taking over ${request.shownAs}, which coilbench did not make: ` +
      (replaced.length > 0 ? `replacing ${listNames(replaced)} (files of coilbench's names only)` : 'none of its files has a name coilbench writes') +
      (kept.length > 0 ? `; leaving ${listNames(kept)} as they are` : ''),
  );
}

/** Make the folder and any missing parents; returns those it made, deepest first (empty if it was there). */
function createFolder(root: string): string[] {
  const made: string[] = [];
  for (let path = root; statOrNull(path) === null; path = dirname(path)) {
    made.push(path);
    if (dirname(path) === path) break;
  }
  try {
    mkdirSync(root, { recursive: true });
  } catch (error) {
    throw new WorkError(`cannot make the folder ${root}: ${(error as Error).message}`);
  }
  return made;
}

/** Remove folders this run made, if they are still empty (another run may have started writing into them). */
function removeEmptyFolders(folders: readonly string[]): void {
  for (const folder of folders) {
    try {
      rmdirSync(folder);
    } catch {
      return;
    }
  }
}

/** Every file and folder under coilbench's own names in `root`, relative, "/"-separated. */
function listOwnFiles(root: string, ownNames: readonly string[]): Set<string> {
  const found = new Set<string>();
  const walk = (relativePath: string): void => {
    found.add(relativePath);
    const info = statOrNull(join(root, relativePath));
    if (info?.isDirectory()) for (const name of readdirSync(join(root, relativePath))) walk(`${relativePath}/${name}`);
  };
  for (const name of ownNames) if (statOrNull(join(root, name)) !== null) walk(name);
  return found;
}

function readLockHolder(lock: string): LockHolder | null {
  try {
    const parsed = JSON.parse(readFileSync(lock, 'utf8')) as Partial<LockHolder>;
    return Number.isInteger(parsed.pid) ? { pid: parsed.pid as number, started: String(parsed.started ?? '?') } : null;
  } catch {
    return null;
  }
}

/** Is the process running? (A process of another user counts as running.) */
function processIsRunning(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function lockedError(lock: string, shownAs: string, holder: LockHolder): InputError {
  return refusal(
    'a folder no other coilbench run is writing (wait for that run to finish; if that process is not coilbench, delete the lock file)',
    `"${shownAs}", locked by process ${holder.pid} since ${holder.started} (${lock})`,
  );
}

function refuseIfLocked(lock: string, shownAs: string): void {
  const holder = readLockHolder(lock);
  if (holder !== null && processIsRunning(holder.pid)) throw lockedError(lock, shownAs, holder);
}

/**
 * Take the lock: the lock file is written whole under a temporary name and
 * hard-linked into place, which fails if a lock exists, so two runs can
 * never both hold it and nobody reads a half-written lock.
 */
function takeLock(lock: string, shownAs: string, note: (line: string) => void): void {
  const content = `${JSON.stringify({ pid: process.pid, started: new Date().toISOString() })}\n`;
  for (let attempt = 0; attempt < LOCK_ATTEMPTS; attempt += 1) {
    const temporary = `${lock}.${process.pid}.${randomBytes(6).toString('hex')}`;
    writeFileSync(temporary, content);
    try {
      linkSync(temporary, lock);
      return;
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      if (code !== 'EEXIST') {
        // A file system without hard links: create the lock exclusively instead.
        if (code === 'EPERM' || code === 'ENOTSUP' || code === 'EOPNOTSUPP') {
          try {
            writeFileSync(lock, content, { flag: 'wx' });
            return;
          } catch (inner) {
            if ((inner as NodeJS.ErrnoException).code !== 'EEXIST') throw inner;
          }
        } else {
          throw new WorkError(`cannot lock ${shownAs}: ${(error as Error).message}`);
        }
      }
    } finally {
      rmSync(temporary, { force: true });
    }
    const holder = readLockHolder(lock);
    if (holder === null) continue; // vanished (its run just finished) or being replaced: try again
    if (processIsRunning(holder.pid)) throw lockedError(lock, shownAs, holder);
    if (breakStaleLock(lock, holder)) {
      note(`taking over the lock of process ${holder.pid} (since ${holder.started}), which is no longer running (${lock})`);
    }
  }
  const holder = readLockHolder(lock);
  throw holder !== null ? lockedError(lock, shownAs, holder) : new WorkError(`cannot lock ${shownAs}: the lock file ${lock} keeps changing`);
}

/**
 * Remove a lock whose process is gone. Two runs may find the same stale
 * lock: a second lock file, taken exclusively, lets only one of them remove
 * it, after checking again that it is still the stale one.
 */
function breakStaleLock(lock: string, stale: LockHolder): boolean {
  const breaker = `${lock}${LOCK_BREAKER_SUFFIX}`;
  try {
    writeFileSync(breaker, String(process.pid), { flag: 'wx' });
  } catch {
    // Another run is clearing it; if that run died doing so, clear its claim for the next attempt.
    removeBreakerOfGoneRun(breaker);
    return false;
  }
  try {
    const holder = readLockHolder(lock);
    if (holder === null || holder.pid !== stale.pid || holder.started !== stale.started) return false;
    unlinkSync(lock);
    return true;
  } finally {
    rmSync(breaker, { force: true });
  }
}

/**
 * Remove the lock's helper files left by runs that are gone: a temporary lock
 * file (`.coilbench.lock.<pid>.<hex>`, takeLock) or a breaker
 * (`.coilbench.lock.break` holding its pid, breakStaleLock) whose process no
 * longer runs. A run killed between writing one and removing it left it in
 * the folder for good (seen after SIGKILL in test/interruption.test.ts). Called
 * with the lock held; a live process's files are its own to remove.
 */
function removeStaleLockFiles(root: string): void {
  for (const name of readdirSync(root)) {
    if (!name.startsWith(`${FOLDER_LOCK}.`)) continue;
    const path = join(root, name);
    if (name === `${FOLDER_LOCK}${LOCK_BREAKER_SUFFIX}`) {
      removeBreakerOfGoneRun(path);
      continue;
    }
    const [pidText = '', hex = '', ...rest] = name.slice(FOLDER_LOCK.length + 1).split('.');
    if (rest.length === 0 && /^\d+$/u.test(pidText) && /^[0-9a-f]+$/u.test(hex) && !processIsRunning(Number(pidText))) rmSync(path, { force: true });
  }
}

/** Remove the breaker `path` (its run's pid inside) when that run no longer runs. */
function removeBreakerOfGoneRun(path: string): void {
  let pid = Number.NaN;
  try {
    pid = Number(readFileSync(path, 'utf8').trim());
  } catch {
    return;
  }
  if (Number.isInteger(pid) && !processIsRunning(pid)) rmSync(path, { force: true });
}

function removeOwnLock(lock: string): void {
  const holder = readLockHolder(lock);
  if (holder?.pid === process.pid) rmSync(lock, { force: true });
}
