/**
 * `coilbench render` end to end on the three-coil sample: the files a render
 * folder must hold, read back by a second WAV reader (the npm package
 * wavefile), determinism, skipping and completing interrupted runs, the
 * level modes, hum mixing, and the sound of the wirings as the trade
 * describes it (common practice: series darker and louder than parallel,
 * out of phase thin).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { WaveFile } from 'wavefile';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { measureLoudness } from '../src/analysis/index.js';
import { captureIo, main } from '../src/cli/index.js';
import type { ListeningReport } from '../src/report/index.js';
import { referenceLoudness } from './support/ebur128-reference.js';

const samples = join(import.meta.dirname, '..', 'samples');
const GUITAR = join(samples, 'three-single-coil.json');
const folders: string[] = [];

function scratchFolder(): string {
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-render-'));
  folders.push(folder);
  return folder;
}

async function run(cwd: string, ...argv: string[]) {
  const io = captureIo(cwd);
  const status = await main(argv, io);
  return { status, out: io.out(), err: io.err() };
}

/** Decode a WAV file with wavefile: header fields, INFO name and samples scaled to ±1. */
function readWav(path: string) {
  const wav = new WaveFile(readFileSync(path));
  const fmt = (wav as unknown as { fmt: { audioFormat: number; numChannels: number; sampleRate: number; bitsPerSample: number } }).fmt;
  const raw = wav.getSamples(false, Float64Array) as unknown as Float64Array;
  const scale = fmt.audioFormat === 3 ? 1 : 2 ** (fmt.bitsPerSample - 1) - 1;
  const samplesOut = Float32Array.from(raw, (value) => value / scale);
  return { fmt, name: wav.getTag('INAM'), comment: wav.getTag('ICMT'), samples: samplesOut };
}

const readReport = (folder: string): ListeningReport => JSON.parse(readFileSync(join(folder, 'report.json'), 'utf8')) as ListeningReport;

