import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { testFolder } from './support/temporary-folder.js';
import { captureIo, main } from '../src/cli/index.js';
import { prepareCircuit, solveTransfers } from '../src/circuit/index.js';
import { parseGuitarText } from '../src/guitar/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { readPrintRows, summedTransferAt } from './support/ngspice-sweep.js';

const samples = join(import.meta.dirname, '..', 'samples');
const SAMPLE_FILES = ['three-single-coil.json', 'humbucker-two-single-coil.json', 'two-humbucker.json', 'two-lead-humbucker.json'];

async function run(cwd: string, ...argv: string[]) {
  const io = captureIo(cwd);
  const status = await main(argv, io);
  return { status, out: io.out(), err: io.err() };
}

interface AnalyzeDocument {
  guitar: string;
  settings: Record<string, unknown>;
  count: number;
  silent: boolean;
  wirings: Array<Record<string, unknown>>;
}

describe('coilbench analyze', () => {
  // Audio figures render every wiring in memory; the second four-coil sample skips them to keep the suite quick.
  it.each(SAMPLE_FILES)('%s: --json gives finite figures for every wiring', async (file) => {
    const withAudio = file !== 'two-humbucker.json';
    const { status, out, err } = await run(samples, 'analyze', file, '--json', ...(withAudio ? [] : ['--no-audio']));
    expect(status).toBe(0);
    expect(err).toBe('');
    const document = JSON.parse(out) as AnalyzeDocument;
    expect(document.count).toBe(document.wirings.length);
    expect(Object.keys(document)).toEqual(['guitar', 'settings', 'count', 'silent', 'wirings', 'groups']);
    for (const wiring of document.wirings) {
      expect(Object.keys(wiring)).toEqual([
        'id', 'expression', 'coils', 'topology', 'outOfPhase', 'description',
        'resonanceHz', 'resonanceHzReason', 'peakDb', 'peakDbReason', 'resonanceQ', 'resonanceQReason',
        'humDb', 'humCategory', 'humCancelling', 'levelDb', 'loudnessLufs', 'centroidHz', 'group',
      ]);
      expect(Number.isInteger(wiring.group)).toBe(true);
      const finite = ['humDb', ...(withAudio ? ['levelDb', 'loudnessLufs', 'centroidHz'] : [])];
      for (const key of finite) expect(Number.isFinite(wiring[key]), `${wiring.expression} ${key}`).toBe(true);
      if (!withAudio) expect(wiring.levelDb).toBeNull();
      // a resonance figure is a finite number, or null with its reason beside it (e.g. no −3 dB point inside the band)
      for (const key of ['resonanceHz', 'peakDb', 'resonanceQ']) {
        const reason = wiring[`${key}Reason`];
        if (wiring[key] === null) expect(typeof reason === 'string' && reason.length > 0, `${wiring.expression} ${key}`).toBe(true);
        else {
          expect(Number.isFinite(wiring[key]), `${wiring.expression} ${key}`).toBe(true);
          expect(reason).toBeNull();
        }
      }
      expect(typeof wiring.humCancelling).toBe('boolean');
    }
  });

  it('reports the load actually used, with overrides', async () => {
    const { status, out } = await run(samples, 'analyze', 'three-single-coil.json', '--json', '--volume', '7', '--tone', '5', '--cable', '900p', '--mains', '50');
    expect(status).toBe(0);
    const settings = (JSON.parse(out) as AnalyzeDocument).settings as {
      volume: { setting: number; wiperFraction: number };
      tone: { setting: number; resistanceOhms: number };
      cableCapacitanceF: number;
      mainsHz: number;
    };
    expect(settings.volume.setting).toBe(7);
    // audio taper, 10 % at 5: r(x) = (81^(x/10) − 1)/80
    expect(settings.volume.wiperFraction).toBeCloseTo((81 ** 0.7 - 1) / 80, 12);
    expect(settings.tone.setting).toBe(5);
    expect(settings.tone.resistanceOhms).toBeCloseTo(25e3, 6);
    expect(settings.cableCapacitanceF).toBeCloseTo(900e-12, 20);
    expect(settings.mainsHz).toBe(50);
  });

  it('sorts: --sort hum puts the quietest first, --sort resonance the highest peak first', async () => {
    const hum = JSON.parse((await run(samples, 'analyze', 'three-single-coil.json', '--json', '--sort', 'hum')).out) as AnalyzeDocument;
    const values = hum.wirings.map((wiring) => wiring.humDb as number);
    expect(values).toEqual([...values].sort((a, b) => a - b));
    const resonance = JSON.parse((await run(samples, 'analyze', 'three-single-coil.json', '--json', '--sort', 'resonance')).out) as AnalyzeDocument;
    const peaks = resonance.wirings.map((wiring) => wiring.resonanceHz as number);
    expect(peaks).toEqual([...peaks].sort((a, b) => b - a));
  });

  it('prints a table and a Markdown table from the same columns', async () => {
    const table = await run(samples, 'analyze', 'three-single-coil.json');
    expect(table.status).toBe(0);
    expect(table.out).toMatch(/resonance Hz\s+peak dB\s+Q\s+hum dB\s+hum\s+level dB\s+centroid Hz\s+group\s+in words/u);
    expect(table.out).toMatch(/w6\s+neck \/\/ mid\s+\d+\s+\+\d+\.\d\s+\d\.\d\d\s+-\d+\s+(?:reduces|cancels)/u);
    const markdown = await run(samples, 'analyze', 'three-single-coil.json', '--markdown');
    expect(markdown.out).toContain('| # | wiring | resonance Hz | peak dB | Q | hum dB | hum | level dB | LUFS | centroid Hz | group | in words |');
    expect(markdown.out.split('\n').filter((line) => line.startsWith('| w'))).toHaveLength(47);
  });

  it('--csv writes the file whole (through a temporary name) with every column', async () => {
    const folder = testFolder('csv');
    const { status, err } = await run(folder, 'analyze', join(samples, 'three-single-coil.json'), '--csv', 'wirings.csv');
    expect(status).toBe(0);
    expect(err).toContain('wrote wirings.csv (47 wirings)');
    const lines = readFileSync(join(folder, 'wirings.csv'), 'utf8').split('\r\n');
    expect(lines[0]).toBe('id,expression,coils,topology,outOfPhase,resonanceHz,peakDb,resonanceQ,humDb,humCategory,humCancelling,levelDb,loudnessLufs,centroidHz,group,description');
    expect(lines).toHaveLength(49); // header, 47 rows, final empty line
    expect(readdirSync(folder)).toEqual(['wirings.csv']);
  });

  it('bad overrides: one line each, exit 2, nothing written', async () => {
    const folder = testFolder('bad');
    const { status, out, err } = await run(
      folder, 'analyze', join(samples, 'three-single-coil.json'),
      '--csv', 'out.csv', '--volume', '11', '--tone', 'bright', '--cable', '9', '--mains', '55', '--sort', 'sparkle',
    );
    expect(status).toBe(2);
    expect(out).toBe('');
    expect(err.trimEnd().split('\n')).toEqual([
      'coilbench: --volume: expected a knob setting from 0 to 10 like 7 or 4.5, got "11"',
      'coilbench: --tone: expected a knob setting from 0 to 10 like 7 or 4.5, got "bright"',
      'coilbench: --cable: expected the cable\'s total capacitance: a capacitance with a unit or prefix like "120p", "22n", "0.022u" or the code "223" (a bare number is ambiguous here), got "9"',
      'coilbench: --mains: expected 50 or 60 (hertz), got "55"',
      'coilbench: --sort: expected one of id, coils, resonance, peak, q, hum, level, loudness, brightness, group, got "sparkle"',
    ]);
    expect(existsSync(join(folder, 'out.csv'))).toBe(false);
  });

  it('--tone on a guitar without a tone control is refused', async () => {
    const folder = testFolder('notone');
    const guitar = JSON.parse(readFileSync(join(samples, 'two-lead-humbucker.json'), 'utf8')) as { controls: Record<string, unknown> };
    guitar.controls.tone = null;
    writeFileSync(join(folder, 'g.json'), JSON.stringify(guitar));
    const { status, err } = await run(folder, 'analyze', 'g.json', '--tone', '5');
    expect(status).toBe(2);
    expect(err).toContain('--tone: expected no --tone for a guitar without a tone control, got "5"');
  });

  it('volume 0 says plainly that nothing reaches the amplifier, with no -Infinity or NaN', async () => {
    const { status, out, err } = await run(samples, 'analyze', 'three-single-coil.json', '--json', '--volume', '0');
    expect(status).toBe(0);
    expect(err).toContain('nothing reaches the amplifier');
    expect(out).not.toMatch(/Infinity|NaN/u);
    const document = JSON.parse(out) as AnalyzeDocument & { note: string };
    expect(document.silent).toBe(true);
    expect(document.note).toContain('nothing reaches the amplifier');
    expect(document.wirings.every((wiring) => wiring.resonanceHz === null && wiring.humDb === null)).toBe(true);
    const table = await run(samples, 'analyze', 'three-single-coil.json', '--volume', '0');
    expect(table.out).toContain('Silent: the volume at 0');
    expect(table.out).not.toMatch(/Infinity|NaN/u);
  });
});

