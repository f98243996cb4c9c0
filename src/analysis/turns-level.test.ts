/**
 * A hotter coil (more turns) reads louder (docs/physics.md §1.6): two coils of
 * one construction at one place, 2.4 H and 4.6 H, each alone in the same
 * guitar. Its EMF grows with N ∝ √L, +2.8 dB (derived); the heavier loading
 * of the larger inductance takes a little of that back in the treble, but the
 * rendered strum's energy must still be higher. A coil given a measured
 * `sensitivity` keeps it whatever its inductance.
 */
import { describe, expect, it } from 'vitest';
import { parseGuitar } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { measureSpectralBasis } from './measure-spectral-basis.js';
import { solveWiringSpectra } from './solve-wiring-spectra.js';

const twoCoils = (hot: Record<string, unknown>) =>
  parseGuitar({
    name: 'hotter coil check (invented values)',
    coils: [
      { id: 'nominal', position: '100mm', resistance: '6k', inductance: '2.4H', capacitance: '110p', winding: 'cw', magnet: 'north' },
      { id: 'hot', position: '100mm', resistance: '9k', capacitance: '130p', winding: 'cw', magnet: 'north', ...hot },
    ],
  });

function singleLevelsDb(guitar: ReturnType<typeof parseGuitar>): { nominal: number; hot: number } {
  const wirings = enumerateWirings(guitar.elements);
  const spectra = solveWiringSpectra(guitar, measureSpectralBasis(guitar), wirings);
  const level = (expression: string): number => spectra.levelsDb[wirings.findIndex((wiring) => wiring.expression === expression)] as number;
  return { nominal: level('nominal'), hot: level('hot') };
}

describe('turns and level', () => {
  it('a coil of 4.6 H reads louder than one of 2.4 H of the same construction', () => {
    const guitar = twoCoils({ inductance: '4.6H' });
    const hot = guitar.coils[1];
    expect(hot?.sensitivity as number).toBeCloseTo(Math.sqrt(4.6 / 2.5), 12);
    const { nominal, hot: hotLevel } = singleLevelsDb(guitar);
    expect(hotLevel - nominal).toBeGreaterThan(1);
    expect(hotLevel - nominal).toBeLessThan(20 * Math.log10(Math.sqrt(4.6 / 2.4)) + 0.5);
  });

  it('a measured sensitivity overrides the turns', () => {
    const guitar = twoCoils({ inductance: '4.6H', sensitivity: Math.sqrt(2.4 / 2.5) });
    expect(guitar.coils[1]?.sensitivity).toBeCloseTo(guitar.coils[0]?.sensitivity as number, 12);
    const { nominal, hot } = singleLevelsDb(guitar);
    // Same EMF, heavier coil: no louder.
    expect(hot - nominal).toBeLessThan(0.5);
  });
});
