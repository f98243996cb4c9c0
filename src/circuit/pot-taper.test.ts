import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings, leaf } from '../wiring/index.js';
import { analysisFrequencies, audioTaperBase, measureCircuitMetrics, measureResponseDb, prepareCircuit, wiperFraction } from './index.js';

describe('pot tapers', () => {
  it.each([0.1, 0.15, 0.2, 0.4])('audio taper with %f at the midpoint passes through 0, the midpoint and 1', (midpoint) => {
    const pot = { taper: 'audio' as const, audioMidpoint: midpoint };
    expect(wiperFraction(pot, 0)).toBe(0);
    expect(wiperFraction(pot, 5)).toBeCloseTo(midpoint, 14);
    expect(wiperFraction(pot, 10)).toBe(1);
    let previous = 0;
    for (let setting = 0.5; setting <= 10; setting += 0.5) {
      const fraction = wiperFraction(pot, setting);
      expect(fraction).toBeGreaterThan(previous);
      previous = fraction;
    }
  });

  it('a 10 % audio pot has base 81 (derived: (1/0.1 − 1)²)', () => {
    expect(audioTaperBase(0.1)).toBeCloseTo(81, 12);
  });

  it('linear taper is x/10', () => {
    expect(wiperFraction({ taper: 'linear', audioMidpoint: 0.1 }, 3)).toBeCloseTo(0.3, 15);
  });
});

describe('response curve for plots', () => {
  const guitar = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8'));

  it('is 0 dB at 100 Hz and peaks where the resonance is', () => {
    const grid = Float64Array.of(100, 1000, 3797, 10000);
    const response = measureResponseDb(prepareCircuit(guitar, grid), leaf(0));
    expect(response?.[0]).toBeCloseTo(0, 12);
    expect(response?.[2]).toBeGreaterThan(response?.[1] as number);
    expect(response?.[2]).toBeGreaterThan(response?.[3] as number);
  });

  it('is null, not -Infinity, with the volume at 0', () => {
    expect(measureResponseDb(prepareCircuit(guitar, analysisFrequencies(), { volumeSetting: 0 }), leaf(0))).toBeNull();
  });

  it('a two-lead humbucker alone cancels hum (its coils are reverse wound and reverse magnetised)', () => {
    const twoLead = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'two-lead-humbucker.json'), 'utf8'));
    const wirings = enumerateWirings(twoLead.elements);
    const analysis = measureCircuitMetrics(twoLead, wirings);
    const bridge = analysis.wirings[wirings.findIndex((wiring) => wiring.expression === 'bridge')];
    const neck = analysis.wirings[wirings.findIndex((wiring) => wiring.expression === 'neck')];
    expect(bridge?.humCancelling).toBe(true);
    expect(neck?.humCancelling).toBe(false);
  });
});
