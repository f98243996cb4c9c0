/**
 * The pages' scripts as built by `npm run build` (scripts/build-page.mjs
 * bundles src/page/main.ts into dist/page.js for the listening page and
 * src/page/comparison-main.ts into dist/comparison-page.js for the comparison
 * page). Each is read once per process; the page inlines it and pins it by
 * hash in its policy.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The bundles: which page → its file in dist/. */
const BUNDLES = { listening: 'page.js', comparison: 'comparison-page.js' } as const;
export type PageScriptName = keyof typeof BUNDLES;

const cached = new Map<PageScriptName, string>();

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

/** The bundled script of a page (the listening page's by default); throws a clear error when the package was not built. */
export function readPageScript(name: PageScriptName = 'listening'): string {
  const known = cached.get(name);
  if (known !== undefined) return known;
  const path = join(packageFolder(), 'dist', BUNDLES[name]);
  if (!existsSync(path)) throw new Error(`coilbench: the ${name} page's script ${path} is missing: run "npm run build"`);
  // "</script" cannot occur in the bundle's code outside strings; escaped inside them it means the same.
  const script = readFileSync(path, 'utf8').replaceAll('</script', '<\\/script');
  cached.set(name, script);
  return script;
}