afterAll(() => {
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

describe('coilbench render: the whole folder', () => {
  let folder = '';
  let report: ListeningReport;
  let firstRun: { status: number; out: string; err: string };

  beforeAll(async () => {
    folder = join(scratchFolder(), 'out');
    firstRun = await run(samples, 'render', GUITAR, '-o', folder);
    report = readReport(folder);
  });

  it('writes the listening page, reports, one WAV per wiring (no page copies), and netlists', () => {
    expect(firstRun.status).toBe(0);
    expect(resolve(samples, firstRun.out.trim())).toBe(join(folder, 'index.html'));
    expect(firstRun.err).toContain('47 written, 0 unchanged');
    for (const name of ['index.html', 'report.json', 'wirings.csv', 'report.md']) expect(existsSync(join(folder, name)), name).toBe(true);
    const wavs = readdirSync(join(folder, 'wav'));
    expect(wavs.filter((name) => name.endsWith('.wav'))).toHaveLength(47);
    expect(wavs.filter((name) => name.endsWith('.wav.js'))).toHaveLength(0); // the page carries coil signals, not copies of the files
    expect(readdirSync(join(folder, 'netlists')).filter((name) => name.endsWith('.cir'))).toHaveLength(47);
    expect(readFileSync(join(folder, 'wirings.csv'), 'utf8').split('\r\n').filter((line) => line !== '')).toHaveLength(48);
    expect(report.wirings).toHaveLength(47);
    expect(report.render).toMatchObject({ phrase: 'strum', chain: 'clean', sampleRateHz: 48_000, level: 'true', format: 'pcm24' });
    // No temporary or scratch files are left behind.
    expect(readdirSync(folder).filter((name) => name.startsWith('.') && !['.coilbench-manifest.json', '.coilbench-folder.json'].includes(name))).toEqual([]);
    expect(wavs.filter((name) => name.includes('.tmp'))).toEqual([]);
  });

  it('every WAV reads back in a second reader (wavefile): RIFF header, sample count, INFO expression, no clipping', () => {
    const frames = Math.round(report.render.durationS * report.render.sampleRateHz);
    let loudest = 0;
    for (const wiring of report.wirings) {
      const wav = readWav(join(folder, wiring.wav ?? ''));
      expect(wav.fmt).toMatchObject({ audioFormat: 1, numChannels: 1, sampleRate: 48_000, bitsPerSample: 24 });
      expect(wav.samples.length).toBe(frames);
      expect(wav.name).toBe(wiring.expression);
      expect(wav.comment).toContain(wiring.description);
      let peak = 0;
      for (const value of wav.samples) peak = Math.max(peak, Math.abs(value));
      loudest = Math.max(loudest, peak);
    }
    // One common gain puts the loudest peak at the −1 dBFS ceiling.
    expect(20 * Math.log10(loudest)).toBeCloseTo(-1, 2);
  });

  it('gives finite metrics for every wiring and curves for the page', () => {
    for (const wiring of report.wirings) {
      for (const value of [wiring.levelDb, wiring.loudnessLufs, wiring.centroidHz, wiring.peakDb, wiring.humDb]) expect(Number.isFinite(value)).toBe(true);
      expect(wiring.responseDb).toHaveLength(report.responseFrequenciesHz.length);
    }
    // Levels refer to the mean of the single coils: their energies average to 0 dB.
    const singles = report.wirings.filter((wiring) => wiring.coils.length === 1);
    const meanEnergy = singles.reduce((sum, wiring) => sum + 10 ** (wiring.levelDb / 10), 0) / singles.length;
    expect(10 * Math.log10(meanEnergy)).toBeCloseTo(0, 9);
  });

  it('sounds as the trade describes: series darker and louder than parallel; out of phase thinner and quieter (common practice)', () => {
    const by = new Map(report.wirings.map((wiring) => [wiring.expression, wiring]));
    const pairs: Array<[string, string]> = [
      ['neck + mid', 'neck // mid'],
      ['neck + bridge', 'neck // bridge'],
      ['mid + bridge', 'mid // bridge'],
    ];
    for (const [seriesText, parallelText] of pairs) {
      const seriesWiring = by.get(seriesText)!;
      const parallelWiring = by.get(parallelText)!;
      expect(seriesWiring.levelDb, seriesText).toBeGreaterThan(parallelWiring.levelDb + 3);
      expect(seriesWiring.centroidHz, seriesText).toBeLessThan(parallelWiring.centroidHz);
    }
    for (const [inPhase, outOfPhase] of [
      ['neck // mid', 'neck // ~mid'],
      ['neck + bridge', 'neck + ~bridge'],
    ] as const) {
      expect(by.get(outOfPhase)!.levelDb).toBeLessThan(by.get(inPhase)!.levelDb - 3);
      expect(by.get(outOfPhase)!.centroidHz).toBeGreaterThan(by.get(inPhase)!.centroidHz * 1.2);
    }
  });

  it("a render's loudness agrees with the reference BS.1770 implementation (ebur128-wasm) within 0.1 LU", () => {
    const chosen = ['w1', 'w9', 'w20'].map((id) => report.wirings.find((wiring) => wiring.id === id)!);
    const audio = chosen.map((wiring) => readWav(join(folder, wiring.wav ?? '')).samples);
    const reference = referenceLoudness(audio.map((channel) => ({ sampleRateHz: 48_000, channels: [channel] })));
    audio.forEach((channel, index) => {
      expect(Math.abs(measureLoudness([channel], 48_000) - (reference[index] as number))).toBeLessThan(0.1);
    });
  });

  it('a re-run skips everything complete and unchanged, and redoes a deleted file', async () => {
    const again = await run(samples, 'render', GUITAR, '-o', folder);
    expect(again.status).toBe(0);
    expect(again.err).toContain('0 written, 47 unchanged');
    const victim = join(folder, report.wirings[8]?.wav ?? '');
    const before = readFileSync(victim);
    rmSync(victim);
    const repaired = await run(samples, 'render', GUITAR, '-o', folder);
    expect(repaired.err).toContain('1 written, 46 unchanged');
    expect(readFileSync(victim).equals(before)).toBe(true);
  });
});

describe('coilbench render: options', () => {
  it('is deterministic: the same input gives byte-identical files', async () => {
    const [a, b] = [scratchFolder(), scratchFolder()];
    for (const target of [a, b]) {
      const result = await run(samples, 'render', GUITAR, '-o', target, '--only', 'w1', '--only', 'neck + ~bridge', '--chain', 'drive');
      expect(result.status).toBe(0);
    }
    const names = readdirSync(join(a, 'wav'));
    expect(names.filter((name) => name.endsWith('.wav')).sort()).toEqual(['w1-neck-alone.wav', 'w9-neck-and-bridge-in-series-bridge-out-of-phase.wav']);
    for (const name of names) expect(readFileSync(join(a, 'wav', name)).equals(readFileSync(join(b, 'wav', name))), name).toBe(true);
  });

  it('--level matched writes every file at one loudness', async () => {
    const target = scratchFolder();
    const result = await run(samples, 'render', GUITAR, '-o', target, '--level', 'matched', '--only', 'w1', '--only', 'w7', '--only', 'w16', '--format', 'f32', '--chain', 'direct');
    expect(result.status).toBe(0);
    const report = readReport(target);
    const loudness = report.wirings.map((wiring) => measureLoudness([readWav(join(target, wiring.wav ?? '')).samples], 48_000));
    for (const value of loudness) expect(Math.abs(value - (loudness[0] as number))).toBeLessThan(0.05);
    expect(report.wirings.map((wiring) => wiring.id)).toEqual(['w1', 'w7', 'w16']);
  });

  it('--hum 60 mixes hum through each wiring: a hum-cancelling pair carries far less 60 Hz than a single coil', async () => {
    const target = scratchFolder();
    // A uniform hum field (--hum-gradient 0), where neck // mid cancels; in the default gradient it only reduces hum (docs/physics.md §6.1).
    const result = await run(samples, 'render', GUITAR, '-o', target, '--hum', '60', '--hum-level', '20mV', '--hum-gradient', '0', '--chain', 'direct', '--only', 'neck', '--only', 'neck // mid');
    expect(result.status).toBe(0);
    const report = readReport(target);
    const at60 = report.wirings.map((wiring) => {
      const audio = readWav(join(target, wiring.wav ?? '')).samples;
      // Magnitude of the exact 60 Hz bin of a one-second window in the ring-out (the strum has no energy there).
      const window = audio.subarray(48_000, 96_000);
      let re = 0;
      let im = 0;
      for (let n = 0; n < window.length; n += 1) {
        re += (window[n] as number) * Math.cos((2 * Math.PI * 60 * n) / 48_000);
        im -= (window[n] as number) * Math.sin((2 * Math.PI * 60 * n) / 48_000);
      }
      return Math.hypot(re, im);
    });
    const [single, pair] = at60 as [number, number];
    const pairReport = report.wirings[1]!;
    expect(pairReport.humCancelling).toBe(true);
    // The hum difference heard matches the circuit's humDb within a few dB (the strings add a little energy near 60 Hz).
    expect(20 * Math.log10(pair / single)).toBeLessThan(-20);
    expect(Math.abs(20 * Math.log10(pair / single) - (pairReport.humDb - report.wirings[0]!.humDb))).toBeLessThan(6);
  });

  it('refuses bad options with one line each, exit 2, nothing written', async () => {
    const target = join(scratchFolder(), 'never');
    const result = await run(samples, 'render', GUITAR, '-o', target, '--chain', 'fuzz', '--rate', '22050', '--format', 'mp3', '--level', 'loud', '--only', 'neck | mid', '--hum', '55', '--phrase', 'polka');
    expect(result.status).toBe(2);
    const lines = result.err.trimEnd().split('\n');
    expect(lines.map((text) => text.split(':')[1]?.trim())).toEqual(['--phrase', '--chain', '--rate', '--format', '--level', '--hum', '--only']);
    expect(existsSync(target)).toBe(false);
  });

  it('says plainly that volume 0 silences every wiring, and writes nothing', async () => {
    const target = join(scratchFolder(), 'never');
    const result = await run(samples, 'render', GUITAR, '-o', target, '--volume', '0');
    expect(result.status).toBe(2);
    expect(result.err).toContain('a volume setting above 0');
    expect(result.err.trimEnd().split('\n')).toHaveLength(1);
    expect(existsSync(join(target, 'wav')) ? readdirSync(join(target, 'wav')) : []).toEqual([]);
  });
});

/** Two renders from the TypeScript sources, each with its analysis thread compiling them again: minutes on a loaded 2-core machine. */
const KILLED_RENDER_TIMEOUT_MS = 180_000;

describe('coilbench render: interruption', () => {
  it('a killed render leaves no truncated file, and the next run completes the set', async () => {
    const target = scratchFolder();
    const child = spawn(process.execPath, ['--import', 'tsx', join(import.meta.dirname, '..', 'src', 'cli.ts'), 'render', GUITAR, '-o', target], {
      stdio: 'ignore',
    });
    // Kill it once the first final files appear (mid-way through writing).
    const deadline = Date.now() + 60_000;
    while (Date.now() < deadline) {
      const wavFolder = join(target, 'wav');
      if (existsSync(wavFolder) && readdirSync(wavFolder).filter((name) => name.endsWith('.wav')).length >= 3) break;
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    child.kill('SIGKILL');
    await new Promise((resolve) => child.on('exit', resolve));
    const written = readdirSync(join(target, 'wav')).filter((name) => name.endsWith('.wav'));
    expect(written.length).toBeGreaterThanOrEqual(3);
    for (const name of written) {
      const wav = readWav(join(target, 'wav', name));
      expect(wav.samples.length * 3 + 44).toBeLessThanOrEqual(statSync(join(target, 'wav', name)).size);
    }
    const resumed = await run(samples, 'render', GUITAR, '-o', target);
    expect(resumed.status).toBe(0);
    const files = readdirSync(join(target, 'wav'));
    expect(files.filter((name) => name.endsWith('.wav'))).toHaveLength(47);
    expect(files.filter((name) => name.includes('.tmp'))).toEqual([]);
    for (const name of files.filter((file) => file.endsWith('.wav'))) expect(readWav(join(target, 'wav', name)).samples.length).toBeGreaterThan(48_000);
  }, KILLED_RENDER_TIMEOUT_MS);
});

describe('coilbench render --no-wav', () => {
  it('writes the page (with every wiring and the coils\' signals), reports and netlists, and no WAV file', async () => {
    const folder = join(scratchFolder(), 'page-only');
    const result = await run(samples, 'render', GUITAR, '-o', folder, '--no-wav', '--only', 'w1', '--only', 'w5');
    expect(result.status).toBe(0);
    expect(result.err).toContain('no WAV files (--no-wav');
    expect(readdirSync(join(folder, 'wav')).filter((name) => name.endsWith('.wav') || name.endsWith('.js'))).toEqual([]);
    const html = readFileSync(join(folder, 'index.html'), 'utf8');
    const data = JSON.parse(/<script type="application\/json" id="page-data">([\s\S]*?)<\/script>/u.exec(html)?.[1] ?? '{}') as { coils: { signals: string[] } };
    expect(data.coils.signals).toHaveLength(3);
    expect(readReport(folder).wirings.map((wiring) => wiring.wav)).toEqual([null, null]);
  });
});
