import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar, parseGuitarText } from '../guitar/index.js';
import { createRandom } from '../math/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { DEFAULT_ALIKE_THRESHOLDS, resolveAlikeThresholds } from './alike-thresholds.js';
import { groupAlikeWirings } from './group-alike-wirings.js';
import { measureSpectralBasis } from './measure-spectral-basis.js';
import { type SpectralProfiles, measureSpectralProfiles } from './measure-spectral-profiles.js';
import { measureSpectrumDistance, measureWiringDifference, measureWiringDistance } from './measure-wiring-difference.js';
import { solveWiringSpectra } from './solve-wiring-spectra.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');
const readSample = (file: string): Record<string, unknown> => JSON.parse(readFileSync(join(samples, file), 'utf8')) as Record<string, unknown>;
const thresholds = DEFAULT_ALIKE_THRESHOLDS;

function profilesOf(guitar: Guitar) {
  const wirings = enumerateWirings(guitar.elements);
  const spectra = solveWiringSpectra(guitar, measureSpectralBasis(guitar), wirings);
  return { wirings, spectra, profiles: measureSpectralProfiles(spectra) };
}

/** Hand-made profiles: each wiring a level, a brightness and a band shape in dB (equal loudness weights). */
function syntheticProfiles(entries: ReadonlyArray<{ level: number; brightness: number; shape: readonly number[] }>): SpectralProfiles {
  const bandCount = entries[0]?.shape.length ?? 0;
  return {
    count: entries.length,
    bandCount,
    centresHz: Array.from({ length: bandCount }, (_, b) => 100 * (b + 1)),
    levelsDb: Float64Array.from(entries, (entry) => entry.level),
    brightnessHz: Float64Array.from(entries, (entry) => entry.brightness),
    shapeDb: Float64Array.from(entries.flatMap((entry) => entry.shape)),
    loudness: new Float64Array(entries.length * bandCount).fill(1),
    silent: new Uint8Array(entries.length),
  };
}

