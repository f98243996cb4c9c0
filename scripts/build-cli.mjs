#!/usr/bin/env node
// Bundles the command line for start-up: src/cli.ts into dist/cli.js, and
// each worker entry the render starts (src/render/*-worker.ts) into
// dist/<name>.js beside it, where the bundled startRenderWorker looks for
// them (a URL relative to the running file). One file per thread instead of
// about 130 modules to resolve and compile: measured on the 2-core machine,
// a 47-wiring render started about 0.15 s sooner (node 20.20; see
// DEVELOPERS.md, "Start-up").
//
// The packages the command line uses are bundled too (commander, fft.js), but
// node-web-audio-api stays a package import: it loads a native addon, and
// only the drive chain asks for it (render-chain-design.ts imports it on
// first need). Run by `npm run build`, after tsc, whose own dist/cli.js it
// replaces; tsc's per-module output stays for the in-process bench.
import { build } from 'esbuild';
import { chmodSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/** Source files of the worker entries, by the naming the render uses (`startRenderWorker('<name>')` ↔ src/render/<name>.ts). */
export function workerEntries(repository = root) {
  const folder = join(repository, 'src', 'render');
  return readdirSync(folder)
    .filter((name) => name.endsWith('-worker.ts'))
    .map((name) => join(folder, name));
}

/**
 * Bundle the command line and its workers into `outFolder` (dist/ by default). cli.js keeps the first line of
 * src/cli.ts (the one that starts Node with the allocator setting) and is made executable: that is how
 * `coilbench` runs it.
 */
export async function bundleCommandLine(outFolder = join(root, 'dist'), repository = root) {
  const common = {
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    external: ['node-web-audio-api'],
    // commander and fft.js are CommonJS: their require() of Node's own modules needs a require in an ES module.
    banner: { js: "import { createRequire as __coilbenchRequire } from 'node:module'; const require = __coilbenchRequire(import.meta.url);" },
    legalComments: 'eof',
    logLevel: 'warning',
  };
  await build({ ...common, entryPoints: [join(repository, 'src', 'cli.ts')], outfile: join(outFolder, 'cli.js') });
  chmodSync(join(outFolder, 'cli.js'), 0o755);
  await build({ ...common, entryPoints: workerEntries(repository), outdir: outFolder });
}

if (process.argv[1] === fileURLToPath(import.meta.url)) await bundleCommandLine();