describe('coilbench netlist', () => {
  it('prints a plain ngspice netlist with one source per used coil, the load, a sweep and a print', async () => {
    const { status, out } = await run(samples, 'netlist', 'three-single-coil.json', 'neck + ~bridge');
    expect(status).toBe(0);
    expect(out.split('\n')[0]).toBe('coilbench: Tidewater bench guitar: three single coils (invented values) - w9: neck + ~bridge');
    expect(out.match(/^V(neck|mid|bridge) /gmu)).toEqual(['Vneck ', 'Vbridge ']);
    expect(out).toContain('.ac dec 20 20 20000');
    expect(out).toContain('.print ac vdb(out) vp(out)*180/pi');
    expect(out.trimEnd().endsWith('.end')).toBe(true);
    expect(out).toMatch(/^Ramp out 0 1000000$/mu);
  });

  it('accepts a connection list: the same circuit as its notation gives the same elements and load', async () => {
    const notation = await run(samples, 'netlist', 'three-single-coil.json', 'neck + ~bridge');
    const joints = await run(samples, 'netlist', 'three-single-coil.json', 'neck.finish = hot, neck.start = bridge.start, bridge.finish = ground');
    expect(joints.status).toBe(0);
    const elements = (text: string): string[] => text.split('\n').filter((line) => /^[VLRC]/u.test(line)).map((line) => line.replace(/\b(j1|n2)\b/gu, 'joint'));
    expect(elements(joints.out)).toEqual(elements(notation.out));
    const bad = await run(samples, 'netlist', 'three-single-coil.json', 'neck.finish = hot', '--build-sheet');
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/^coilbench: --build-sheet: expected a wiring in \+, \/\/ and ~ notation/u);
  });

  it('accepts a wiring number and any spelling of the same wiring', async () => {
    const a = await run(samples, 'netlist', 'three-single-coil.json', 'w9');
    const b = await run(samples, 'netlist', 'three-single-coil.json', '~bridge+neck');
    expect(a.out).toBe(b.out);
  });

  it('refuses a bad expression with exit 2 and one line', async () => {
    const { status, out, err } = await run(samples, 'netlist', 'three-single-coil.json', 'neck + treble');
    expect(status).toBe(2);
    expect(out).toBe('');
    expect(err).toBe('coilbench: <wiring>: expected a known coil (neck, mid, bridge), got "treble" at column 8 of "neck + treble"\n');
  });

  it('the build sheet of a series out-of-phase wiring reads as a solderer expects', async () => {
    const { status, out } = await run(samples, 'netlist', 'three-single-coil.json', 'neck + ~bridge', '--build-sheet');
    expect(status).toBe(0);
    // Two coils wound and magnetised alike, in series out of phase: like ends joined (common practice).
    expect(out).toMatch(/neck \(winding cw, north pole up; in phase\):\n\s+finish -> hot\n\s+start\s+-> j1/u);
    expect(out).toMatch(/bridge \(winding cw, north pole up; out of phase\):\n\s+start\s+-> j1\n\s+finish -> ground/u);
    expect(out).toMatch(/hot\s+: neck finish/u);
    expect(out).toMatch(/j1\s+: neck start \+ bridge start/u);
    expect(out).toMatch(/ground: bridge finish/u);
    expect(out).toContain('mid: leave both leads unconnected');
    expect(out).toContain('about 12.3 kΩ'); // 5.9 kΩ + 6.4 kΩ in series
    for (const caution of ['stand', 'burns', 'fume', 'wash your', 'meter', 'cover', 'Never open an amplifier']) expect(out).toContain(caution);
  });
});

