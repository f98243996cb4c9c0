/**
 * Renders a guitar's wirings into a folder: one WAV per wiring (the same
 * performance through each), its SPICE netlist, and report.json for the
 * listening page. Two passes keep memory bounded whatever the number of
 * wirings: the first renders each wiring once, measures it, and parks the
 * processed audio in a scratch file; the second applies the gains (which
 * need every wiring's peak or loudness) and writes the final files.
 *
 * Every output is written atomically, and a manifest records what each was
 * made from, so a re-run skips what is complete and unchanged and an
 * interrupted run is completed by the next one.
 */
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { basename, join, relative } from 'node:path';
import { type CircuitOverrides, type WiringCircuitMetrics, phaseClassKey, renderNetlist } from '../circuit/index.js';
import { type AlikeThresholds, type DistinctGroups, measureSpectralBasis } from '../analysis/index.js';
import { WorkError } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import {
  type ListeningReport,
  type ReportSwitchPosition,
  type ReportGroups,
  type ReportWiring,
  reportGuitar,
} from '../report/index.js';
import type { Phrase } from '../string/index.js';
import type { Wiring } from '../wiring/index.js';
import type { ChainName } from './chain-name.js';
import {
  type RawAudioMetrics,
  REFERENCE_PHRASE,
  REFERENCE_SAMPLE_RATE_HZ,
  REFERENCE_SEED,
  REFERENCE_FIGURES_VERSION,
  RENDER_TAIL_S,
  referLevels,
  referenceCoilsOf,
} from './measure-wiring-audio.js';
import { type AudioSettings, type HumMix, type PassItem, type WiringRenderer, createWiringRenderer, isReferencePerformance } from './render-pass.js';
import { runRenderPassOnThreads } from './run-render-pass.js';
import { defaultThreadCount } from './worker-threads.js';
import { type OutputFolder, netlistFileName, wavFileName } from './output-folder.js';
import { gainToDb, planMatchedGains, planTrueLevelGain } from './plan-gains.js';
import { MANIFEST_VERSION, type Manifest, hashOf, hashWithShared, readManifest } from './render-manifest.js';
import type { WavFormat } from './wav-file.js';
import { type EncodedWav, encodeFinalWav } from './encode-final-wav.js';
import { ENCODE_THREAD_IN_FLIGHT, encodeThreadPays, startEncodeThread } from './encode-thread.js';
import { readScratchAudio } from './scratch-audio.js';
import { atomicWritesStopped, createDeferredSync, removeStaleTempFiles, writeFileAtomic, writeFileAtomicSync } from './write-file-atomic.js';
import { writeJsonFileAtomicSync } from './write-json-file.js';
import { activeScratchFolders } from './scratch-folders.js';
import { type FileRecord, fileMatches } from './file-record.js';
import { maxOf } from '../math/index.js';
import type { PageSettings } from './write-listening-page.js';
import { type PendingAnalysis, prepareRenderAnalysis } from './render-analysis-thread.js';

/** Bump when the sound of a render changes for the same inputs (string model, pickup, chain), so old files are redone. 3: stiff strings (inharmonicity on by default). */
export const RENDER_MODEL_VERSION = 3;
/** File writes allowed to run in the background at once (each holds one encoded file in memory). */
const MAX_PENDING_WRITES = 4;
/**
 * Netlists written between two turns of the event loop: each costs about
 * 0.1 ms (its text and its file), so a Ctrl-C waits a few milliseconds at
 * most (judgement, as PAUSE_INTERVAL_MS in pause-for-signals.ts).
 */
const NETLISTS_PER_TURN = 64;
/** Least time between manifest saves while writing files, ms: an interrupted run loses at most this much record (the files themselves are always whole). */
const MANIFEST_SAVE_INTERVAL_MS = 250;
/**
 * Processed audio a render may hold in memory between its passes, bytes,
 * shared by its threads: a thread whose wirings' audio all fits holds it,
 * any other parks all of its audio in scratch files (render-pass.ts). 32 MB
 * holds the 47 wirings of three coils (about 0.5 MB each for a 2.6 s phrase
 * at 48 kHz); a render of hundreds or thousands of wirings holds none.
 */
const PARK_IN_MEMORY_BYTES = 32 * 2 ** 20;

export type { HumMix };

