import { renderListeningPage, renderPageAudioScript } from '../../src/report/index.js';
import { makeExampleReport } from '../../test/support/example-report.js';
import { heading, line, medianMs } from './timing.js';

const RESPONSE_POINTS = 200;
const SAMPLE_RATE_HZ = 48000;
const DURATION_S = 6;
const BYTES_PER_SAMPLE_24_BIT = 3;
const BYTES_PER_MB = 1e6;

export function benchListeningPage(): void {
  heading('Listening page (renderListeningPage; figures invented, 200 response points)');
  for (const ids of [['neck', 'mid', 'bridge'], ['neck', 'neck-inner', 'bridge-inner', 'bridge']]) {
    const report = makeExampleReport(ids, 'Bench guitar (invented values)', RESPONSE_POINTS);
    let size = 0;
    const ms = medianMs(() => {
      size = renderListeningPage(report).length;
    });
    line(`${report.wirings.length} wirings: page of ${(size / BYTES_PER_MB).toFixed(2)} MB`, `${ms.toFixed(1)} ms`);
  }
  const wav = new Uint8Array(44 + SAMPLE_RATE_HZ * DURATION_S * BYTES_PER_SAMPLE_24_BIT).map((_, index) => index % 251);
  let scriptSize = 0;
  const ms = medianMs(() => {
    scriptSize = renderPageAudioScript('w1', wav).length;
  });
  line(`page audio script for a ${DURATION_S} s 24-bit WAV: ${(scriptSize / BYTES_PER_MB).toFixed(2)} MB`, `${ms.toFixed(1)} ms`);
}
