import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { phaseClassKey } from '../circuit/index.js';
import { builtInPhrase } from '../string/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { WorkError } from '../errors/index.js';
import { type AudioSettings, type PassHandOff, type PassItem, type WiringRenderer, classOrder, runRenderPassWith } from './render-pass.js';
import { OWN_SHARE_WEIGHT, keptOnHandOff, runRenderPassOnThreads, splitByShape } from './run-render-pass.js';
import { shapeKey } from '../wiring/index.js';

const guitar = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'humbucker-two-single-coil.json'), 'utf8'));
const wirings = enumerateWirings(guitar.elements).slice(4, 40);
const items: PassItem[] = wirings.map((wiring, index) => ({ id: wiring.id, network: wiring.network, metrics: true, audio: index % 3 !== 0 }));
const settings: AudioSettings = {
  guitar,
  overrides: {},
  phrase: builtInPhrase('riff'),
  chain: 'drive',
  sampleRateHz: 44_100,
  seed: 7,
  hum: { mainsHz: 50, emfVolts: 0.01 },
  measureProcessedLoudness: true,
};
const folders: string[] = [];
afterAll(() => folders.forEach((folder) => rmSync(folder, { recursive: true, force: true })));

describe('runRenderPassOnThreads', () => {
  it('keeps whole shapes together and balances the parts', () => {
    const parts = splitByShape(items, 2);
    expect(parts).toHaveLength(2);
    expect(parts.flat().map((item) => item.id).sort()).toEqual(items.map((item) => item.id).sort());
    const shapesOf = (part: readonly PassItem[]) => new Set(part.map((item) => shapeKey(item.network)));
    const [first, second] = parts.map(shapesOf);
    for (const shape of first ?? []) expect(second?.has(shape)).toBe(false);
  });

  it('gives the same results and the same audio bytes on two threads as on one (a worker thread does half, its audio held in memory)', async () => {
    const [one, two] = [mkdtempSync(join(tmpdir(), 'coilbench-pass-')), mkdtempSync(join(tmpdir(), 'coilbench-pass-'))];
    folders.push(one, two);
    let steps = 0;
    const single = await runRenderPassOnThreads(settings, items, one, 1);
    // Room for every wiring's audio, shared by the two threads: each holds all of its own.
    const frames = single.find((result) => result.audio)?.audio?.frames ?? 0;
    const audioCount = items.filter((item) => item.audio).length;
    const held = { ...settings, parkInMemoryBytes: 2 * audioCount * frames * Float32Array.BYTES_PER_ELEMENT };
    const split = await runRenderPassOnThreads(held, items, two, 2, () => (steps += 1), 1);
    expect(steps).toBe(items.length);
    expect(split.map((result) => result.id)).toEqual(items.map((item) => item.id));
    const bytesOf = (result: (typeof split)[number]): Buffer =>
      result.samples ? Buffer.from(result.samples.buffer, result.samples.byteOffset, result.samples.byteLength) : readFileSync(result.scratch ?? '');
    split.forEach((result, index) => {
      const reference = single[index];
      expect(result.metrics).toEqual(reference?.metrics);
      expect(result.audio).toEqual(reference?.audio);
      expect(reference?.samples).toBeUndefined();
      expect(Boolean(result.scratch) || Boolean(result.samples)).toBe(items[index]?.audio);
      if (reference?.scratch) expect(bytesOf(result).equals(readFileSync(reference.scratch))).toBe(true);
    });
    expect(split.filter((result) => result.samples).length).toBe(audioCount);
    expect(split.filter((result) => result.scratch)).toHaveLength(0);
  });

  it('reuses the buffer of audio parked in a scratch file for the next wiring, never one held in memory (direct chain)', async () => {
    const direct: AudioSettings = { ...settings, chain: 'direct', hum: null };
    const audioItems = items.map((item) => ({ ...item, audio: true }));
    const [all, few] = [mkdtempSync(join(tmpdir(), 'coilbench-pass-')), mkdtempSync(join(tmpdir(), 'coilbench-pass-'))];
    folders.push(all, few);
    // Everything held in memory: no scratch file, so no buffer is reused.
    const held = await runRenderPassOnThreads({ ...direct, parkInMemoryBytes: 2 ** 30 }, audioItems, all, 1);
    const frames = held[0]?.audio?.frames ?? 0;
    // Room for all but one wiring: none is held (all or none), each one's buffer then synthesising the next.
    const roomForAllButOne = (audioItems.length - 1) * frames * Float32Array.BYTES_PER_ELEMENT;
    const parked = await runRenderPassOnThreads({ ...direct, parkInMemoryBytes: roomForAllButOne }, audioItems, few, 1);
    expect(parked.filter((result) => result.samples)).toHaveLength(0);
    expect(parked.filter((result) => result.scratch)).toHaveLength(audioItems.length);
    const bytesOf = (result: (typeof parked)[number]): Buffer =>
      result.samples ? Buffer.from(result.samples.buffer, result.samples.byteOffset, result.samples.byteLength) : readFileSync(result.scratch ?? '');
    parked.forEach((result, index) => {
      const reference = held[index];
      expect(result.audio).toEqual(reference?.audio);
      expect(bytesOf(result).equals(bytesOf(reference as (typeof held)[number]))).toBe(true);
    });
  });
});


