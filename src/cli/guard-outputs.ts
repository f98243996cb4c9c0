/**
 * Inputs are never written: before a command writes anything, every path it
 * will write is compared with every file it reads (both resolved, following
 * symbolic links), and every output path is checked for what would make the
 * write fail late (a folder where a file is meant, a file where a folder is
 * meant, a missing or unwritable parent, a name too long). All problems are
 * reported at once as bad input (exit status 2) and nothing is written.
 */
import { accessSync, constants, realpathSync, statSync } from 'node:fs';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';
import { InputError, type InputProblem, describeFileSystemCode, fileSystemCodeOf } from '../errors/index.js';

/** Longest name of one path component, bytes (NAME_MAX on Linux and macOS file systems). */
export const MAX_NAME_BYTES = 255;
/** Longest whole path, bytes (PATH_MAX on Linux). */
export const MAX_PATH_BYTES = 4096;

/** Names a render writes inside its folder (files, and folders whose whole contents it owns). */
export const RENDER_FOLDER_ENTRIES: readonly string[] = Object.freeze([
  'index.html',
  'report.json',
  'report.md',
  'wirings.csv',
  '.coilbench-manifest.json',
  'wav/',
  'netlists/',
  '.scratch/',
]);

export interface OutputTarget {
  /** The option or argument that named it (`--csv`, `-o`), for messages. */
  readonly option: string;
  /** As the user wrote it (relative to the working folder). */
  readonly path: string;
  /** A file written whole, or a folder the command writes into. */
  readonly kind: 'file' | 'folder';
  /** For a folder: the entries written inside it ("name" a file, "name/" everything below); defaults to a render's. */
  readonly entries?: readonly string[];
}

/** A path with symbolic links resolved as far as it exists; the part that does not exist yet is appended unchanged. */
export function resolveThroughLinks(path: string): string {
  let existing = path;
  const rest: string[] = [];
  for (;;) {
    try {
      const real = realpathSync(existing);
      return rest.length === 0 ? real : join(real, ...rest.reverse());
    } catch {
      const parent = dirname(existing);
      if (parent === existing) return path;
      rest.push(basename(existing));
      existing = parent;
    }
  }
}

function kindOf(path: string): 'file' | 'folder' | 'other' | 'missing' {
  try {
    const info = statSync(path);
    return info.isDirectory() ? 'folder' : info.isFile() ? 'file' : 'other';
  } catch {
    return 'missing';
  }
}

/** The nearest folder above `path` that exists (where a new file or folder would be created). */
function nearestExistingFolder(path: string): string {
  let folder = dirname(path);
  while (kindOf(folder) === 'missing' && dirname(folder) !== folder) folder = dirname(folder);
  return folder;
}

function isInside(child: string, parent: string): boolean {
  const between = relative(parent, child);
  return between !== '' && !between.startsWith('..') && !between.startsWith(sep) && between !== '..';
}

/** Problems with one output path on its own (length, kind, parent). */
function checkTarget(target: OutputTarget, full: string, problems: InputProblem[]): boolean {
  const at = target.option;
  const tooLong = full.split(sep).find((part) => Buffer.byteLength(part) > MAX_NAME_BYTES);
  if (tooLong !== undefined) {
    problems.push({ path: at, expected: `a path whose every name has at most ${MAX_NAME_BYTES} bytes`, got: `a name of ${Buffer.byteLength(tooLong)} bytes` });
    return false;
  }
  if (Buffer.byteLength(full) > MAX_PATH_BYTES) {
    problems.push({ path: at, expected: `a path of at most ${MAX_PATH_BYTES} bytes`, got: `${Buffer.byteLength(full)} bytes` });
    return false;
  }
  const kind = kindOf(full);
  if (target.kind === 'file' && kind === 'folder') {
    problems.push({ path: at, expected: 'a file name (it is written whole)', got: `the folder ${JSON.stringify(target.path)}` });
    return false;
  }
  if (target.kind === 'folder' && (kind === 'file' || kind === 'other')) {
    problems.push({ path: at, expected: 'a folder to write into (new or from an earlier run)', got: `the existing file ${JSON.stringify(target.path)}` });
    return false;
  }
  if (target.kind === 'file' && kind === 'other') {
    problems.push({ path: at, expected: 'a regular file name', got: `${JSON.stringify(target.path)}, which is not a regular file` });
    return false;
  }
  const parent = target.kind === 'file' ? dirname(full) : kind === 'folder' ? full : nearestExistingFolder(full);
  if (kindOf(parent) === 'file' || kindOf(parent) === 'other') {
    problems.push({ path: at, expected: 'a path whose every step is a folder', got: `${JSON.stringify(target.path)}, which passes through a file` });
    return false;
  }
  if (target.kind === 'file' && kindOf(parent) !== 'folder') {
    problems.push({ path: at, expected: 'a file in an existing folder', got: `${JSON.stringify(target.path)} (no folder ${JSON.stringify(dirname(target.path))})` });
    return false;
  }
  try {
    accessSync(parent, constants.W_OK);
  } catch (error) {
    problems.push({ path: at, expected: 'a place this user may write', got: `${JSON.stringify(target.path)}: ${describeFileSystemCode(fileSystemCodeOf(error))}` });
    return false;
  }
  return true;
}

/**
 * Throws InputError when an output would write over an input or cannot be
 * written. `inputs` are the files the command reads (relative to `cwd`).
 */
export function guardOutputs(inputs: readonly string[], outputs: readonly OutputTarget[], cwd: string): void {
  const problems = findOutputProblems(inputs, outputs, cwd);
  if (problems.length > 0) throw new InputError(problems);
}

/** The problems guardOutputs would throw, for commands that gather every problem before refusing. */
export function findOutputProblems(inputs: readonly string[], outputs: readonly OutputTarget[], cwd: string): InputProblem[] {
  const problems: InputProblem[] = [];
  const realInputs = inputs.map((input) => ({ input, real: resolveThroughLinks(resolve(cwd, input)) }));
  for (const target of outputs) {
    const full = resolve(cwd, target.path);
    if (!checkTarget(target, full, problems)) continue;
    const real = resolveThroughLinks(full);
    for (const { input, real: inputReal } of realInputs) {
      let clash = false;
      if (target.kind === 'file') clash = real === inputReal;
      else {
        clash = real === inputReal || (target.entries ?? RENDER_FOLDER_ENTRIES).some((entry) => {
          const written = resolveThroughLinks(join(real, entry));
          return entry.endsWith('/') ? inputReal === written || isInside(inputReal, written) : inputReal === written;
        });
      }
      if (clash) {
        problems.push({
          path: target.option,
          expected: target.kind === 'file' ? 'a file other than the files read' : 'a folder where no file read would be written over',
          got: `${JSON.stringify(target.path)}, which would overwrite the input ${JSON.stringify(input)}`,
        });
      }
    }
  }
  return problems;
}