export interface RenderRequest {
  readonly guitar: Guitar;
  /** Every wiring of the guitar (levels refer to its single-element wirings). */
  readonly all: readonly Wiring[];
  /** The wirings to render. */
  readonly selected: readonly Wiring[];
  readonly phrase: Phrase;
  readonly chain: ChainName;
  readonly sampleRateHz: number;
  readonly format: WavFormat;
  readonly level: 'true' | 'matched';
  readonly hum: HumMix | null;
  readonly overrides: CircuitOverrides;
  /** Seed of the pluck noise for the files. */
  readonly seed: number;
  readonly folder: OutputFolder;
  /** Name of the generator for report.json ("coilbench 0.1.0"). */
  readonly generator: string;
  /** Write the WAV files (default true); false writes only the page, netlists and reports. */
  readonly writeWav?: boolean;
  /** Threads for the first pass (default: the machine's cores, at most two). */
  readonly threads?: number;
  /** "Sounds alike" thresholds for the groups in the report (src/analysis defaults when absent). */
  readonly thresholds?: Partial<AlikeThresholds>;
  /** A switch plan's positions in order (`switch --render`): the report and page label the wirings by position. */
  readonly positions?: readonly ReportSwitchPosition[];
  /** Run the analysis (circuit figures, groups, response curves) on a thread of its own (default: when the machine has a second core). */
  readonly analysisThread?: boolean;
  /** Processed audio held in memory between the passes, bytes (default PARK_IN_MEMORY_BYTES; the rest goes to scratch files). */
  readonly parkInMemoryBytes?: number;
  /** Encode part of the final WAV files on a second thread (default: for ENCODE_THREAD_MIN_FILES files or more, on a machine with a second core). */
  readonly encodeThread?: boolean;
}

export interface RenderEvents {
  /** A stage begins ("measuring", "writing"). */
  readonly onStage?: (stage: string, total: number) => void;
  /** One more wiring done in the current stage. */
  readonly onStep?: (done: number, total: number) => void;
}

export interface RenderedWiring {
  readonly wiring: Wiring;
  readonly circuit: WiringCircuitMetrics;
  readonly levelDb: number;
  readonly loudnessLufs: number;
  readonly centroidHz: number;
  /** Path of the WAV relative to the folder, or null with `writeWav: false`. */
  readonly wav: string | null;
}

export interface RenderOutcome {
  readonly report: ListeningReport;
  readonly rows: readonly RenderedWiring[];
  readonly written: number;
  readonly skipped: number;
  /** Common gain of true-level files, dB; null for loudness-matched files. */
  readonly commonGainDb: number | null;
  /** Loudness every matched file reaches, LUFS; null for true-level files. */
  readonly matchedLoudnessLufs: number | null;
  readonly audioSeconds: number;
  /** Which wirings of `scope` sound alike (in `scope` order). */
  readonly distinct: DistinctGroups;
  /** The wirings `distinct` covers: every wiring, or for `--only` on a guitar of more than 1000 wirings the rendered ones and the single elements. */
  readonly scope: readonly Wiring[];
}

/** What the manifest keeps per wiring, keyed by canonical expression. */
interface Entry {
  metricsHash?: string;
  metrics?: RawAudioMetrics;
  audioHash?: string;
  /** Peak, length and (for matched files) loudness of the processed audio before gain. */
  audio?: { peak: number; loudnessLufs: number | null; frames: number };
  fileHash?: string;
  file?: string;
  /** Size and SHA-256 of the WAV as written: a re-run keeps it only if it still matches. */
  written?: { wav: FileRecord };
}

/** The parts of a guitar that shape its sound (names and notes do not). */
function soundOf(guitar: Guitar): unknown {
  return { ...guitar, name: undefined, notes: undefined, assumed: undefined, coils: guitar.coils.map((coil) => ({ ...coil, notes: undefined })) };
}


export async function renderGuitar(request: RenderRequest, events: RenderEvents = {}): Promise<RenderOutcome> {
  // The analysis (circuit figures, groups, response curves) needs no audio: it starts now, on its own
  // thread where there is a second core, and loads its code while the strings are rendered.
  const scope = distinctScope(request.all, request.selected);
  const analysis = prepareRenderAnalysis(
    { guitar: request.guitar, overrides: request.overrides, selected: request.selected.map((wiring) => wiring.network), scope, thresholds: request.thresholds },
    request.analysisThread ?? defaultThreadCount() > 1,
  );
  try {
    return await renderWith(request, events, analysis, scope);
  } finally {
    await analysis.cancel();
  }
}

