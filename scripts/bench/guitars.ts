/** Guitars the benches use: the bundled samples, and a five-coil guitar made from one of them (invented values). */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { type Guitar, parseGuitar, parseGuitarText } from '../../src/guitar/index.js';

export const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

export function sample(file: string): Guitar {
  return parseGuitarText(readFileSync(join(SAMPLES, file), 'utf8'), file);
}

/** Five coils: the four-coil sample plus a single coil between mid and bridge (invented values), as guitar-file text. */
export function fiveCoilGuitarJson(): string {
  const raw = JSON.parse(readFileSync(join(SAMPLES, 'humbucker-two-single-coil.json'), 'utf8')) as { name: string; coils: unknown[] };
  raw.name = 'Bench five-coil guitar (invented values)';
  raw.coils.push({ id: 'extra', position: '70mm', resistance: '6.3k', inductance: '2.55H', capacitance: '120p', winding: 'cw', magnet: 'north' });
  return JSON.stringify(raw, null, 2);
}

/** The five-coil guitar, parsed. */
export function fiveCoilGuitar(): Guitar {
  return parseGuitar(JSON.parse(fiveCoilGuitarJson()));
}
