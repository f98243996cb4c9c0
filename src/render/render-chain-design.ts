/**
 * The audio-graph part of a chain design (run-chain-design.ts: today the
 * oversampled clipper alone) in node-web-audio-api's OfflineAudioContext
 * (never a realtime AudioContext: there is no sound card, and an open one
 * keeps the process alive). One mono context per graph render; the result is
 * read with copyFromChannel.
 *
 * Latency: `renderGraphDesign` plays its samples as they are and returns as
 * many frames, the stages' fixed delay kept; runChainDesign adds the zeros
 * and drops the delay for the chain as a whole. The zeros are needed:
 * node-web-audio-api 1.0.9's WaveShaperNode stops at once when its input goes
 * silent (no source playing) and drops the frames still inside its
 * oversampler, which would lose the input's last 128 frames. Zeros played by
 * a source are not silence to it.
 *
 * The buffer is taken from the promise or, when the library's promise loses
 * its race and gives null, from the context's `complete` event
 * (await-rendered-buffer.ts).
 *
 * The library (a native module) is loaded on the first graph render only:
 * commands and chains that need no graph (direct, clean, compressed) do not
 * pay for loading it.
 */
import type { OfflineAudioContext } from 'node-web-audio-api';
import type { ChainDesign } from './chain-design.js';
import { type ChainContext, connectChainDesign } from './connect-chain-design.js';
import { type BufferSource, type RenderingContext, awaitRenderedBuffer } from './await-rendered-buffer.js';
import { runChainDesign } from './run-chain-design.js';
import { audioWithHeaderRoom } from './wav-file.js';

type Context = InstanceType<typeof OfflineAudioContext>;
type ContextClass = typeof OfflineAudioContext;

let contextClass: Promise<ContextClass> | undefined;
/** node-web-audio-api's OfflineAudioContext, imported once on first need. */
function loadContextClass(): Promise<ContextClass> {
  contextClass ??= import('node-web-audio-api').then((library) => library.OfflineAudioContext);
  return contextClass;
}

/** A context wired to play mono `samples`, as they are, through every stage of `design` (all Web Audio nodes). */
export async function prepareGraphContext(samples: Float32Array, design: ChainDesign): Promise<Context> {
  const OfflineAudioContext = await loadContextClass();
  const frames = samples.length;
  const context = new OfflineAudioContext({ numberOfChannels: 1, length: frames, sampleRate: design.sampleRateHz });
  const buffer = context.createBuffer(1, frames, design.sampleRateHz);
  buffer.copyToChannel(samples as Float32Array<ArrayBuffer>, 0);
  const source = context.createBufferSource();
  source.buffer = buffer;
  const last = connectChainDesign(context as unknown as ChainContext<AudioNode>, design, source as unknown as AudioNode);
  last.connect(context.destination as unknown as AudioNode);
  source.start(0);
  return context;
}

/**
 * A context wired to render mono `samples` through `design` (all Web Audio
 * nodes) the way a whole chain is timed: the input, then `latencyFrames`
 * zeros (see above). The first `latencyFrames` frames of its result are the
 * stages' fixed delay.
 */
export function prepareChainContext(samples: Float32Array, design: ChainDesign): Promise<Context> {
  const padded = new Float32Array(samples.length + design.latencyFrames);
  padded.set(samples);
  return prepareGraphContext(padded, design);
}

/**
 * Render mono `samples` through `design` at its sample rate. The output has
 * the input's length and timing. run-chain-design.ts computes the gains,
 * biquads and compressor (the same code the listening page runs), the
 * clipper runs here in node-web-audio-api. `onBufferSource` is told where each graph
 * render's result came from (the stress test counts the races).
 */
export function renderChainDesign(
  samples: Float32Array,
  design: ChainDesign,
  onBufferSource?: (source: BufferSource) => void,
): Promise<Float32Array> {
  return runChainDesign(samples, design, (part, partDesign) => renderGraphDesign(part, partDesign, onBufferSource));
}

/**
 * Play mono `samples` through a design whose stages are all Web Audio nodes,
 * in node-web-audio-api: as many frames out as in, the fixed delay kept
 * (run-chain-design.ts's RenderGraph).
 */
export async function renderGraphDesign(
  samples: Float32Array,
  design: ChainDesign,
  onBufferSource?: (source: BufferSource) => void,
): Promise<Float32Array> {
  // With room for a WAV header before it, as runChainDesign's own signal has (wav-file.ts, encodeWavOver).
  const output = audioWithHeaderRoom(samples.length);
  if (samples.length === 0) return output;
  const context = await prepareGraphContext(samples, design);
  const { buffer: rendered, source: from } = await awaitRenderedBuffer(context as unknown as RenderingContext);
  onBufferSource?.(from);
  rendered.copyFromChannel(output, 0);
  return output;
}
