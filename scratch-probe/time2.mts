import { parseGuitar } from '../src/guitar/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { measureCircuitMetrics } from '../src/circuit/index.js';
import { seededRandom } from '../test/support/seeded-random.js';
import { randomGuitar } from '../test/support/random-guitar.js';
const random = seededRandom(7);
for (const elements of [1,2,3,4,5]) {
  const n = elements === 5 ? 3 : 20;
  const t = performance.now();
  let bad = 0;
  for (let i = 0; i < n; i++) {
    const g = parseGuitar(randomGuitar(random, elements).document);
    const w = enumerateWirings(g.elements);
    try { const m = measureCircuitMetrics(g, w); for (const x of m.wirings) for (const v of Object.values(x)) if (typeof v === 'number' && !Number.isFinite(v)) bad++; } catch (e) { bad++; console.log(String(e).slice(0,200)); }
  }
  console.log(elements, ((performance.now()-t)/n).toFixed(1), 'ms', bad);
}
