import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureCoilDrive, measureSpectralBasis } from '../analysis/index.js';
import { prepareCircuitMetrics } from '../circuit/index.js';
import { parseGuitarText, wiringCountFor } from '../guitar/index.js';
import { testFolder } from '../../test/support/temporary-folder.js';
import { describeLoad, settingsRecord } from './commands/analyze.js';
import { captureIo } from './io.js';
import { main } from './main.js';
import { streamAnalysis } from './stream-analysis.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');

/** The streamed analysis of a small guitar (the code path six elements take), run directly. */
async function streamed(file: string, format: 'table' | 'markdown' | 'json', folder: string, csv?: string): Promise<{ out: string; err: string }> {
  const guitar = parseGuitarText(readFileSync(join(samples, file), 'utf8'), file);
  const basis = measureSpectralBasis(guitar);
  const circuit = prepareCircuitMetrics(guitar, undefined, { drive: measureCoilDrive(basis) });
  const io = captureIo(folder);
  await streamAnalysis({
    io,
    guitar,
    circuit,
    basis,
    overrides: undefined,
    total: wiringCountFor(guitar.elements.length),
    csv,
    format,
    big: false,
    settings: settingsRecord(circuit.load, circuit.points),
    settingsLine: describeLoad(circuit.load),
    footnotes: ['footnote'],
    silentNote: 'silent',
  });
  return { out: io.out(), err: io.err() };
}

describe('streamed analyze (more than 9,997 wirings), on a small guitar', () => {
  it('JSON, CSV, table and Markdown carry the same figures as the in-memory analyze --no-audio, and the level from band spectra', async () => {
    const folder = testFolder('stream-analysis');
    const io = captureIo(folder);
    expect(await main(['analyze', join(samples, 'three-single-coil.json'), '--no-audio', '--json', '--csv', join(folder, 'memory.csv')], io), io.err()).toBe(0);
    const memory = JSON.parse(io.out()) as { wirings: Array<Record<string, unknown>>; settings: unknown };

    const json = await streamed('three-single-coil.json', 'json', folder, 'streamed.csv');
    const document = JSON.parse(json.out) as { count: number; settings: unknown; wirings: Array<Record<string, unknown>>; groups: null; groupsNote: string };
    expect(document.count).toBe(47);
    expect(document.settings).toEqual(memory.settings);
    expect(document.groups).toBeNull();
    expect(document.groupsNote).toMatch(/pairs of wirings/u);
    expect(document.wirings.map((row) => row.id)).toEqual(memory.wirings.map((row) => row.id));
    document.wirings.forEach((row, index) => {
      const other = memory.wirings[index] as Record<string, unknown>;
      for (const key of ['expression', 'description', 'resonanceHz', 'peakDb', 'resonanceQ', 'humDb', 'humCategory']) expect(row[key], `${String(row.id)} ${key}`).toEqual(other[key]);
      expect(typeof row.levelDb).toBe('number');
      expect(typeof row.brightnessHz).toBe('number');
      expect(row.loudnessLufs).toBeNull();
    });
    // single coils average 0 dB (the level's reference is their mean energy)
    const singles = document.wirings.filter((row) => (row.coils as string[]).length === 1).map((row) => row.levelDb as number);
    expect(singles.reduce((sum, level) => sum + 10 ** (level / 10), 0) / singles.length).toBeCloseTo(1, 12);

    // The CSV: whole, renamed into place, no temporary file left; the same cells as the in-memory CSV but the level and the group.
    expect(json.err).toMatch(/wrote streamed\.csv \(47 wirings\)/u);
    expect(readdirSync(folder).filter((name) => name.endsWith('.tmp'))).toEqual([]);
    const csvRows = (name: string): string[][] => readFileSync(join(folder, name), 'utf8').trimEnd().split('\r\n').map((line) => line.split(','));
    const streamedCsv = csvRows('streamed.csv');
    const memoryCsv = csvRows('memory.csv');
    expect(streamedCsv[0]).toEqual(memoryCsv[0]);
    const header = memoryCsv[0] as string[];
    const level = header.indexOf('levelDb');
    const group = header.indexOf('group');
    expect(streamedCsv).toHaveLength(48);
    streamedCsv.slice(1).forEach((cells, row) => {
      const expected = [...(memoryCsv[row + 1] as string[])];
      expect(Number(cells[level])).toBeCloseTo(document.wirings[row]?.levelDb as number, 12);
      expected[level] = cells[level] as string;
      expected[group] = '';
      expect(cells).toEqual(expected);
    });

    const table = await streamed('three-single-coil.json', 'table', folder);
    const lines = table.out.split('\n');
    const headerLine = lines.findIndex((line) => line.includes('resonance Hz'));
    expect(lines[headerLine + 1]).toMatch(/^-+( {2}-+)+$/u);
    const rows = lines.slice(headerLine + 2).filter((line) => /^\s*w\d+ /u.test(line));
    expect(rows).toHaveLength(47);
    // every row's columns line up under the header: the expression column starts at the same place
    const start = (lines[headerLine] as string).indexOf('wiring');
    for (const row of rows) expect(row.slice(start - 2, start)).toBe('  ');
    expect(table.out).toMatch(/Not computed for 47 wirings: groups/u);

    const markdown = await streamed('three-single-coil.json', 'markdown', folder);
    expect(markdown.out.split('\n').filter((line) => /^\| w\d+ \|/u.test(line))).toHaveLength(47);
  }, 120_000);

  it('six elements: asks for --no-audio and refuses --sort, before any work and without writing', async () => {
    const folder = testFolder('stream-refusals');
    const io = captureIo(folder);
    expect(await main(['analyze', join(samples, 'three-humbucker.json'), '--sort', 'peak', '--csv', 'out.csv'], io)).toBe(2);
    expect(io.err()).toMatch(/^coilbench: --no-audio: expected --no-audio above 9,997 wirings .*got "audio figures for 228,386 wirings"$/mu);
    expect(io.err()).toMatch(/^coilbench: --sort: expected no --sort above 9,997 wirings .*got "--sort peak for 228,386 wirings"$/mu);
    expect(existsSync(join(folder, 'out.csv'))).toBe(false);
  });
});
