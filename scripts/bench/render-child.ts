/**
 * One render measured in a process of its own, so its peak memory is its own:
 * `tsx scripts/bench/render-child.ts <guitar> <chain> <threads> [cold|warm]` prints
 * { wirings, seconds, warmSeconds, audioSeconds, peakRssMb } as JSON.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { ChainName } from '../../src/render/index.js';

// The compiled code in dist/ (what `npx coilbench` runs; `npm run bench` builds it first), typed as its source.
const dist = (folder: string): string => join(import.meta.dirname, '..', '..', 'dist', folder, 'index.js');
const { parseGuitarText } = (await import(dist('guitar'))) as typeof import('../../src/guitar/index.js');
const { outputFolder, renderGuitar } = (await import(dist('render'))) as typeof import('../../src/render/index.js');
const { builtInPhrase } = (await import(dist('string'))) as typeof import('../../src/string/index.js');
const { enumerateWirings } = (await import(dist('wiring'))) as typeof import('../../src/wiring/index.js');

const [file = 'samples/three-single-coil.json', chain = 'direct', threadText = '2', repeat = 'cold'] = process.argv.slice(2);
const guitar = parseGuitarText(readFileSync(file, 'utf8'), file);
const all = enumerateWirings(guitar.elements);
/** One fresh render (empty folder, nothing cached); returns its wall time and audio seconds. */
async function renderOnce(): Promise<{ seconds: number; audioSeconds: number }> {
  const root = mkdtempSync(join(tmpdir(), 'coilbench-bench-'));
  try {
    const started = performance.now();
    const outcome = await renderGuitar({
    guitar,
    all,
    selected: all,
    phrase: builtInPhrase('strum', guitar.strings.length),
    chain: chain as ChainName,
    sampleRateHz: 48_000,
    format: 'pcm24',
    level: 'true',
    hum: null,
    overrides: {},
    seed: 1,
    folder: outputFolder(root),
    generator: 'coilbench bench',
    threads: Number(threadText),
    });
    return { seconds: (performance.now() - started) / 1000, audioSeconds: outcome.audioSeconds };
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
}

const KILOBYTES_PER_MEGABYTE = 1024;
// The first render in a fresh process pays for compiling the code (what `coilbench render` costs);
// the second shows the steady rate of a longer session.
const cold = await renderOnce();
const warm = repeat === 'warm' ? await renderOnce() : null;
console.log(
  JSON.stringify({
    wirings: all.length,
    seconds: cold.seconds,
    warmSeconds: warm?.seconds ?? null,
    audioSeconds: cold.audioSeconds,
    peakRssMb: process.resourceUsage().maxRSS / KILOBYTES_PER_MEGABYTE,
  }),
);
