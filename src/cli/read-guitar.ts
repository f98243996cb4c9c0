/** Reads a guitar file from disk, turning file-system failures into clear input errors. */
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import { readInputText } from './read-input-file.js';

export function readGuitarFile(path: string, cwd: string): Guitar {
  return parseGuitarText(readInputText(path, cwd, 'guitar file (JSON)'), path);
}
