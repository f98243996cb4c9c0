/**
 * The first pass of a render, for a list of wirings: each wiring's reference
 * render measured (docs/design.md metrics) and/or its file audio made (phrase,
 * hum, effects chain) and parked in a scratch file, with its peak and, for
 * loudness-matched files, its loudness. Runs in the main thread or in a
 * worker thread alike (render-worker.ts): its input and output are plain data.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { measureLoudness } from '../analysis/index.js';
import { InputError, WorkError } from '../errors/index.js';
import { type CircuitOverrides, phaseClassKey } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { appendAll } from '../math/index.js';
import type { Phrase } from '../string/index.js';
import type { Network } from '../wiring/index.js';
import type { ChainName } from './chain-name.js';
import { renderEffectsChain } from './effects-chain.js';
import { type AudioFigureMeter, measureFiguresByClass } from '../analysis/index.js';
import {
  type RawAudioMetrics,
  REFERENCE_PHRASE,
  REFERENCE_SAMPLE_RATE_HZ,
  REFERENCE_SEED,
  RENDER_TAIL_S,
  prepareReferenceFigures,
  prepareReferenceSynthesis,
  renderReferenceCoils,
} from './measure-wiring-audio.js';
import { PEAK_CEILING_DB } from './plan-gains.js';
import { samplePasses } from './sample-passes.js';
import { audioWithHeaderRoom } from './wav-file.js';
import { type CoilSignals, type WiringSynthesis, assertAudible, prepareWiringSynthesis } from './synthesize-wirings.js';

export interface HumMix {
  readonly mainsHz: 50 | 60;
  /** Peak EMF the mains field induces in a coil of hum sensitivity 1, volts. */
  readonly emfVolts: number;
}

/** What shapes the audio of every file (the same for all wirings of a render). */
export interface AudioSettings {
  readonly guitar: Guitar;
  readonly overrides: CircuitOverrides;
  readonly phrase: Phrase;
  readonly chain: ChainName;
  readonly sampleRateHz: number;
  readonly seed: number;
  readonly hum: HumMix | null;
  /** Measure the loudness of the processed audio (loudness-matched files need it). */
  readonly measureProcessedLoudness: boolean;
  /**
   * The coils' signals for the reference phrase, when the caller already has
   * them (`referenceCoilsOf` of its spectral basis): the strings are then not
   * rendered again, in this thread or in a worker.
   */
  readonly referenceCoils?: CoilSignals;
  /**
   * Bytes of processed audio a pass may hold in memory, handed back in its
   * results: when all of the pass's audio fits, it is all held; otherwise
   * every wiring's audio goes to a scratch file (default 0). Holding only a
   * part would keep those megabytes through the whole pass and the writing
   * after it, for the few files it spares a read.
   */
  readonly parkInMemoryBytes?: number;
}

export interface PassItem {
  readonly id: string;
  /** The wiring's name (canonical expression), for messages. */
  readonly name?: string;
  readonly network: Network;
  /** Measure the reference figures (levels, loudness, centroid; from the coils' cross-spectra, no render)? */
  readonly metrics: boolean;
  /** Make the file's audio and park it? */
  readonly audio: boolean;
}

export interface PassResult {
  readonly id: string;
  readonly metrics?: RawAudioMetrics;
  readonly audio?: { readonly peak: number; readonly loudnessLufs: number | null; readonly frames: number };
  /** Scratch file holding the processed audio (raw float32), when made and not held in memory. */
  readonly scratch?: string;
  /** The processed audio itself, when made and held in memory (within `parkInMemoryBytes`). */
  readonly samples?: Float32Array;
  /** Why the file audio could not be made (the effects chain failed twice); the metrics, if asked for, are still there. */
  readonly failure?: string;
}

export interface WiringRenderer {
  /** The reference figures of wirings (docs/design.md metrics, before levels are referred to the single coils), in their order. */
  figures(networks: readonly Network[]): RawAudioMetrics[];
  /**
   * The processed audio of a wiring (file phrase, hum, chain), before gain.
   * A failed chain render is tried once more; a second failure is a
   * WorkError naming `name`. The synthesis writes into `into` when given
   * (a buffer of the render's length the caller no longer needs): reusing
   * memory the process already has, where a fresh buffer costs the
   * operating system's zeroing of new pages.
   */
  processed(network: Network, name?: string, into?: Float32Array): Promise<Float32Array>;
  readonly sampleRateHz: number;
}

