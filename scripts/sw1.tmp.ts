import { readFileSync } from 'node:fs';
import { parseGuitarText } from '../src/guitar/index.js';
import { findWiring, enumerateWirings, vocabularyOf, printNetwork } from '../src/wiring/index.js';
import { parseSwitchTexts, solveSwitchPlan, readPlanPositions, type PositionWish } from '../src/switching/index.js';
const g = parseGuitarText(readFileSync('/work/wt/switch/samples/' + process.argv[2], 'utf8'));
const ws = enumerateWirings(g.elements);
const voc = vocabularyOf(g);
const kit = parseSwitchTexts([process.argv[3] as string]);
const wishes: PositionWish[] = process.argv.slice(4).map((t) => t === 'off' ? { kind: 'off' } : t === 'free' ? { kind: 'free' } : (() => { const w = findWiring(t, ws, voc, 'x'); return { kind: 'wiring', network: w.network, expression: w.expression }; })());
const t0 = performance.now();
const r = solveSwitchPlan(kit, g.elements.length, wishes);
console.log(r.status, r.steps, (performance.now() - t0).toFixed(1), 'ms');
if (r.plan) {
  console.log(JSON.stringify({ items: r.plan.itemNets, lugs: r.plan.lugNets }));
  for (const p of readPlanPositions(g, r.plan)) console.log(p.position.index + 1, p.reading.kind === 'wiring' ? printNetwork(p.reading.network, g.elements.map((e) => e.id)) : JSON.stringify(p.reading));
}
