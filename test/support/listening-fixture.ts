/**
 * A render folder for listening-page tests, built from synthesised tones:
 * report.json, index.html (renderListeningPage) and wav/<name>.wav with its
 * page audio script wav/<name>.wav.js. Invented test data.
 *
 * Every wiring plays the same harmonic tone whose fundamental glides
 * linearly, f0(t) = GLIDE_START_HZ + GLIDE_RATE_HZ_PER_S·t, so the pitch
 * heard tells the playback position; the wirings differ in level and in how
 * fast the harmonics fall off (brightness). Their report figures are
 * measured from the same synthesis (see `measureTone`); they are fixture
 * values, not physics.
 */
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { createRandom, seedFromText, maxOf } from '../../src/math/index.js';
import { type ListeningReport, type ReportWiring, renderListeningPage, renderPageAudioScript } from '../../src/report/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { encodeTestWav } from './write-test-wav.js';

export const GLIDE_START_HZ = 150;
export const GLIDE_RATE_HZ_PER_S = 100;
const HARMONICS = 8;
/** Harmonic roll-off exponents: amplitude of harmonic k is k^(−tilt). */
const TILT_RANGE = [0.5, 2.5] as const;
/** Level of the wirings before the common headroom, dB. */
const LEVEL_RANGE_DB = [-14, 0] as const;
/** Peak of the loudest possible tone, full scale. */
const PEAK_FULL_SCALE = 0.8;
const EDGE_FADE_S = 0.01;
/** BS.1770 loudness offset, dB: L = −0.691 + 10·log10(mean square) (ITU-R BS.1770-4 eq. 2; used here without K-weighting or gating, a fixture approximation). */
const LOUDNESS_OFFSET_DB = -0.691;
const RESPONSE_POINTS = 96;
const RESPONSE_RANGE_HZ = [20, 20000] as const;
const REFERENCE_HZ = 100;

export interface FixtureOptions {
  readonly elementIds: readonly string[];
  readonly name: string;
  readonly notes: string | null;
  /** Write audio (false: every wiring has `wav: null`). */
  readonly withAudio: boolean;
  readonly durationS: number;
  readonly sampleRateHz: number;
  readonly bitsPerSample: 16 | 24;
}

const DEFAULTS: FixtureOptions = Object.freeze({
  elementIds: ['neck', 'mid', 'bridge'],
  name: 'Test three-coil guitar (invented values)',
  notes: 'Invented values for tests.',
  withAudio: true,
  durationS: 3,
  sampleRateHz: 48000,
  bitsPerSample: 24,
});

export interface ListeningFixture {
  readonly dir: string;
  readonly pageUrl: string;
  readonly folderUrl: string;
  readonly report: ListeningReport;
  /** Linear amplitude of harmonic k (1-based) of each wiring's tone, before its level. */
  readonly tones: ReadonlyMap<string, { readonly tilt: number; readonly amplitude: number }>;
  remove(): void;
}

interface Tone {
  readonly tilt: number;
  readonly amplitude: number;
}

function harmonicWeights(tilt: number): number[] {
  return Array.from({ length: HARMONICS }, (_, index) => (index + 1) ** -tilt);
}

/** Samples of one tone: Σ_k a_k·sin(k·φ(t)), φ(t) = 2π(f_start·t + rate·t²/2), with short fades at the ends. */
function synthesise(tone: Tone, durationS: number, sampleRateHz: number): Float32Array {
  const count = Math.round(durationS * sampleRateHz);
  const weights = harmonicWeights(tone.tilt);
  const samples = new Float32Array(count);
  const fade = EDGE_FADE_S * sampleRateHz;
  for (let n = 0; n < count; n += 1) {
    const t = n / sampleRateHz;
    const phase = 2 * Math.PI * (GLIDE_START_HZ * t + (GLIDE_RATE_HZ_PER_S * t * t) / 2);
    // sin(kφ) by the recurrence sin(kφ) = 2cos(φ)·sin((k−1)φ) − sin((k−2)φ).
    const twoCos = 2 * Math.cos(phase);
    let previous = 0;
    let current = Math.sin(phase);
    let sum = 0;
    for (let k = 0; k < HARMONICS; k += 1) {
      sum += (weights[k] ?? 0) * current;
      const next = twoCos * current - previous;
      previous = current;
      current = next;
    }
    const edge = Math.min(1, n / fade, (count - 1 - n) / fade);
    samples[n] = tone.amplitude * sum * edge;
  }
  return samples;
}

