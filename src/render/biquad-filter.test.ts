/**
 * Our biquads and gains against node-web-audio-api 1.0.9's BiquadFilterNode
 * and GainNode (the library the command line rendered them with before),
 * bit for bit, in both forms (linear-stages.ts: the JavaScript here and in
 * float32-audio.ts, and WebAssembly), and our coefficients against the
 * cookbook's.
 */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../math/index.js';
import { makePluck } from '../../test/support/tone-measures.js';
import { designBiquad } from './biquad-design.js';
import { designNodeBiquad, renderBiquad } from './biquad-filter.js';
import { type ChainDesign, type ChainStage, designEffectsChain } from './chain-design.js';
import { resolveChainOptions } from './chain-options.js';
import { FLOAT32_MIN_NORMAL, renderGain } from './float32-audio.js';
import { linearStages } from './linear-stages.js';
import { renderGraphDesign } from './render-chain-design.js';

/** The rates the command line offers (src/cli/commands/render.ts). */
const RATES = [44_100, 48_000, 88_200, 96_000];

/** Every biquad section of the chains (the drive chain holds them all: its low cut, the tone stack, the cabinet). */
function chainSections(sampleRateHz: number): Extract<ChainStage, { kind: 'biquad' }>[] {
  return designEffectsChain('drive', resolveChainOptions(), sampleRateHz).stages.flatMap((stage) => (stage.kind === 'biquad' ? [stage] : []));
}

/** One stage alone in an OfflineAudioContext of node-web-audio-api. */
function renderInNode(samples: Float32Array, stage: ChainStage, sampleRateHz: number): Promise<Float32Array> {
  const design: ChainDesign = { name: 'clean', sampleRateHz, stages: [stage], latencyFrames: 0 };
  return renderGraphDesign(samples, design);
}

/** Indices where two arrays differ in any bit (the sign of zero included). */
function differences(a: Float32Array, b: Float32Array): number[] {
  const found: number[] = [];
  for (let i = 0; i < a.length; i += 1) if (!Object.is(a[i], b[i])) found.push(i);
  return found;
}

/** Our biquad's samples (the JavaScript's), after checking that the WebAssembly form gives the same bits. */
function ourBiquad(samples: Float32Array, stage: Extract<ChainStage, { kind: 'biquad' }>, sampleRateHz: number): Float32Array {
  const javascript = renderBiquad(samples, designNodeBiquad(stage.filter, sampleRateHz));
  const webassembly = Float32Array.from(samples);
  linearStages('webassembly')(webassembly, [stage], sampleRateHz);
  expect(differences(javascript, webassembly), `${stage.purpose}: WebAssembly against JavaScript`).toEqual([]);
  return javascript;
}

/** Our gain's samples (the JavaScript's), after checking that the WebAssembly form gives the same bits. */
function ourGain(samples: Float32Array, gain: number): Float32Array {
  const javascript = renderGain(samples, gain);
  const webassembly = Float32Array.from(samples);
  linearStages('webassembly')(webassembly, [{ kind: 'gain', gain }], 48_000);
  expect(differences(javascript, webassembly), 'gain: WebAssembly against JavaScript').toEqual([]);
  return javascript;
}

const takes = new Map<number, Float32Array>();
/** A pluck with seeded noise: broadband, with samples near every rounding boundary (made once per rate). */
function makeTake(sampleRateHz: number): Float32Array {
  const made = takes.get(sampleRateHz);
  if (made) return made;
  const take = makePluck(82.41, 0.3, 1, sampleRateHz);
  const random = createRandom(11);
  for (let i = 0; i < take.length; i += 1) take[i] = (take[i] ?? 0) + 0.002 * (random() - 0.5);
  takes.set(sampleRateHz, take);
  return take;
}

describe.each(RATES)('at %s Hz, the same float32 samples as node-web-audio-api 1.0.9', (sampleRateHz) => {
  it.each(chainSections(sampleRateHz).map((stage) => [stage.purpose, stage] as const))('%s', async (_, stage) => {
    const take = makeTake(sampleRateHz);
    const ours = ourBiquad(take, stage, sampleRateHz);
    expect(differences(await renderInNode(take, stage, sampleRateHz), ours)).toEqual([]);
  });
});

