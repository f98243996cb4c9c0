import { readFileSync } from 'node:fs';
import { parseGuitar } from '../src/guitar/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { measureCircuitMetrics } from '../src/circuit/index.js';
for (const f of process.argv.slice(2)) {
  const g = parseGuitar(JSON.parse(readFileSync(f, 'utf8')));
  const w = enumerateWirings(g.elements);
  const m = measureCircuitMetrics(g, w);
  let bad = 0; m.wirings.forEach((x) => { for (const v of Object.values(x)) if (typeof v === 'number' && !Number.isFinite(v)) bad++; });
  console.log(f, bad);
}
