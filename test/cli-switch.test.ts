/**
 * `coilbench switch` end to end, in-process: a plan with its build sheet,
 * drawing and netlists; refusals with the reason (exit 2, nothing written);
 * the kit from the guitar file's `switching` section; one position's netlist
 * through the Debian ngspice (`ngspice -b`) against the series–parallel
 * engine.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { prepareCircuit, solveTransfers } from '../src/circuit/index.js';
import { parseGuitarText } from '../src/guitar/index.js';
import { escapeHtml } from '../src/report/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { readPrintRows, summedTransferAt } from './support/ngspice-sweep.js';

const samples = join(import.meta.dirname, '..', 'samples');
const STANDARD = ['neck', 'neck // mid', 'mid', 'mid // bridge', 'bridge'].flatMap((text) => ['--wiring', text]);

async function run(cwd: string, ...args: string[]) {
  const io = captureIo(cwd);
  const code = await main(args, io);
  return { code, out: io.out(), err: io.err() };
}

describe('coilbench switch', () => {
  it('plans a one-pole five-position lever for three single coils: lugs, joints, positions, meter readings, cautions, drawing', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-switch-'));
    const svg = join(folder, 'plan.svg');
    const { code, out, err } = await run(samples, 'switch', 'three-single-coil.json', '--switch', 'lever-5-position-1-pole', ...STANDARD, '--svg', svg);
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/A common\s+hot/u);
    expect(out).toMatch(/Check each position with a meter before closing up/u);
    expect(out).toMatch(/Switch lug layouts differ between makers/u);
    expect(out).toMatch(/Never open an amplifier/u);
    expect(out).toMatch(/fume extractor/u);
    expect(out).toMatch(/matches the wanted wiring/u);
    // Position 2: neck and mid in parallel, 5.9 kΩ ∥ 6.1 kΩ = 3.0 kΩ (Ohm's law).
    expect(out).toMatch(/2\s+neck \/\/ mid\s+neck \/\/ mid\s+about 3 kΩ/u);
    const drawing = readFileSync(svg, 'utf8');
    expect(drawing.startsWith('<svg')).toBe(true);
    expect(drawing.trimEnd().endsWith('</svg>')).toBe(true);
    expect(drawing).toContain('pole A');
  });

  it('--render labels the page, report and files by position, in position order', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-switch-render-'));
    const out = join(folder, 'positions');
    // Position 5 repeats position 3's wiring: the page and files must still list five positions in order.
    const wanted = ['neck', 'neck // mid', 'mid', 'mid // bridge', 'mid'];
    const { code, err } = await run(samples, 'switch', 'three-single-coil.json', '--switch', 'lever-5-position-2-pole', ...wanted.flatMap((text) => ['--wiring', text]), '--render', '-o', out);
    expect(err).not.toMatch(/coilbench: .*expected/u);
    expect(code).toBe(0);
    const report = JSON.parse(readFileSync(join(out, 'report.json'), 'utf8')) as {
      positions: { position: number; label: string; wiringId: string | null; expression: string | null }[];
      wirings: { id: string; expression: string; wav: string | null }[];
    };
    expect(report.positions.map((position) => position.label)).toEqual(wanted.map((text, k) => `position ${k + 1}: ${text}`));
    for (const position of report.positions) {
      expect(report.wirings.find((wiring) => wiring.id === position.wiringId)?.expression).toBe(position.expression);
    }
    const page = readFileSync(join(out, 'index.html'), 'utf8');
    const shown = wanted.map((text, k) => page.indexOf(`<strong>${escapeHtml(`position ${k + 1}: ${text}`)}</strong>`));
    expect(shown.every((at) => at > 0)).toBe(true);
    expect([...shown].sort((a, b) => a - b)).toEqual(shown);
    const table = readFileSync(join(out, 'switch-positions.md'), 'utf8');
    const rows = table.split('\n').filter((line) => /^\| position \d/u.test(line));
    expect(rows.map((row) => row.split('|')[1]?.trim())).toEqual(wanted.map((text, k) => `position ${k + 1}: ${text}`));
    // Each row names the WAV file of its wiring.
    for (const [k, row] of rows.entries()) {
      const wav = report.wirings.find((wiring) => wiring.id === report.positions[k]?.wiringId)?.wav;
      expect(wav).toBeTruthy();
      expect(row).toContain(wav as string);
      expect(existsSync(join(out, wav as string))).toBe(true);
    }
  }, 120_000);

  it('refuses eight wirings on a five-position switch with the reason, and writes nothing', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-switch-'));
    const svg = join(folder, 'plan.svg');
    const eight = ['w1', 'w2', 'w3', 'w4', 'w5', 'w6', 'w7', 'w8'].flatMap((id) => ['--wiring', id]);
    const { code, err } = await run(samples, 'switch', 'three-single-coil.json', '--switch', 'lever-5-position-2-pole', ...eight, '--svg', svg, '--search-limit', '20000');
    expect(code).toBe(2);
    expect(err).toMatch(/coilbench: --wiring: expected at most 5 wirings, one per position of lever-5-position-2-pole, got "8 wirings"/u);
    expect(existsSync(svg)).toBe(false);
  });

  it('refuses series in an in-between lever position after a single coil, naming both positions', async () => {
    const { code, err } = await run(samples, 'switch', 'three-single-coil.json', '--switch', 'lever-5-position-1-pole', '--wiring', 'neck', '--wiring', 'neck + mid');
    expect(code).toBe(2);
    expect(err).toMatch(/--wiring \(position 2\): expected a wiring that keeps every joint of position 1 \(neck\)/u);
  });

  it('reads the kit from the guitar file, and names a bad preset by its path', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-switch-'));
    const guitar = JSON.parse(readFileSync(join(samples, 'humbucker-two-single-coil.json'), 'utf8')) as Record<string, unknown>;
    delete guitar['$schema'];
    writeFileSync(join(folder, 'good.json'), JSON.stringify({ ...guitar, switching: { switches: [{ preset: 'toggle-2-position-2-pole' }] } }));
    const good = await run(folder, 'switch', 'good.json', '--wiring', 'bridge_screw + bridge_slug', '--wiring', 'bridge_screw');
    expect(good.err).toBe('');
    expect(good.code).toBe(0);
    expect(good.out).toMatch(/Kit: toggle-2-position-2-pole \(2 positions\)/u);
    writeFileSync(join(folder, 'bad.json'), JSON.stringify({ ...guitar, switching: { switches: [{ preset: 'lever-7-position-2-pole' }] } }));
    const bad = await run(folder, 'switch', 'bad.json', '--wiring', 'neck');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/coilbench: switching\.switches\[0\]\.preset: expected a preset like/u);
  });

  it('--choose picks the most different wirings a two-position toggle gives for one humbucker, and compares pole counts', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-switch-'));
    const guitar = {
      name: 'one humbucker (invented values)',
      coils: [
        { id: 'screw', pickup: 'bridge', position: '51mm', resistance: '4.1k', inductance: '2.1H', winding: 'cw', magnet: 'north' },
        { id: 'slug', pickup: 'bridge', position: '33mm', resistance: '4.0k', inductance: '2.0H', winding: 'ccw', magnet: 'south' },
      ],
    };
    writeFileSync(join(folder, 'one.json'), JSON.stringify(guitar));
    const { code, out, err } = await run(folder, 'switch', 'one.json', '--switch', 'toggle-2-position-1-pole', '--choose');
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/Kits compared/u);
    expect(out).toMatch(/toggle-2-position-2-pole \(2 positions\)\s+2\s+\d+\.\d\d×/u);
    const rows = out.split('\n').filter((line) => /^\s+[12]\s{2,}\S/u.test(line));
    expect(rows).toHaveLength(2);
  });

  const found = spawnSync('ngspice', ['--version'], { encoding: 'utf8' });
  const available = found.status === 0;
  if (!available && process.env['CI']) throw new Error('ngspice is not installed: .ci/run installs the Debian package');
  it.skipIf(!available)('writes per-position netlists that the Debian ngspice runs, matching the wanted wiring within 0.01 dB', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-switch-'));
    const { code } = await run(samples, 'switch', 'three-single-coil.json', '--switch', 'lever-5-position-1-pole', ...STANDARD, '--netlists', folder);
    expect(code).toBe(0);
    const result = spawnSync('ngspice', ['-b', join(folder, 'position-4.cir')], { encoding: 'utf8' });
    expect(result.status).toBe(0);
    const rows = readPrintRows(result.stdout);
    expect(rows.length).toBeGreaterThanOrEqual(61);
    const guitar = parseGuitarText(readFileSync(join(samples, 'three-single-coil.json'), 'utf8'));
    const wiring = enumerateWirings(guitar.elements).find((candidate) => candidate.expression === 'mid // bridge');
    const frequencies = Float64Array.from(rows.map((cells) => cells[1] as number));
    const transfers = solveTransfers(prepareCircuit(guitar, frequencies), wiring?.network ?? { kind: 'element', element: 0, inverted: false });
    rows.forEach((cells, k) => {
      const { re, im } = summedTransferAt(transfers, k);
      expect(Math.abs(20 * Math.log10(Math.hypot(re, im)) - (cells[2] as number))).toBeLessThan(0.01);
    });
  });
});
