/**
 * One render measured in a process of its own, so its peak memory is its own:
 * `tsx scripts/bench/render-child.ts <guitar> <chain>` prints
 * { wirings, seconds, audioSeconds, peakRssMb } as JSON.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { parseGuitarText } from '../../src/guitar/index.js';
import { type ChainName, outputFolder, renderGuitar } from '../../src/render/index.js';
import { builtInPhrase } from '../../src/string/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';

const [file = 'samples/three-single-coil.json', chain = 'direct'] = process.argv.slice(2);
const guitar = parseGuitarText(readFileSync(file, 'utf8'), file);
const all = enumerateWirings(guitar.elements);
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
  });
  const seconds = (performance.now() - started) / 1000;
  const KILOBYTES_PER_MEGABYTE = 1024;
  console.log(JSON.stringify({ wirings: all.length, seconds, audioSeconds: outcome.audioSeconds, peakRssMb: process.resourceUsage().maxRSS / KILOBYTES_PER_MEGABYTE }));
} finally {
  rmSync(root, { recursive: true, force: true });
}
