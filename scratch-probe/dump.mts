import { writeFileSync } from 'node:fs';
import { seededRandom } from '../test/support/seeded-random.js';
import { randomGuitar } from '../test/support/random-guitar.js';
// Replays the old generator's draw order is not possible after the cable change, so search anew for a NaN case with the old code? Just dump seed-7 style cases.
const random = seededRandom(7);
for (const elements of [1,2,3,4]) for (let i = 0; i < 20; i++) { const g = randomGuitar(random, elements); if (elements === 4 && i < 2) writeFileSync(`/tmp/hz/case-${i}.json`, JSON.stringify(g.document, null, 1)); }