/** Do files of this phrase, rate and seed play the reference performance (so its coil signals serve them)? */
export function isReferencePerformance(phrase: Phrase, sampleRateHz: number, seed: number): boolean {
  return phrase.name === REFERENCE_PHRASE && sampleRateHz === REFERENCE_SAMPLE_RATE_HZ && seed === REFERENCE_SEED;
}

/** Syntheses made on first need, so work that is all cached renders nothing. */
export function createWiringRenderer(settings: AudioSettings): WiringRenderer {
  // The reference phrase's coil signals serve both the figures and, when the files play the same performance, the files.
  let coils: CoilSignals | undefined;
  const referenceCoils = (): CoilSignals => (coils ??= settings.referenceCoils ?? renderReferenceCoils(settings.guitar));
  let reference: WiringSynthesis | undefined;
  const referenceSynthesis = (): WiringSynthesis => {
    reference ??= prepareReferenceSynthesis(settings.guitar, settings.overrides, referenceCoils());
    assertAudible(reference, 'controls.volume.setting');
    return reference;
  };
  let meter: AudioFigureMeter | undefined;
  const referenceFigures = (): AudioFigureMeter => {
    meter ??= prepareReferenceFigures(settings.guitar, settings.overrides, referenceCoils());
    assertAudible(meter, 'controls.volume.setting');
    return meter;
  };
  const sameAsReference = isReferencePerformance(settings.phrase, settings.sampleRateHz, settings.seed);
  let files: WiringSynthesis | undefined;
  const fileSynthesis = (): WiringSynthesis => {
    if (sameAsReference) return referenceSynthesis();
    files ??= prepareWiringSynthesis(settings.guitar, settings.phrase, {
      sampleRateHz: settings.sampleRateHz,
      seed: settings.seed,
      overrides: settings.overrides,
      strings: { tailS: RENDER_TAIL_S },
    });
    assertAudible(files, 'controls.volume.setting');
    return files;
  };
  return {
    sampleRateHz: settings.sampleRateHz,
    figures: (networks) => (networks.length === 0 ? [] : measureFiguresByClass(settings.guitar, referenceFigures(), networks)),
    async processed(network, name, into) {
      const synthesis = fileSynthesis();
      // A fresh buffer has room before it for the WAV header, so that the second pass can make the file over it (wav-file.ts).
      const audio = synthesis.synthesize(network, into !== undefined && into.length === synthesis.length ? into : audioWithHeaderRoom(synthesis.length));
      if (settings.hum) {
        const hum = synthesis.synthesizeHum(network, settings.hum.mainsHz, settings.hum.emfVolts);
        for (let n = 0; n < audio.length; n += 1) audio[n] = (audio[n] as number) + (hum[n] as number);
      }
      return renderChainRetried(audio, synthesis.sampleRateHz, settings.chain, name ?? 'a wiring');
    },
  };
}

/**
 * Wirings whose audio a pass makes at once, by effects chain: one, except
 * through a chain with an audio-graph render (drive), whose wait on the
 * library's own render thread leaves this thread free to synthesise the
 * next wiring. Results are still taken in order, so nothing else changes.
 */
export const AUDIO_IN_FLIGHT: Readonly<Record<ChainName, number>> = Object.freeze({
  direct: 1,
  clean: 1,
  compressed: 1,
  drive: 2,
});

/** A wiring's audio as its render ended: the samples or the error, and the buffer its synthesis was offered. */
type MadeAudio = { readonly processed: Float32Array; readonly into: Float32Array | undefined } | { readonly error: unknown; readonly into: Float32Array | undefined };

/** Tries of one wiring's chain render before it is reported (the first and one retry). */
export const CHAIN_RENDER_TRIES = 2;

/**
 * One wiring's effects chain, tried again once when it fails (a render the
 * library lost to a race or a transient fault). Bad input is not retried.
 */
