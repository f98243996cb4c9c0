import { parseGuitar } from '../../src/guitar/index.js';
import { builtInPhrase } from '../../src/string/index.js';
import { renderPageFor } from '../../src/render/write-listening-page.js';
import { makeExampleReport } from '../../test/support/example-report.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { heading, line, medianMs } from './timing.js';

const BYTES_PER_MB = 1e6;
const SAMPLE_RATE_HZ = 48000;

/** Page size grows with coils, not wirings: the three-coil sample (47 wirings) and the two-humbucker sample (four coils, 572 wirings). */
export function benchListeningPage(): void {
  heading('Listening page (coil signals in the page; strum at 48 kHz)');
  for (const sample of ['three-single-coil.json', 'two-humbucker.json']) {
    const guitar = parseGuitar(JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'samples', sample), 'utf8')));
    const report = makeExampleReport(guitar.elements.map((element) => element.id), guitar.name, 96);
    let size = 0;
    const ms = medianMs(() => {
      size = renderPageFor(report, { guitar, phrase: builtInPhrase('strum', guitar.strings.length), sampleRateHz: SAMPLE_RATE_HZ, seed: 1, overrides: {}, hum: null }).length;
    });
    line(`${sample}: ${guitar.coils.length} coils, page of ${(size / BYTES_PER_MB).toFixed(2)} MB (${(size / BYTES_PER_MB / guitar.coils.length).toFixed(2)} MB per coil)`, `${ms.toFixed(0)} ms`);
  }
}
