/**
 * Integrated loudness from the reference BS.1770 implementation ebur128-wasm
 * (npm, the Rust ebur128 crate as WebAssembly), run in a child process
 * because Node 20 loads it only with --experimental-wasm-modules
 * (test/reference/ebur128-integrated.mjs).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const REFERENCE_SCRIPT = join(import.meta.dirname, '..', 'reference', 'ebur128-integrated.mjs');

export interface ReferenceCase {
  readonly sampleRateHz: number;
  /** One channel (mono) or two (stereo). */
  readonly channels: readonly Float32Array[];
}

/** LUFS of each case, in order. Throws when the reference fails. */
export function referenceLoudness(cases: readonly ReferenceCase[]): number[] {
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-ebur128-'));
  try {
    const job = cases.map((testCase, caseIndex) => ({
      sampleRateHz: testCase.sampleRateHz,
      files: testCase.channels.map((channel, channelIndex) => {
        const path = join(folder, `case${caseIndex}-ch${channelIndex}.f32`);
        writeFileSync(path, new Uint8Array(channel.buffer, channel.byteOffset, channel.byteLength));
        return path;
      }),
    }));
    const jobPath = join(folder, 'job.json');
    writeFileSync(jobPath, JSON.stringify(job));
    const run = spawnSync(process.execPath, ['--experimental-wasm-modules', '--no-warnings', REFERENCE_SCRIPT, jobPath], { encoding: 'utf8' });
    if (run.status !== 0) throw new Error(`ebur128-wasm reference failed: ${run.stderr}`);
    return JSON.parse(run.stdout) as number[];
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
