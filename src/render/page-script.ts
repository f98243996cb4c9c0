/**
 * The listening page's script as built by `npm run build` (scripts/build-page.mjs
 * bundles src/page/main.ts with esbuild into dist/page.js). Read once per
 * process; the page inlines it and pins it by hash in its policy.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | undefined;

/** The folder holding coilbench's package.json (from compiled or source code alike). */
function packageFolder(): string {
  let folder = dirname(fileURLToPath(import.meta.url));
  while (!existsSync(join(folder, 'package.json'))) {
    const parent = dirname(folder);
    if (parent === folder) throw new Error('coilbench: cannot find the package folder');
    folder = parent;
  }
  return folder;
}

/** The bundled page script; throws a clear error when the package was not built. */
export function readPageScript(): string {
  if (cached !== undefined) return cached;
  const path = join(packageFolder(), 'dist', 'page.js');
  if (!existsSync(path)) throw new Error(`coilbench: the listening page's script ${path} is missing: run "npm run build"`);
  // "</script" cannot occur in the bundle's code outside strings; escaped inside them it means the same.
  cached = readFileSync(path, 'utf8').replaceAll('</script', '<\\/script');
  return cached;
}
