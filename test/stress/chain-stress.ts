/**
 * Chained-render stress: many short drive-chain renders at once on two
 * worker threads (several contexts in flight per thread), while more threads
 * burn the CPU, counting the renders that fail.
 *
 *   npx tsx test/stress/chain-stress.ts [renders per thread] [old]
 *
 * runs it alone and prints the counts; `old` renders the way the code did
 * before the library's race was handled (the promise's value only).
 */
import { startWorkerModule } from '../../src/render/index.js';
import type { BurnJob, StressJob, StressReport } from './chain-stress-worker.js';

export interface StressOptions {
  /** Worker threads rendering (default 2: both cores of the reference machine). */
  readonly threads: number;
  readonly rendersPerThread: number;
  /** Contexts in flight at once per thread. */
  readonly concurrency: number;
  /** Extra threads spinning to load the CPU while the renders run. */
  readonly burners: number;
  readonly frames: number;
  readonly sampleRateHz: number;
  readonly mode: 'new' | 'old';
}

export const DEFAULT_STRESS: StressOptions = Object.freeze({
  threads: 2,
  rendersPerThread: 150,
  concurrency: 6,
  burners: 2,
  frames: 1200,
  sampleRateHz: 48_000,
  mode: 'new',
});

const WORKER = new URL('./chain-stress-worker.ts', import.meta.url);
/** Longest a stress may burn the CPU, ms (the burners stop by themselves then, even if a render hangs). */
const BURN_LIMIT_MS = 60_000;

function run<T>(job: StressJob | BurnJob): Promise<T> {
  return new Promise((resolve, reject) => {
    const worker = startWorkerModule(WORKER, job);
    worker.once('message', (message: T) => {
      resolve(message);
      void worker.terminate();
    });
    worker.once('error', reject);
  });
}

export async function runChainStress(options: Partial<StressOptions> = {}): Promise<StressReport & { threads: number }> {
  const settings = { ...DEFAULT_STRESS, ...options };
  const untilMs = Date.now() + BURN_LIMIT_MS;
  const burners = Array.from({ length: settings.burners }, () => startWorkerModule(WORKER, { kind: 'burn', untilMs } satisfies BurnJob));
  try {
    const job: StressJob = {
      kind: 'render',
      renders: settings.rendersPerThread,
      concurrency: settings.concurrency,
      frames: settings.frames,
      sampleRateHz: settings.sampleRateHz,
      mode: settings.mode,
    };
    const reports = await Promise.all(Array.from({ length: settings.threads }, () => run<StressReport>(job)));
    return {
      threads: settings.threads,
      renders: reports.reduce((sum, report) => sum + report.renders, 0),
      failures: reports.reduce((sum, report) => sum + report.failures, 0),
      fromEvent: reports.reduce((sum, report) => sum + report.fromEvent, 0),
      firstFailure: reports.find((report) => report.firstFailure !== null)?.firstFailure ?? null,
      checksum: reports.reduce((sum, report) => sum + report.checksum, 0),
    };
  } finally {
    await Promise.all(burners.map((burner) => burner.terminate()));
  }
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').at(-1) ?? '\0')) {
  const perThread = Number(process.argv[2] ?? DEFAULT_STRESS.rendersPerThread);
  const mode = process.argv[3] === 'old' ? 'old' : 'new';
  const started = Date.now();
  const report = await runChainStress({ rendersPerThread: perThread, mode });
  console.log(JSON.stringify({ mode, ...report, seconds: (Date.now() - started) / 1000 }));
}
