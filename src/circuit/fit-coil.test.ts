/**
 * Fitting the coil model: the worked example (samples/coil-sweep.csv,
 * generated from a known model, invented values) is recovered within 1 %,
 * and the unloaded-peak fit inverts the second-order closed forms of
 * docs/physics.md §1.1.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { coilImpedanceAt } from './coil-model.js';
import { fitCoilToPeak, fitCoilToSweep } from './fit-coil.js';
import { parseImpedanceSweep } from './parse-impedance-sweep.js';
import { SAMPLE_SWEEP_COIL, renderSampleSweep } from './sample-coil-sweep.js';

const SAMPLE = join(import.meta.dirname, '..', '..', 'samples', 'coil-sweep.csv');
const TWO_PI = 2 * Math.PI;

describe('fitCoilToSweep', () => {
  it('the committed sample is the known model (regenerate with scripts/write-coil-sweep.ts)', () => {
    expect(readFileSync(SAMPLE, 'utf8')).toBe(renderSampleSweep());
  });

  it('recovers the known model from the sample sweep within 1 % (our own check: data generated from the model)', () => {
    const sweep = parseImpedanceSweep(readFileSync(SAMPLE, 'utf8'), 'coil-sweep.csv');
    const fit = fitCoilToSweep(sweep);
    const truth = SAMPLE_SWEEP_COIL;
    expect(Math.abs(fit.resistanceOhms / truth.resistanceOhms - 1)).toBeLessThan(0.01);
    expect(Math.abs(fit.inductanceH / truth.inductanceH - 1)).toBeLessThan(0.01);
    expect(Math.abs(fit.capacitanceF / truth.capacitanceF - 1)).toBeLessThan(0.01);
    expect(Math.abs(fit.eddyShare / truth.eddyShare - 1)).toBeLessThan(0.01);
    expect(Math.abs(fit.eddyResistanceOhms / truth.eddyResistanceOhms - 1)).toBeLessThan(0.01);
    expect(fit.rmsRelativeError).toBeLessThan(1e-4);
  });

  it('fits real and imaginary columns as well as magnitude and phase', () => {
    const text = ['frequency,real,imaginary']
      .concat(
        Array.from({ length: 40 }, (_, k) => 30 * 1.18 ** k).map((f) => {
          const [re, im] = coilImpedanceAt({ ...SAMPLE_SWEEP_COIL, eddyShare: 0, lossResistanceOhms: 300e3 }, f);
          return `${f},${re},${im}`;
        }),
      )
      .join('\n');
    const fit = fitCoilToSweep(parseImpedanceSweep(text, 'sweep.csv'), { losses: 'parallel' });
    expect(Math.abs((fit.lossResistanceOhms as number) / 300e3 - 1)).toBeLessThan(0.01);
    expect(Math.abs(fit.capacitanceF / SAMPLE_SWEEP_COIL.capacitanceF - 1)).toBeLessThan(0.01);
  });

  it('refuses a sweep without the columns it needs, naming the line', () => {
    expect(() => parseImpedanceSweep('f,z\n1,2\n', 'bad.csv')).toThrow(InputError);
    expect(() => parseImpedanceSweep('frequency,magnitude,phase\n100,abc,3\n', 'bad.csv')).toThrow(/bad\.csv:2: expected a positive magnitude/u);
  });
});

describe('fitCoilToPeak (docs/physics.md §1.1 with RL = Rp)', () => {
  it('inverts the closed forms: a coil of known C and Rp gives back C and Rp from its peak and height', () => {
    const r = 6000;
    const l = 2.5;
    const c = 120e-12;
    const rp = 800e3;
    // ω0 = √((1 + R/Rp)/(L·C)), Q = ω0/(1/(Rp·C) + R/L); peak ω0·√(1 − 1/(2Q²)), height Q/√(1 − 1/(4Q²))
    const omega0 = Math.sqrt((1 + r / rp) / (l * c));
    const q = omega0 / (1 / (rp * c) + r / l);
    const peakHz = (omega0 * Math.sqrt(1 - 1 / (2 * q * q))) / TWO_PI;
    const height = q / Math.sqrt(1 - 1 / (4 * q * q));
    for (const measurement of [{ height }, { q }]) {
      const fit = fitCoilToPeak({ resistanceOhms: r, inductanceH: l, peakHz, ...measurement });
      expect(fit).not.toBeNull();
      expect(fit?.capacitanceF).toBeCloseTo(c, 18);
      expect(Math.abs((fit?.lossResistanceOhms as number) / rp - 1)).toBeLessThan(1e-9);
    }
  });

  it('says when the peak is higher than the winding resistance alone allows', () => {
    expect(fitCoilToPeak({ resistanceOhms: 6000, inductanceH: 2.5, peakHz: 9000, height: 200 })).toBeNull();
  });
});
