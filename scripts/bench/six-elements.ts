/**
 * Six wiring elements (samples/three-humbucker.json, 228,386 wirings): the
 * `wirings` table and JSON, `analyze --no-audio --csv` (streamed: rows
 * written as computed) and `render --only w1`, each in a fresh process
 * (wall time, processor time and peak memory), beside the same commands on
 * the four-element sample as the reference run. Goals: `wirings` under 15 s
 * and 1 GB, `analyze --no-audio` under 1 GB whatever its time, `render
 * --only w1` under 30 s (printed, never asserted). `npm run bench --
 * six-elements` runs this section alone (the analyze takes minutes).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { EAGER_FEEDBACK_FLAG } from '../../src/cli/eager-feedback.js';
import { heading, line } from './timing.js';

interface CliResult {
  seconds: number;
  /** Processor time of the whole child process (start-up included): on a busy machine, closer to what an idle one takes than the wall time. */
  cpuSeconds: number;
  peakRssMb: number;
  status: number;
  outputMb: number;
}

function runInChild(argv: readonly string[]): CliResult {
  // With the command line's V8 setting (src/cli/eager-feedback.ts): cli-child runs `main`, not src/cli.ts.
  const child = spawnSync(process.execPath, [EAGER_FEEDBACK_FLAG, '--import', 'tsx', join(import.meta.dirname, 'cli-child.ts'), ...argv], { encoding: 'utf8', maxBuffer: 1 << 20 });
  if (child.status !== 0) throw new Error(`six-element bench failed: ${child.stderr}`);
  const result = JSON.parse(child.stdout.trim().split('\n').at(-1) ?? '{}') as CliResult;
  if (result.status !== 0) throw new Error(`coilbench ${argv.join(' ')} exited with ${result.status}`);
  return result;
}

export function benchSixElements(): void {
  heading('Six elements (228,386 wirings) against four (572), each command in a fresh process');
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-bench-six-'));
  try {
    const cases: Array<[string, string[]]> = [
      ['wirings (table)', ['wirings']],
      ['wirings --json', ['wirings', '--json']],
      ['analyze --no-audio --csv', ['analyze', '--no-audio', '--csv']],
      ['render --only w1 (direct)', ['render', '--only', 'w1', '--chain', 'direct']],
    ];
    for (const [label, argv] of cases) {
      const withOutput = (guitar: string, name: string): string[] => {
        if (argv[0] === 'render') return [argv[0], guitar, ...argv.slice(1), '-o', join(folder, name)];
        if (argv.includes('--csv')) return [argv[0] as string, guitar, ...argv.slice(1), join(folder, `${name}.csv`)];
        return [argv[0] as string, guitar, ...argv.slice(1)];
      };
      const four = runInChild(withOutput('samples/two-humbucker.json', 'four'));
      const six = runInChild(withOutput('samples/three-humbucker.json', 'six'));
      line(
        `${label}: six elements`,
        `${six.seconds.toFixed(1)} s wall, ${six.cpuSeconds.toFixed(1)} s processor, ${six.peakRssMb.toFixed(0)} MB peak, ${six.outputMb.toFixed(1)} MB out (${(six.seconds / four.seconds).toFixed(1)}× the four-element run)`,
      );
    }
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
