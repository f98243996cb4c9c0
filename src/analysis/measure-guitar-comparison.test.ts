import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { parseGuitar } from '../guitar/index.js';
import { measureGuitarComparison } from './measure-guitar-comparison.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');
const raw = (file: string): Record<string, unknown> => JSON.parse(readFileSync(join(samples, file), 'utf8')) as Record<string, unknown>;
const demo = raw('three-single-coil.json');

describe('measureGuitarComparison', () => {
  it('finds no difference at all between a guitar and itself', () => {
    const guitar = parseGuitar(demo);
    const comparison = measureGuitarComparison(guitar, guitar);
    expect(comparison.wirings).toHaveLength(47);
    expect(comparison.unmatched).toEqual([]);
    for (const wiring of comparison.wirings) {
      expect(wiring.indexB).toBe(wiring.indexA);
      expect(wiring.levelDb.change).toBe(0);
      expect(wiring.resonanceHz.change ?? 0).toBe(0);
      expect(wiring.brightnessHz.change).toBe(0);
      expect(wiring.humDb.change).toBe(0);
      expect(wiring.spectrumDb).toBe(0);
      expect(wiring.distance).toBe(0);
      expect(wiring.audible).toBe(false);
      expect([wiring.levelDb, wiring.resonanceHz, wiring.brightnessHz, wiring.humDb].some((figure) => figure.aboveThreshold)).toBe(false);
    }
  });

  it('moves every resonance down when only the cable capacitance grows, as ω0 = √((1 + R/RL)/(L·C)) says', () => {
    // docs/physics.md §1.1: more capacitance across the coil lowers the loaded resonance of every wiring.
    const longCable = parseGuitar({ ...demo, name: 'Demo with a long cable (invented)', cable: { capacitance: '1200p' } });
    const comparison = measureGuitarComparison(parseGuitar(demo), longCable);
    let shifted = 0;
    for (const wiring of comparison.wirings) {
      const { a, b } = wiring.resonanceHz;
      if (a === null || b === null) continue;
      expect(b, comparison.base.wirings[wiring.indexA]?.expression).toBeLessThan(a);
      shifted += 1;
    }
    expect(shifted).toBeGreaterThan(40);
    // Hum at 60 Hz sits far below every resonance: the cable leaves it within a few hundredths of a dB.
    for (const wiring of comparison.wirings) if (!wiring.humDb.humCancelling[0]) expect(Math.abs(wiring.humDb.change ?? 1)).toBeLessThan(0.05);
  });

  it('matches wirings through a renaming and a different declaration order', () => {
    const coils = demo.coils as Array<Record<string, unknown>>;
    const renamed = parseGuitar({
      ...demo,
      name: 'Demo with other coil names (invented)',
      coils: [
        { ...coils[2], id: 'back' },
        { ...coils[0], id: 'front' },
        { ...coils[1], id: 'centre' },
      ],
    });
    const rename = new Map([
      ['neck', 'front'],
      ['mid', 'centre'],
      ['bridge', 'back'],
    ]);
    const comparison = measureGuitarComparison(parseGuitar(demo), renamed, { rename });
    expect(comparison.unmatched).toEqual([]);
    const expressions = (index: number) => [comparison.base.wirings[index]?.expression, comparison.candidate.wirings[comparison.wirings[index]!.indexB]?.expression];
    expect(expressions(4)).toEqual(['neck + ~mid', 'front + ~centre']);
    expect(expressions(8)).toEqual(['neck + ~bridge', 'back + ~front']); // back is declared first there: the ~ moves to front, the same wiring
    for (const wiring of comparison.wirings) {
      expect(Math.abs(wiring.levelDb.change ?? 1)).toBeLessThan(1e-9);
      expect(wiring.spectrumDb).toBeLessThan(1e-6);
      expect(wiring.audible).toBe(false);
    }
    expect(() => measureGuitarComparison(parseGuitar(demo), renamed, { renamePath: '--map' })).toThrow(InputError);
    expect(() => measureGuitarComparison(parseGuitar(demo), renamed, { renamePath: '--map' })).toThrow(
      /--map: expected elements that match neck, mid, bridge one to one \(rename with --map first=second,…\), got "back, front, centre"/u,
    );
  });

  it('flags a resonance shift only between clear peaks, not between the tenth-of-a-dB bumps of a nearly flat response', () => {
    // The bridge coil at 3.1 H instead of 2.6 H. Three coils in series with one out of phase give a nearly flat
    // response: its "resonance" is whichever bump stands 0.1 dB proud, and that one jumps octaves between the sets.
    const hotter = structuredClone(demo) as { coils: Array<Record<string, unknown>> };
    const bridge = hotter.coils.find((coil) => coil.id === 'bridge') as Record<string, unknown>;
    bridge.inductance = '3.1H';
    const comparison = measureGuitarComparison(parseGuitar(demo), parseGuitar(hotter));
    const flat = comparison.wirings.filter((wiring) => (wiring.resonanceHz.change ?? 0) > 100);
    expect(flat.length).toBeGreaterThan(0);
    for (const wiring of flat) expect(wiring.resonanceHz.aboveThreshold).toBe(false);
    // The bridge coil alone has a peak of about 3.6 dB that moves down by about 10 %: flagged.
    const alone = comparison.wirings[2] as (typeof comparison.wirings)[number];
    expect((alone.resonanceHz.change ?? 0) < -5).toBe(true);
    expect(alone.resonanceHz.aboveThreshold).toBe(true);
  });

  it('puts the hotter candidate set on the demo guitar: louder, lower resonances, flagged changes', () => {
    const comparison = measureGuitarComparison(parseGuitar(demo), parseGuitar(raw('three-single-coil-alt.json')));
    const singles = comparison.wirings.slice(0, 3);
    for (const wiring of singles) {
      // more turns: more output (sensitivity ≈ +0.9 dB) and more inductance (lower resonance)
      expect(wiring.levelDb.change ?? 0).toBeGreaterThan(0);
      expect(wiring.resonanceHz.b ?? 0).toBeLessThan(wiring.resonanceHz.a ?? 0);
      expect(wiring.resonanceHz.aboveThreshold).toBe(true);
    }
    expect(comparison.wirings.some((wiring) => wiring.audible)).toBe(true);
  });
});
