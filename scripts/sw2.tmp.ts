import { readFileSync } from 'node:fs';
import { parseGuitarText } from '../src/guitar/index.js';
import { createRandom } from '../src/math/index.js';
import { parseSwitchTexts, solveSwitchPlan } from '../src/switching/index.js';
import { randomInterestingPlan } from '../test/support/random-switch-plan.js';
const g = parseGuitarText(readFileSync('samples/' + process.argv[2], 'utf8'));
const kit = parseSwitchTexts(process.argv[3]!.split('+'));
const random = createRandom(Number(process.argv[4] ?? 1));
for (let k = 0; k < Number(process.argv[5] ?? 10); k += 1) {
  const got = randomInterestingPlan(g, kit, random, Number(process.argv[6] ?? 3));
  if (!got) { console.log('none'); continue; }
  const wishes = got.wishes;
  (globalThis as any).leaves = 0; const t0 = performance.now();
  const r = solveSwitchPlan(kit, g.elements.length, wishes, { stepBudget: 2e6 });
  console.log((globalThis as any).leaves, r.status, r.steps, (performance.now() - t0).toFixed(0), 'ms', wishes.map((w) => (w.kind === 'wiring' ? w.expression : w.kind)).join(' | '));
}