async function renderWith(request: RenderRequest, events: RenderEvents, analysis: PendingAnalysis, scope: readonly Wiring[]): Promise<RenderOutcome> {
  const { guitar, folder } = request;
  for (const path of [folder.root, folder.wavFolder, folder.netlistFolder]) {
    mkdirSync(path, { recursive: true });
    removeStaleTempFiles(path);
  }
  const scratch = folder.scratch;
  rmSync(scratch, { recursive: true, force: true });
  mkdirSync(scratch, { recursive: true });
  activeScratchFolders.add(scratch);

  // Files are renamed into place without an fsync each; their folders are synced once at the end (write-file-atomic.ts).
  const deferred = createDeferredSync();
  const manifest = readManifest<Entry>(folder.manifest);
  const entries: Record<string, Entry> = { ...manifest.entries };
  let lastSave = performance.now();
  const saveManifest = async (force = true): Promise<void> => {
    if (!force && performance.now() - lastSave < MANIFEST_SAVE_INTERVAL_MS) return;
    // Entries, and each entry's fields, in key order, not in the order runs happened to record them (the figures may
    // arrive after the audio): a resumed render writes the same bytes as an uninterrupted one.
    const byKey = <T>([a]: [string, T], [b]: [string, T]): number => (a < b ? -1 : a > b ? 1 : 0);
    const sorted = Object.fromEntries(Object.entries(entries).sort(byKey).map(([key, entry]) => [key, Object.fromEntries(Object.entries(entry).sort(byKey)) as Entry]));
    const document: Manifest<Entry> = { version: MANIFEST_VERSION, entries: sorted };
    await writeFileAtomic(folder.manifest, JSON.stringify(document), deferred);
    lastSave = performance.now();
  };

  const sound = soundOf(guitar);
  const base = { model: RENDER_MODEL_VERSION, sound, overrides: request.overrides };
  // Every field but the expression is the same for every wiring: its JSON is made once (hashWithShared).
  const metricsHash = hashWithShared({ ...base, phrase: REFERENCE_PHRASE, rate: REFERENCE_SAMPLE_RATE_HZ, seed: REFERENCE_SEED, tail: RENDER_TAIL_S, figures: REFERENCE_FIGURES_VERSION });
  const metricsHashOf = (wiring: Wiring): string => metricsHash({ expression: wiring.expression });
  const audioHash = hashWithShared({
    ...base,
    phrase: request.phrase.notes,
    chain: request.chain,
    rate: request.sampleRateHz,
    seed: request.seed,
    hum: request.hum,
    tail: RENDER_TAIL_S,
  });
  const audioHashOf = (wiring: Wiring): string => audioHash({ expression: wiring.expression });

  // The strings of the reference phrase, rendered once: the figures, the reference synthesis, the analysis and the page all use them.
  const basis = measureSpectralBasis(guitar);
  const referenceCoils = referenceCoilsOf(guitar, basis);
  const settings: AudioSettings = {
    referenceCoils,
    parkInMemoryBytes: request.parkInMemoryBytes ?? PARK_IN_MEMORY_BYTES,
    guitar,
    overrides: request.overrides,
    phrase: request.phrase,
    chain: request.chain,
    sampleRateHz: request.sampleRateHz,
    seed: request.seed,
    hum: request.hum,
    measureProcessedLoudness: request.level === 'matched',
  };

  // Pass 1: metrics (reference render) and processed audio (file render) for every wiring needed
  // that the manifest does not already hold, spread over threads.
  const selectedIds = new Set(request.selected.map((wiring) => wiring.id));
  // Phase patterns of one network shape share their transfers: render them one after another.
  const needed = groupByShape(guitar, request.all.filter((wiring) => wiring.elements.length === 1 || selectedIds.has(wiring.id)));
  const raw = new Map<string, RawAudioMetrics>();
  const scratchFiles = new Map<string, string>();
  const inMemory = new Map<string, Float32Array>();
  const items: PassItem[] = [];
  const hashes = new Map<string, { metricsHash: string; audioHash: string }>();
  for (const wiring of needed) {
    const entry: Entry = (entries[wiring.expression] ??= {});
    const metricsHash = metricsHashOf(wiring);
    const audioHash = audioHashOf(wiring);
    hashes.set(wiring.id, { metricsHash, audioHash });
    const metricsCached = entry.metricsHash === metricsHash && entry.metrics !== undefined;
    if (metricsCached && entry.metrics) raw.set(wiring.id, entry.metrics);
    const missingLoudness = request.level === 'matched' && entry.audio?.loudnessLufs === null;
    const audioCached = entry.audioHash === audioHash && entry.audio !== undefined && !missingLoudness;
    const wantAudio = request.writeWav !== false && selectedIds.has(wiring.id) && !audioCached;
    if (!metricsCached || wantAudio) items.push({ id: wiring.id, name: wiring.expression, network: wiring.network, metrics: !metricsCached, audio: wantAudio });
  }
  const expressionOf = new Map(needed.map((wiring) => [wiring.id, wiring.expression]));
  // While there is audio to render, the analysis measures the audio figures too (the audio threads do nothing else);
  // with none (--no-wav, or every file kept) they are measured in the first pass beside the analysis.
  const figuresInAnalysis = items.some((item) => item.audio) ? items.filter((item) => item.metrics) : [];
  analysis.start(basis, figuresInAnalysis.map((item) => item.network), referenceCoils);
  const passItems = figuresInAnalysis.length === 0 ? items : items.filter((item) => item.audio).map((item) => ({ ...item, metrics: false }));
  events.onStage?.('rendering', passItems.length);
  let step = 0;
  // With no audio to render (--no-wav, or every file kept) the pass is figures only, and the analysis thread already
  // keeps the second core busy: a worker would only compete with it (measured, five coils, 9,997 wirings, render
  // --no-wav: 12.0 and 14.7 s, peak 377 and 379 MB, on this thread; 13.4 and 15.2 s, 417 and 431 MB, with a worker).
  const passThreads = analysis.onThread && passItems.every((item) => !item.audio) ? 1 : (request.threads ?? defaultThreadCount());
  // With the analysis on a thread of its own, the pass's worker starts once that thread is done (run-render-pass.ts).
  const analysisDone = analysis.onThread ? analysis.result() : undefined;
  const results = await runRenderPassOnThreads(
    settings,
    passItems,
    scratch,
    passThreads,
    () => {
      step += 1;
      events.onStep?.(step, passItems.length);
    },
    undefined,
    analysisDone,
  );
  for (const result of results) {
    const entry = entries[expressionOf.get(result.id) ?? ''] as Entry;
    const hash = hashes.get(result.id);
    if (result.metrics && hash) {
      raw.set(result.id, result.metrics);
      Object.assign(entry, { metricsHash: hash.metricsHash, metrics: result.metrics });
    }
    if (result.audio && (result.scratch || result.samples) && hash) {
      if (result.scratch) scratchFiles.set(result.id, result.scratch);
      if (result.samples) inMemory.set(result.id, result.samples);
      Object.assign(entry, { audioHash: hash.audioHash, audio: result.audio, fileHash: undefined, written: undefined });
    }
  }
  let renderer: WiringRenderer | undefined;
  const processedAudio = (wiring: Wiring): Promise<Float32Array> => {
    renderer ??= createWiringRenderer(settings);
    return renderer.processed(wiring.network, wiring.expression);
  };
  await saveManifest();
  // A wiring whose chain failed twice: what the others made is kept in the manifest, so the same command finishes the work.
  const failures = results.filter((result) => result.failure !== undefined).map((result) => result.failure as string);
  if (failures.length > 0) {
    rmSync(scratch, { recursive: true, force: true });
    activeScratchFolders.delete(scratch);
    await deferred.flush();
    throw new WorkError(`${failures.join('; ')}; nothing written was lost, and running the same command again finishes the render`);
  }

  // Gains: one for all files, or one per file to a common loudness.
  const selected = request.selected;
  const peaks = selected.map((wiring) => entries[wiring.expression]?.audio?.peak ?? 0);
  let gains: number[];
  let commonGainDb: number | null = null;
  let matchedLoudnessLufs: number | null = null;
  if (request.level === 'true') {
    const gain = planTrueLevelGain(peaks);
    gains = selected.map(() => gain);
    commonGainDb = gainToDb(gain);
  } else {
    const planned = planMatchedGains(
      selected.map((wiring) => entries[wiring.expression]?.audio?.loudnessLufs ?? Number.NaN),
      peaks,
    );
    gains = [...planned.gains];
    matchedLoudnessLufs = Number.isFinite(planned.targetLufs) ? planned.targetLufs : null;
  }

  // The report needs the analysis and the gains, not the files: it is built as soon as the analysis answers (at once
  // when it already has), between two files if need be, and the page's bytes are then made on the analysis thread
  // while this one goes on writing files. Circuit metrics (read from the response as the strings drive it) for the
  // rendered wirings; groups for every wiring, or (when only some of more than MAX_WIRINGS_GROUPED_FOR_SOME are asked
  // for) among the chosen ones and the single elements, so that one wiring of a six-element guitar costs one wiring,
  // not 228,386. The figures measured there join the manifest in memory here, and on disk with its next save.
  const reported = analysis.result().then(({ figures, drive, circuit, distinct, responseFrequenciesHz: responseGrid, responsesDb }) => {
    figuresInAnalysis.forEach((item, index) => {
      const metrics = figures[index] as RawAudioMetrics;
      const hash = hashes.get(item.id);
      raw.set(item.id, metrics);
      if (hash) Object.assign(entries[expressionOf.get(item.id) ?? ''] as Entry, { metricsHash: hash.metricsHash, metrics });
    });
    const audioMetrics = referLevels(request.all, raw);
    const circuitById = new Map(selected.map((wiring, index) => [wiring.id, circuit.wirings[index] as WiringCircuitMetrics]));
    const groupById = new Map(scope.map((wiring, index) => [wiring.id, distinct.groups.groupOf[index] ?? null]));

    const rows: RenderedWiring[] = selected.map((wiring) => {
      const audio = audioMetrics.get(wiring.id);
      return {
        wiring,
        circuit: circuitById.get(wiring.id) as WiringCircuitMetrics,
        levelDb: audio?.levelDb ?? Number.NaN,
        loudnessLufs: audio?.loudnessLufs ?? Number.NaN,
        centroidHz: audio?.centroidHz ?? Number.NaN,
        wav: request.writeWav === false ? null : relative(folder.root, join(folder.wavFolder, wavFileName(wiring))).split('\\').join('/'),
      };
    });
    const reportWirings: ReportWiring[] = rows.map((row, index) => {
      const response = responsesDb[index] ?? null;
      return {
        id: row.wiring.id,
        number: row.wiring.number,
        expression: row.wiring.expression,
        description: row.wiring.description,
        coils: row.wiring.elementIds,
        topology: row.wiring.topology,
        outOfPhase: row.wiring.outOfPhase,
        wav: row.wav,
        levelDb: row.levelDb,
        loudnessLufs: row.loudnessLufs,
        centroidHz: row.centroidHz,
        resonanceHz: row.circuit.resonanceHz,
        peakDb: row.circuit.peakDb ?? 0,
        resonanceQ: row.circuit.resonanceQ,
        humDb: row.circuit.humDb ?? 0,
        humCancelling: row.circuit.humCancelling,
        humCategory: row.circuit.humCategory,
        responseDb: response ? Array.from(response) : [],
        group: groupById.get(row.wiring.id) ?? null,
      };
    });

    const frames = selected.map((wiring) => entries[wiring.expression]?.audio?.frames ?? 0);
    const durationS = Math.max(0, maxOf(frames)) / request.sampleRateHz;
    // Audio made in this run (cached files cost nothing).
    const audioSeconds = (results.filter((result) => result.audio).length * durationS);
    const report: ListeningReport = {
      generator: request.generator,
      guitar: reportGuitar(guitar, basename(folder.root), circuit.load),
      render: {
        phrase: request.phrase.name,
        chain: request.chain,
        sampleRateHz: request.sampleRateHz,
        durationS,
        level: request.level,
        commonGainDb: commonGainDb ?? 0,
        mainsHz: circuit.load.mainsHz,
        humMixHz: request.hum?.mainsHz ?? null,
        format: request.format,
      },
      responseFrequenciesHz: Array.from(responseGrid),
      wirings: reportWirings,
      groups: reportGroups(scope, distinct),
      ...(request.positions === undefined ? {} : { positions: request.positions }),
    };
    // The page's bytes, made on the analysis thread (idle now) while this one writes the WAV files, when there is one.
    const referencePerformance = isReferencePerformance(request.phrase, request.sampleRateHz, request.seed);
    const pageSettings: PageSettings = {
      guitar,
      phrase: request.phrase,
      sampleRateHz: request.sampleRateHz,
      seed: request.seed,
      overrides: request.overrides,
      hum: request.hum,
      drive,
      ...(referencePerformance ? { coils: referenceCoils } : {}),
    };
    const page = analysis.renderPage(report, pageSettings);
    page.catch(() => undefined); // awaited below (so not reported as unhandled if the WAV files fail first)
    return { report, rows, audioSeconds, distinct, page };
  });
  reported.catch(() => undefined); // awaited below, after the files

  // Pass 2: final files. With many files a second thread encodes some of them (encode-thread.ts) while this one
  // encodes and writes the others: the bytes are the same from either thread, and only this thread writes files.
  const writes = createWriteQueue(MAX_PENDING_WRITES);
  events.onStage?.('writing', selected.length);
  let written = 0;
  let skipped = 0;
  const encoder = request.writeWav !== false && (request.encodeThread ?? encodeThreadPays(selected.length)) ? startEncodeThread() : null;
  const handedOver: Promise<void>[] = [];
  let spare: Float32Array | undefined;
  try {
    for (const [index, wiring] of selected.entries()) {
      const entry = entries[wiring.expression] as Entry;
      const gain = gains[index] ?? 1;
      const name = wavFileName(wiring);
      const path = join(folder.wavFolder, name);
      const fileHash = hashOf({ audio: entry.audioHash, gain: gain.toPrecision(12), format: request.format, name });
      // Kept only if the file still matches the size and SHA-256 recorded when it was written.
      const intact = entry.written !== undefined && fileMatches(path, entry.written.wav);
      if (request.writeWav === false || (entry.fileHash === fileHash && entry.file === name && intact)) {
        skipped += 1;
      } else {
        const parked = scratchFiles.get(wiring.id);
        const held = inMemory.get(wiring.id);
        inMemory.delete(wiring.id);
        // Handed to the encoding thread while it has room: a parked file is read there, not here.
        const handOver = encoder !== null && encoder.inFlight() < ENCODE_THREAD_IN_FLIGHT;
        const audio = held ?? (parked === undefined ? await processedAudio(wiring) : handOver ? null : readScratchAudio(parked, spare));
        const options = {
          sampleRateHz: request.sampleRateHz,
          format: request.format,
          info: {
            name: wiring.expression,
            comment: `${wiring.description}; phrase ${request.phrase.name}; ${request.chain} chain; ${request.level === 'true' ? 'true relative level' : 'loudness matched'}`,
            software: request.generator,
          },
        };
        // Written in the background while the next wiring is prepared; the manifest records a file only once it is whole.
        const write = (encoded: EncodedWav): Promise<void> =>
          writes.add(async () => {
            await writeFileAtomic(path, encoded.bytes, deferred);
            Object.assign(entry, { fileHash, file: name, written: { wav: encoded.record } });
          });
        if (encoder !== null && handOver) {
          const done = encoder.encode(audio ?? { scratch: parked as string }, gain, options).then(write);
          done.catch(() => undefined); // awaited below (so not reported as unhandled meanwhile)
          handedOver.push(done);
        } else {
          const samples = audio as Float32Array;
          await write(encodeFinalWav(samples, gain, options));
          // Read from scratch for this file alone: the next file read here reuses it (its bytes are the WAV's own).
          if (held === undefined && parked !== undefined) spare = samples;
        }
        await saveManifest(false);
        written += 1;
      }
      events.onStep?.(index + 1, selected.length);
    }
    await Promise.all(handedOver);
  } catch (error) {
    // Keep the record of every file already whole, so a re-run skips them and finishes the rest.
    await Promise.allSettled(handedOver);
    await writes.drain().catch(() => undefined);
    await saveManifest();
    await deferred.flush();
    throw error;
  } finally {
    await encoder?.close();
  }
  await writes.drain();
  await saveManifest();
  rmSync(scratch, { recursive: true, force: true });
  activeScratchFolders.delete(scratch);

  // Netlists, one per rendered wiring (written only when their text changed): small files, written one after
  // another (writeFileAtomicSync), a turn of the event loop every NETLISTS_PER_TURN so a Ctrl-C is answered.
  for (const [index, wiring] of selected.entries()) {
    const path = join(folder.netlistFolder, netlistFileName(wiring));
    const text = renderNetlist(guitar, wiring, request.overrides);
    if (!existsSync(path) || readFileSync(path, 'utf8') !== text) writeFileAtomicSync(path, text, deferred);
    if (index % NETLISTS_PER_TURN === NETLISTS_PER_TURN - 1) {
      await new Promise<void>((resolve) => setImmediate(resolve));
      // An interrupt is being handled: start no other file (the process is about to exit).
      if (atomicWritesStopped()) await new Promise<never>(() => undefined);
    }
  }

  const { report, rows, audioSeconds, distinct, page } = await reported;
  if (figuresInAnalysis.length > 0) await saveManifest();
  writeJsonFileAtomicSync(folder.reportJson, report); // in chunks: 38 MB for 9,997 wirings (write-json-file.ts)
  // Rewritten by every run, so its folder's one fsync at the end serves it as it does the WAV files (write-file-atomic.ts).
  await writeFileAtomic(folder.page, await page, deferred);
  await deferred.flush();
  return { report, rows, written, skipped, commonGainDb, matchedLoudnessLufs, audioSeconds, distinct, scope };
}