describe('runRenderPassWith: wirings in flight', () => {
  /** A renderer whose wirings end out of order (seeded delays), some failing, each filling the buffer it is offered with its index. */
  function fakeRenderer(frames: number, failing: ReadonlySet<number>, offered: Array<Float32Array | undefined>): WiringRenderer {
    let call = 0;
    return {
      sampleRateHz: settings.sampleRateHz,
      figures: (networks) => networks.map(() => ({ energy: 1, loudnessLufs: -20, centroidHz: 1000 })),
      processed: async (_network, name, into) => {
        // Wirings are made phase class by phase class, not in the list's order: each is known by its name.
        const index = items.findIndex((item) => item.id === name);
        offered[call] = into;
        call += 1;
        const audio = into ?? new Float32Array(frames);
        audio.fill(index + 1);
        await new Promise((resolve) => setTimeout(resolve, (index * 7) % 5));
        if (failing.has(index)) throw new WorkError(`${name ?? 'a wiring'}: the drive chain failed 2 times (test)`);
        // Half the wirings come back in a new array, as a chain with its own output does (the offered one is then free).
        return index % 2 === 0 ? Float32Array.from(audio) : audio;
      },
    };
  }

  it('gives every wiring its own audio and failure, in order, whatever the number in flight and the order they end', async () => {
    const frames = 64;
    const audioItems = items.map((item) => ({ ...item, audio: true }));
    const failing = new Set([3, 4, 11]);
    const runs = [];
    // Every wiring's audio held in memory (a chain's new array leaves the synthesis buffer free), or all parked in scratch files.
    for (const [depth, room] of [1, 2, 3].flatMap((depth) => [[depth, audioItems.length], [depth, audioItems.length - 1]] as const)) {
      const folder = mkdtempSync(join(tmpdir(), 'coilbench-pass-'));
      folders.push(folder);
      const offered: Array<Float32Array | undefined> = [];
      const held = { ...settings, parkInMemoryBytes: room * frames * Float32Array.BYTES_PER_ELEMENT };
      const results = await runRenderPassWith(fakeRenderer(frames, failing, offered), held, audioItems, folder, undefined, depth);
      expect(results.map((result) => result.id)).toEqual(audioItems.map((item) => item.id));
      results.forEach((result, index) => {
        if (failing.has(index)) {
          expect(result.failure).toMatch(/failed 2 times/u);
          expect(result.samples ?? result.scratch).toBeUndefined();
          return;
        }
        const samples = result.samples ?? new Float32Array(new Uint8Array(readFileSync(result.scratch ?? '')).buffer);
        // Its own value, not a later wiring's written over a buffer it still held.
        expect(Array.from(new Set(samples))).toEqual([index + 1]);
      });
      // Buffers were offered again when parked (the reuse happens), and never one still held in memory.
      const heldBuffers = new Set(results.flatMap((result) => (result.samples ? [result.samples.buffer] : [])));
      if (room < audioItems.length) expect(offered.some((buffer) => buffer !== undefined)).toBe(true);
      for (const buffer of offered) if (buffer) expect(heldBuffers.has(buffer.buffer)).toBe(false);
      runs.push(results.map((result) => [result.id, result.audio?.peak ?? null, result.failure ?? null]));
    }
    for (const run of runs) expect(run).toEqual(runs[0]);
  });
});

describe('runRenderPassWith: phase class by phase class', () => {
  it('makes each class’s wirings one after another, classes in the order they first come, and gives results in the list’s order', async () => {
    const all = enumerateWirings(guitar.elements).map((wiring) => ({ id: wiring.id, network: wiring.network, metrics: false, audio: true }));
    const order = classOrder(guitar, all);
    expect([...order].sort((a, b) => a - b)).toEqual(all.map((_, index) => index));
    const keys = order.map((index) => phaseClassKey(guitar, (all[index] as PassItem).network));
    const runs = keys.filter((key, position) => position === 0 || key !== keys[position - 1]);
    // Each class is one run, and the list itself was not already in that order (a class's wirings apart).
    expect(new Set(runs).size).toBe(runs.length);
    const listed = all.map((item) => phaseClassKey(guitar, item.network));
    expect(listed.filter((key, index) => index === 0 || key !== listed[index - 1]).length).toBeGreaterThan(runs.length);
    expect(runs).toEqual([...new Set(listed)]);

    const made: string[] = [];
    const renderer: WiringRenderer = {
      sampleRateHz: settings.sampleRateHz,
      figures: () => [],
      processed: async (_network, name) => {
        made.push(name ?? '');
        return Float32Array.of(all.findIndex((item) => item.id === name));
      },
    };
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-pass-'));
    folders.push(folder);
    const results = await runRenderPassWith(renderer, { ...settings, parkInMemoryBytes: 1 << 20 }, all, folder, undefined, 2);
    expect(made).toEqual(order.map((index) => (all[index] as PassItem).id));
    expect(results.map((result) => result.id)).toEqual(all.map((item) => item.id));
    results.forEach((result, index) => expect(result.samples?.[0]).toBe(index));
  });
});

