import { parseGuitar } from '../src/guitar/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { measureCircuitMetrics } from '../src/circuit/index.js';
import { seededRandom } from '../test/support/seeded-random.js';
import { randomGuitar } from '../test/support/random-guitar.js';
const random = seededRandom(7);
for (const elements of [1,2,3,4]) {
  for (let i = 0; i < 20; i++) {
    const doc = randomGuitar(random, elements).document;
    if (elements < 4) continue;
    const g = parseGuitar(doc);
    const w = enumerateWirings(g.elements);
    try { const m = measureCircuitMetrics(g, w); m.wirings.forEach((x, k) => { for (const [key, v] of Object.entries(x)) if (typeof v === 'number' && !Number.isFinite(v)) console.log(i, w[k]!.expression, key, v, JSON.stringify(x)); }); } catch (e) { console.log(String(e).slice(0,200)); }
  }
}
