/**
 * The page's sound engine: the same synthesis the command line runs
 * (src/render/synthesize-wirings.ts, Y(f) = Σ T_i(f)·E_i(f) with the circuit
 * of src/circuit), fed with the coil signals the page carries, then the same
 * chain design (src/render/chain-design.ts) in the browser's own Web Audio
 * graph (src/render/connect-chain-design.ts), rendered offline into a buffer
 * and measured with the same loudness meter (src/analysis, ITU-R BS.1770).
 *
 * Knobs change the circuit (volume, tone, tone capacitor, cable) or the
 * chain; each circuit setting gets its own synthesis, retuned on first need
 * from the first one (only the load is computed again).
 */
import { measureLoudness } from '../analysis/index.js';
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import {
  type ChainContext,
  type ChainDesign,
  type ChainName,
  type WiringSynthesis,
  coilSpectraOfSignals,
  connectChainDesign,
  createWiringSynthesis,
  designEffectsChain,
  resolveChainOptions,
  runChainDesign,
  RENDER_QUANTUM_FRAMES,
} from '../render/portable/index.js';
import type { Network } from '../wiring/index.js';
import { type PageCoilSignals, type PageSound, decodeSignal } from './page-data.js';

/** The knobs a listener can turn. */
export interface Knobs {
  /** Volume position 0–10. */
  readonly volumeSetting: number;
  /** Tone position 0–10, or null when the guitar has no tone control. */
  readonly toneSetting: number | null;
  /** Tone capacitor, farads, or null without a tone control. */
  readonly toneCapacitorF: number | null;
  readonly cableCapacitanceF: number;
  readonly chain: ChainName;
}

/** One wiring rendered at one setting of the knobs. */
export interface RenderedWiring {
  readonly key: string;
  /** Processed samples (chain applied), before any playback gain. */
  readonly samples: Float32Array;
  readonly peak: number;
  /** ITU-R BS.1770 integrated loudness of `samples`, LUFS. */
  readonly loudnessLufs: number;
}

/** The guitar with the knobs' tone capacitor (the circuit reads it from the guitar). */
export function guitarWithKnobs(guitar: Guitar, knobs: Knobs): Guitar {
  const tone = guitar.controls.tone;
  if (!tone || knobs.toneCapacitorF === null || knobs.toneCapacitorF === tone.capacitorF) return guitar;
  return { ...guitar, controls: { ...guitar.controls, tone: { ...tone, capacitorF: knobs.toneCapacitorF } } };
}

/** The circuit overrides for the knobs. */
export function overridesOf(knobs: Knobs, base: CircuitOverrides): CircuitOverrides {
  return {
    ...base,
    volumeSetting: knobs.volumeSetting,
    ...(knobs.toneSetting === null ? {} : { toneSetting: knobs.toneSetting }),
    cableCapacitanceF: knobs.cableCapacitanceF,
  };
}

/** A key naming the circuit part of the knobs. */
function circuitKey(knobs: Knobs): string {
  return [knobs.volumeSetting, knobs.toneSetting, knobs.toneCapacitorF, knobs.cableCapacitanceF].join('|');
}

/** A key naming a wiring at the knobs. */
export function renderKey(expression: string, knobs: Knobs): string {
  return `${expression}@${circuitKey(knobs)}|${knobs.chain}`;
}

/**
 * Each coil's spectrum E_i (`coilSpectraOfSignals`), decoded and transformed
 * on first need: the synthesis reads only the coils a wiring uses, so the
 * first sound (often one coil) waits for one transform, not one per coil.
 */
export function lazyCoilSpectra(coils: PageCoilSignals): readonly Float64Array[] {
  const known: (Float64Array | undefined)[] = coils.signals.map(() => undefined);
  const spectra: Float64Array[] = [];
  coils.signals.forEach((text, index) => {
    Object.defineProperty(spectra, index, {
      enumerable: true,
      get: () => (known[index] ??= coilSpectraOfSignals({ ...coils, signals: [decodeSignal(text)] })[0] as Float64Array),
    });
  });
  return spectra;
}

/** Syntheses kept for recent knob settings (each holds its load and gain, a few FFT-sized buffers; our own bound). */
const SYNTHESES_KEPT = 8;

export interface WiringEngine {
  readonly sampleRateHz: number;
  readonly length: number;
  /** The knobs the render used. */
  readonly renderKnobs: Knobs;
  /** The direct signal of a wiring at the knobs (volts at the amplifier input). */
  synthesize(network: Network, knobs: Knobs): Float32Array;
  /** The processed signal through the knobs' chain, with its peak and loudness. */
  render(expression: string, network: Network, knobs: Knobs): Promise<RenderedWiring>;
  /** Compute every coil's spectrum not computed yet (for idle time after the first sound). */
  prepareSpectra(): void;
}