describe('measureWiringDifference', () => {
  it('is the largest difference over its threshold, and zero between a wiring and itself', () => {
    const profiles = syntheticProfiles([
      { level: 0, brightness: 1000, shape: [0, 0, 0, 0] },
      { level: 0.5, brightness: 1020, shape: [1, -1, 1, -1] },
      { level: -2, brightness: 1000, shape: [0, 0, 0, 0] },
    ]);
    expect(measureWiringDifference(profiles, 0, profiles, 0, thresholds)).toMatchObject({ levelDb: 0, spectrumDb: 0, brightnessPercent: 0, distance: 0, alike: true });
    // Hand-worked: RMS of ±1 dB = 1 dB (equal weights); level 0.5/1; brightness ln(1.02)/ln(1.03) = 0.67.
    const difference = measureWiringDifference(profiles, 0, profiles, 1, thresholds);
    expect(difference.spectrumDb).toBeCloseTo(1, 12);
    expect(difference.levelDb).toBeCloseTo(0.5, 12);
    expect(difference.brightnessPercent).toBeCloseTo(2, 10);
    expect(difference.distance).toBeCloseTo(1, 12);
    expect(difference.alike).toBe(false);
    expect(measureWiringDistance(profiles, 0, profiles, 2, thresholds)).toBeCloseTo(2, 12);
    expect(measureWiringDistance(profiles, 2, profiles, 0, thresholds)).toBeCloseTo(2, 12);
    // Brightness: +3 % reads exactly 1 at a 3 % threshold.
    const brighter = syntheticProfiles([
      { level: 0, brightness: 1000, shape: [0] },
      { level: 0, brightness: 1030, shape: [0] },
    ]);
    expect(measureWiringDistance(brighter, 0, brighter, 1, thresholds)).toBeCloseTo(1, 12);
  });

  it('is the same double whichever wiring comes first (the exact shortlist search compares distances for equality)', () => {
    // 700 Hz and 2804 Hz: Math.log(2804 / 700) and −Math.log(700 / 2804) differ in the last bit; the level and
    // band terms are chosen below the brightness term so that term decides the distance.
    const profiles = syntheticProfiles([
      { level: 0, brightness: 700, shape: [0, 1] },
      { level: 0.25, brightness: 2804, shape: [1, 0] },
    ]);
    expect(Math.abs(Math.log(2804 / 700))).not.toBe(Math.abs(Math.log(700 / 2804)));
    expect(measureWiringDistance(profiles, 0, profiles, 1, thresholds)).toBe(measureWiringDistance(profiles, 1, profiles, 0, thresholds));
    expect(measureWiringDifference(profiles, 0, profiles, 1, thresholds).distance).toBe(measureWiringDifference(profiles, 1, profiles, 0, thresholds).distance);
    // Hand-worked: ln(2804/700)/ln(1.03) = 46.95.
    expect(measureWiringDistance(profiles, 0, profiles, 1, thresholds)).toBeCloseTo(Math.log(2804 / 700) / Math.log(1.03), 10);
  });

  it('weights band differences by loudness share', () => {
    const profiles = syntheticProfiles([
      { level: 0, brightness: 1000, shape: [0, 0] },
      { level: 0, brightness: 1000, shape: [0, 2] },
    ]);
    profiles.loudness.set([3, 1, 3, 1]);
    // √((3·0² + 1·2²)/(3 + 1)) = 1
    expect(measureSpectrumDistance(profiles, 0, profiles, 1)).toBeCloseTo(1, 12);
  });

  it('puts a louder copy of the guitar exactly its gain above, with the same spectrum', () => {
    const raw = readSample('three-single-coil.json');
    const base = parseGuitar(raw);
    // Every coil's sensitivity (derived from its turns) raised by 2 dB.
    const hotter = parseGuitar({
      ...raw,
      coils: (raw.coils as Array<Record<string, unknown>>).map((coil, index) => ({ ...coil, sensitivity: (base.coils[index]?.sensitivity as number) * 10 ** (2 / 20) })),
    });
    const a = profilesOf(base);
    const b = solveWiringSpectra(hotter, measureSpectralBasis(hotter), a.wirings);
    const onScaleOfA = measureSpectralProfiles(b, a.spectra.referenceEnergy);
    a.wirings.forEach((wiring, w) => {
      const difference = measureWiringDifference(a.profiles, w, onScaleOfA, w, thresholds);
      expect(difference.levelDb, wiring.expression).toBeCloseTo(2, 9);
      expect(difference.spectrumDb).toBeLessThan(1e-9);
      expect(Math.abs(difference.brightnessPercent ?? 1)).toBeLessThan(1e-9);
    });
  });
});

