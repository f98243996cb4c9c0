/**
 * Worker threads for the render and the audio figures: how many to use, and
 * how to start one on a module in compiled or source form. Apart from the
 * render pass (run-render-pass.ts), so that a command measuring figures loads
 * neither the render pass nor the effects chain.
 */
import { availableParallelism } from 'node:os';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/** Threads to use by default: the machine's cores, at most two (the render's memory grows with each thread). */
export function defaultThreadCount(): number {
  return Math.max(1, Math.min(2, availableParallelism()));
}

/** The ESM entry of tsx's loader API, read from its package's exports map (development only: tsx is a dev dependency). */
function tsxLoaderUrl(): string {
  const manifestPath = createRequire(import.meta.url).resolve('tsx/package.json');
  const manifest = JSON.parse(readFileSync(manifestPath, 'utf8')) as { exports: Record<string, { import: { default: string } }> };
  const entry = manifest.exports['./esm/api']?.import.default ?? './dist/esm/api/index.mjs';
  return pathToFileURL(join(dirname(manifestPath), entry)).href;
}

/**
 * Start a worker thread on the module at `entry` (a URL of a .js or .ts
 * file): compiled code directly, or, when running from source (development
 * and tests), a small script that registers tsx's loader in the worker and
 * then imports the TypeScript module.
 */
export function startWorkerModule(entry: URL, workerData: unknown): Worker {
  if (!entry.pathname.endsWith('.ts')) return new Worker(entry, { workerData });
  const loader = tsxLoaderUrl();
  const source = `import(${JSON.stringify(loader)}).then((api) => { api.register(); return import(${JSON.stringify(entry.href)}); });`;
  return new Worker(source, { eval: true, workerData });
}
