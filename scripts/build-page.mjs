#!/usr/bin/env node
// Bundles the pages' scripts (src/page/main.ts for the listening page,
// src/page/comparison-main.ts for the comparison page of `compare --render`,
// and the modules they import: the circuit, wiring, synthesis and loudness
// code the command line runs) into dist/page.js and dist/comparison-page.js,
// each one self-contained IIFE the render inlines into its page. Run by
// `npm run build` (and so by `prepare`).
import { build } from 'esbuild';
import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
mkdirSync(join(root, 'dist'), { recursive: true });
const entries = [
  ['main.ts', 'page.js'],
  ['comparison-main.ts', 'comparison-page.js'],
];
await Promise.all(entries.map(([entry, output]) => build({
  entryPoints: [join(root, 'src', 'page', entry)],
  outfile: join(root, 'dist', output),
  bundle: true,
  format: 'iife',
  platform: 'browser',
  target: 'es2022',
  minify: true,
  legalComments: 'none',
  charset: 'utf8',
  logLevel: 'warning',
})));
