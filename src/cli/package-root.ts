/** Finds files shipped with the package (samples, schema) from compiled or source code alike. */
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The folder holding coilbench's package.json. */
export function packageRoot(): string {
  let folder = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (existsSync(join(folder, 'package.json')) && existsSync(join(folder, 'samples'))) return folder;
    const parent = dirname(folder);
    if (parent === folder) throw new Error('coilbench: cannot find the package folder');
    folder = parent;
  }
}

/** The bundled demo guitar. */
export function demoGuitarPath(): string {
  return join(packageRoot(), 'samples', 'three-single-coil.json');
}
