/**
 * The first pass of a render spread over threads: the wirings are split into
 * groups of whole network shapes (phase patterns of one shape share their
 * transfers), one group stays on this thread and the others go to worker
 * threads. Each wiring's result depends on nothing but its own input, so the
 * output is the same, byte for byte, however it is split.
 */
import type { Worker } from 'node:worker_threads';
import { phaseClassKey } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { type AudioSettings, type PassHandOff, type PassItem, type PassResult, createWiringRenderer, runRenderPass, runRenderPassWith } from './render-pass.js';
import type { WorkerJob, WorkerMessage } from './render-worker.js';
import { shapeKey } from '../wiring/index.js';
import { minOf, appendAll } from '../math/index.js';
import { jobResult, startRenderWorker } from './worker-threads.js';
import { createPause } from './pause-for-signals.js';

/**
 * Fewest wirings worth a worker thread, whatever the effects chain: a worker starts cold
 * (loading its code, preparing the synthesis again) and shares the two cores
 * with the render's analysis thread, so it pays only when each thread gets
 * about a second of work. Every chain is our own code but the drive's
 * clipper, whose audio graph renders on the library's own thread while this
 * one synthesises the next wiring (render-pass.ts, AUDIO_IN_FLIGHT), so one
 * thread keeps more than a core busy. Measured on the 2-core machine,
 * alternating builds, 47 wirings: drive on one thread with two wirings in
 * flight 1.94–2.02 s, 225 MB, against 2.34–2.64 s, 300 MB on two threads
 * with one (on one thread with one, 2.54–3.40 s against 2.80–3.40 s);
 * compressed on one thread 1.87–1.99 s, 191 MB, against 2.01–2.08 s, 240 MB
 * on two; direct and clean were already faster on one. 572 wirings through
 * drive still gain from the second thread: 11.7 s, 393 MB on two against
 * 13.3 s, 321 MB on one (one run each).
 */
export const MIN_ITEMS_PER_THREAD = 50;

/**
 * What a wiring's reference figures cost against its file audio through the
 * direct chain, as a weight: figures come from the coils' cross-spectra
 * (about 0.1–0.4 ms a wiring) where file audio needs a synthesis, an inverse
 * FFT and the file's measures (about 10–25 ms), so figures alone need about
 * fifty times as many wirings to be worth a thread (measured with
 * `npm run bench -- commands` on a 2-core machine).
 */
export const FIGURES_ITEM_WEIGHT = 0.02;

/** Work of one item in units of one wiring's direct file audio. */
function itemWeight(item: PassItem): number {
  return item.audio ? 1 : item.metrics ? FIGURES_ITEM_WEIGHT : 0;
}

/**
 * How much more work the calling thread's share holds than a worker's: a
 * worker starts about 0.5–0.7 s after the caller (loading its code) and then
 * shares the cores with the render's analysis thread, so with equal shares
 * the caller waited for it (measured in CPU profiles of the four-coil
 * sample, 572 wirings direct, 2 threads: the caller idle about 0.5 s at the
 * end of the pass with equal shares, about 0.25 s with this weight).
 * Shares never change a result, only which thread computes it.
 */
export const OWN_SHARE_WEIGHT = 1.25;

/**
 * Split items into at most `parts` runs of whole shapes (largest shapes
 * placed first, each on the run with the least work for its weight): the
 * first run, the caller's, weighs `firstWeight`, the others 1.
 */
export function splitByShape(items: readonly PassItem[], parts: number, firstWeight = 1): PassItem[][] {
  const groups = new Map<string, PassItem[]>();
  for (const item of items) {
    const key = shapeKey(item.network);
    groups.set(key, [...(groups.get(key) ?? []), item]);
  }
  const weight = (group: readonly PassItem[]): number => group.reduce((sum, item) => sum + itemWeight(item), 0);
  const ordered = [...groups.values()].sort((a, b) => weight(b) - weight(a));
  const bins: PassItem[][] = Array.from({ length: parts }, () => []);
  const loads = new Array<number>(parts).fill(0);
  const capacity = (bin: number): number => (bin === 0 ? firstWeight : 1);
  for (const group of ordered) {
    const filled = loads.map((load, bin) => load / capacity(bin));
    const lightest = filled.indexOf(minOf(filled));
    appendAll(bins[lightest] ?? [], group);
    loads[lightest] = (loads[lightest] ?? 0) + weight(group);
  }
  return bins.filter((bin) => bin.length > 0);
}

function runInWorker(job: WorkerJob, onStep: () => void, workers: Worker[]): Promise<PassResult[]> {
  const worker = startRenderWorker('render-worker', job);
  workers.push(worker);
  return jobResult<WorkerMessage, PassResult[]>(worker, 'render worker', (message) => {
    if (message.kind === 'done') return message.results;
    onStep();
    return undefined;
  });
}

/**
 * How many of `rest` (a pass's wirings not yet started, phase class by phase
 * class) the pass keeps when it gives the others to a worker starting now:
 * none given when they weigh under `minItemsPerThread`; else the pass keeps
 * OWN_SHARE_WEIGHT parts to the worker's one (the worker starts cold), cut
 * where a phase class ends so that no class is solved on both threads.
 */
