import type { Command } from 'commander';
import { enumerateWirings, type Wiring } from '../../wiring/index.js';
import { writeTable } from '../format-table.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';
import { writeJson } from '../write-json.js';
import type { RowWiring } from '../metric-columns.js';

/** The `--json` record of a wiring (contract in docs/design.md). */
export function wiringRecord(wiring: RowWiring): Record<string, unknown> {
  return {
    id: wiring.id,
    expression: wiring.expression,
    coils: wiring.elementIds,
    topology: wiring.topology,
    outOfPhase: wiring.outOfPhase,
    description: wiring.description,
  };
}

export function registerWirings(program: Command, io: Io): void {
  program
    .command('wirings')
    .description('list every distinct wiring of the coils')
    .argument('<guitar>', 'guitar file (JSON)')
    .option('--json', 'print one JSON document on stdout')
    .action((file: string, options: { json?: boolean }) => {
      const guitar = readGuitarFile(file, io.cwd);
      const wirings = enumerateWirings(guitar.elements);
      if (options.json) {
        // Written in chunks: six elements give 228,386 wirings.
        writeJson({ guitar: guitar.name, count: wirings.length, wirings: wirings.map(wiringRecord) }, io.stdout);
        return;
      }
      io.stdout(`${guitar.name}: ${wirings.length} distinct wirings\n\n`);
      writeTable(
        wirings,
        [
          { title: '#', value: (w) => w.id, align: 'right' },
          { title: 'wiring', value: (w) => w.expression },
          { title: 'coils', value: (w) => String(w.elements.length), align: 'right' },
          { title: 'topology', value: (w) => w.topology },
          { title: 'out of phase', value: (w) => (w.outOfPhase.length > 0 ? w.outOfPhase.join(', ') : '-') },
          { title: 'in words', value: (w) => w.description },
        ],
        io.stdout,
      );
    });
}
