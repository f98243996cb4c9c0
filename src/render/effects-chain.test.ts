import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { createRandom } from '../math/index.js';
import { makePluck, makeSine, measurePeak } from '../../test/support/tone-measures.js';
import { CHAIN_NAMES, type ChainName, describeChain, parseChainName } from './chain-name.js';
import { DEFAULT_CHAIN_OPTIONS } from './chain-options.js';
import { renderEffectsChain } from './effects-chain.js';

const PROCESSED: readonly Exclude<ChainName, 'direct'>[] = ['clean', 'drive', 'compressed'];

const takes = new Map<number, Float32Array>();
/** A 1 s pluck with a little seeded noise on top, so renders have broadband content (made once per rate). */
function makeTestTake(sampleRateHz: number): Float32Array {
  const made = takes.get(sampleRateHz);
  if (made) return made;
  const take = makePluck(82.41, 0.2, 1, sampleRateHz);
  const random = createRandom(7);
  for (let i = 0; i < take.length; i += 1) take[i] = (take[i] ?? 0) + 0.001 * (random() - 0.5);
  takes.set(sampleRateHz, take);
  return take;
}

/** Bit-for-bit equality of two sample arrays (faster than a deep comparison). */
function sameSamples(a: Float32Array, b: Float32Array): boolean {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength));
}

describe('chain names and descriptions', () => {
  it('lists the four chains and describes each in plain words', () => {
    expect(CHAIN_NAMES).toEqual(['direct', 'clean', 'drive', 'compressed']);
    expect(describeChain('clean')).toBe('clean amplifier tone stack and speaker cabinet');
    for (const name of CHAIN_NAMES) expect(describeChain(name).length).toBeGreaterThan(10);
  });
  it('reads a chain name from the command line or refuses it in the usual grammar', () => {
    expect(parseChainName('drive')).toBe('drive');
    expect(() => parseChainName('crunch')).toThrow('--chain: expected one of direct, clean, drive, compressed, got "crunch"');
  });
});

describe('direct', () => {
  it('is the identity: the same samples, in a new array', async () => {
    const input = makeTestTake(44_100);
    const output = await renderEffectsChain(input, 44_100, 'direct', { inputGain: 3 });
    expect(sameSamples(output, input)).toBe(true);
    expect(output).not.toBe(input);
  });
});

describe.each([44_100, 48_000])('every chain at %s Hz', (sampleRateHz) => {
  it.each(CHAIN_NAMES)('%s keeps a 3 s render’s duration, to its last frames', async (chain) => {
    const input = makeSine(330, 0.05, 3, sampleRateHz);
    const output = await renderEffectsChain(input, sampleRateHz, chain);
    expect(output).toHaveLength(3 * sampleRateHz);
    // A steady tone stays steady to the end: the last render quantum is as loud as the ten before it.
    const last = measurePeak(output, output.length - 128);
    const before = measurePeak(output, output.length - 1408, output.length - 128);
    expect(last / before).toBeGreaterThan(0.95);
    expect(last / before).toBeLessThan(1.05);
  });

  it.each(PROCESSED)('%s renders the same input to identical samples twice', async (chain) => {
    const input = makeTestTake(sampleRateHz);
    const first = await renderEffectsChain(input, sampleRateHz, chain);
    const second = await renderEffectsChain(input, sampleRateHz, chain);
    expect(sameSamples(first, second)).toBe(true);
    expect(sameSamples(first, input)).toBe(false);
    expect(measurePeak(first)).toBeGreaterThan(0);
  });
});

describe('input level', () => {
  it('inputGain scales the input before the chain: clean is linear, drive is not', async () => {
    const sampleRateHz = 48_000;
    const volts = makeTestTake(sampleRateHz);
    const normalised = volts.map((value) => value / 0.25); // as if 1 = 0.25 V
    const clean = await renderEffectsChain(volts, sampleRateHz, 'clean');
    const cleanScaled = await renderEffectsChain(normalised, sampleRateHz, 'clean', { inputGain: 0.25 });
    expect(measurePeak(clean.map((value, i) => value - (cleanScaled[i] ?? 0))) / measurePeak(clean)).toBeLessThan(1e-6);
    const drive = await renderEffectsChain(volts, sampleRateHz, 'drive');
    const driveHalf = await renderEffectsChain(volts, sampleRateHz, 'drive', { inputGain: 0.5 });
    // Half the input does not give half the output once the clipper saturates.
    expect(measurePeak(driveHalf) / measurePeak(drive)).toBeGreaterThan(0.6);
  });
});

describe('bad input', () => {
  const input = new Float32Array(1000);
  it.each([
    [{ inputGain: 0 }, 'chain.inputGain: expected a factor above 0 and at most 1000, got 0'],
    [{ driveDb: 90 }, 'chain.driveDb: expected a gain in dB from 0 to 60, got 90'],
    [{ driveDb: Number.NaN }, 'chain.driveDb: expected a gain in dB from 0 to 60, got null'],
  ])('refuses options %o', async (options, message) => {
    await expect(renderEffectsChain(input, 48_000, 'clean', options)).rejects.toThrow(message);
  });
  it('refuses an unknown chain, an unusable sample rate and samples that are not numbers', async () => {
    await expect(renderEffectsChain(input, 48_000, 'loud' as ChainName)).rejects.toThrow('chain: expected one of direct, clean, drive, compressed, got "loud"');
    await expect(renderEffectsChain(input, 8000, 'clean')).rejects.toThrow('sampleRateHz: expected a whole number of Hz from 22050 to 192000, got 8000');
    const broken = new Float32Array(10);
    broken[3] = Number.NaN;
    await expect(renderEffectsChain(broken, 48_000, 'drive')).rejects.toThrow('samples[3]: expected a finite sample value, got NaN');
    await expect(renderEffectsChain(broken, 48_000, 'drive')).rejects.toBeInstanceOf(InputError);
    // An odd length with the infinity last (the sample after the last pair), and a −∞ at an odd index.
    const endless = new Float32Array(11);
    endless[10] = Number.POSITIVE_INFINITY;
    await expect(renderEffectsChain(endless, 48_000, 'clean')).rejects.toThrow('samples[10]: expected a finite sample value, got Infinity');
    endless[10] = 0;
    endless[7] = Number.NEGATIVE_INFINITY;
    await expect(renderEffectsChain(endless, 48_000, 'clean')).rejects.toThrow('samples[7]: expected a finite sample value, got -Infinity');
  });
  it('renders nothing to nothing', async () => {
    for (const chain of CHAIN_NAMES) expect(await renderEffectsChain(new Float32Array(0), 48_000, chain)).toHaveLength(0);
  });
  it('keeps its defaults frozen', () => {
    expect(Object.isFrozen(DEFAULT_CHAIN_OPTIONS)).toBe(true);
    expect(DEFAULT_CHAIN_OPTIONS).toEqual({ inputGain: 1, driveDb: 26 });
  });
});

describe('the process', () => {
  it('ends by itself after rendering every chain (no audio context left open)', () => {
    const script = join(import.meta.dirname, '..', '..', 'test', 'support', 'render-chains-and-exit.ts');
    const result = spawnSync(process.execPath, ['--import', 'tsx', script], { encoding: 'utf8', timeout: 30_000 });
    expect(result.error).toBeUndefined(); // a timeout would show here
    expect(result.stderr).toBe('');
    expect(result.stdout.trim()).toBe('rendered 144000 144000 144000 144000');
    expect(result.status).toBe(0);
  });
});
