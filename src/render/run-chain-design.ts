/**
 * Run a chain design in any host: the stages a Web Audio graph does well
 * (biquads, the oversampled clipper) go to the host's OfflineAudioContext
 * through `renderGraph`; the compressor (render-compressor.ts) and runs of
 * plain gains are computed here, so both hosts run the very same code for
 * them. A gain here is the GainNode's float32 product: x·g with g rounded to
 * float32, the exact double product rounded once to float32 on storing.
 *
 * The command line passes node-web-audio-api's context
 * (render-chain-design.ts), the listening page the browser's own
 * (src/page/wiring-engine.ts).
 */
import { type ChainDesign, type ChainStage, measureDesignLatencyFrames } from './chain-design.js';
import { designCompressor, renderCompressor } from './render-compressor.js';

/**
 * How a host renders a design whose stages are all Web Audio nodes: the
 * output has the input's length and lines up with it (the design's
 * `latencyFrames` removed).
 */
export type RenderGraph = (samples: Float32Array, design: ChainDesign) => Promise<Float32Array>;

/** Render mono `samples` through `design`; a new array of the same length (the input is not modified). */
export async function runChainDesign(samples: Float32Array, design: ChainDesign, renderGraph: RenderGraph): Promise<Float32Array> {
  let signal: Float32Array = Float32Array.from(samples);
  let pending: ChainStage[] = [];
  const flush = async (): Promise<void> => {
    if (pending.length === 0) return;
    if (pending.every((stage) => stage.kind === 'gain')) {
      for (const stage of pending) {
        if (stage.kind !== 'gain') continue;
        const gain = Math.fround(stage.gain);
        for (let n = 0; n < signal.length; n += 1) signal[n] = (signal[n] as number) * gain;
      }
    } else {
      signal = await renderGraph(signal, { ...design, stages: pending, latencyFrames: measureDesignLatencyFrames(pending) });
    }
    pending = [];
  };
  for (const stage of design.stages) {
    if (stage.kind !== 'compressor') {
      pending.push(stage);
      continue;
    }
    await flush();
    renderCompressor(signal, designCompressor(stage.settings, design.sampleRateHz), signal);
  }
  await flush();
  return signal;
}
