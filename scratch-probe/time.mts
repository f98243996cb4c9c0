import { writeFileSync } from 'node:fs';
import { captureIo, main } from '../src/cli/index.js';
import { seededRandom } from '../test/support/seeded-random.js';
import { randomGuitar } from '../test/support/random-guitar.js';
const random = seededRandom(5);
for (const elements of [1,2,3,4,5]) {
  for (const audio of [false, true]) {
    if (audio && elements > 3) continue;
    const t = performance.now(); let fails = 0;
    const n = elements >= 4 ? 3 : 10;
    for (let i = 0; i < n; i++) {
      const g = randomGuitar(random, elements);
      writeFileSync('/tmp/hz/rg.json', JSON.stringify(g.document));
      const io = captureIo('/tmp/hz');
      const s = await main(['analyze', 'rg.json', '--json', ...(audio ? [] : ['--no-audio'])], io);
      if (s !== 0) { fails++; console.log(io.err().slice(0, 300)); }
    }
    console.log(elements, audio, ((performance.now()-t)/n).toFixed(0), 'ms each', fails, 'fails');
  }
}