async function renderChainRetried(audio: Float32Array, sampleRateHz: number, chain: ChainName, name: string): Promise<Float32Array> {
  // The direct chain is the output jack as is: the synthesis already made a fresh array of finite samples (the WAV encoder checks them again).
  if (chain === 'direct') return audio;
  let last: unknown;
  for (let attempt = 1; attempt <= CHAIN_RENDER_TRIES; attempt += 1) {
    try {
      return await renderEffectsChain(audio, sampleRateHz, chain);
    } catch (error) {
      if (error instanceof InputError) throw error;
      last = error;
    }
  }
  const reason = last instanceof Error ? last.message : String(last);
  throw new WorkError(`${name}: the ${chain} chain failed ${CHAIN_RENDER_TRIES} times (${reason})`, { cause: last });
}

/** Largest sample magnitude (sample-passes.ts). */
export function peakOf(samples: Float32Array): number {
  return samplePasses().peak(samples);
}

/**
 * Loudness of `audio` as it will be written: ITU-R BS.1770's absolute gate
 * (−70 LKFS) makes loudness shift by slightly more or less than a gain, so a
 * quiet wiring (−45 LUFS before gain) is measured scaled to the peak ceiling,
 * near the level its file gets, and the scale taken off again:
 * L = L(g·x) − 20·log10(g), g = ceiling / peak.
 */
function measureLoudnessNearCeiling(audio: Float32Array, sampleRateHz: number): number {
  const peak = peakOf(audio);
  if (!(peak > 0)) return measureLoudness([audio], sampleRateHz);
  const gain = 10 ** (PEAK_CEILING_DB / 20) / peak;
  const scaled = Float32Array.from(audio, (value) => value * gain);
  return measureLoudness([scaled], sampleRateHz) - 20 * Math.log10(gain);
}

/** Run the first pass over `items`, parking processed audio in `scratchFolder`. `onStep` is told after each item. */
export function runRenderPass(
  settings: AudioSettings,
  items: readonly PassItem[],
  scratchFolder: string,
  onStep?: (result: PassResult) => void,
): Promise<PassResult[]> {
  return runRenderPassWith(createWiringRenderer(settings), settings, items, scratchFolder, onStep);
}

/**
 * A share of a pass given away while it runs (run-render-pass.ts: to a worker
 * thread started once a core is free). After each wiring the pass awaits
 * `freed` (which may turn the event loop, where the news that a core is free
 * comes in); once it says yes, the pass calls `take` once with the wirings it
 * has not started, in the order it would make them, and whether it holds its
 * audio in memory (undefined: no audio made yet). `take` answers how many
 * from the front the pass keeps; the rest are no longer its own, and their
 * places in its results stay empty.
 */
export interface PassHandOff {
  freed(): Promise<boolean>;
  take(rest: readonly PassItem[], holdingAll: boolean | undefined): number;
}

