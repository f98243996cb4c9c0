/**
 * Run a chain design through node-web-audio-api's OfflineAudioContext (never a
 * realtime AudioContext: there is no sound card, and an open one keeps the
 * process alive). One mono context per render; the result is read with
 * copyFromChannel.
 *
 * Latency: the context renders `latencyFrames` more frames than the input,
 * and the first `latencyFrames` are dropped, so the output lines up with the
 * input sample for sample and has the input's length. The source plays that
 * many zeros after the input: node-web-audio-api 1.0.9's WaveShaperNode
 * stops at once when its input goes silent (no source playing) and drops the
 * frames still inside its oversampler, which would lose the input's last
 * 128 frames. Zeros played by a source are not silence to it.
 *
 * The buffer is taken from the promise or, when the library's promise loses
 * its race and gives null, from the context's `complete` event
 * (await-rendered-buffer.ts).
 *
 * The library (a native module) is loaded on the first chain render only:
 * commands and direct renders that need no chain do not pay for loading it.
 */
import type { OfflineAudioContext } from 'node-web-audio-api';
import type { ChainDesign } from './chain-design.js';
import { type ChainContext, connectChainDesign } from './connect-chain-design.js';
import { type BufferSource, type RenderingContext, awaitRenderedBuffer } from './await-rendered-buffer.js';
import { runChainDesign } from './run-chain-design.js';

type Context = InstanceType<typeof OfflineAudioContext>;
type ContextClass = typeof OfflineAudioContext;

let contextClass: Promise<ContextClass> | undefined;
/** node-web-audio-api's OfflineAudioContext, imported once on first need. */
function loadContextClass(): Promise<ContextClass> {
  contextClass ??= import('node-web-audio-api').then((library) => library.OfflineAudioContext);
  return contextClass;
}

/**
 * A context wired to render mono `samples` through `design`: the input,
 * then `latencyFrames` zeros (see above), through every stage. The first
 * `latencyFrames` frames of its result are the chain's fixed delay.
 */
export async function prepareChainContext(samples: Float32Array, design: ChainDesign): Promise<Context> {
  const OfflineAudioContext = await loadContextClass();
  const frames = samples.length;
  const latency = design.latencyFrames;
  const context = new OfflineAudioContext({ numberOfChannels: 1, length: frames + latency, sampleRate: design.sampleRateHz });
  const padded = new Float32Array(frames + latency); // input, then zeros through the latency (see above)
  padded.set(samples);
  const buffer = context.createBuffer(1, frames + latency, design.sampleRateHz);
  buffer.copyToChannel(padded, 0);
  const source = context.createBufferSource();
  source.buffer = buffer;
  const last = connectChainDesign(context as unknown as ChainContext<AudioNode>, design, source as unknown as AudioNode);
  last.connect(context.destination as unknown as AudioNode);
  source.start(0);
  return context;
}

/**
 * Render mono `samples` through `design` at its sample rate. The output has
 * the input's length and timing. The compressor and plain gains are computed
 * by run-chain-design.ts (the same code the listening page runs), the other
 * stages in node-web-audio-api. `onBufferSource` is told where each graph
 * render's result came from (the stress test counts the races).
 */
export function renderChainDesign(
  samples: Float32Array,
  design: ChainDesign,
  onBufferSource?: (source: BufferSource) => void,
): Promise<Float32Array> {
  return runChainDesign(samples, design, (part, partDesign) => renderGraphDesign(part, partDesign, onBufferSource));
}

/** Render mono `samples` through a design whose stages are all Web Audio nodes, in node-web-audio-api. */
export async function renderGraphDesign(
  samples: Float32Array,
  design: ChainDesign,
  onBufferSource?: (source: BufferSource) => void,
): Promise<Float32Array> {
  const output = new Float32Array(samples.length);
  if (samples.length === 0) return output;
  const context = await prepareChainContext(samples, design);
  const { buffer: rendered, source: from } = await awaitRenderedBuffer(context as unknown as RenderingContext);
  onBufferSource?.(from);
  rendered.copyFromChannel(output, 0, design.latencyFrames);
  return output;
}
