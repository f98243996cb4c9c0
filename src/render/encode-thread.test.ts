import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { temporaryFolder } from '../../test/support/temporary-folder.js';
import { InputError } from '../errors/index.js';
import { encodeFinalWav } from './encode-final-wav.js';
import { startEncodeThread } from './encode-thread.js';
import type { WavFormat } from './wav-file.js';

/** A deterministic test signal: a few partials and a little of everything near full scale. */
function signal(length: number, seed: number): Float32Array {
  return Float32Array.from({ length }, (_, n) => 0.6 * Math.sin(0.01 * seed * n) + 0.45 * Math.sin(0.37 * n + seed) * Math.cos(0.0007 * n));
}

describe('the encoding thread of a render\'s second pass', () => {
  const thread = startEncodeThread();
  afterAll(async () => {
    await thread.close();
  });

  it('gives the bytes and record the render\'s own thread gives, for every format and gain', async () => {
    const cases: Array<[WavFormat, number, number]> = [
      ['pcm24', 0.8, 4801],
      ['pcm16', 1.7, 1000],
      ['f32', 0.25, 2048],
      ['pcm24', 3, 10],
    ];
    const options = (format: WavFormat) => ({ sampleRateHz: 44_100, format, info: { name: 'neck + ~bridge', comment: 'test', software: 'coilbench test' } });
    const threaded = await Promise.all(cases.map(([format, gain, length], index) => thread.encode(signal(length, index + 1), gain, options(format))));
    cases.forEach(([format, gain, length], index) => {
      const own = encodeFinalWav(signal(length, index + 1), gain, options(format));
      expect(Buffer.from(threaded[index]!.bytes).equals(Buffer.from(own.bytes))).toBe(true);
      expect(threaded[index]!.record).toEqual(own.record);
    });
  });

  it('reads audio parked in a scratch file itself, one file after another into the same buffer, with the bytes of samples sent over', async () => {
    const folder = temporaryFolder('encode-scratch');
    const options = { sampleRateHz: 48_000, format: 'pcm24' as const };
    const parked = [5, 6, 7].map((seed) => {
      const samples = signal(3000, seed);
      const path = join(folder, `${seed}.f32`);
      writeFileSync(path, new Uint8Array(samples.buffer));
      return path;
    });
    // One at a time, so the second and third files are read into the first one's buffer.
    for (const [index, path] of parked.entries()) {
      const fromFile = await thread.encode({ scratch: path }, 0.9, options);
      const own = encodeFinalWav(signal(3000, index + 5), 0.9, options);
      expect(Buffer.from(fromFile.bytes).equals(Buffer.from(own.bytes))).toBe(true);
      expect(fromFile.record).toEqual(own.record);
    }
  });

  it('moves a buffer the samples fill, copies a view into a larger one', async () => {
    const whole = signal(500, 9);
    const bigger = signal(1000, 9);
    const view = bigger.subarray(100, 600);
    const before = Float32Array.from(view);
    await Promise.all([thread.encode(whole, 1, {}), thread.encode(view, 1, {})]);
    expect(whole.length).toBe(0); // detached: it moved
    expect(Array.from(view)).toEqual(Array.from(before)); // copied: the caller's samples are untouched
  });

  it('rethrows a bad sample as the InputError the render\'s own thread would throw, and goes on working', async () => {
    const bad = signal(64, 3);
    bad[17] = Number.NaN;
    const error = await thread.encode(bad, 1, {}).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).message).toMatch(/channels\[0\]\[17\]/u);
    const next = await thread.encode(signal(64, 4), 1, {});
    expect(next.bytes.length).toBeGreaterThan(64 * 3);
  });
});
