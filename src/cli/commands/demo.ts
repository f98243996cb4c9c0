import type { Command } from 'commander';
import { demoGuitarPath } from '../package-root.js';
import type { Io } from '../io.js';

/** `demo`: the main job on the bundled demo guitar. */
export function registerDemo(program: Command, io: Io, run: (argv: string[]) => Promise<number>): void {
  program
    .command('demo')
    .description('run coilbench on the bundled demo guitar (a three single-coil guitar with invented values)')
    .action(async () => {
      io.stderr(`coilbench: demo guitar ${demoGuitarPath()}\n`);
      const status = await run(['wirings', demoGuitarPath()]);
      if (status !== 0) throw new Error(`demo failed with status ${status}`);
    });
}