describe('netlists in plain ngspice (Debian ngspice, `ngspice -b`)', () => {
  const found = spawnSync('ngspice', ['--version'], { encoding: 'utf8' });
  const available = found.status === 0;
  if (!available && process.env.CI) throw new Error('ngspice is not installed: .ci/run installs the Debian package');
  it.skipIf(!available)('prints a sweep that matches the solver to the printed precision', async () => {
    const guitar = parseGuitarText(readFileSync(join(samples, 'humbucker-two-single-coil.json'), 'utf8'));
    const wiring = enumerateWirings(guitar.elements).find((candidate) => candidate.expression === 'neck + (~mid // bridge_screw)');
    expect(wiring).toBeDefined();
    const folder = testFolder('ngspice');
    const { out } = await run(samples, 'netlist', 'humbucker-two-single-coil.json', wiring?.expression ?? '');
    writeFileSync(join(folder, 'w.cir'), out);
    const result = spawnSync('ngspice', ['-b', join(folder, 'w.cir')], { encoding: 'utf8' });
    expect(result.status).toBe(0);
    const rows = readPrintRows(result.stdout);
    expect(rows.length).toBeGreaterThanOrEqual(61);
    const frequencies = Float64Array.from(rows.map((cells) => cells[1] as number));
    const transfers = solveTransfers(prepareCircuit(guitar, frequencies), wiring?.network ?? { kind: 'element', element: 0, inverted: false });
    rows.forEach((cells, k) => {
      const { re, im } = summedTransferAt(transfers, k);
      expect(Math.abs(20 * Math.log10(Math.hypot(re, im)) - (cells[2] as number))).toBeLessThan(0.001);
      const phase = (Math.atan2(im, re) * 180) / Math.PI;
      const difference = ((phase - (cells[3] as number) + 540) % 360) - 180;
      expect(Math.abs(difference)).toBeLessThan(0.001);
    });
  });
});