export function keptOnHandOff(guitar: Guitar, rest: readonly PassItem[], minItemsPerThread: number): number {
  const weights = rest.map(itemWeight);
  const total = weights.reduce((sum, weight) => sum + weight, 0);
  if (total < minItemsPerThread) return rest.length;
  const keep = (total * OWN_SHARE_WEIGHT) / (OWN_SHARE_WEIGHT + 1);
  let kept = 0;
  let cut = 0;
  while (cut < rest.length && kept < keep) {
    kept += weights[cut] as number;
    cut += 1;
  }
  const classOf = (item: PassItem | undefined): string | undefined => (item === undefined ? undefined : phaseClassKey(guitar, item.network));
  while (cut < rest.length && classOf(rest[cut]) === classOf(rest[cut - 1])) cut += 1;
  return cut;
}

/**
 * Run the first pass on up to `threads` threads; results in the order of `items`.
 *
 * `coreFreed`, when given, settles once another thread of the render (its
 * analysis) has finished with a core: the pass then starts on this thread
 * alone, and a worker takes part of what is left at that moment
 * (keptOnHandOff). Three threads on two cores gained nothing over two, and
 * each render thread holds its own synthesis (measured, five coils, 9,997
 * wirings direct: about 70 MB of WebAssembly memory a render thread).
 * Without it the wirings are split at the start (splitByShape).
 */
export async function runRenderPassOnThreads(
  settings: AudioSettings,
  items: readonly PassItem[],
  scratchFolder: string,
  threads: number,
  onStep?: () => void,
  minItemsPerThread = MIN_ITEMS_PER_THREAD,
  coreFreed?: Promise<unknown>,
): Promise<PassResult[]> {
  const work = items.reduce((sum, item) => sum + itemWeight(item), 0);
  const parts = Math.max(1, Math.min(threads, Math.floor(work / minItemsPerThread)));
  if (parts <= 1) return runRenderPass(settings, items, scratchFolder, () => onStep?.());
  if (coreFreed !== undefined && parts === 2) return runRenderPassHandingOff(settings, items, scratchFolder, coreFreed, onStep, minItemsPerThread);
  const [own = [], ...others] = splitByShape(items, parts, OWN_SHARE_WEIGHT);
  // The in-memory allowance is the render's, shared by its threads.
  const shared: AudioSettings = { ...settings, parkInMemoryBytes: Math.floor((settings.parkInMemoryBytes ?? 0) / parts) };
  const step = (): void => onStep?.();
  const workers: Worker[] = [];
  let batches: PassResult[][];
  try {
    batches = await Promise.all([
      ...others.map((chunk) => runInWorker({ settings: shared, items: chunk, scratchFolder }, step, workers)),
      runRenderPass(shared, own, scratchFolder, step),
    ]);
  } catch (error) {
    await Promise.all(workers.map((worker) => worker.terminate()));
    throw error;
  }
  return inItemOrder(items, batches);
}

/** The pass on this thread, part of what is left handed to one worker once `coreFreed` settles (runRenderPassOnThreads). */
async function runRenderPassHandingOff(
  settings: AudioSettings,
  items: readonly PassItem[],
  scratchFolder: string,
  coreFreed: Promise<unknown>,
  onStep: (() => void) | undefined,
  minItemsPerThread: number,
): Promise<PassResult[]> {
  let free = false;
  coreFreed.then(
    () => (free = true),
    () => (free = true),
  );
  const step = (): void => onStep?.();
  const workers: Worker[] = [];
  const handed: { results?: Promise<PassResult[]> } = {};
  // The analysis thread's answer arrives only on a turn of the event loop, which a pass of direct wirings (no real
  // waits) would never take: a turn every PAUSE_INTERVAL_MS.
  const pause = createPause();
  const handOff: PassHandOff = {
    freed: async () => {
      await pause();
      return free;
    },
    take: (rest, holdingAll) => {
      const kept = keptOnHandOff(settings.guitar, rest, minItemsPerThread);
      if (kept < rest.length) {
        // The worker holds its audio in memory as this thread does (the render's allowance covers all of it), or parks it all.
        const shared: AudioSettings = { ...settings, parkInMemoryBytes: holdingAll === false ? 0 : (settings.parkInMemoryBytes ?? 0) };
        handed.results = runInWorker({ settings: shared, items: rest.slice(kept), scratchFolder }, step, workers);
        // Awaited below, after this thread's share: a failure meanwhile must not be an unhandled rejection.
        handed.results.catch(() => undefined);
      }
      return kept;
    },
  };
  let batches: PassResult[][];
  try {
    const own = await runRenderPassWith(createWiringRenderer(settings), settings, items, scratchFolder, step, undefined, handOff);
    batches = [own, handed.results === undefined ? [] : await handed.results];
  } catch (error) {
    await Promise.all(workers.map((worker) => worker.terminate()));
    throw error;
  }
  return inItemOrder(items, batches);
}

/** The threads' results in the order of `items` (flat() passes over the places a pass handed off). */
function inItemOrder(items: readonly PassItem[], batches: readonly PassResult[][]): PassResult[] {
  const byId = new Map(batches.flat().map((result) => [result.id, result]));
  return items.map((item) => byId.get(item.id) as PassResult);
}
