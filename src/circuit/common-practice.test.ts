/**
 * What players and luthiers know from the trade (common practice, no single
 * published source; docs/physics.md §1.2 and §6).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar, parseGuitarText } from '../guitar/index.js';
import { enumerateWirings, leaf, parallel, series, type Network } from '../wiring/index.js';
import {
  analysisFrequencies,
  HUM_FLOOR_DB,
  measureCircuitMetrics,
  measureResonance,
  prepareCircuit,
  solvePowerSumAt,
  solveTransfers,
} from './index.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');
const raw = JSON.parse(readFileSync(join(SAMPLES, 'three-single-coil.json'), 'utf8')) as Record<string, unknown>;
const guitar = parseGuitarText(JSON.stringify(raw), 'three-single-coil.json');
const pairs: Array<[number, number]> = [
  [0, 1],
  [0, 2],
  [1, 2],
];

/** |Σ_i T_i(f)|: the output when every coil sees the same string signal. */
function inPhaseOutput(target: Guitar, network: Network, frequencyHz: number): number {
  const transfers = solveTransfers(prepareCircuit(target, Float64Array.of(frequencyHz)), network);
  let re = 0;
  let im = 0;
  for (const transfer of transfers) {
    re += transfer[0] as number;
    im += transfer[1] as number;
  }
  return Math.hypot(re, im);
}

describe('series and parallel (common practice)', () => {
  const prepared = prepareCircuit(guitar, analysisFrequencies());
  const resonance = (network: Network): number => measureResonance(prepared, network).resonanceHz as number;

  it.each(pairs)('coils %i and %i in series are louder in the bass than either alone', (a, b) => {
    const alone = Math.max(inPhaseOutput(guitar, leaf(a), 100), inPhaseOutput(guitar, leaf(b), 100));
    expect(inPhaseOutput(guitar, series(leaf(a), leaf(b)), 100)).toBeGreaterThan(1.5 * alone);
  });

  it.each(pairs)('coils %i and %i in series peak lower than either alone, in parallel higher', (a, b) => {
    const lowest = Math.min(resonance(leaf(a)), resonance(leaf(b)));
    const highest = Math.max(resonance(leaf(a)), resonance(leaf(b)));
    expect(resonance(series(leaf(a), leaf(b)))).toBeLessThan(lowest);
    expect(resonance(parallel(leaf(a), leaf(b)))).toBeGreaterThan(highest);
  });
});

describe('turning the volume down without a treble bleed darkens the sound (common practice)', () => {
  /**
   * Presence: the mean level over 2–6 kHz relative to 100 Hz, dB. Rolling the
   * knob back a little puts the upper track in series with the cable's
   * capacitance and takes the resonant peak away. (In this plain model the
   * very top octave comes back at low settings, where the track on either
   * side of the wiper is small; the trade's remark is about rolling back.)
   */
  const presenceDb = (target: Guitar, volume: number): number => {
    const prepared = prepareCircuit(target, Float64Array.of(100), { volumeSetting: volume });
    const reference = solvePowerSumAt(prepared, leaf(0), 100);
    const band = [2000, 2500, 3000, 3500, 4000, 4500, 5000, 5500, 6000];
    return band.reduce((sum, f) => sum + 20 * Math.log10(solvePowerSumAt(prepared, leaf(0), f) / reference), 0) / band.length;
  };

  it.each([9, 8, 7, 6])('volume %i is darker than 10 by more than 2 dB of presence', (volume) => {
    expect(presenceDb(guitar, volume)).toBeLessThan(presenceDb(guitar, 10) - 2);
  });

  it('a treble bleed keeps more of the treble at the same setting', () => {
    const bled = parseGuitarText(
      JSON.stringify({ ...raw, controls: { ...(raw.controls as object), trebleBleed: { capacitor: '1n', resistor: '150k', arrangement: 'parallel' } } }),
      'bled',
    );
    expect(presenceDb(bled, 7)).toBeGreaterThan(presenceDb(guitar, 7) + 1);
  });

  it('volume 0 leaves nothing at the output, reported as silent, never -Infinity or NaN', () => {
    const analysis = measureCircuitMetrics(guitar, enumerateWirings(guitar.elements), { volumeSetting: 0 });
    expect(analysis.silent).toBe(true);
    for (const metrics of analysis.wirings) {
      expect(Object.values(metrics).every((value) => value === null || value === false)).toBe(true);
    }
  });
});