describe('runRenderPassWith: a share handed off while it runs', () => {
  const all = enumerateWirings(guitar.elements).map((wiring) => ({ id: wiring.id, network: wiring.network, metrics: false, audio: true }));
  const renderer = (made: string[]): WiringRenderer => ({
    sampleRateHz: settings.sampleRateHz,
    figures: () => [],
    processed: async (_network, name) => {
      made.push(name ?? '');
      return Float32Array.of(all.findIndex((item) => item.id === name));
    },
  });

  it('offers the wirings not yet started, once, after the first wiring that finds the core free, and makes only those it keeps', async () => {
    const made: string[] = [];
    const offers: string[][] = [];
    let waits = 0;
    const handOff: PassHandOff = {
      // Free once five wirings are started; the pass keeps ten of what is left.
      freed: async () => {
        waits += 1;
        return made.length >= 5;
      },
      take: (rest, holdingAll) => {
        offers.push(rest.map((item) => item.id));
        expect(holdingAll).toBe(true);
        return 10;
      },
    };
    const folder = mkdtempSync(join(tmpdir(), 'coilbench-pass-'));
    folders.push(folder);
    const depth = 2;
    const results = await runRenderPassWith(renderer(made), { ...settings, parkInMemoryBytes: 1 << 20 }, all, folder, undefined, depth, handOff);
    const order = classOrder(guitar, all).map((index) => (all[index] as PassItem).id);
    // With two in flight, five are started when the third ends: it waits after the first three, offers the rest
    // once, and makes the ten it keeps after the five started.
    expect(waits).toBe(3);
    expect(offers).toEqual([order.slice(5)]);
    expect(made).toEqual(order.slice(0, 15));
    const kept = new Set(made);
    results.forEach((result, index) => {
      if (kept.has(all[index]?.id ?? '')) expect(result.samples?.[0]).toBe(index);
      else expect(result).toBeUndefined();
    });
  });

  it('keeps all when the rest is too little for a worker, else about OWN_SHARE_WEIGHT parts in whole phase classes', () => {
    const order = classOrder(guitar, all).map((index) => all[index] as PassItem);
    expect(keptOnHandOff(guitar, order, order.length + 1)).toBe(order.length);
    const kept = keptOnHandOff(guitar, order, 50);
    const keys = order.map((item) => phaseClassKey(guitar, item.network));
    // No class on both sides of the cut, and the cut is the first class end past the share.
    expect(keys[kept]).not.toBe(keys[kept - 1]);
    // Every wiring weighs the same here: the share is OWN_SHARE_WEIGHT / (OWN_SHARE_WEIGHT + 1) of the count.
    const share = Math.ceil((order.length * OWN_SHARE_WEIGHT) / (OWN_SHARE_WEIGHT + 1));
    const classEnd = keys.findIndex((key, index) => index >= share && key !== keys[index - 1]);
    expect(kept).toBe(classEnd);
    expect(kept).toBeLessThan(order.length);
  });

  it('gives the same results and audio bytes when a worker takes part of the pass once the core is free', async () => {
    const direct: AudioSettings = { ...settings, chain: 'direct', hum: null };
    const audioItems = items.slice(0, 16).map((item) => ({ ...item, audio: true }));
    const [one, two] = [mkdtempSync(join(tmpdir(), 'coilbench-pass-')), mkdtempSync(join(tmpdir(), 'coilbench-pass-'))];
    folders.push(one, two);
    const single = await runRenderPassOnThreads(direct, audioItems, one, 1);
    let steps = 0;
    // The core is free from the start: the worker takes its share after the first wiring (at least 4 wirings a
    // thread), a share there is (the cut is not at the end).
    const minItems = 4;
    const rest = classOrder(guitar, audioItems).slice(1).map((index) => audioItems[index] as PassItem);
    expect(keptOnHandOff(guitar, rest, minItems)).toBeLessThan(rest.length);
    const split = await runRenderPassOnThreads(direct, audioItems, two, 2, () => (steps += 1), minItems, Promise.resolve());
    expect(steps).toBe(audioItems.length);
    expect(split.map((result) => result.id)).toEqual(audioItems.map((item) => item.id));
    split.forEach((result, index) => {
      expect(result.audio).toEqual(single[index]?.audio);
      expect(readFileSync(result.scratch ?? '').equals(readFileSync(single[index]?.scratch ?? ''))).toBe(true);
    });
  });
});
