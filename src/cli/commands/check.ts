import type { Command } from 'commander';
import { countWirings } from '../../wiring/index.js';
import { describeGuitar } from '../describe-guitar.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';

/** Fields whose defaults change phase or hum, so the summary points them out. */
const PHASE_FIELDS = /\.(winding|magnet)$/u;

export function registerCheck(program: Command, io: Io): void {
  program
    .command('check')
    .description('validate a guitar file and print a short summary')
    .argument('<guitar>', 'guitar file (JSON)')
    .action((file: string) => {
      const guitar = readGuitarFile(file, io.cwd);
      const lines = describeGuitar(guitar);
      const elements = guitar.elements.map((element) => element.id);
      lines.push(`  ${elements.length} wiring elements (${elements.join(', ')}): ${countWirings(elements.length)} distinct wirings`);
      const phaseDefaults = guitar.assumed.filter((path) => PHASE_FIELDS.test(path));
      const otherDefaults = guitar.assumed.filter((path) => !PHASE_FIELDS.test(path));
      if (phaseDefaults.length > 0) {
        lines.push(`  note: assumed cw winding and north pole up for ${phaseDefaults.join(', ')}; phase and hum depend on them, so give them when known`);
      }
      if (otherDefaults.length > 0) lines.push(`  defaults used: ${otherDefaults.join(', ')}`);
      lines.push(`${file}: OK`);
      io.stdout(`${lines.join('\n')}\n`);
    });
}
