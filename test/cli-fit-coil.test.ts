/** `coilbench fit-coil`: the worked example, the peak form, writing into a guitar file, and bad input (exit 2, nothing written). */
import { copyFileSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { SAMPLE_SWEEP_COIL } from '../src/circuit/index.js';
import { parseGuitarText } from '../src/guitar/index.js';

const samples = join(import.meta.dirname, '..', 'samples');

async function run(cwd: string, ...argv: string[]) {
  const io = captureIo(cwd);
  const status = await main(argv, io);
  return { status, out: io.out(), err: io.err() };
}

describe('coilbench fit-coil', () => {
  it('prints the worked example recovered within 1 %, in SI units with --json', async () => {
    const { status, out } = await run(samples, 'fit-coil', 'coil-sweep.csv', '--json');
    expect(status).toBe(0);
    const fit = JSON.parse(out) as Record<string, number>;
    expect(Math.abs((fit.inductanceH as number) / SAMPLE_SWEEP_COIL.inductanceH - 1)).toBeLessThan(0.01);
    expect(Math.abs((fit.capacitanceF as number) / SAMPLE_SWEEP_COIL.capacitanceF - 1)).toBeLessThan(0.01);
    expect(Math.abs((fit.eddyShare as number) / SAMPLE_SWEEP_COIL.eddyShare - 1)).toBeLessThan(0.01);
    expect(fit.rmsRelativeError).toBeLessThan(1e-4);
    const text = await run(samples, 'fit-coil', 'coil-sweep.csv');
    expect(text.out).toMatch(/fit error\s+[\d.e-]+ % rms/u);
  });

  it('fits from the unloaded peak', async () => {
    const { status, out } = await run(samples, 'fit-coil', '--peak', '9k', '--height', '12', '--resistance', '6k', '--inductance', '2.5H', '--json');
    expect(status).toBe(0);
    const fit = JSON.parse(out) as Record<string, number>;
    expect(Math.abs((fit.unloadedPeakHz as number) / 9000 - 1)).toBeLessThan(1e-4);
    expect(Math.abs((fit.unloadedPeakDb as number) - 12)).toBeLessThan(1e-3);
  });

  it('writes the fitted values into a guitar file that stays valid', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-fit-'));
    copyFileSync(join(samples, 'three-single-coil.json'), join(folder, 'guitar.json'));
    copyFileSync(join(samples, 'coil-sweep.csv'), join(folder, 'sweep.csv'));
    const { status } = await run(folder, 'fit-coil', 'sweep.csv', '--guitar', 'guitar.json', '--coil', 'mid');
    expect(status).toBe(0);
    const guitar = parseGuitarText(readFileSync(join(folder, 'guitar.json'), 'utf8'));
    const mid = guitar.coils.find((coil) => coil.id === 'mid');
    expect(Math.abs((mid?.inductanceH as number) / SAMPLE_SWEEP_COIL.inductanceH - 1)).toBeLessThan(0.01);
    expect(Math.abs((mid?.eddyShare as number) / SAMPLE_SWEEP_COIL.eddyShare - 1)).toBeLessThan(0.01);
    expect(readdirSync(folder).sort()).toEqual(['guitar.json', 'sweep.csv']);
  });

  it('refuses bad input with exit 2 and one line per problem, leaving the guitar file as it was', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-fit-'));
    copyFileSync(join(samples, 'three-single-coil.json'), join(folder, 'guitar.json'));
    const before = readFileSync(join(folder, 'guitar.json'), 'utf8');
    writeFileSync(join(folder, 'bad.csv'), 'frequency,magnitude,phase\n100,-3,0\n');
    const bad = await run(folder, 'fit-coil', 'bad.csv', '--guitar', 'guitar.json', '--coil', 'mid');
    expect(bad.status).toBe(2);
    expect(bad.err).toBe('coilbench: bad.csv:2: expected a positive magnitude in ohms and a phase in degrees (−180 to 180), got "100,-3,0"\n');
    copyFileSync(join(samples, 'coil-sweep.csv'), join(folder, 'sweep.csv'));
    const wrongCoil = await run(folder, 'fit-coil', 'sweep.csv', '--guitar', 'guitar.json', '--coil', 'nope');
    expect(wrongCoil.status).toBe(2);
    expect(wrongCoil.err).toContain('--coil: expected one of the coil ids');
    expect(readFileSync(join(folder, 'guitar.json'), 'utf8')).toBe(before);
    const nothing = await run(folder, 'fit-coil');
    expect(nothing.status).toBe(2);
  });
});
