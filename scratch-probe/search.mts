import { writeFileSync } from 'node:fs';
import { parseGuitar } from '../src/guitar/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { measureCircuitMetrics } from '../src/circuit/index.js';
import { seededRandom } from '../test/support/seeded-random.js';
import { randomGuitar } from '../test/support/random-guitar.js';
const bad = (doc: any): boolean => { try { const g = parseGuitar(doc); const w = enumerateWirings(g.elements); const m = measureCircuitMetrics(g, w); return m.wirings.some((x) => Object.values(x).some((v) => typeof v === 'number' && !Number.isFinite(v))); } catch { return false; } };
const random = seededRandom(11);
let found: any;
for (let i = 0; i < 4000 && !found; i++) { const g = randomGuitar(random, 1 + random.below(2)).document; if (bad(g)) found = g; }
if (!found) { console.log('none'); process.exit(0); }
// greedy shrink: delete optional fields, round numbers
const paths = (o: any, p: string[] = []): string[][] => Object.entries(o).flatMap(([k, v]) => v && typeof v === 'object' && !Array.isArray(v) ? [[...p, k], ...paths(v, [...p, k])] : [[...p, k]]);
let changed = true;
while (changed) { changed = false;
  for (const p of paths(found)) { const c = structuredClone(found); let t = c; for (const k of p.slice(0, -1)) t = t?.[k]; if (!t) continue; delete t[p[p.length-1]!]; if (bad(c)) { found = c; changed = true; } }
  for (let i = found.coils.length - 1; i >= 0 && found.coils.length > 1; i--) { const c = structuredClone(found); c.coils.splice(i, 1); if (bad(c)) { found = c; changed = true; } }
}
console.log(JSON.stringify(found, null, 1));
writeFileSync('/tmp/hz/shrunk.json', JSON.stringify(found, null, 2));
