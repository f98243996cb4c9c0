/**
 * One validation: whatever `check` accepts, `analyze` and `render` accept
 * too, and every refusal names the field as the user wrote it (never an
 * internal name such as cableCapacitanceF or referenceEnergy). Random
 * guitars (test/support/random-guitar.ts) plus the edges of the limits.
 * COILBENCH_PROPERTY_GUITARS=N runs N random guitars (default 30).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { randomGuitarFile } from './support/random-guitar.js';

const GUITARS = Number(process.env.COILBENCH_PROPERTY_GUITARS ?? 30);
const INTERNAL_NAMES = /cableCapacitanceF|referenceEnergy|volumeSetting|toneSetting|internal error/u;
const folder = mkdtempSync(join(tmpdir(), 'coilbench-validation-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

async function run(...argv: string[]) {
  const io = captureIo(folder);
  const status = await main(argv, io);
  return { status, err: io.err() };
}

describe('check and the other commands agree', () => {
  it(`${GUITARS} random guitars: refused by check, or accepted by analyze (circuit figures)`, async () => {
    for (let seed = 1; seed <= GUITARS; seed += 1) {
      writeFileSync(join(folder, 'guitar.json'), JSON.stringify(randomGuitarFile(seed)));
      const check = await run('check', 'guitar.json');
      expect(check.err).not.toMatch(INTERNAL_NAMES);
      if (check.status !== 0) continue;
      const analyze = await run('analyze', 'guitar.json', '--no-audio', '--json');
      expect(analyze.err, `seed ${seed}`).not.toMatch(INTERNAL_NAMES);
      expect(analyze.status, `seed ${seed}: ${analyze.err}`).toBe(0);
    }
  }, 300_000);

  it('at the edges: the longest accepted lead, the least sensitive coils, a lead one step too long', async () => {
    const base = { name: 'Edge guitar (invented values)', coils: [{ id: 'neck', position: '160mm', resistance: '6k', inductance: '2.4H', sensitivity: 0.001 }] };
    writeFileSync(join(folder, 'edge.json'), JSON.stringify({ ...base, cable: { length: '20m', capacitancePerMetre: '1n' } }));
    expect((await run('check', 'edge.json')).status).toBe(0);
    const analyze = await run('analyze', 'edge.json', '--json');
    expect(analyze.status, analyze.err).toBe(0);
    writeFileSync(join(folder, 'long.json'), JSON.stringify({ ...base, cable: { length: '20.1m', capacitancePerMetre: '1n' } }));
    for (const command of ['check', 'analyze', 'wirings', 'render']) {
      const refused = await run(command, 'long.json');
      expect(refused.status).toBe(2);
      expect(refused.err).toMatch(/^coilbench: cable\.length: expected a lead whose total capacitance/u);
    }
  }, 120_000);
});
