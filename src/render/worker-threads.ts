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
import { fileURLToPath, pathToFileURL } from 'node:url';
import { type ResourceLimits, Worker } from 'node:worker_threads';
import { WorkError } from '../errors/index.js';
import { type WorkerFailure, errorOfFailure } from './worker-failure.js';

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
export function startWorkerModule(entry: URL, workerData: unknown, resourceLimits?: ResourceLimits): Worker {
  const limits = resourceLimits === undefined ? {} : { resourceLimits };
  if (!entry.pathname.endsWith('.ts')) return new Worker(entry, { workerData, ...limits });
  const loader = tsxLoaderUrl();
  const source = `import(${JSON.stringify(loader)}).then((api) => { api.register(); return import(${JSON.stringify(entry.href)}); });`;
  return new Worker(source, { eval: true, workerData, ...limits });
}

/** Start the worker entry `name` of this folder (render/), in the form (.js or .ts) this file runs in. */
export function startRenderWorker(name: string, workerData: unknown, resourceLimits?: ResourceLimits): Worker {
  const extension = fileURLToPath(import.meta.url).endsWith('.ts') ? 'ts' : 'js';
  return startWorkerModule(new URL(`./${name}.${extension}`, import.meta.url), workerData, resourceLimits);
}

/**
 * The young generation of a thread that measures many wirings (the render's
 * analysis, `analyze`'s audio figures), MB: three semi-spaces of 4 MB, where
 * V8 sizes them for throughput (up to 16 MB each on 64-bit machines). These
 * threads make many small short-lived arrays, and a smaller nursery holds
 * fewer of them at once. Measured on the 2-core machine, five coils, 9,997
 * wirings, three alternating runs: `analyze` (its figures thread limited)
 * peaked at 190–198 MB against 229–255 MB, in 16.0–17.3 s against
 * 15.1–16.9 s.
 */
export const MEASURING_THREAD_LIMITS: ResourceLimits = Object.freeze({ maxYoungGenerationSizeMb: 12 });

/**
 * The result of a worker that runs one job. Every message but a failure goes
 * to `read`, which returns the result once the job is done (undefined for a
 * step on the way). A posted failure is rethrown with its class
 * (worker-failure.ts); a worker error, or an exit before the result, is a
 * WorkError naming `what`. The worker is stopped once the job is settled,
 * unless `then` is 'keep' (a thread with a second job to come: the caller
 * stops it).
 */
export function jobResult<Message extends { readonly kind: string }, Result>(
  worker: Worker,
  what: string,
  read: (message: Exclude<Message, WorkerFailure>) => Result | undefined,
  then: 'stop' | 'keep' = 'stop',
): Promise<Result> {
  return new Promise((resolve, reject) => {
    let settled = false;
    const settle = (action: () => void): void => {
      if (settled) return;
      settled = true;
      action();
      if (then === 'stop') void worker.terminate();
    };
    worker.on('message', (message: Message | WorkerFailure) => {
      if (message.kind === 'failed') {
        settle(() => reject(errorOfFailure(message as WorkerFailure, what)));
        return;
      }
      const result = read(message as Exclude<Message, WorkerFailure>);
      if (result !== undefined) settle(() => resolve(result));
    });
    worker.on('error', (error) => settle(() => reject(new WorkError(`${what} failed: ${error.message}`, { cause: error }))));
    worker.on('exit', (code) => {
      if (!settled) reject(new WorkError(`${what} stopped (exit code ${code})`));
    });
  });
}
