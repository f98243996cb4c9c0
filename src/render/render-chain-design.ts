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
 */
import { OfflineAudioContext } from 'node-web-audio-api';
import type { ChainDesign } from './chain-design.js';
import { type ChainContext, connectChainDesign } from './connect-chain-design.js';

/** Render mono `samples` through `design` at its sample rate. The output has the input's length and timing. */
export async function renderChainDesign(samples: Float32Array, design: ChainDesign): Promise<Float32Array> {
  const frames = samples.length;
  const output = new Float32Array(frames);
  if (frames === 0) return output;
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
  const rendered = await context.startRendering();
  rendered.copyFromChannel(output, 0, latency);
  return output;
}
