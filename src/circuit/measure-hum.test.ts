/**
 * Hum in a field with a gradient (measure-hum.ts; docs/physics.md §6, §6.1):
 * identical coils in a uniform field cancel completely (to the floor); in a
 * graded field the residual of two matched coils spaced s is 2·sinh(γ·s/2),
 * ≈ γ·s = 3s/r for a dipole source at distance r (the §6 estimate); a 10 %
 * turns mismatch leaves about −20 dB (§6: −20·log10(δ)); humDb is the worse
 * of the two field directions; humDb's reference ignores elements that
 * cancel hum by themselves.
 */
import { describe, expect, it } from 'vitest';
import { parseGuitar } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { HUM_FLOOR_DB, humCategory } from './measure-hum.js';
import { measureCircuitMetrics } from './measure-circuit-metrics.js';

const COIL = { resistance: '4k', inductance: '2.3H', capacitance: '140p', construction: 'steel poles' };
/** A light load (10 MΩ ∥ 100 MΩ), so every wiring passes 60 Hz alike and the ratios are the field's and the turns'. */
const LIGHT_LOAD = { controls: { volume: { pot: '10M' }, tone: null }, amp: { resistance: '100M', capacitance: 0 } };

function humbucker(spacingM: number, extra: [Record<string, unknown>, Record<string, unknown>] = [{}, {}]): ReturnType<typeof parseGuitar> {
  return parseGuitar({
    name: 'humbucker (invented values)',
    coils: [
      { id: 'screw', position: 0.05 + spacingM / 2, winding: 'cw', magnet: 'south', ...COIL, ...extra[0] },
      { id: 'slug', position: 0.05 - spacingM / 2, winding: 'ccw', magnet: 'north', ...COIL, ...extra[1] },
    ],
    ...LIGHT_LOAD,
  });
}

function seriesHumDb(guitar: ReturnType<typeof parseGuitar>, humGradientPerM: number): number {
  const wirings = enumerateWirings(guitar.elements);
  const index = wirings.findIndex((wiring) => wiring.expression === 'screw + slug');
  return measureCircuitMetrics(guitar, wirings, { humGradientPerM }).wirings[index]?.humDb as number;
}

