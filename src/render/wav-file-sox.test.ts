/**
 * encodeWav read back by a third reader: SoX (Debian package `sox`, which
 * .ci/run installs). `soxi` reports the header (channels, rate, precision,
 * encoding, sample count); `sox FILE -t f64 -` decodes the samples to raw
 * float64, with integers scaled by 1/2^(bits−1) exactly. On a developer
 * machine without sox the test is skipped with a message; in CI (CI set) it
 * runs and fails if sox is missing.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { pluckedTone } from '../../test/support/signals.js';
import { type WavFormat, encodeWav, pcmFullScale } from './wav-file.js';

const soxAvailable = spawnSync('sox', ['--version'], { encoding: 'utf8' }).status === 0;
const runSox = soxAvailable || Boolean(process.env.CI);
if (!runSox) console.warn('wav-file-sox.test.ts skipped: install SoX (apt-get install sox) to read WAV files back with a third reader');

function run(command: string, args: readonly string[]): Buffer {
  const result = spawnSync(command, args);
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (${result.error?.message ?? result.stderr.toString()}); install SoX: apt-get install sox`);
  return result.stdout;
}

function soxi(option: string, path: string): string {
  return run('soxi', [option, path]).toString('utf8').trim();
}

describe.skipIf(!runSox)('encodeWav read back by SoX', () => {
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-wav-'));
  afterAll(() => rmSync(folder, { recursive: true, force: true }));
  const tone = pluckedTone({ sampleRateHz: 48_000, durationS: 0.25, fundamentalsHz: [110, 220], noteTimesS: [0, 0.1], harmonics: 15, decayS: 1, amplitude: 0.2, seed: 8 });

  const expectations: readonly { format: WavFormat; bits: string; encoding: RegExp }[] = [
    { format: 'pcm16', bits: '16', encoding: /Signed Integer PCM/u },
    { format: 'pcm24', bits: '24', encoding: /Signed Integer PCM/u },
    { format: 'f32', bits: '32', encoding: /Floating Point PCM/u },
  ];

  for (const { format, bits, encoding } of expectations) {
    for (const frames of [12_000, 11_999]) {
      it(`${format}, ${frames} frames: header, count and peak`, () => {
        const written = tone.subarray(0, frames);
        const path = join(folder, `${format}-${frames}.wav`);
        writeFileSync(path, encodeWav([written, written], { format, sampleRateHz: 96_000, info: { name: 'neck + bridge' } }));
        expect(soxi('-c', path)).toBe('2');
        expect(soxi('-r', path)).toBe('96000');
        expect(soxi('-b', path)).toBe(bits);
        expect(soxi('-s', path)).toBe(String(frames));
        expect(soxi('-e', path)).toMatch(encoding);

        const raw = run('sox', [path, '-t', 'f64', '-']);
        const decoded = new Float64Array(raw.buffer.slice(raw.byteOffset, raw.byteOffset + raw.byteLength));
        expect(decoded).toHaveLength(2 * frames);
        let readPeak = 0;
        for (const value of decoded) readPeak = Math.max(readPeak, Math.abs(value));
        let writtenPeak = 0;
        for (const value of written) writtenPeak = Math.max(writtenPeak, Math.abs(value));
        expect(writtenPeak).toBeGreaterThan(0.1);
        expect(writtenPeak).toBeLessThan(1);
        if (format === 'f32') {
          expect(Math.abs(readPeak - writtenPeak)).toBeLessThanOrEqual(writtenPeak * 2 ** -23);
        } else {
          // SoX scales a b-bit integer by 1/2^(b−1); we stored round(x·(2^(b−1) − 1)): one LSB apart at most.
          const bytesPerSample = Number(bits) / 8;
          const storedPeak = readPeak * 2 ** (Number(bits) - 1);
          expect(Math.abs(storedPeak - writtenPeak * pcmFullScale(bytesPerSample))).toBeLessThanOrEqual(1);
        }
      });
    }
  }
});