describe('groupAlikeWirings', () => {
  it('puts wirings that swap two identical coils at one position in one group', () => {
    // Invented test guitar: "a" and "b" are the same coil at the same place (say, a pickup measured twice), "c" another.
    const coil = { resistance: '6k', inductance: '2.5H', capacitance: '110p', winding: 'cw', magnet: 'north' };
    const guitar = parseGuitar({
      name: 'Test: two identical coils at one position (invented values)',
      scale: '648mm',
      coils: [
        { id: 'twin_one', position: '100mm', ...coil },
        { id: 'twin_two', position: '100mm', ...coil },
        { id: 'bridge', position: '40mm', ...coil, resistance: '6.5k', inductance: '2.7H' },
      ],
    });
    const { wirings, profiles } = profilesOf(guitar);
    const grouping = groupAlikeWirings(profiles, thresholds);
    const index = (expression: string): number => wirings.findIndex((wiring) => wiring.expression === expression);
    const swapped: Array<[string, string]> = [
      ['twin_one', 'twin_two'],
      ['twin_one + bridge', 'twin_two + bridge'],
      ['twin_one + ~bridge', 'twin_two + ~bridge'],
      ['twin_one // bridge', 'twin_two // bridge'],
      ['(twin_one // bridge) + twin_two', 'twin_one + (twin_two // bridge)'],
      ['(twin_one + bridge) // twin_two', 'twin_one // (twin_two + bridge)'],
    ];
    for (const [left, right] of swapped) {
      expect(index(left), left).toBeGreaterThanOrEqual(0);
      expect(index(right), right).toBeGreaterThanOrEqual(0);
      expect(measureWiringDistance(profiles, index(left), profiles, index(right), thresholds), `${left} vs ${right}`).toBeLessThan(1e-6);
      expect(grouping.groupOf[index(left)], `${left} / ${right}`).toBe(grouping.groupOf[index(right)]);
    }
    // Two identical coils out of phase cancel completely: silent, and alike only to each other's silence.
    expect(profiles.silent[index('twin_one + ~twin_two')]).toBe(1);
    expect(grouping.groupOf[index('twin_one + ~twin_two')]).toBe(grouping.groupOf[index('twin_one // ~twin_two')]);
    expect(grouping.groupOf[index('twin_one + ~twin_two')]).not.toBe(grouping.groupOf[index('twin_one')]);
  });

  it('keeps an out-of-phase pair of adjacent coils apart from its in-phase twin', () => {
    const { wirings, profiles } = profilesOf(parseGuitarText(readFileSync(join(samples, 'three-single-coil.json'), 'utf8'), 'demo'));
    const grouping = groupAlikeWirings(profiles, thresholds);
    const index = (expression: string): number => wirings.findIndex((wiring) => wiring.expression === expression);
    for (const [inPhase, outOfPhase] of [
      ['neck + mid', 'neck + ~mid'],
      ['neck // mid', 'neck // ~mid'],
      ['mid + bridge', 'mid + ~bridge'],
      ['mid // bridge', 'mid // ~bridge'],
    ] as const) {
      expect(grouping.groupOf[index(inPhase)]).not.toBe(grouping.groupOf[index(outOfPhase)]);
      expect(measureWiringDistance(profiles, index(inPhase), profiles, index(outOfPhase), thresholds)).toBeGreaterThan(5);
    }
  });

  it('does not depend on the order the wirings come in', () => {
    const raw = readSample('humbucker-two-single-coil.json');
    const guitar = parseGuitar(raw);
    const { wirings, spectra } = profilesOf(guitar);
    const forward = groupAlikeWirings(measureSpectralProfiles(spectra), thresholds, wirings.map((wiring) => wiring.number));
    const random = createRandom(2024);
    const order = wirings.map((_, index) => index).sort(() => random() - 0.5);
    const shuffledWirings = order.map((index) => wirings[index]!);
    const shuffledSpectra = solveWiringSpectra(guitar, spectra.basis, shuffledWirings);
    const shuffled = groupAlikeWirings(measureSpectralProfiles(shuffledSpectra), thresholds, shuffledWirings.map((wiring) => wiring.number));
    const byExpression = (grouping: typeof forward, list: typeof wirings) =>
      new Map(list.map((wiring, index) => [wiring.expression, grouping.groupOf[index]]));
    expect(byExpression(shuffled, shuffledWirings)).toEqual(byExpression(forward, wirings));
    expect(forward.groups.length).toBeLessThan(wirings.length); // matched coils make some wirings alike
    expect(forward.groups[0]?.members[0]).toBe(0); // groups numbered by their first wiring
  });

  it('chains: A alike to B, B alike to C makes one group even when A and C differ', () => {
    const profiles = syntheticProfiles([
      { level: 0, brightness: 1000, shape: [0] },
      { level: 0.8, brightness: 1000, shape: [0] },
      { level: 1.6, brightness: 1000, shape: [0] },
      { level: 5, brightness: 1000, shape: [0] },
    ]);
    const grouping = groupAlikeWirings(profiles, resolveAlikeThresholds());
    expect([...grouping.groupOf]).toEqual([1, 1, 1, 2]);
    expect(grouping.groups[0]?.largestDistance).toBeCloseTo(1.6, 12);
    expect(grouping.groups[1]?.largestDistance).toBe(0);
  });

  it('finds each wiring its nearest neighbour, as a search over every pair does', () => {
    const { profiles } = profilesOf(parseGuitar(readSample('three-single-coil.json')));
    const grouping = groupAlikeWirings(profiles, thresholds);
    for (let a = 0; a < profiles.count; a += 1) {
      let best = Number.POSITIVE_INFINITY;
      for (let b = 0; b < profiles.count; b += 1) if (b !== a) best = Math.min(best, measureWiringDistance(profiles, a, profiles, b, thresholds));
      expect(grouping.nearestDistance[a]).toBeCloseTo(best, 12);
      expect(measureWiringDistance(profiles, a, profiles, grouping.nearest[a] as number, thresholds)).toBeCloseTo(best, 12);
    }
  });
});
