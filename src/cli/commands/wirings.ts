import type { Command } from 'commander';
import { wiringCountFor } from '../../guitar/index.js';
import { iterateWirings, type Wiring } from '../../wiring/index.js';
import { writeTablePausing } from '../format-table.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';
import { createPause } from '../../render/measuring/index.js';
import { mapIterable, writeJsonPausing } from '../../report/text/index.js';
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
    .action(async (file: string, options: { json?: boolean }) => {
      const guitar = readGuitarFile(file, io.cwd);
      const count = wiringCountFor(guitar.elements.length);
      // Streamed one wiring at a time (six elements give 228,386), pausing so Ctrl-C is answered.
      const wirings: Iterable<Wiring> = { [Symbol.iterator]: () => iterateWirings(guitar.elements) };
      const pause = createPause();
      if (options.json) {
        await writeJsonPausing({ guitar: guitar.name, count, wirings: mapIterable(wirings, wiringRecord) }, io.stdout, pause);
        return;
      }
      io.stdout(`${guitar.name}: ${count} distinct wirings\n\n`);
      await writeTablePausing(
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
        pause,
      );
    });
}
