/**
 * The coil element model (coil-model.ts, docs/physics.md §1.6) against
 * closed forms: a parallel loss resistance is one more resistive load, so the
 * second-order peak and Q of §1.1 hold with RL' = RL ∥ Rp; the eddy branch is
 * a shorted secondary reflected into the winding (transformer algebra).
 */
import { describe, expect, it } from 'vitest';
import { parseGuitar } from '../guitar/index.js';
import { leaf } from '../wiring/index.js';
import { coilImpedanceAt, coilSeriesImpedance, createCoilPhasors, type CoilModel } from './coil-model.js';
import { prepareCircuit } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

const TWO_PI = 2 * Math.PI;

/** |T(f)| of a one-coil guitar's only wiring, solved at one frequency. */
function gainAt(guitar: ReturnType<typeof parseGuitar>, frequencyHz: number): number {
  const prepared = prepareCircuit(guitar, Float64Array.of(frequencyHz));
  const transfer = solveTransfers(prepared, leaf(0))[0] as Float64Array;
  return Math.hypot(transfer[0] as number, transfer[1] as number);
}

/** Golden-section search for the maximum of a unimodal function on [low, high]. */
function maximise(fn: (x: number) => number, low: number, high: number): { x: number; value: number } {
  const ratio = (Math.sqrt(5) - 1) / 2;
  let a = low;
  let b = high;
  for (let step = 0; step < 200 && b - a > 1e-9 * b; step += 1) {
    const c = b - ratio * (b - a);
    const d = a + ratio * (b - a);
    if (fn(c) > fn(d)) b = d;
    else a = c;
  }
  const x = (a + b) / 2;
  return { x, value: fn(x) };
}

describe('parallel loss resistance against the second-order closed forms (docs/physics.md §1.1, §1.6)', () => {
  // Invented coil: 6 kΩ, 2.5 H, 120 pF, loss resistance 400 kΩ; cable 500 pF; 1 MΩ amplifier; volume pot 10 MΩ.
  const R = 6e3;
  const L = 2.5;
  const C = 620e-12;
  const RP = 400e3;
  const file = (extra: Record<string, unknown>): ReturnType<typeof parseGuitar> =>
    parseGuitar({
      name: 'loss resistance check (invented values)',
      coils: [{ id: 'coil', position: '100mm', resistance: R, inductance: L, capacitance: '120p', eddyShare: 0, ...extra }],
      controls: { volume: { pot: '10M', setting: 10 }, tone: null },
      cable: { capacitance: '500p' },
      amp: { resistance: '1M', capacitance: 0 },
    });
  const guitar = file({ lossResistance: RP });
  const load = 1 / (1 / RP + 1 / 1e6 + 1 / 10e6);
  // ω0 = √((1 + R/RL)/(L·C)), Q = ω0/(1/(RL·C) + R/L), peak at ω0·√(1 − 1/(2Q²)), height Q/√(1 − 1/(4Q²)) above DC (§1.1)
  const omega0 = Math.sqrt((1 + R / load) / (L * C));
  const q = omega0 / (1 / (load * C) + R / L);
  const peakHz = (omega0 * Math.sqrt(1 - 1 / (2 * q * q))) / TWO_PI;
  const height = q / Math.sqrt(1 - 1 / (4 * q * q));

  it(`peaks at the closed-form frequency (${peakHz.toFixed(1)} Hz) and height (Q = ${q.toFixed(3)})`, () => {
    const peak = maximise((f) => gainAt(guitar, f), 1000, 10000);
    expect(Math.abs(peak.x / peakHz - 1)).toBeLessThan(1e-6);
    const dc = gainAt(guitar, 0);
    expect(dc).toBeCloseTo(load / (R + load), 12);
    expect(Math.abs(peak.value / dc / height - 1)).toBeLessThan(1e-9);
  });

  it('lowers the peak against the same coil without it', () => {
    const lossless = file({});
    const withLoss = maximise((f) => gainAt(guitar, f), 1000, 10000).value;
    const without = maximise((f) => gainAt(lossless, f), 1000, 10000).value;
    expect(withLoss).toBeLessThan(without);
  });
});

describe('eddy-current branch (docs/physics.md §1.6)', () => {
  const coil: CoilModel = { resistanceOhms: 4000, inductanceH: 2.3, capacitanceF: 150e-12, lossResistanceOhms: null, eddyShare: 0.4, eddyResistanceOhms: 2 * Math.PI * 3000 * 0.4 * 2.3 };

  it('equals a shorted secondary reflected into the winding: jωL1 + ω²M²/(R2 + jωL2) with L1k² = κL', () => {
    // Secondary: L2 = 1 mH, k² = κ, M² = k²·L1·L2, R2 = Re·L2/(κ·L1) (referred back: Re = R2·κ·L1/L2).
    const l2 = 1e-3;
    const r2 = (coil.eddyResistanceOhms * l2) / (coil.eddyShare * coil.inductanceH);
    const m2 = coil.eddyShare * coil.inductanceH * l2;
    const phasors = createCoilPhasors();
    for (const f of [50, 500, 3000, 10000, 20000]) {
      const w = TWO_PI * f;
      // ω²M²/(R2 + jωL2) = ω²M²·(R2 − jωL2)/(R2² + ω²L2²)
      const denominator = r2 * r2 + w * w * l2 * l2;
      const expectedRe = coil.resistanceOhms + (w * w * m2 * r2) / denominator;
      const expectedIm = w * coil.inductanceH - (w * w * m2 * w * l2) / denominator;
      coilSeriesImpedance(coil, w, phasors);
      expect(phasors.seriesRe / expectedRe - 1).toBeCloseTo(0, 10);
      expect(phasors.seriesIm / expectedIm - 1).toBeCloseTo(0, 10);
    }
  });

  it('keeps the full inductance at low frequency and L·(1 − κ) far above the corner', () => {
    const phasors = createCoilPhasors();
    coilSeriesImpedance(coil, TWO_PI * 1, phasors);
    expect(phasors.seriesIm / TWO_PI / coil.inductanceH).toBeCloseTo(1, 4);
    coilSeriesImpedance(coil, TWO_PI * 1e7, phasors);
    expect(phasors.seriesIm / (TWO_PI * 1e7) / (coil.inductanceH * (1 - coil.eddyShare))).toBeCloseTo(1, 4);
    expect(phasors.seriesRe).toBeCloseTo(coil.resistanceOhms + coil.eddyResistanceOhms, 0);
  });

  it('a lossless coil is R + jωL in parallel with C', () => {
    const plain: CoilModel = { ...coil, eddyShare: 0 };
    const f = 5000;
    const w = TWO_PI * f;
    // Z = (R + jωL)/(1 − ω²LC + jωRC)
    const nr = plain.resistanceOhms;
    const ni = w * plain.inductanceH;
    const dr = 1 - w * w * plain.inductanceH * plain.capacitanceF;
    const di = w * plain.resistanceOhms * plain.capacitanceF;
    const norm = dr * dr + di * di;
    const [re, im] = coilImpedanceAt(plain, f);
    expect(re).toBeCloseTo((nr * dr + ni * di) / norm, 6);
    expect(im).toBeCloseTo((ni * dr - nr * di) / norm, 6);
  });
});