export function createWiringEngine(data: PageSound): WiringEngine {
  const { guitar, coils } = data;
  const spectra = lazyCoilSpectra(coils);
  const syntheses = new Map<string, WiringSynthesis>();
  let base: WiringSynthesis | null = null;
  const synthesisFor = (knobs: Knobs): WiringSynthesis => {
    const key = circuitKey(knobs);
    let synthesis = syntheses.get(key);
    if (synthesis) {
      syntheses.delete(key);
      syntheses.set(key, synthesis);
      return synthesis;
    }
    // The first setting prepares the coils at every FFT bin; every other one retunes it: only the load is computed
    // again, and the open-circuit products of the wiring shape are shared (synthesize-wirings.ts).
    const knobGuitar = guitarWithKnobs(guitar, knobs);
    const overrides = overridesOf(knobs, data.overrides);
    synthesis = base === null ? createWiringSynthesis(knobGuitar, { ...coils, spectra }, overrides) : base.retune(knobGuitar, overrides);
    base ??= synthesis;
    syntheses.set(key, synthesis);
    while (syntheses.size > SYNTHESES_KEPT) syntheses.delete(syntheses.keys().next().value as string);
    return synthesis;
  };
  const tone = guitar.controls.tone;
  const renderKnobs: Knobs = {
    volumeSetting: data.overrides.volumeSetting ?? guitar.controls.volume.setting,
    toneSetting: tone ? (data.overrides.toneSetting ?? tone.setting) : null,
    toneCapacitorF: tone ? tone.capacitorF : null,
    cableCapacitanceF: data.overrides.cableCapacitanceF ?? guitar.cable.capacitanceF,
    chain: data.chain as ChainName,
  };

  const synthesize = (network: Network, knobs: Knobs): Float32Array => {
    const synthesis = synthesisFor(knobs);
    const audio = synthesis.synthesize(network);
    if (data.hum) {
      const hum = synthesis.synthesizeHum(network, data.hum.mainsHz, data.hum.emfVolts);
      for (let n = 0; n < audio.length; n += 1) audio[n] = (audio[n] as number) + (hum[n] as number);
    }
    return audio;
  };

  return {
    sampleRateHz: coils.sampleRateHz,
    length: coils.length,
    renderKnobs,
    synthesize,
    prepareSpectra: () => {
      for (let coil = 0; coil < spectra.length; coil += 1) void spectra[coil];
    },
    async render(expression, network, knobs) {
      // Each step is timed as a performance measure (`npm run bench -- page` reads them).
      const started = performance.now();
      const direct = synthesize(network, knobs);
      const synthesized = performance.now();
      const samples = knobs.chain === 'direct' ? direct : await renderChainInBrowser(direct, coils.sampleRateHz, knobs.chain);
      const chained = performance.now();
      let peak = 0;
      for (let n = 0; n < samples.length; n += 1) peak = Math.max(peak, Math.abs(samples[n] as number));
      const loudnessLufs = measureLoudness([samples], coils.sampleRateHz);
      performance.measure('coilbench-synthesize', { start: started, end: synthesized });
      performance.measure('coilbench-chain', { start: synthesized, end: chained });
      performance.measure('coilbench-loudness', { start: chained, end: performance.now() });
      return { key: renderKey(expression, knobs), samples, peak, loudnessLufs };
    },
  };
}

/**
 * Parts the page splits a chain's graph render into (the drive chain's
 * clipper): each part renders in an OfflineAudioContext of its own, and a
 * browser renders each offline context on a thread of its own, so the parts
 * render at once on a machine of two cores or more.
 */
export const GRAPH_PARTS = 2;

/**
 * Frames of input a part after the first is given before its own, their
 * output dropped: a whole number of render quanta, so that every part's
 * quanta fall where the single render's do, and far more than the clipper
 * remembers (its oversampler's filters span a few hundred frames; the graph
 * stages are otherwise memoryless). The browser test checks that the parts
 * give the single render's samples, bit for bit.
 */
export const PART_LEAD_IN_FRAMES = 16 * RENDER_QUANTUM_FRAMES;

/**
 * Run `samples` through a chain, the node render's way (render-chain-design.ts,
 * run-chain-design.ts): the gains, biquads and compressor in our own code,
 * the clipper in the browser's OfflineAudioContext, in `parts` parts at once.
 */
export function renderChainInBrowser(samples: Float32Array, sampleRateHz: number, chain: ChainName, parts = GRAPH_PARTS): Promise<Float32Array> {
  return runChainDesign(samples, designEffectsChain(chain, resolveChainOptions({}), sampleRateHz), (input, design) => renderGraphInParts(input, design, parts));
}

/** The graph render of `samples` cut into `parts` spans of whole render quanta, each given its lead-in, rendered at once and joined. */
async function renderGraphInParts(samples: Float32Array, design: ChainDesign, parts: number): Promise<Float32Array> {
  const frames = samples.length;
  const span = Math.ceil(frames / Math.max(1, parts) / RENDER_QUANTUM_FRAMES) * RENDER_QUANTUM_FRAMES;
  if (parts <= 1 || span <= PART_LEAD_IN_FRAMES) return renderGraphInBrowser(samples, design);
  const starts: number[] = [];
  for (let start = 0; start < frames; start += span) starts.push(start);
  const rendered = await Promise.all(
    starts.map((start, part) => renderGraphInBrowser(samples.subarray(part === 0 ? 0 : start - PART_LEAD_IN_FRAMES, Math.min(frames, start + span)), design)),
  );
  const output = new Float32Array(frames);
  starts.forEach((start, part) => output.set((rendered[part] as Float32Array).subarray(part === 0 ? 0 : PART_LEAD_IN_FRAMES), start));
  return output;
}

/** A design whose stages are all Web Audio nodes, played as given in the browser's OfflineAudioContext (as many frames out, the delay kept). */
async function renderGraphInBrowser(samples: Float32Array, design: ChainDesign): Promise<Float32Array> {
  const sampleRateHz = design.sampleRateHz;
  const frames = samples.length;
  const context = new OfflineAudioContext({ numberOfChannels: 1, length: frames, sampleRate: sampleRateHz });
  const buffer = context.createBuffer(1, frames, sampleRateHz);
  buffer.copyToChannel(samples as Float32Array<ArrayBuffer>, 0);
  const source = context.createBufferSource();
  source.buffer = buffer;
  const last = connectChainDesign(context as unknown as ChainContext<AudioNode>, design, source as AudioNode);
  last.connect(context.destination);
  source.start(0);
  const rendered = await context.startRendering();
  const output = new Float32Array(frames);
  rendered.copyFromChannel(output, 0);
  return output;
}
