/**
 * Steady-state gain of each chain for quiet sines, measured on the rendered
 * output, against the magnitude response computed from the same biquad
 * coefficients with the Audio EQ Cookbook formulas (R. Bristow-Johnson) —
 * an independent computation of what node-web-audio-api's BiquadFilterNode
 * and WaveShaperNode do, and of our own compressor (render-compressor.ts).
 */
import { describe, expect, it } from 'vitest';
import { makeSine, measureSineAmplitude } from '../../test/support/tone-measures.js';
import { designEffectsChain } from './chain-design.js';
import type { ChainName } from './chain-name.js';
import { resolveChainOptions } from './chain-options.js';
import { measureChainResponse } from './chain-response.js';
import { renderEffectsChain } from './effects-chain.js';

const FREQUENCIES_HZ = [82.41, 110, 220, 440, 1000, 2600, 4000, 6000, 10_000];
/** Quiet enough that the clipper is linear to 0.1 % and the compressor stays below its threshold (−36 dB). */
const AMPLITUDE_V = 0.001;
const SECONDS = 0.6;
/** The slowest section (90 Hz, Q 1.1) decays by e every ≈ 4 ms; half a second is far past the transient. */
const SETTLED_S = 0.3;
/** dB. Observed differences: below 0.001 dB for every chain (drive's clipper is only nearly linear, hence its wider margin). */
const TOLERANCE_DB: Record<Exclude<ChainName, 'direct'>, number> = { clean: 0.005, compressed: 0.005, drive: 0.01 };

describe.each([44_100, 48_000])('small-signal response at %s Hz', (sampleRateHz) => {
  it.each(['clean', 'drive', 'compressed'] as const)('%s matches the cookbook response', async (chain) => {
    const expected = measureChainResponse(designEffectsChain(chain, resolveChainOptions(), sampleRateHz), FREQUENCIES_HZ);
    for (const [i, frequencyHz] of FREQUENCIES_HZ.entries()) {
      const output = await renderEffectsChain(makeSine(frequencyHz, AMPLITUDE_V, SECONDS, sampleRateHz), sampleRateHz, chain);
      const measuredDb = 20 * Math.log10(measureSineAmplitude(output, frequencyHz, sampleRateHz, Math.round(SETTLED_S * sampleRateHz)) / AMPLITUDE_V);
      expect(Math.abs(measuredDb - (expected[i] ?? Number.NaN)), `${chain} at ${frequencyHz} Hz: ${measuredDb.toFixed(4)} dB`).toBeLessThan(TOLERANCE_DB[chain]);
    }
  });
});

describe('the designed curves have the documented shape', () => {
  const fs = 48_000;
  const clean = designEffectsChain('clean', resolveChainOptions(), fs);
  it('clean: box resonance bump, mid dip, presence peak, steep top roll-off', () => {
    const [at40, at110, at600, at2600, at5000, at10000] = measureChainResponse(clean, [40, 110, 600, 2600, 5000, 10_000]) as [number, number, number, number, number, number];
    expect(at40).toBeLessThan(-8); // below the closed-box corner, −12 dB per octave
    expect(at110).toBeGreaterThan(2); // box resonance and bass shelf
    expect(at600).toBeLessThan(-3); // tone stack dip
    expect(at2600).toBeGreaterThan(3.5); // presence
    expect(at5000 - at10000).toBeGreaterThan(20); // fourth-order low-pass: ≈ 24 dB per octave
  });
  it('drive at rest: the clean curve plus the low cut, drive gain, clipper slope and output trim', () => {
    const drive = designEffectsChain('drive', resolveChainOptions({ driveDb: 20 }), fs);
    const [cleanAt1k] = measureChainResponse(clean, [1000]) as [number];
    const [driveAt1k] = measureChainResponse(drive, [1000]) as [number];
    // 20 dB drive − 12 dB trim + 20·log10(1 − tanh²(0.15)) = −0.195 dB; low cut (100 Hz, Q 0.5) at 1 kHz: −0.086 dB.
    expect(driveAt1k - cleanAt1k).toBeCloseTo(20 - 12 - 0.195 - 0.086, 2);
  });
});
