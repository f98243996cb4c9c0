/**
 * Worker-thread half of the chained-render stress (chain-stress.ts): renders
 * many short takes through the drive chain, several at once in this thread,
 * and posts back how many failed, how many buffers came from the `complete`
 * event (the library's lost race) and a checksum of every output.
 *
 * `mode: 'old'` renders the way the code did before the race was handled
 * (the promise's value only), to measure how often that failed.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { designEffectsChain, resolveChainOptions } from '../../src/render/index.js';
import { prepareChainContext, renderChainDesign } from '../../src/render/render-chain-design.js';
import type { ChainDesign } from '../../src/render/index.js';

export interface StressJob {
  readonly kind: 'render';
  readonly renders: number;
  readonly concurrency: number;
  readonly frames: number;
  readonly sampleRateHz: number;
  readonly mode: 'new' | 'old';
}
export interface BurnJob {
  readonly kind: 'burn';
  readonly untilMs: number;
}
export interface StressReport {
  readonly renders: number;
  readonly failures: number;
  readonly fromEvent: number;
  readonly firstFailure: string | null;
  /** Σ of every output sample times its index: equal across runs when every render is right. */
  readonly checksum: number;
}

/** The old rendering: the promise's value only (it may be null). */
async function renderOld(samples: Float32Array, design: ChainDesign): Promise<Float32Array> {
  const rendered = await (await prepareChainContext(samples, design)).startRendering();
  const output = new Float32Array(samples.length);
  rendered.copyFromChannel(output, 0, design.latencyFrames);
  return output;
}

/** A short decaying tone, different for each render index (so a mixed-up buffer changes the checksum). */
function take(index: number, frames: number, sampleRateHz: number): Float32Array {
  const out = new Float32Array(frames);
  const hz = 110 + (index % 17) * 23;
  for (let n = 0; n < frames; n += 1) out[n] = 0.3 * Math.exp(-n / frames) * Math.sin((2 * Math.PI * hz * n) / sampleRateHz);
  return out;
}

export async function runStress(job: StressJob): Promise<StressReport> {
  const design = designEffectsChain('drive', resolveChainOptions({}), job.sampleRateHz);
  let next = 0;
  let failures = 0;
  let fromEvent = 0;
  let checksum = 0;
  let firstFailure: string | null = null;
  const lane = async (): Promise<void> => {
    while (next < job.renders) {
      const index = next;
      next += 1;
      try {
        const input = take(index, job.frames, job.sampleRateHz);
        const output =
          job.mode === 'old'
            ? await renderOld(input, design)
            : await renderChainDesign(input, design, (source) => {
                if (source === 'complete-event') fromEvent += 1;
              });
        for (let n = 0; n < output.length; n += 1) checksum += (output[n] as number) * ((n % 7) + 1) * ((index % 5) + 1);
      } catch (error) {
        failures += 1;
        firstFailure ??= error instanceof Error ? error.message : String(error);
      }
    }
  };
  await Promise.all(Array.from({ length: job.concurrency }, lane));
  return { renders: job.renders, failures, fromEvent, firstFailure, checksum };
}

const port = parentPort;
if (port) {
  const job = workerData as StressJob | BurnJob;
  if (job.kind === 'burn') {
    // Added CPU load: spin until told time is up.
    let x = 0;
    while (Date.now() < job.untilMs) x = Math.sqrt(x + 1);
    port.postMessage(x);
  } else {
    port.postMessage(await runStress(job));
  }
}
