/**
 * Whole renders (strings, spectra, every wiring's audio, metrics, chain, WAV
 * and page files, reports), each in a child process so its peak memory is
 * measured alone. Real-time factor = seconds of audio written per second of
 * wall time.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { defaultThreadCount } from '../../src/render/index.js';
import { EAGER_FEEDBACK_FLAG } from '../../src/cli/eager-feedback.js';
import { heading, line } from './timing.js';

interface ChildResult {
  wirings: number;
  seconds: number;
  warmSeconds: number | null;
  audioSeconds: number;
  peakRssMb: number;
}

function renderInChild(guitar: string, chain: string, threads: number, repeat: 'cold' | 'warm'): ChildResult {
  // With the command line's V8 setting (src/cli/eager-feedback.ts), so the render runs as users run it.
  const child = spawnSync(process.execPath, [EAGER_FEEDBACK_FLAG, '--import', 'tsx', join(import.meta.dirname, 'render-child.ts'), guitar, chain, String(threads), repeat], {
    encoding: 'utf8',
  });
  if (child.status !== 0) throw new Error(`render bench failed: ${child.stderr}`);
  return JSON.parse(child.stdout.trim().split('\n').at(-1) ?? '{}') as ChildResult;
}

export function benchRender(): void {
  heading('In-process renders (renderGuitar from dist/ inside a tsx process; one process per case)');
  console.log('  first render after loading, then a second render in the same process; start-up and loading are not timed,');
  console.log('  and the peak memory includes the TypeScript loader (the fresh-process figures above are what users wait for)');
  const threads = defaultThreadCount();
  const cases: Array<[string, string, number, 'cold' | 'warm']> = [
    ['samples/three-single-coil.json', 'direct', threads, 'warm'],
    ['samples/three-single-coil.json', 'drive', threads, 'warm'],
    ['samples/humbucker-two-single-coil.json', 'direct', 1, 'cold'],
    ['samples/humbucker-two-single-coil.json', 'direct', threads, 'cold'],
  ];
  for (const [guitar, chain, threadCount, repeat] of cases) {
    const result = renderInChild(guitar, chain, threadCount, repeat);
    const rate = (seconds: number): string => `${(result.audioSeconds / seconds).toFixed(0)}×`;
    const warm = result.warmSeconds === null ? '' : `; again ${result.warmSeconds.toFixed(2)} s, ${rate(result.warmSeconds)}`;
    line(
      `${result.wirings} wirings, ${chain}, ${threadCount} thread${threadCount === 1 ? '' : 's'}`,
      `${result.seconds.toFixed(2)} s for ${result.audioSeconds.toFixed(0)} s of audio: ${rate(result.seconds)} real time${warm}; peak memory ${result.peakRssMb.toFixed(0)} MB`,
    );
  }
}
