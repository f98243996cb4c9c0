/**
 * The solver against closed forms for a single loaded coil and for two equal
 * coils (docs/physics.md §1.1, §1.2, §1.4; the second-order peak and Q are the
 * textbook results ω_r = ω_n·√(1 − 2ζ²), M_r = 1/(2ζ·√(1 − ζ²)), ζ = 1/(2Q),
 * e.g. K. Ogata, Modern Control Engineering, as quoted there).
 */
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar } from '../guitar/index.js';
import { type Network, enumerateWirings, leaf, parallel, series } from '../wiring/index.js';
import { type PreparedCircuit, measureResonance, prepareCircuit, analysisFrequencies, solveTransfers } from './index.js';

/** The power sum √(Σ_i |T_i(f)|²) at `frequencyHz`, solved there (no overrides). */
function powerSumAt(prepared: PreparedCircuit, network: Network, frequencyHz: number): number {
  return Math.sqrt(solveTransfers(prepareCircuit(prepared.guitar, Float64Array.of(frequencyHz)), network).reduce((sum, transfer) => sum + (transfer[0] as number) ** 2 + (transfer[1] as number) ** 2, 0));
}

interface Case {
  readonly name: string;
  readonly resistanceOhms: number;
  readonly inductanceH: number;
  readonly coilCapacitanceF: number;
  readonly cableCapacitanceF: number;
  readonly loadOhms: number;
  /** docs/physics.md §1.4 table: f0, pole Q, peak frequency, peak gain, peak above DC (dB). */
  readonly f0Hz: number;
  readonly q: number;
  readonly peakHz: number;
  readonly peakGain: number;
  readonly peakAboveDcDb: number;
}

const CASES: readonly Case[] = [
  { name: 'single coil, 111.1 kΩ load', resistanceOhms: 6e3, inductanceH: 2.5, coilCapacitanceF: 120e-12, cableCapacitanceF: 500e-12, loadOhms: 1 / (1 / 250e3 + 1 / 250e3 + 1 / 1e6), f0Hz: 4150, q: 1.542, peakHz: 3688, peakGain: 1.546, peakAboveDcDb: 4.24 },
  { name: 'same coil, 1 MΩ load', resistanceOhms: 6e3, inductanceH: 2.5, coilCapacitanceF: 120e-12, cableCapacitanceF: 500e-12, loadOhms: 1e6, f0Hz: 4055, q: 6.349, peakHz: 4029, peakGain: 6.33, peakAboveDcDb: 16.08 },
  { name: 'humbucker, 200 kΩ load', resistanceOhms: 8e3, inductanceH: 4.5, coilCapacitanceF: 150e-12, cableCapacitanceF: 500e-12, loadOhms: 200e3, f0Hz: 3001, q: 1.991, peakHz: 2805, peakGain: 1.978, peakAboveDcDb: 6.26 },
];

/** Volume pot fixed at 10 MΩ; the amplifier's resistance makes up the rest of the load, so volume ∥ amp = the case's load. */
const VOLUME_OHMS = 10e6;

function singleCoilGuitar(
  c: Pick<Case, 'resistanceOhms' | 'inductanceH' | 'coilCapacitanceF' | 'cableCapacitanceF' | 'loadOhms'> & { readonly lossResistanceOhms?: number },
  coils = 1,
): Guitar {
  return parseGuitar({
    name: 'closed-form check (invented values)',
    coils: Array.from({ length: coils }, (_, index) => ({
      id: `coil${index + 1}`,
      position: `${100 + 20 * index}mm`,
      resistance: c.resistanceOhms,
      inductance: c.inductanceH,
      capacitance: c.coilCapacitanceF,
      // The closed forms are for the lossless R-L-C coil of §1.1.
      eddyShare: 0,
      ...(c.lossResistanceOhms === undefined ? {} : { lossResistance: c.lossResistanceOhms }),
    })),
    controls: { volume: { pot: VOLUME_OHMS, setting: 10 }, tone: null },
    cable: { capacitance: c.cableCapacitanceF },
    amp: { resistance: 1 / (1 / c.loadOhms - 1 / VOLUME_OHMS), capacitance: 0 },
  });
}

/** docs/physics.md §1.1: ω0 = √((1 + R/RL)/(L·C)), Q = ω0/(1/(RL·C) + R/L), K = RL/(R + RL). */
function secondOrder(c: Case): { f0Hz: number; q: number; dcGain: number } {
  const capacitance = c.coilCapacitanceF + c.cableCapacitanceF;
  const omega0 = Math.sqrt((1 + c.resistanceOhms / c.loadOhms) / (c.inductanceH * capacitance));
  const q = omega0 / (1 / (c.loadOhms * capacitance) + c.resistanceOhms / c.inductanceH);
  return { f0Hz: omega0 / (2 * Math.PI), q, dcGain: c.loadOhms / (c.resistanceOhms + c.loadOhms) };
}

