import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { coilPositionAt } from './guitar.js';
import { parseGuitar, parseGuitarText } from './parse-guitar.js';

const samplesFolder = join(import.meta.dirname, '..', '..', 'samples');
const sample = (name: string) => parseGuitarText(readFileSync(join(samplesFolder, name), 'utf8'), name);

describe('parseGuitar', () => {
  it('reads every bundled sample', () => {
    const files = readdirSync(samplesFolder).filter((file) => file.endsWith('.json'));
    expect(files.length).toBeGreaterThanOrEqual(4);
    for (const file of files) expect(() => sample(file)).not.toThrow();
  });

  it('converts units and keeps declaration order', () => {
    const guitar = sample('three-single-coil.json');
    expect(guitar.scaleM).toBeCloseTo(0.648, 12);
    expect(guitar.coils.map((coil) => coil.id)).toEqual(['neck', 'mid', 'bridge']);
    const [neck, mid, bridge] = guitar.coils;
    expect(neck?.resistanceOhms).toBeCloseTo(5900, 9);
    expect(neck?.inductanceH).toBeCloseTo(2.35, 12);
    expect(neck?.capacitanceF).toBeCloseTo(110e-12, 20);
    expect(mid?.winding).toBe('ccw');
    expect(mid?.magnet).toBe('south');
    expect(bridge?.positionBassM).toBeCloseTo(0.048, 12);
    expect(bridge?.positionTrebleM).toBeCloseTo(0.038, 12);
    expect(guitar.controls.tone?.capacitorF).toBeCloseTo(22e-9, 20);
    expect(guitar.cable.capacitanceF).toBeCloseTo(470e-12, 20);
    expect(guitar.strings.map((s) => s.number)).toEqual([6, 5, 4, 3, 2, 1]);
    expect(guitar.strings[0]?.openHz).toBeCloseTo(82.4069, 3);
  });

  it('places a slanted coil under each string by straight-line interpolation', () => {
    const bridge = sample('three-single-coil.json').coils[2]!;
    expect(coilPositionAt(bridge, 0, 6)).toBeCloseTo(0.048, 12);
    expect(coilPositionAt(bridge, 5, 6)).toBeCloseTo(0.038, 12);
    expect(coilPositionAt(bridge, 1, 6)).toBeCloseTo(0.046, 12);
  });

  it('fills documented defaults and says which it used', () => {
    const guitar = parseGuitar({
      name: 'bare',
      coils: [{ id: 'neck', position: '100mm', resistance: '6k', inductance: '2.5H' }],
    });
    expect(guitar.scaleM).toBeCloseTo(0.6477, 12);
    expect(guitar.strings).toHaveLength(6);
    expect(guitar.coils[0]?.capacitanceF).toBeCloseTo(100e-12, 20);
    expect(guitar.coils[0]?.winding).toBe('cw');
    expect(guitar.controls.volume).toMatchObject({ setting: 10, taper: 'audio', audioMidpoint: 0.1 });
    expect(guitar.controls.volume.potOhms).toBeCloseTo(250e3, 6);
    expect(guitar.controls.tone).toMatchObject({ setting: 10, taper: 'audio' });
    expect(guitar.controls.tone?.potOhms).toBeCloseTo(250e3, 6);
    expect(guitar.controls.tone?.capacitorF).toBeCloseTo(22e-9, 20);
    expect(guitar.controls.trebleBleed).toBeNull();
    expect(guitar.cable.capacitanceF).toBeCloseTo(500e-12, 20);
    expect(guitar.amp.resistanceOhms).toBeCloseTo(1e6, 6);
    expect(guitar.amp.capacitanceF).toBeCloseTo(50e-12, 20);
    expect(guitar.assumed).toContain('coils[0].winding');
    expect(guitar.assumed).toContain('scale');
    expect(guitar.assumed).not.toContain('coils[0].sensitivity');
  });

  it('takes "tone": null as no tone control, and a cable given by length', () => {
    const guitar = parseGuitar({
      name: 'no tone',
      coils: [{ id: 'neck', position: '100mm', resistance: '6k', inductance: '2.5H' }],
      controls: { tone: null },
      cable: { length: '4.5m', capacitancePerMetre: '120p' },
    });
    expect(guitar.controls.tone).toBeNull();
    expect(guitar.cable.capacitanceF).toBeCloseTo(540e-12, 20);
  });

  it('makes a two-lead humbucker one wiring element, placed at its first coil', () => {
    const guitar = sample('two-lead-humbucker.json');
    expect(guitar.elements.map((element) => element.id)).toEqual(['neck', 'bridge']);
    expect(guitar.elements[1]).toMatchObject({ kind: 'two-lead pickup', coilIndices: [1, 2] });
  });

  it('keeps four-conductor humbucker coils as separate elements', () => {
    const guitar = sample('two-humbucker.json');
    expect(guitar.elements.map((element) => element.id)).toEqual(['neck_slug', 'neck_screw', 'bridge_screw', 'bridge_slug']);
    expect(guitar.pickups.map((pickup) => pickup.name)).toEqual(['neck', 'bridge']);
  });

  it('refuses more than six wiring elements', () => {
    const coils = Array.from({ length: 7 }, (_, index) => ({
      id: `c${index}`,
      position: `${40 + index * 20}mm`,
      resistance: '6k',
      inductance: '2.5H',
    }));
    expect(() => parseGuitar({ name: 'seven', coils })).toThrow(InputError);
    expect(() => parseGuitar({ name: 'seven', coils })).toThrow(/at most 6 wiring elements/u);
  });

  it('accepts tuning as note names or frequencies', () => {
    const guitar = parseGuitar({
      name: 'bass',
      tuning: ['E1', 'A1', 55 * 2 ** (5 / 12), '98Hz'],
      coils: [{ id: 'neck', position: '100mm', resistance: '6k', inductance: '2.5H' }],
    });
    expect(guitar.strings.map((s) => s.name)).toEqual(['E1', 'A1', 'D2', 'G2']);
    expect(guitar.strings[3]?.openHz).toBe(98);
  });
});