/**
 * Most wirings a guitar may have for `--only` renders to still group all of them (four elements: 572,
 * a second or two), so that their group numbers are those of `analyze`; beyond it (9,997 and 228,386
 * wirings) the groups are among the chosen wirings and the single elements.
 */
const MAX_WIRINGS_GROUPED_FOR_SOME = 1000;

/** The wirings whose groups a render reports: all of them, or the chosen ones and the single elements (in numbering order). */
function distinctScope(all: readonly Wiring[], selected: readonly Wiring[]): readonly Wiring[] {
  if (selected.length === all.length || all.length <= MAX_WIRINGS_GROUPED_FOR_SOME) return all;
  const chosen = new Set(selected.map((wiring) => wiring.id));
  return all.filter((wiring) => wiring.elements.length === 1 || chosen.has(wiring.id));
}

/** The report's record of the groups of alike wirings. */
function reportGroups(all: readonly Wiring[], distinct: DistinctGroups): ReportGroups {
  const count = distinct.groups.groups.length;
  const { levelDb, spectrumDb, brightnessPercent } = distinct.thresholds;
  return {
    summary: `${all.length} wirings, ${count} audibly distinct group${count === 1 ? '' : 's'} at these thresholds`,
    thresholds: { levelDb, spectrumDb, brightnessPercent },
    groups: distinct.groups.groups.map((group) => ({
      group: group.number,
      members: group.members.map((member) => all[member]?.id ?? '?'),
      expressions: group.members.map((member) => all[member]?.expression ?? '?'),
    })),
  };
}

