/** Writes a file under a temporary name in the same folder, then renames it, so a reader never sees half a file. */
import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { WorkError } from '../errors/index.js';

export function writeFileAtomic(path: string, text: string): void {
  const temporary = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  try {
    writeFileSync(temporary, text, 'utf8');
    renameSync(temporary, path);
  } catch (error) {
    rmSync(temporary, { force: true });
    const code = (error as NodeJS.ErrnoException).code ?? 'error';
    throw new WorkError(`could not write ${path} (${code})`, { cause: error });
  }
}