/**
 * Half-power Q of H = K/(1 − u² + j·u/Q), u = ω/ω0 (derived): |H|² = K²/D(v),
 * D = (1 − v)² + v/Q², v = u²; the peak is at v_p = 1 − 1/(2Q²) with
 * D_min = (1/Q²)(1 − 1/(4Q²)); the −3 dB points solve D(v) = 2·D_min:
 * v² − (2 − 1/Q²)·v + 1 − 2·D_min = 0. Q_bw = √v_p / (√v₊ − √v₋).
 */
function halfPowerQ(q: number): number {
  const vPeak = 1 - 1 / (2 * q * q);
  const dMin = (1 / (q * q)) * (1 - 1 / (4 * q * q));
  const b = 2 - 1 / (q * q);
  const root = Math.sqrt(b * b - 4 * (1 - 2 * dMin));
  return Math.sqrt(vPeak) / (Math.sqrt((b + root) / 2) - Math.sqrt((b - root) / 2));
}

describe('single loaded coil against the second-order closed forms (docs/physics.md §1.4)', () => {
  it.each(CASES)('$name: the formulas reproduce the published table', (c) => {
    const { f0Hz, q } = secondOrder(c);
    expect(f0Hz).toBeCloseTo(c.f0Hz, -1);
    expect(q).toBeCloseTo(c.q, 2);
    const zeta = 1 / (2 * q);
    expect((f0Hz * Math.sqrt(1 - 2 * zeta * zeta))).toBeCloseTo(c.peakHz, -1);
  });

  it.each(CASES)('$name: resonance, peak and Q from the solver', (c) => {
    const guitar = singleCoilGuitar(c);
    const prepared = prepareCircuit(guitar, analysisFrequencies());
    const network = leaf(0);
    const metrics = measureResonance(prepared, network);
    const { f0Hz, q, dcGain } = secondOrder(c);
    const zeta = 1 / (2 * q);
    const peakHz = f0Hz * Math.sqrt(1 - 2 * zeta * zeta);
    const peakGain = dcGain / (2 * zeta * Math.sqrt(1 - zeta * zeta));
    expect(metrics.resonanceHz).not.toBeNull();
    expect(Math.abs((metrics.resonanceHz as number) / peakHz - 1)).toBeLessThan(1e-5);
    expect(Math.abs((metrics.resonanceHz as number) - c.peakHz)).toBeLessThan(1); // the table, rounded to 1 Hz
    const measuredGain = powerSumAt(prepared, network, metrics.resonanceHz as number);
    expect(measuredGain).toBeCloseTo(peakGain, 9);
    expect(Math.abs(measuredGain - c.peakGain)).toBeLessThan(0.001);
    // peakDb is relative to 100 Hz, which sits within 0.01 dB of DC for these coils
    expect(Math.abs((metrics.peakDb as number) - c.peakAboveDcDb)).toBeLessThan(0.01);
    expect(metrics.resonanceQ).not.toBeNull();
    expect(Math.abs((metrics.resonanceQ as number) / halfPowerQ(q) - 1)).toBeLessThan(1e-5);
  });

  it('tone branch 250 kΩ + 22 nF included exactly: peak ≈ 3684 Hz, gain ≈ 1.547, bass gain 0.952 (§1.4, fourth row)', () => {
    const guitar = parseGuitar({
      name: 'closed-form check with tone (invented values)',
      coils: [{ id: 'coil', position: '100mm', resistance: '6k', inductance: '2.5H', capacitance: '120p', eddyShare: 0 }],
      controls: { volume: { pot: '250k', setting: 10 }, tone: { pot: '250k', capacitor: '22n', setting: 10 } },
      cable: { capacitance: '500p' },
      amp: { resistance: '1M', capacitance: 0 },
    });
    const prepared = prepareCircuit(guitar, analysisFrequencies());
    const metrics = measureResonance(prepared, leaf(0));
    expect(Math.abs((metrics.resonanceHz as number) - 3684)).toBeLessThan(3);
    expect(Math.abs(powerSumAt(prepared, leaf(0), metrics.resonanceHz as number) - 1.547)).toBeLessThan(0.002);
    // The table's "DC gain 0.952" is the bass plateau, where the tone branch conducts through its
    // capacitor (0.952 at 100–200 Hz). At true DC the capacitor blocks: RL/(R + RL) with
    // RL = 250 kΩ ∥ 1 MΩ = 200 kΩ, so 200/206 = 0.9709 (derived).
    expect(Math.abs(powerSumAt(prepared, leaf(0), 100) - 0.952)).toBeLessThan(0.0005);
    expect(powerSumAt(prepared, leaf(0), 0)).toBeCloseTo(200e3 / 206e3, 12);
  });
});