describe('hum (common practice; docs/physics.md §6)', () => {
  it('the in-between wirings with a reverse-wound, reverse-polarity middle coil cancel hum by more than 20 dB in a uniform field', () => {
    const wirings = enumerateWirings(guitar.elements);
    const uniform = measureCircuitMetrics(guitar, wirings, { humGradientPerM: 0 });
    const graded = measureCircuitMetrics(guitar, wirings);
    for (const expression of ['neck // mid', 'mid // bridge']) {
      const index = wirings.findIndex((wiring) => wiring.expression === expression);
      const metrics = uniform.wirings[index];
      expect(metrics?.humDb, expression).toBeLessThan(-20);
      expect(metrics?.humCancelling).toBe(true);
      // In the default field's gradient (docs/physics.md §6.1) coils 50–60 mm apart still reduce hum, but less.
      const withGradient = graded.wirings[index];
      expect(withGradient?.humDb as number, expression).toBeLessThan(-6);
      expect(withGradient?.humDb as number, expression).toBeGreaterThan(metrics?.humDb as number);
    }
    // Neck and bridge are wound and magnetised alike: in parallel and in phase they add hum.
    const neckBridge = graded.wirings[wirings.findIndex((wiring) => wiring.expression === 'neck // bridge')];
    expect(neckBridge?.humCancelling).toBe(false);
    expect(neckBridge?.humCategory).toBe('noisy');
  });

  it('perfectly matched coils in a uniform field cancel completely: the figure sits at the floor, not at -Infinity', () => {
    const coil = { resistance: '6k', inductance: '2.4H', capacitance: '110p' };
    const matched = parseGuitar({
      name: 'matched coils (invented values)',
      coils: [
        { id: 'neck', position: '160mm', winding: 'cw', magnet: 'north', ...coil },
        { id: 'mid', position: '100mm', winding: 'ccw', magnet: 'south', ...coil },
      ],
    });
    const wirings = enumerateWirings(matched.elements);
    const analysis = measureCircuitMetrics(matched, wirings, { humGradientPerM: 0 });
    const index = wirings.findIndex((wiring) => wiring.expression === 'neck // mid');
    expect(analysis.wirings[index]?.humDb).toBe(HUM_FLOOR_DB);
    expect(analysis.wirings[index]?.humCategory).toBe('cancels');
    for (const metrics of analysis.wirings) expect(Number.isFinite(metrics.humDb)).toBe(true);
  });

  it('a humbucker with a 5 % hum mismatch rejects about 26 dB (docs/physics.md §6: −20·log10(0.05))', () => {
    const coil = { resistance: '4k', inductance: '2.3H', capacitance: '140p', position: '45mm' };
    const humbucker = parseGuitar({
      name: 'mismatched humbucker (invented values)',
      coils: [
        { id: 'screw', winding: 'cw', magnet: 'south', humSensitivity: 1, ...coil },
        { id: 'slug', winding: 'ccw', magnet: 'north', humSensitivity: 0.95, ...coil },
      ],
      // A light load (10 MΩ ∥ 100 MΩ), so single and series wirings pass 60 Hz alike.
      controls: { volume: { pot: '10M' }, tone: null },
      amp: { resistance: '100M', capacitance: 0 },
    });
    const wirings = enumerateWirings(humbucker.elements);
    const analysis = measureCircuitMetrics(humbucker, wirings);
    // Series in phase: residual 0.05 of one coil; the reference is the mean of 1 and 0.95 → 0.05/0.975.
    const index = wirings.findIndex((wiring) => wiring.expression === 'screw + slug');
    expect(Math.abs((analysis.wirings[index]?.humDb as number) - 20 * Math.log10(0.05 / 0.975))).toBeLessThan(0.01);
  });
});