/**
 * Runs file writes in the background, at most `limit` at a time: `add` waits
 * only when the queue is full, `drain` waits for everything. The first
 * failure is thrown by the next `add` or by `drain`.
 */
function createWriteQueue(limit: number): { add(write: () => Promise<void>): Promise<void>; drain(): Promise<void> } {
  const pending = new Set<Promise<void>>();
  let failure: unknown;
  const settle = async (): Promise<void> => {
    if (failure !== undefined) throw failure;
  };
  return {
    async add(write) {
      while (pending.size >= limit) await Promise.race(pending);
      await settle();
      const task: Promise<void> = write()
        .catch((error: unknown) => {
          failure ??= error;
        })
        .finally(() => pending.delete(task));
      pending.add(task);
    },
    async drain() {
      await Promise.all(pending);
      await settle();
    },
  };
}

/** Wirings reordered so those sharing a network shape (a phase class, with coupled coils) are adjacent (stable within one). */
function groupByShape(guitar: Guitar, wirings: readonly Wiring[]): Wiring[] {
  const groups = new Map<string, Wiring[]>();
  for (const wiring of wirings) {
    const key = phaseClassKey(guitar, wiring.network);
    groups.set(key, [...(groups.get(key) ?? []), wiring]);
  }
  return [...groups.values()].flat();
}

