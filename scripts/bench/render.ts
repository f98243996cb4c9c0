/**
 * Whole renders (strings, spectra, every wiring's audio, metrics, chain, WAV
 * and page files, reports), each in a child process so its peak memory is
 * measured alone. Real-time factor = seconds of audio written per second of
 * wall time.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { heading, line } from './timing.js';

interface ChildResult {
  wirings: number;
  seconds: number;
  audioSeconds: number;
  peakRssMb: number;
}

function renderInChild(guitar: string, chain: string): ChildResult {
  const child = spawnSync(process.execPath, ['--import', 'tsx', join(import.meta.dirname, 'render-child.ts'), guitar, chain], { encoding: 'utf8' });
  if (child.status !== 0) throw new Error(`render bench failed: ${child.stderr}`);
  return JSON.parse(child.stdout.trim().split('\n').at(-1) ?? '{}') as ChildResult;
}

export function benchRender(): void {
  heading('Rendering every wiring to files (strum, 48 kHz, 24-bit; one process per run)');
  const cases: Array<[string, string]> = [
    ['samples/three-single-coil.json', 'direct'],
    ['samples/three-single-coil.json', 'drive'],
    ['samples/humbucker-two-single-coil.json', 'direct'],
  ];
  for (const [guitar, chain] of cases) {
    const result = renderInChild(guitar, chain);
    line(
      `${result.wirings} wirings, ${chain} chain`,
      `${result.seconds.toFixed(2)} s for ${result.audioSeconds.toFixed(0)} s of audio: ${(result.audioSeconds / result.seconds).toFixed(0)}× real time, peak memory ${result.peakRssMb.toFixed(0)} MB`,
    );
  }
}