describe('two equal coils in series and in parallel (docs/physics.md §1.2)', () => {
  // Coil 2.25 H / 4 kΩ / 150 pF each; cable 500 pF; 500 kΩ ∥ 500 kΩ ∥ 1 MΩ = 200 kΩ.
  const guitar = singleCoilGuitar(
    { resistanceOhms: 4e3, inductanceH: 2.25, coilCapacitanceF: 150e-12, cableCapacitanceF: 500e-12, loadOhms: 200e3 },
    2,
  );
  const prepared = prepareCircuit(guitar, analysisFrequencies());
  it.each([
    ['one coil', 4066, leaf(0), 4e3, 2.25, 150e-12],
    ['series', 2965, series(leaf(0), leaf(1)), 8e3, 4.5, 75e-12],
    ['parallel', 5255, parallel(leaf(0), leaf(1)), 2e3, 1.125, 300e-12],
  ] as const)('%s peaks at %d Hz, as one coil of R, L, C', (_, tableHz, network, r, l, cp) => {
    const equivalent: Case = { name: '', resistanceOhms: r, inductanceH: l, coilCapacitanceF: cp, cableCapacitanceF: 500e-12, loadOhms: 200e3, f0Hz: 0, q: 0, peakHz: 0, peakGain: 0, peakAboveDcDb: 0 };
    const { f0Hz, q } = secondOrder(equivalent);
    const zeta = 1 / (2 * q);
    const metrics = measureResonance(prepared, network);
    expect(Math.abs((metrics.resonanceHz as number) / (f0Hz * Math.sqrt(1 - 2 * zeta * zeta)) - 1)).toBeLessThan(1e-5);
    expect(Math.abs((metrics.resonanceHz as number) - tableHz)).toBeLessThan(1);
  });
});

describe('DC gain RL/(R + RL) (docs/physics.md §1.1)', () => {
  it('every wiring of a three-coil guitar at 0 Hz: resistive Millman by hand', () => {
    const guitar = parseGuitar({
      name: 'DC check (invented values)',
      coils: [
        { id: 'neck', position: '150mm', resistance: '5.9k', inductance: '2.35H', winding: 'cw', magnet: 'north' },
        { id: 'mid', position: '100mm', resistance: '6.1k', inductance: '2.45H', winding: 'ccw', magnet: 'south' },
        { id: 'bridge', position: '45mm', resistance: '6.4k', inductance: '2.6H' },
      ],
      controls: { volume: { pot: '250k' }, tone: { pot: '250k', capacitor: '22n' } },
      amp: { resistance: '1M' },
    });
    const load = 1 / (1 / 250e3 + 1 / 1e6); // the tone capacitor blocks DC
    const prepared = prepareCircuit(guitar, Float64Array.of(0));
    const r = guitar.coils.map((coil) => coil.resistanceOhms);
    for (const wiring of enumerateWirings(guitar.elements)) {
      // Independent DC solution: Thevenin resistance and each coil's share of the open-circuit voltage.
      const solve = (node: typeof wiring.network): { ohms: number; weights: Map<number, number> } => {
        if (node.kind === 'element') return { ohms: r[node.element] as number, weights: new Map([[node.element, node.inverted ? -1 : 1]]) };
        const parts = node.parts.map(solve);
        if (node.kind === 'series') {
          return { ohms: parts.reduce((sum, part) => sum + part.ohms, 0), weights: new Map(parts.flatMap((part) => [...part.weights])) };
        }
        const conductance = parts.reduce((sum, part) => sum + 1 / part.ohms, 0);
        return {
          ohms: 1 / conductance,
          weights: new Map(parts.flatMap((part) => [...part.weights].map(([coil, weight]) => [coil, (weight * (1 / part.ohms)) / conductance] as [number, number]))),
        };
      };
      const expected = solve(wiring.network);
      const divider = load / (expected.ohms + load); // DC gain RL/(R + RL)
      const transfers = solveTransfers(prepared, wiring.network);
      transfers.forEach((transfer, coil) => {
        expect(transfer[0]).toBeCloseTo((expected.weights.get(coil) ?? 0) * divider, 12);
        expect(transfer[1]).toBeCloseTo(0, 12);
      });
    }
  });
});
