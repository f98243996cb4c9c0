/**
 * A render whose final WAVs are partly encoded on a second thread
 * (encode-thread.ts) writes the same folder as one that encodes them all on
 * its own thread: every WAV byte for byte, and the same manifest records.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { builtInPhrase } from '../string/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { outputFolder } from './output-folder.js';
import { renderGuitar } from './render-guitar.js';

const guitar = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8'), 'three-single-coil.json');
const all = enumerateWirings(guitar.elements);
const work = mkdtempSync(join(tmpdir(), 'coilbench-encode-thread-'));

afterAll(() => rmSync(work, { recursive: true, force: true }));

async function renderInto(name: string, encodeThread: boolean, parkInMemoryBytes?: number): Promise<string> {
  const folder = outputFolder(join(work, name));
  await renderGuitar({
    guitar,
    all,
    selected: all.slice(0, 16),
    phrase: builtInPhrase('strum', guitar.strings.length),
    chain: 'direct',
    sampleRateHz: 22_050,
    format: 'pcm24',
    level: 'matched',
    hum: null,
    overrides: {},
    seed: 1,
    folder,
    generator: 'coilbench test',
    encodeThread,
    ...(parkInMemoryBytes === undefined ? {} : { parkInMemoryBytes }),
  });
  return folder.root;
}

describe('the final WAVs encoded partly on a second thread', () => {
  it('are the files and manifest records of a render that encodes them all on its own thread', { timeout: 120_000 }, async () => {
    const own = await renderInto('own', false);
    const shared = await renderInto('shared', true);
    const names = readdirSync(join(own, 'wav')).filter((name) => name.endsWith('.wav')).sort();
    expect(names).toHaveLength(16);
    expect(readdirSync(join(shared, 'wav')).filter((name) => name.endsWith('.wav')).sort()).toEqual(names);
    for (const name of names) expect(readFileSync(join(shared, 'wav', name)).equals(readFileSync(join(own, 'wav', name))), name).toBe(true);
    const entries = (root: string) => (JSON.parse(readFileSync(join(root, '.coilbench-manifest.json'), 'utf8')) as { entries: unknown }).entries;
    expect(entries(shared)).toEqual(entries(own));
  });

  it('are the same when every wiring\'s audio waits in a scratch file: read on the encoding thread, or into one reused buffer on the render\'s own', { timeout: 120_000 }, async () => {
    const own = await renderInto('own-held', false);
    const names = readdirSync(join(own, 'wav')).filter((name) => name.endsWith('.wav')).sort();
    for (const encodeThread of [false, true]) {
      const parked = await renderInto(`parked-${encodeThread}`, encodeThread, 0);
      for (const name of names) expect(readFileSync(join(parked, 'wav', name)).equals(readFileSync(join(own, 'wav', name))), name).toBe(true);
    }
  });
});
