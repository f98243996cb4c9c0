/**
 * Reads a file named on the command line (a guitar or phrase file), turning
 * every file-system failure into one clear input problem, and refusing what
 * is not a regular file or is too large before reading it.
 */
import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { InputError, describeFileSystemCode } from '../errors/index.js';
import { MAX_JSON_CHARACTERS } from '../guitar/index.js';

/** Largest input file read, bytes (UTF-8 takes at most 4 bytes per character of the text limit; a file beyond that is refused unread). */
export const MAX_INPUT_FILE_BYTES = 4 * MAX_JSON_CHARACTERS;

/** The text of `path` (relative to `cwd`); `what` says what it should be ("a guitar file (JSON)"). Throws InputError. */
export function readInputText(path: string, cwd: string, what: string): string {
  const full = resolve(cwd, path);
  const refuse = (got: string): InputError => new InputError([{ path, expected: `a readable ${what}`, got }]);
  try {
    const info = statSync(full);
    if (info.isDirectory()) throw refuse('a folder');
    if (!info.isFile()) throw refuse('something that is not a regular file');
    if (info.size > MAX_INPUT_FILE_BYTES) throw refuse(`a file of ${info.size} bytes (at most ${MAX_INPUT_FILE_BYTES} are read)`);
    return readFileSync(full, 'utf8');
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    throw refuse(code === 'ENOENT' ? 'no such file' : describeFileSystemCode(code));
  }
}