describe('hum field with a gradient', () => {
  it('two identical coils in a uniform field cancel completely: the floor, category "cancels"', () => {
    expect(seriesHumDb(humbucker(0.018), 0)).toBe(HUM_FLOOR_DB);
    expect(humCategory(HUM_FLOOR_DB)).toBe('cancels');
  });

  it('judges the category on the figure as printed (whole dB), so a printed −20 reads "cancels" and a printed −6 "reduces"', () => {
    expect(humCategory(-19.6)).toBe('cancels');
    expect(humCategory(-19.4)).toBe('reduces');
    expect(humCategory(-5.6)).toBe('reduces');
    expect(humCategory(-5.4)).toBe('noisy');
  });

  it('with a gradient, rejection follows the dipole estimate 3s/r (docs/physics.md §6: s = 18 mm at r = 0.5 m ≈ 11 % ≈ −19 dB)', () => {
    const r = 0.5;
    const gradient = 3 / r;
    const spacings = [0.01, 0.018, 0.04, 0.08];
    const figures = spacings.map((s) => seriesHumDb(humbucker(s), gradient));
    spacings.forEach((s, k) => {
      // Residual |e^{γs/2} − e^{−γs/2}| over the mean single coil (e^{γs/2} + e^{−γs/2})/2 = 2·tanh(γs/2) ≈ γ·s = 3s/r.
      const exact = 20 * Math.log10(2 * Math.tanh((gradient * s) / 2));
      expect(Math.abs((figures[k] as number) - exact)).toBeLessThan(0.01);
      // The linear estimate holds while γ·s is small (within 0.1 dB up to γ·s = 0.25).
      if (gradient * s <= 0.25) expect(Math.abs((figures[k] as number) - 20 * Math.log10((3 * s) / r))).toBeLessThan(0.1);
    });
    expect(Math.abs((figures[1] as number) - -19.3)).toBeLessThan(0.1);
    // Rejection falls as the spacing grows.
    for (let k = 1; k < figures.length; k += 1) expect(figures[k] as number).toBeGreaterThan(figures[k - 1] as number);
  });

  it('counts on no luck of the field direction: a mismatch the gradient makes up one way reads as the other way leaves it', () => {
    // 10 % more turns on the coil nearer the bridge, 40 mm apart, at γ = 3 /m (docs/physics.md §6.1): in a field
    // growing towards the neck the stronger field on the weaker coil makes up most of the mismatch, in the other
    // it adds to it. Derived: the residual is |n₁·e^{γd/2} − n₂·e^{−γd/2}| over the mean single coil for d = ±s.
    const spacing = 0.04;
    const gradient = 3;
    const guitar = humbucker(spacing, [{ turns: 5000 }, { turns: 5500 }]);
    const residual = (direction: number): number => {
      const [near, far] = [5000 * Math.exp((direction * gradient * spacing) / 2), 5500 * Math.exp((-direction * gradient * spacing) / 2)];
      return 20 * Math.log10(Math.abs(near - far) / ((near + far) / 2));
    };
    const [lucky, other] = [residual(1), residual(-1)];
    expect(lucky).toBeLessThan(-25); // −32.2 dB: the field growing towards the neck makes up the mismatch
    expect(other).toBeGreaterThan(-15); // −13.4 dB
    expect(Math.abs(seriesHumDb(guitar, gradient) - other)).toBeLessThan(0.01);
    // Matched coils have no lucky direction: both give the same figure (the dipole check above).
    expect(Math.abs(seriesHumDb(humbucker(spacing), gradient) - 20 * Math.log10(2 * Math.tanh((gradient * spacing) / 2)))).toBeLessThan(0.01);
  });

  it('a 10 % turns mismatch gives about −20 dB in a uniform field (docs/physics.md §6: −20·log10(0.1))', () => {
    const guitar = humbucker(0.018, [{ turns: 5000 }, { turns: 5500 }]);
    // Residual 500 turns over the mean single coil, 5250 turns: 20·log10(500/5250) = −20.4 dB.
    expect(Math.abs(seriesHumDb(guitar, 0) - 20 * Math.log10(500 / 5250))).toBeLessThan(0.01);
    // The same mismatch derived from inductance (N ∝ √L): 2.3 H and 2.3·1.1² H.
    const derived = humbucker(0.018, [{ inductance: 2.3 }, { inductance: 2.3 * 1.1 * 1.1 }]);
    expect(Math.abs(seriesHumDb(derived, 0) - -20)).toBeLessThan(1.5);
  });

  it("humDb's reference is the mean single coil that does not cancel hum: a two-lead humbucker does not halve it", () => {
    const guitar = parseGuitar({
      name: 'single coil and two-lead humbucker (invented values)',
      coils: [
        { id: 'neck', position: '160mm', resistance: '6k', inductance: '2.5H', capacitance: '110p', winding: 'cw', magnet: 'north' },
        { id: 'screw', pickup: 'bridge', position: '51mm', winding: 'cw', magnet: 'south', ...COIL },
        { id: 'slug', pickup: 'bridge', position: '33mm', winding: 'ccw', magnet: 'north', ...COIL },
      ],
      pickups: { bridge: { leads: 2 } },
      ...LIGHT_LOAD,
    });
    const wirings = enumerateWirings(guitar.elements);
    const analysis = measureCircuitMetrics(guitar, wirings, { humGradientPerM: 0 });
    const neck = analysis.wirings[wirings.findIndex((wiring) => wiring.expression === 'neck')];
    const bridge = analysis.wirings[wirings.findIndex((wiring) => wiring.expression === 'bridge')];
    expect(Math.abs(neck?.humDb as number)).toBeLessThan(0.01);
    expect(bridge?.humCategory).toBe('cancels');
  });
});
