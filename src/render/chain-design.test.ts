/**
 * Timing: the fixed delay node-web-audio-api adds (the oversampled clipper's)
 * is what chain-design.ts says, the compressor (our own code) adds none, and the renderer
 * removes them, so every chain's output lines up with its input sample for
 * sample. Checked against a float64 direct-form filter of the same sections.
 */
import { describe, expect, it } from 'vitest';
import { type Coefficients, filterCascade, makePluck, measurePeak } from '../../test/support/tone-measures.js';
import { designBiquad } from './biquad-design.js';
import {
  type ChainDesign,
  DRIVE_OUTPUT_DB,
  OVERSAMPLED_SHAPER_LATENCY_FRAMES,
  designEffectsChain,
} from './chain-design.js';
import { resolveChainOptions } from './chain-options.js';
import { COMPRESSOR_SETTINGS } from './compressor-settings.js';
import { DRIVE_BIAS } from './drive-curve.js';
import { renderEffectsChain } from './effects-chain.js';
import { renderGraphDesign } from './render-chain-design.js';

/** Index of the largest |sample|. */
function peakIndex(signal: Float32Array): number {
  let best = 0;
  for (let i = 1; i < signal.length; i += 1) if (Math.abs(signal[i] ?? 0) > Math.abs(signal[best] ?? 0)) best = i;
  return best;
}

/** Render an impulse through only the stages of `design` that `keep` selects, with no latency removed. */
async function rawImpulseResponse(design: ChainDesign, keep: (kind: string) => boolean, impulseAt: number, frames: number): Promise<Float32Array> {
  const impulse = new Float32Array(frames);
  impulse[impulseAt] = 1e-3; // quiet: the clipper is linear and the compressor below its threshold
  return renderGraphDesign(impulse, { ...design, stages: design.stages.filter((stage) => keep(stage.kind)), latencyFrames: 0 });
}

describe('fixed latency inside node-web-audio-api 1.0.9', () => {
  const IMPULSE_AT = 1000;
  it.each([44_100, 48_000])('the 4× oversampled clipper delays by one render quantum (128 frames) at %s Hz', async (sampleRateHz) => {
    const design = designEffectsChain('drive', resolveChainOptions({ driveDb: 0 }), sampleRateHz);
    const response = await rawImpulseResponse(design, (kind) => kind === 'shaper', IMPULSE_AT, 4096);
    expect(peakIndex(response) - IMPULSE_AT).toBe(OVERSAMPLED_SHAPER_LATENCY_FRAMES);
    expect(OVERSAMPLED_SHAPER_LATENCY_FRAMES).toBe(128);
  });
  it('direct, clean and compressed add none; drive carries its own in the design', () => {
    const options = resolveChainOptions();
    expect(designEffectsChain('direct', options, 48_000).latencyFrames).toBe(0);
    expect(designEffectsChain('clean', options, 48_000).latencyFrames).toBe(0);
    expect(designEffectsChain('drive', options, 48_000).latencyFrames).toBe(128);
    expect(designEffectsChain('compressed', options, 48_000).latencyFrames).toBe(0);
  });
});

describe.each([44_100, 48_000])('output lines up with the input, sample for sample, at %s Hz', (sampleRateHz) => {
  const options = resolveChainOptions();
  const sections = (chain: 'clean' | 'drive'): Coefficients[] =>
    designEffectsChain(chain, options, sampleRateHz).stages.flatMap((stage) => (stage.kind === 'biquad' ? [designBiquad(stage.filter, sampleRateHz)] : []));
  // Expected small-signal gains, written out from the definitions rather than taken from the design:
  // compressor makeup (W3C Web Audio API): (1/full-range gain)^0.6, full-range gain = T' − T'/R dB, T' = T + knee/2;
  // drive: drive gain × clipper slope at rest 1 − tanh²(b) × output trim.
  const centreDb = COMPRESSOR_SETTINGS.thresholdDb + COMPRESSOR_SETTINGS.kneeDb / 2;
  const makeup = (1 / 10 ** ((centreDb - centreDb / COMPRESSOR_SETTINGS.ratio) / 20)) ** 0.6;
  const driveGain = 10 ** (options.driveDb / 20) * (1 - Math.tanh(DRIVE_BIAS) ** 2) * 10 ** (DRIVE_OUTPUT_DB / 20);

  it.each([
    // chain, input peak (V), expected gain, relative tolerance. Observed: below 10⁻⁷ for clean and compressed; for
    // drive 5·10⁻⁴, from the clipper's curvature (its chords either side of rest differ by 0.04 %) and from the
    // WaveShaperNode computing its table position in float32 (x + 1 resolves x to 6·10⁻⁸), which sets a floor near
    // −130 dB re saturation; hence a 0.1 mV input, loud enough to sit well above that floor.
    ['clean', 1e-3, 1, 1e-5],
    ['compressed', 1e-3, makeup, 1e-5],
    ['drive', 1e-4, driveGain, 1e-3],
  ] as const)('%s', async (chain, peakV, gain, tolerance) => {
    const input = makePluck(110, peakV, 0.5, sampleRateHz);
    const output = await renderEffectsChain(input, sampleRateHz, chain);
    const expected = filterCascade(input, sections(chain === 'compressed' ? 'clean' : chain), gain);
    const scale = measurePeak(expected);
    const error = measurePeak(expected.map((value, i) => value - (output[i] ?? 0)));
    expect(error / scale).toBeLessThan(tolerance);
    // One frame early or late would be far outside the tolerance: the check can tell alignment apart.
    const shifted = measurePeak(expected.map((value, i) => value - (output[i + 1] ?? 0)));
    expect(shifted / scale).toBeGreaterThan(100 * tolerance);
  });
});