/** The first pass with a given renderer (tests give one of their own), `depth` wirings' audio in flight at most. */
export async function runRenderPassWith(
  renderer: WiringRenderer,
  settings: AudioSettings,
  items: readonly PassItem[],
  scratchFolder: string,
  onStep?: (result: PassResult) => void,
  depth = AUDIO_IN_FLIGHT[settings.chain],
  handOff?: PassHandOff,
): Promise<PassResult[]> {
  // Figures first, phase class by phase class (cheap: no render); then each wiring's file audio.
  const measured = items.filter((item) => item.metrics);
  const figures = renderer.figures(measured.map((item) => item.network));
  const figuresOf = new Map(measured.map((item, index) => [item.id, figures[index] as RawAudioMetrics]));
  const audioCount = items.filter((item) => item.audio).length;
  // Decided at the first audio made (every wiring of a pass has the same length): all held in memory, or none.
  let holdAll: boolean | undefined;
  // A buffer whose audio went to a scratch file (or whose chain made a new one), free for the next synthesis:
  // 0.2–0.4 ms to fill where fresh memory took 1–2 ms (zeroed pages), about a millisecond a wiring.
  let spare: Float32Array | undefined;
  // Wirings whose audio is on its way, started in order, `depth` at most: a chain that waits for an audio graph's
  // render (drive) lets this thread synthesise the next wiring meanwhile. Each is taken in the order started.
  const started: Array<Promise<MadeAudio> | null> = [];
  // Items are made phase class by phase class (classOrder), so each class's circuit is solved once: a synthesis keeps
  // the products of the last class it solved (wiring-spectrum.ts). The results keep the order of `items`.
  const order = classOrder(settings.guitar, items);
  // Positions from `end` on were handed off (handOff), or there are none.
  let end = order.length;
  let offered = false;
  const start = (position: number): void => {
    if (position >= end) return;
    const index = order[position];
    const item = index === undefined ? undefined : items[index];
    if (item === undefined || index === undefined) return;
    if (!item.audio) {
      started[index] = null;
      return;
    }
    const into = spare;
    spare = undefined;
    started[index] = renderer.processed(item.network, item.name ?? item.id, into).then(
      (processed) => ({ processed, into }),
      (error: unknown) => ({ error, into }),
    );
  };
  const byItem: PassResult[] = [];
  for (let position = 0; position < Math.min(depth, items.length); position += 1) start(position);
  for (let position = 0; position < end; position += 1) {
    const index = order[position] as number;
    const item = items[index] as PassItem;
    const metrics = figuresOf.get(item.id);
    let audio: PassResult['audio'];
    let scratch: string | undefined;
    let samples: Float32Array | undefined;
    let failure: string | undefined;
    let processed: Float32Array | undefined;
    const made = await started[index];
    started[index] = null;
    if (made) {
      if ('error' in made) {
        // One wiring's failure does not cost the others: it is reported, the rest carries on.
        if (!(made.error instanceof WorkError)) throw made.error;
        failure = made.error.message;
        spare ??= made.into;
      } else {
        processed = made.processed;
        // A chain that made its own output leaves the synthesis buffer free.
        if (processed !== made.into) spare ??= made.into;
      }
    }
    if (processed) {
      holdAll ??= audioCount * processed.byteLength <= (settings.parkInMemoryBytes ?? 0);
      if (holdAll) {
        samples = processed;
      } else {
        scratch = join(scratchFolder, `${item.id}.f32`);
        writeFileSync(scratch, new Uint8Array(processed.buffer, processed.byteOffset, processed.byteLength));
        spare ??= processed;
      }
      audio = {
        peak: peakOf(processed),
        frames: processed.length,
        loudnessLufs: settings.measureProcessedLoudness ? measureLoudnessNearCeiling(processed, settings.sampleRateHz) : null,
      };
    }
    const result: PassResult = {
      id: item.id,
      ...(metrics ? { metrics } : {}),
      ...(audio ? { audio } : {}),
      ...(scratch ? { scratch } : {}),
      ...(samples ? { samples } : {}),
      ...(failure ? { failure } : {}),
    };
    byItem[index] = result;
    onStep?.(result);
    // The next wiring starts once this one is parked: its synthesis may reuse this one's buffer.
    start(position + depth);
    if (handOff !== undefined && !offered && (await handOff.freed())) {
      offered = true;
      const first = Math.min(end, position + depth + 1);
      end = first + handOff.take(order.slice(first, end).map((at) => items[at] as PassItem), holdAll);
    }
  }
  return byItem;
}

/**
 * The positions of `items` with the items of each phase class together (src/circuit/phase-class.ts: wirings whose
 * transfers differ only in their coils' signs), classes in the order their first item comes, items in their own
 * order within a class. In the order wirings are listed a class's items are often apart (the three single coils'
 * 47 wirings: 29 changes of class for 17 classes; two four-conductor humbuckers' 572: 444 for 292).
 */
export function classOrder(guitar: Guitar, items: readonly PassItem[]): number[] {
  const classes = new Map<string, number[]>();
  items.forEach((item, index) => {
    const key = phaseClassKey(guitar, item.network);
    const members = classes.get(key);
    if (members === undefined) classes.set(key, [index]);
    else members.push(index);
  });
  const order: number[] = [];
  for (const members of classes.values()) appendAll(order, members);
  return order;
}
