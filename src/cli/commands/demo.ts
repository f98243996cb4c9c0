import { join } from 'node:path';
import type { Command } from 'commander';
import type { Io } from '../io.js';
import { demoGuitarPath } from '../package-root.js';
import { readGuitarFile } from '../read-guitar.js';
import { type RenderOptionText, addRenderOptions, reportRender, runRender } from './render.js';

/** Where the demo's files go, relative to the working folder (docs/design.md). */
export const DEMO_FOLDER = join('renders', 'demo');

/** `demo`: the main job on the bundled demo guitar. */
export function registerDemo(program: Command, io: Io): void {
  addRenderOptions(
    program
      .command('demo')
      .description('render every wiring of the bundled demo guitar (a three single-coil guitar with invented values) into renders/demo'),
  ).action(async (options: RenderOptionText) => {
    const file = demoGuitarPath();
    io.stderr(`coilbench: demo guitar ${file} (invented values)\n`);
    const guitar = readGuitarFile(file, io.cwd);
    const { outcome, root, seconds } = await runRender(file, guitar, options, io, DEMO_FOLDER);
    reportRender(io, root, outcome, seconds);
  });
}
