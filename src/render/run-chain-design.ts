/**
 * Run a chain design in any host. Our own code computes every stage it can
 * compute exactly as node-web-audio-api 1.0.9's audio graph does: the gains
 * (float32-audio.ts) and the biquads (biquad-filter.ts), bit for bit, and
 * the compressor (render-compressor.ts), which is ours in every host. Only
 * the oversampled clipper (a WaveShaperNode, whose FFT resampler we do not
 * reproduce) goes to the host's OfflineAudioContext through `renderGraph`.
 * So the clean and compressed chains need no audio context at all, and the
 * drive chain's context holds a single node.
 *
 * Timing, as a single graph of every stage would have it: the input is
 * followed by the design's `latencyFrames` in zeros, every stage runs over
 * that longer signal in order (the graph part as the host renders it, its
 * fixed delay kept), and the first `latencyFrames` are dropped at the end,
 * so the output has the input's length and lines up with it. The zeros
 * matter: a WaveShaperNode in node-web-audio-api 1.0.9 drops the frames
 * still inside its oversampler when its input stops (render-chain-design.ts).
 * When the design has a graph part, the zeros go on to the end of the last
 * render quantum: a graph computes whole quanta, so in one graph of every
 * stage the stages before the clipper ring on into that quantum's last
 * frames, and the clipper's oversampler reads them (measured: without them,
 * up to 72 samples of that quantum differ in the last bits).
 *
 * The command line passes node-web-audio-api's context
 * (render-chain-design.ts), the listening page the browser's own
 * (src/page/wiring-engine.ts).
 */
import { type ChainDesign, type ChainStage, RENDER_QUANTUM_FRAMES, measureDesignLatencyFrames } from './chain-design.js';
import { type LinearStage, linearStages } from './linear-stages.js';
import { designCompressor, renderCompressor } from './render-compressor.js';
import { audioWithHeaderRoom } from './wav-file.js';

/**
 * How a host renders a design whose stages are all Web Audio nodes: it plays
 * `samples` as they are (no zeros added) through the stages and returns as
 * many frames as it was given, the stages' fixed delay not removed.
 */
export type RenderGraph = (samples: Float32Array, design: ChainDesign) => Promise<Float32Array>;

/** `frames` rounded up to whole render quanta. */
function wholeQuanta(frames: number): number {
  return Math.ceil(frames / RENDER_QUANTUM_FRAMES) * RENDER_QUANTUM_FRAMES;
}

/** A stage the host's audio graph runs rather than our code. */
type GraphStage = Extract<ChainStage, { kind: 'shaper' }>;

/** True for the stages run by the host's audio graph rather than by our code. */
export function isGraphStage(stage: ChainStage): stage is GraphStage {
  return stage.kind === 'shaper';
}

/** Render mono `samples` through `design`; a new array of the same length, in memory of its own (the input is not modified). */
export async function runChainDesign(samples: Float32Array, design: ChainDesign, renderGraph: RenderGraph): Promise<Float32Array> {
  if (samples.length === 0) return new Float32Array(0);
  const latency = design.latencyFrames;
  const graphed = design.stages.some(isGraphStage);
  const frames = graphed ? wholeQuanta(samples.length + latency) : samples.length + latency;
  // The input, then zeros (see above), with room before it for a WAV header: the render makes the file over the output
  // (wav-file.ts, encodeWavOver), which is a view of this memory past the delay, not a copy.
  let signal: Float32Array = audioWithHeaderRoom(frames);
  signal.set(samples);
  // Each run of gains and biquads goes to linear-stages.ts in one pass, each run of graph stages to one render of the
  // host; a run is handed over when a stage of another kind comes.
  let linear: LinearStage[] = [];
  let graph: GraphStage[] = [];
  const runLinear = (): void => {
    if (linear.length > 0) linearStages()(signal, linear, design.sampleRateHz);
    linear = [];
  };
  const runGraph = async (): Promise<void> => {
    if (graph.length > 0) signal = await renderGraph(signal, { ...design, stages: graph, latencyFrames: measureDesignLatencyFrames(graph) });
    graph = [];
  };
  for (const stage of design.stages) {
    if (isGraphStage(stage)) {
      runLinear();
      graph.push(stage);
      continue;
    }
    await runGraph();
    if (stage.kind === 'compressor') {
      runLinear();
      renderCompressor(signal, designCompressor(stage.settings, design.sampleRateHz), signal);
    } else {
      linear.push(stage);
    }
  }
  runLinear();
  await runGraph();
  return signal.length === samples.length ? signal : signal.subarray(latency, latency + samples.length);
}
