/** Reads a guitar file from disk, turning file-system failures into clear input errors. */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { InputError } from '../errors/index.js';
import { type Guitar, parseGuitarText } from '../guitar/index.js';

export function readGuitarFile(path: string, cwd: string): Guitar {
  const full = resolve(cwd, path);
  let text: string;
  try {
    text = readFileSync(full, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const got = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : `an unreadable file (${code ?? 'error'})`;
    throw new InputError([{ path, expected: 'a readable guitar file (JSON)', got }]);
  }
  return parseGuitarText(text, path);
}