/** Figures of a synthesised tone: mean square (for loudness and level) and the harmonic centroid at the mean fundamental. */
function measureTone(tone: Tone, samples: Float32Array, durationS: number): { meanSquare: number; centroidHz: number } {
  let energy = 0;
  for (const sample of samples) energy += sample * sample;
  const weights = harmonicWeights(tone.tilt);
  const meanF0 = GLIDE_START_HZ + (GLIDE_RATE_HZ_PER_S * durationS) / 2;
  // Centroid of the magnitude spectrum of a harmonic tone: Σ a_k·k·f0 / Σ a_k.
  const centroidHz = (weights.reduce((sum, a, index) => sum + a * (index + 1), 0) * meanF0) / weights.reduce((sum, a) => sum + a, 0);
  return { meanSquare: energy / samples.length, centroidHz };
}

/** Second-order low-pass magnitude (docs/physics.md §1.1): |H| = 1/√((1−x²)² + (x/Q)²), x = f/f0, in dB relative to 100 Hz. */
function lowPassResponse(naturalHz: number, q: number, frequencies: readonly number[]): number[] {
  const magnitude = (hz: number): number => {
    const x = hz / naturalHz;
    return 1 / Math.sqrt((1 - x * x) ** 2 + (x / q) ** 2);
  };
  const reference = magnitude(REFERENCE_HZ);
  return frequencies.map((hz) => 20 * Math.log10(magnitude(hz) / reference));
}

function humFigure(coils: number, outOfPhase: number): number {
  if (coils === 1) return 0;
  if (outOfPhase > 0 && coils === 2) return -32;
  if (outOfPhase === 1 && coils === 3) return -9;
  return 3;
}

