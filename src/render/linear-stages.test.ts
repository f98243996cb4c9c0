/**
 * A run of linear stages as WebAssembly against the JavaScript form, bit for
 * bit (each stage alone is held to node-web-audio-api 1.0.9 in
 * biquad-filter.test.ts): every chain's gains and biquads in one run, over
 * signals of several lengths, a longer one after a shorter (the kernel's room
 * grows) and a shorter one after (only its own samples are copied back).
 */
import { describe, expect, it } from 'vitest';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import { createRandom } from '../math/index.js';
import { designEffectsChain } from './chain-design.js';
import { CHAIN_NAMES } from './chain-name.js';
import { resolveChainOptions } from './chain-options.js';
import { type LinearStage, linearStages } from './linear-stages.js';

const SAMPLE_RATE_HZ = 44_100;

/** Every chain's gains and biquads, in their order (the clipper and compressor left out: they are not linear stages). */
function linearStagesOf(name: (typeof CHAIN_NAMES)[number]): LinearStage[] {
  return designEffectsChain(name, resolveChainOptions(), SAMPLE_RATE_HZ).stages.flatMap((stage) => (stage.kind === 'gain' || stage.kind === 'biquad' ? [stage] : []));
}

/** Noise with a burst of silence and a few subnormal samples set in (the flushing step runs too). */
function signalOf(length: number, seed: number): Float32Array {
  const random = createRandom(seed);
  const signal = Float32Array.from({ length }, () => 0.3 * (random() - 0.5));
  signal.fill(0, length >> 2, length >> 1);
  for (let n = 7; n < length; n += 997) signal[n] = n % 2 === 0 ? 3e-39 : -1e-40;
  return signal;
}

describe('a run of linear stages as WebAssembly gives the JavaScript form’s samples', () => {
  const runs = CHAIN_NAMES.map((name) => [name, linearStagesOf(name)] as const).filter(([, stages]) => stages.length > 0);

  it('covers chains with gains and biquads', () => {
    expect(runs.some(([, stages]) => stages.some((stage) => stage.kind === 'biquad') && stages.some((stage) => stage.kind === 'gain'))).toBe(true);
  });

  it.each(runs)('%s chain, 1 000 then 30 000 then 5 samples', (_, stages) => {
    for (const [length, seed] of [
      [1_000, 1],
      [30_000, 2],
      [5, 3],
    ] as const) {
      const expected = signalOf(length, seed);
      const got = Float32Array.from(expected);
      linearStages('javascript')(expected, stages, SAMPLE_RATE_HZ);
      linearStages('webassembly')(got, stages, SAMPLE_RATE_HZ);
      expect(firstBitDifference(expected, got)).toBe(-1);
    }
  });
});
