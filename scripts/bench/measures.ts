import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measureCentroid, measureEnergy, measureLoudness } from '../../src/analysis/index.js';
import { createRandom } from '../../src/math/index.js';
import { encodeWav, writeFileAtomic } from '../../src/render/index.js';
import { heading, line, medianMs, medianMsAsync } from './timing.js';

const RATE_HZ = 48_000;
const DURATION_S = 4;
const WIRINGS_FOUR_COILS = 572;

/** 4 s of a decaying harmonic tone with a little noise: the size and shape of one wiring's render. */
function testSignal(): Float32Array {
  const random = createRandom(1);
  const out = new Float32Array(DURATION_S * RATE_HZ);
  for (let n = 0; n < out.length; n += 1) {
    const t = n / RATE_HZ;
    let sample = 0;
    for (let harmonic = 1; harmonic <= 20; harmonic += 1) sample += (Math.exp(-t * harmonic) / harmonic) * Math.sin(2 * Math.PI * 110 * harmonic * t);
    out[n] = 0.2 * sample + 1e-3 * (random() - 0.5);
  }
  return out;
}

export async function benchMeasures(): Promise<void> {
  heading(`Measures and WAV files (one ${DURATION_S} s mono render at ${RATE_HZ / 1000} kHz)`);
  const signal = testSignal();
  const perWiring: number[] = [];
  const report = (label: string, ms: number): void => {
    perWiring.push(ms);
    line(label, `${ms.toFixed(2)} ms`);
  };
  report('integrated loudness (BS.1770-4)', medianMs(() => measureLoudness([signal], RATE_HZ), 9));
  report('spectral centroid (one 2^18-point FFT)', medianMs(() => measureCentroid(signal, RATE_HZ), 9));
  report('energy', medianMs(() => measureEnergy(signal), 9));
  for (const format of ['pcm24', 'pcm16', 'f32'] as const) {
    const ms = medianMs(() => encodeWav(signal, { sampleRateHz: RATE_HZ, format, info: { name: '(neck + ~mid) // bridge' } }), 9);
    if (format === 'pcm24') report(`WAV encode ${format}`, ms);
    else line(`WAV encode ${format}`, `${ms.toFixed(2)} ms`);
  }
  const folder = mkdtempSync(join(tmpdir(), 'coilbench-bench-'));
  try {
    const bytes = encodeWav(signal, { sampleRateHz: RATE_HZ });
    report(`atomic write of the pcm24 file (${(bytes.length / 1e6).toFixed(2)} MB, fsync)`, await medianMsAsync(() => writeFileAtomic(join(folder, 'w1.wav'), bytes), 9));
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
  const total = perWiring.reduce((sum, ms) => sum + ms, 0);
  line(`all of the above per wiring; × ${WIRINGS_FOUR_COILS} wirings (four coils)`, `${total.toFixed(1)} ms; ${((total * WIRINGS_FOUR_COILS) / 1000).toFixed(1)} s`);
}
