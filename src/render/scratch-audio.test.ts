import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { temporaryFolder } from '../../test/support/temporary-folder.js';
import { readScratchAudio } from './scratch-audio.js';

const work = temporaryFolder('scratch-audio');

/** Raw float32 samples as the first pass parks them (render-pass.ts writes the samples' bytes as they are). */
function park(name: string, samples: Float32Array): string {
  const path = join(work, name);
  writeFileSync(path, new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength));
  return path;
}

describe('readScratchAudio', () => {
  const samples = Float32Array.from({ length: 4801 }, (_, n) => Math.sin(0.013 * n) * 0.7 - 1e-9 * n);

  it('gives back the very samples that were parked, into a new buffer without a spare', () => {
    const read = readScratchAudio(park('a.f32', samples));
    expect(Buffer.from(read.buffer, read.byteOffset, read.byteLength).equals(Buffer.from(samples.buffer))).toBe(true);
  });

  it('reads into a spare of the file\'s length, and into a new buffer when the spare has another length', () => {
    const path = park('b.f32', samples);
    const spare = new Float32Array(samples.length).fill(Number.NaN);
    const into = readScratchAudio(path, spare);
    expect(into).toBe(spare);
    expect(Array.from(into)).toEqual(Array.from(samples));
    const shorter = new Float32Array(samples.length - 1);
    const fresh = readScratchAudio(path, shorter);
    expect(fresh).not.toBe(shorter);
    expect(Array.from(fresh)).toEqual(Array.from(samples));
  });

  it('refuses a file that does not hold whole float32 samples', () => {
    const path = join(work, 'odd.f32');
    writeFileSync(path, new Uint8Array(4 * 10 + 3));
    expect(() => readScratchAudio(path)).toThrow(/43 bytes, not whole float32 samples/u);
  });
});