describe('subnormals, flushed as the library flushes them', () => {
  it('keeps bit for bit through three seconds of exact silence after a click (outputs flushed to signed zeros, then the float64 state)', async () => {
    // Measured: the outputs fall below 2⁻¹²⁶ within 0.1 s and the float64 state below 2⁻⁹⁰⁰ within 2.4 s for every section.
    const sampleRateHz = 48_000;
    const click = new Float32Array(3 * sampleRateHz);
    click[10] = 0.5;
    click[11] = -0.2;
    let negativeZeros = 0;
    for (const stage of chainSections(sampleRateHz)) {
      const ours = ourBiquad(click, stage, sampleRateHz);
      expect(differences(await renderInNode(click, stage, sampleRateHz), ours), stage.purpose).toEqual([]);
      negativeZeros += ours.filter((value) => Object.is(value, -0)).length;
    }
    expect(negativeZeros).toBeGreaterThan(1000); // the flush happened, sign kept

  });
  it('keeps bit for bit when sound follows silence and subnormal input (the flushing loop hands back to the plain one)', async () => {
    // Zeros first (a drive chain's sections see them), a pluck with subnormal and smallest-normal samples set in,
    // a second of silence (the ring-out falls below 2⁻¹²⁶, flushed, then to zero), and the pluck again.
    const sampleRateHz = 48_000;
    const pluck = makeTake(sampleRateHz).subarray(0, sampleRateHz / 4);
    const signal = new Float32Array(100 + 2 * pluck.length + sampleRateHz);
    signal.set(pluck, 100);
    signal.set(pluck, 100 + pluck.length + sampleRateHz);
    for (const at of [150, 151, 4_000, 9_001]) signal[at] = at % 2 === 0 ? 3e-39 : -FLOAT32_MIN_NORMAL;
    for (const stage of chainSections(sampleRateHz)) {
      const ours = ourBiquad(signal, stage, sampleRateHz);
      expect(differences(await renderInNode(signal, stage, sampleRateHz), ours), stage.purpose).toEqual([]);
      // The second pluck is sound again, not zeros (the state came back from flushing).
      expect(Math.abs(ours[signal.length - pluck.length + 1_000] ?? 0)).toBeGreaterThan(FLOAT32_MIN_NORMAL);
    }
  });

  it('reads subnormal input as zero in a gain, as the library does', async () => {
    const sampleRateHz = 48_000;
    const input = new Float32Array(256);
    input[10] = 1e-38; // subnormal: below 2⁻¹²⁶ ≈ 1.18·10⁻³⁸
    input[11] = -5e-39;
    input[20] = 1e-37;
    input[21] = 0.25;
    const gain = 3.3; // 3.3·10⁻³⁸ would be a normal float32
    const ours = ourGain(input, gain);
    expect(differences(await renderInNode(input, { kind: 'gain', gain, purpose: 'test' }, sampleRateHz), ours)).toEqual([]);
    expect(Object.is(ours[10], 0)).toBe(true);
    expect(Object.is(ours[11], -0)).toBe(true);
    expect(Math.abs(ours[20] ?? 0)).toBeGreaterThan(FLOAT32_MIN_NORMAL);
    // A normal input times a small gain made subnormal: written as a zero of its sign, as the library does.
    const small = 1e-9;
    const underflowing = Float32Array.from([0, 2e-30, -3e-31, 0.5, 1e-29, -0, 1.5e-29]);
    const quiet = ourGain(underflowing, small);
    expect(differences(await renderInNode(underflowing, { kind: 'gain', gain: small, purpose: 'test' }, sampleRateHz), quiet)).toEqual([]);
    expect(Object.is(quiet[1], 0) && Object.is(quiet[2], -0)).toBe(true);
  });
});

describe('coefficients', () => {
  it.each(RATES)('at %s Hz are the cookbook’s for the plain values, to the float32 rounding of the node’s parameters', (sampleRateHz) => {
    for (const { filter } of chainSections(sampleRateHz)) {
      const node = designNodeBiquad(filter, sampleRateHz);
      const cookbook = designBiquad(filter, sampleRateHz);
      for (const key of ['b0', 'b1', 'b2', 'a1', 'a2'] as const) {
        // Q in dB as float32 is good to 6·10⁻⁸ relative; a few of those in the coefficients.
        expect(Math.abs(node[key] - cookbook[key]), `${filter.purpose} ${key}`).toBeLessThan(1e-6 * Math.max(1, Math.abs(cookbook[key])));
      }
    }
  });
});
