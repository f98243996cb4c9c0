#!/usr/bin/env node
// Bundles the listening page's script (src/page/main.ts and the modules it
// imports: the circuit, wiring, synthesis and loudness code the command line
// runs) into dist/page.js, one self-contained IIFE the render inlines into
// each page. Run by `npm run build` (and so by `prepare`).
import { build } from 'esbuild';
import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
mkdirSync(join(root, 'dist'), { recursive: true });
await build({
  entryPoints: [join(root, 'src', 'page', 'main.ts')],
  outfile: join(root, 'dist', 'page.js'),
  bundle: true,
  format: 'iife',
  platform: 'browser',
  target: 'es2022',
  minify: true,
  legalComments: 'none',
  charset: 'utf8',
  logLevel: 'warning',
});
