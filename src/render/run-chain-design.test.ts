/**
 * Our code in place of audio nodes changes no sample: every chain renders
 * exactly what one node-web-audio-api 1.0.9 graph of all its Web Audio
 * stages renders (the way the command line rendered chains before), bit for
 * bit, whatever the length.
 */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../math/index.js';
import { makePluck } from '../../test/support/tone-measures.js';
import { awaitRenderedBuffer, type RenderingContext } from './await-rendered-buffer.js';
import { type ChainDesign, designEffectsChain } from './chain-design.js';
import { resolveChainOptions } from './chain-options.js';
import { designCompressor, renderCompressor } from './render-compressor.js';
import { prepareChainContext, renderChainDesign, renderGraphDesign } from './render-chain-design.js';
import { isGraphStage, runChainDesign } from './run-chain-design.js';
import { WAV_HEADER_ROOM_BYTES, encodeWav, encodeWavOver } from './wav-file.js';

/** `design` with every stage a Web Audio node, as one graph: the input and latency zeros played, the delay cut. */
async function renderAsOneGraph(samples: Float32Array, design: ChainDesign): Promise<Float32Array> {
  const context = await prepareChainContext(samples, design);
  const { buffer } = await awaitRenderedBuffer(context as unknown as RenderingContext);
  const output = new Float32Array(samples.length);
  buffer.copyFromChannel(output, 0, design.latencyFrames);
  return output;
}

/** A pluck with seeded noise, `extraFrames` past a whole second (so the end falls inside a render quantum). */
function makeTake(sampleRateHz: number, extraFrames: number): Float32Array {
  const pluck = makePluck(110, 0.25, 0.5, sampleRateHz);
  const take = new Float32Array(sampleRateHz + extraFrames);
  take.set(pluck);
  const random = createRandom(extraFrames);
  for (let i = 0; i < take.length; i += 1) take[i] = (take[i] ?? 0) + 0.003 * (random() - 0.5);
  return take;
}

function differences(a: Float32Array, b: Float32Array): number {
  let count = 0;
  for (let i = 0; i < a.length; i += 1) if (!Object.is(a[i], b[i])) count += 1;
  return count;
}

describe.each([44_100, 48_000, 96_000])('at %s Hz, the same samples as one graph of every stage', (sampleRateHz) => {
  const options = resolveChainOptions();
  // 37 and 101 frames into a quantum: the drive chain's low cut rings on into the quantum's last frames, which the
  // clipper's oversampler reads (run-chain-design.ts); 0: the input ends on a quantum boundary.
  it.each([
    ['clean', 37],
    ['drive', 0],
    ['drive', 37],
    ['drive', 64],
    ['drive', 101],
  ] as const)('%s, %s frames past a whole second', async (chain, extraFrames) => {
    const take = makeTake(sampleRateHz, extraFrames);
    const design = designEffectsChain(chain, options, sampleRateHz);
    const ours = await renderChainDesign(take, design);
    expect(ours).toHaveLength(take.length);
    expect(differences(await renderAsOneGraph(take, design), ours)).toBe(0);
  });
  it('compressed: gain and compressor in our code, then the tone stack and cabinet as one graph', async () => {
    const take = makeTake(sampleRateHz, 37);
    const design = designEffectsChain('compressed', options, sampleRateHz);
    const [input, compressor, ...rest] = design.stages;
    if (input?.kind !== 'gain' || compressor?.kind !== 'compressor') throw new Error('unexpected compressed design');
    const before = take.map((value) => value * Math.fround(input.gain));
    renderCompressor(before, designCompressor(compressor.settings, sampleRateHz), before);
    const graph = await renderAsOneGraph(before, { ...design, stages: rest, latencyFrames: 0 });
    expect(differences(graph, await renderChainDesign(take, design))).toBe(0);
  });
});

describe('what goes to the audio graph', () => {
  it('only the clipper: clean and compressed make no graph render, drive one per render', async () => {
    const take = makeTake(48_000, 5);
    const calls: string[][] = [];
    const spy = (samples: Float32Array, design: ChainDesign): Promise<Float32Array> => {
      calls.push(design.stages.map((stage) => stage.kind));
      return renderGraphDesign(samples, design);
    };
    for (const chain of ['clean', 'compressed', 'drive'] as const) await runChainDesign(take, designEffectsChain(chain, resolveChainOptions(), 48_000), spy);
    expect(calls).toEqual([['shaper']]);
    expect(designEffectsChain('drive', resolveChainOptions(), 48_000).stages.filter(isGraphStage)).toHaveLength(1);
  });
});

describe('runChainDesign: output a WAV can be made over', () => {
  it('gives each chain its own memory with room for a WAV header before it, and encodeWavOver the same bytes as encodeWav', async () => {
    const sampleRateHz = 48_000;
    const take = makeTake(sampleRateHz, 37);
    for (const name of ['clean', 'compressed', 'drive'] as const) {
      const design = designEffectsChain(name, resolveChainOptions({}), sampleRateHz);
      const output = await renderChainDesign(take, design);
      expect(output.buffer).not.toBe(take.buffer);
      expect(output.byteOffset).toBeGreaterThanOrEqual(WAV_HEADER_ROOM_BYTES);
      const expected = encodeWav(Float32Array.from(output), { info: { name: 'neck + bridge', comment: `${name} chain` } });
      const bytes = encodeWavOver(output, { info: { name: 'neck + bridge', comment: `${name} chain` } });
      expect(bytes.buffer).toBe(output.buffer);
      expect(Buffer.from(bytes).equals(Buffer.from(expected))).toBe(true);
    }
  });
});