export function buildListeningFixture(partial: Partial<FixtureOptions> = {}): ListeningFixture {
  const options: FixtureOptions = { ...DEFAULTS, ...partial };
  const dir = mkdtempSync(join(tmpdir(), 'coilbench-page-'));
  if (options.withAudio) mkdirSync(join(dir, 'wav'));
  const random = createRandom(seedFromText(options.elementIds.join('|')));
  const enumerated = enumerateWirings(options.elementIds.map((id) => ({ id })));
  const frequencies = Array.from(
    { length: RESPONSE_POINTS },
    (_, index) => RESPONSE_RANGE_HZ[0] * (RESPONSE_RANGE_HZ[1] / RESPONSE_RANGE_HZ[0]) ** (index / (RESPONSE_POINTS - 1)),
  );
  const weightsPeak = (tilt: number): number => harmonicWeights(tilt).reduce((sum, a) => sum + a, 0);
  const tones = new Map<string, Tone>();
  const measured = enumerated.map((wiring) => {
    const tilt = TILT_RANGE[0] + random() * (TILT_RANGE[1] - TILT_RANGE[0]);
    const levelDb = LEVEL_RANGE_DB[0] + random() * (LEVEL_RANGE_DB[1] - LEVEL_RANGE_DB[0]);
    const tone = { tilt, amplitude: (PEAK_FULL_SCALE * 10 ** (levelDb / 20)) / weightsPeak(tilt) };
    tones.set(wiring.id, tone);
    const naturalHz = 2000 + random() * 4000;
    const q = 0.8 + random() * 3;
    let wav: string | null = null;
    let figures = { meanSquare: tone.amplitude ** 2 * 0.5, centroidHz: 0 };
    if (options.withAudio) {
      const samples = synthesise(tone, options.durationS, options.sampleRateHz);
      figures = measureTone(tone, samples, options.durationS);
      wav = `wav/${wiring.id}.wav`;
      const bytes = encodeTestWav(samples, options.sampleRateHz, options.bitsPerSample);
      writeFileSync(join(dir, wav), bytes);
      writeFileSync(join(dir, `${wav}.js`), renderPageAudioScript(wiring.id, bytes));
    } else {
      const weights = harmonicWeights(tilt);
      const meanF0 = GLIDE_START_HZ + (GLIDE_RATE_HZ_PER_S * options.durationS) / 2;
      figures = {
        meanSquare: (tone.amplitude ** 2 * weights.reduce((sum, a) => sum + a * a, 0)) / 2,
        centroidHz: (weights.reduce((sum, a, index) => sum + a * (index + 1), 0) * meanF0) / weights.reduce((sum, a) => sum + a, 0),
      };
    }
    const responseDb = lowPassResponse(naturalHz, q, frequencies);
    const peakIndex = responseDb.indexOf(maxOf(responseDb));
    const hasPeak = peakIndex > 0 && peakIndex < responseDb.length - 1;
    const humDb = humFigure(wiring.elementIds.length, wiring.outOfPhase.length);
    return { wiring, wav, figures, responseDb, hasPeak, peakIndex, humDb, q };
  });
  const singles = measured.filter((entry) => entry.wiring.elementIds.length === 1);
  const singleMeanSquare = singles.reduce((sum, entry) => sum + entry.figures.meanSquare, 0) / singles.length;
  const wirings: ReportWiring[] = measured.map((entry) => ({
    id: entry.wiring.id,
    number: entry.wiring.number,
    expression: entry.wiring.expression,
    description: entry.wiring.description,
    coils: entry.wiring.elementIds,
    topology: entry.wiring.topology,
    outOfPhase: entry.wiring.outOfPhase,
    wav: entry.wav,
    levelDb: 10 * Math.log10(entry.figures.meanSquare / singleMeanSquare),
    loudnessLufs: LOUDNESS_OFFSET_DB + 10 * Math.log10(entry.figures.meanSquare),
    centroidHz: entry.figures.centroidHz,
    resonanceHz: entry.hasPeak ? (frequencies[entry.peakIndex] ?? null) : null,
    peakDb: entry.hasPeak ? (entry.responseDb[entry.peakIndex] ?? 0) : 0,
    resonanceQ: entry.hasPeak ? entry.q : null,
    humDb: entry.humDb,
    humCancelling: entry.humDb <= -20,
    responseDb: entry.responseDb,
    group: null,
  }));
  const report: ListeningReport = {
    generator: 'coilbench test fixture',
    guitar: {
      name: options.name,
      slug: 'test-guitar',
      notes: options.notes,
      scaleM: 0.648,
      tuning: ['E2', 'A2', 'D3', 'G3', 'B3', 'E4'],
      coils: options.elementIds.map((id, index) => ({
        id,
        pickup: null,
        position: `${160 - index * 45} mm`,
        resistanceOhms: 5900 + index * 300,
        inductanceH: 2.35 + index * 0.1,
        capacitanceF: 110e-12,
        winding: index % 2 === 0 ? 'cw' : 'ccw',
        magnet: index % 2 === 0 ? 'north' : 'south',
      })),
      controls: ['volume 250 kΩ audio taper, set to 10', 'tone 250 kΩ with 22 nF, set to 10'],
      cableCapacitanceF: 470e-12,
      ampResistanceOhms: 1e6,
      ampCapacitanceF: 50e-12,
    },
    render: {
      phrase: 'glide (test tone)',
      chain: 'direct',
      sampleRateHz: options.sampleRateHz,
      durationS: options.durationS,
      level: 'true',
      commonGainDb: 0,
      mainsHz: 60,
      humMixHz: null,
      format: options.bitsPerSample === 24 ? 'pcm24' : 'pcm16',
    },
    responseFrequenciesHz: frequencies,
    wirings,
  };
  writeFileSync(join(dir, 'report.json'), `${JSON.stringify(report, null, 2)}\n`);
  writeFileSync(join(dir, 'index.html'), renderListeningPage(report));
  const folderUrl = pathToFileURL(`${dir}/`).href;
  return {
    dir,
    folderUrl,
    pageUrl: new URL('index.html', folderUrl).href,
    report,
    tones,
    remove: () => rmSync(dir, { recursive: true, force: true }),
  };
}
