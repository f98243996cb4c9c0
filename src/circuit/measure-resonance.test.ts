/**
 * Resonance, peak and Q are finite or absent, and right: a property test
 * over random valid guitars (fast-check), each wiring's figures against a
 * reference read off a dense grid of exact nodal solves (20 000 log-spaced
 * points over 20 Hz–20 kHz, spacing 0.035 %), with a random correlated
 * drive D = A·Aᴴ (positive semidefinite, as any cross-spectral matrix is),
 * read by test/support/dense-peak.ts. Wherever the reference has a peak, the figure has
 * one within 0.05 %; wherever it finds both −3 dB points, Q is a finite
 * number within 1 %; wherever it does not, Q is null with a reason. No
 * figure is ever Infinity or NaN.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type DensePeak, readDensePeak } from '../../test/support/dense-peak.js';
import { coilArbitrary } from '../../test/support/random-coils.js';
import { type Guitar, parseGuitar } from '../guitar/index.js';
import { enumerateWirings, type Network } from '../wiring/index.js';
import { type CoilDrive, drivePairIndex, logSpacedFrequencies, measureResonance, prepareCircuit, solveDrivenResponse } from './index.js';

const DENSE_POINTS = 20_000;
const DENSE = logSpacedFrequencies(20, 20_000, DENSE_POINTS);
const FREQUENCY_TOLERANCE = 5e-4;
const Q_TOLERANCE = 0.01;
/** Random cases per run: 30 by default (about 8 s), more with COILBENCH_PROPERTY_RUNS. */
const RUNS = Number(process.env.COILBENCH_PROPERTY_RUNS ?? 30);


const guitarArbitrary = fc
  .record({
    coils: fc.array(coilArbitrary, { minLength: 1, maxLength: 3 }),
    volume: fc.double({ min: 0.5, max: 10, noNaN: true }),
    tone: fc.option(fc.double({ min: 0, max: 10, noNaN: true }), { nil: undefined }),
    bleed: fc.option(fc.constantFrom('470p', '1n', '2.2n'), { nil: undefined }),
    cable: fc.double({ min: 100e-12, max: 2e-9, noNaN: true }),
    ampOhms: fc.constantFrom(1e6, 10e6),
  })
  .map(
    ({ coils, volume, tone, bleed, cable, ampOhms }): Guitar =>
      parseGuitar({
        name: 'random guitar (invented values)',
        coils: coils.map((coil, index) => ({ id: `coil${index + 1}`, position: `${40 + 30 * index}mm`, ...coil })),
        controls: {
          volume: { pot: '250k', setting: volume },
          ...(tone === undefined ? {} : { tone: { pot: '250k', capacitor: '22n', setting: tone } }),
          ...(bleed === undefined ? {} : { trebleBleed: { capacitor: bleed } }),
        },
        cable: { capacitance: cable },
        amp: { resistance: ampOhms, capacitance: 0 },
      }),
  );

/** A random positive semidefinite D = A·Aᴴ at two frequencies (so it also varies with f), normalised to mean diagonal 1. */
const driveArbitrary = (coilCount: number): fc.Arbitrary<CoilDrive> =>
  fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 4 * coilCount * coilCount, maxLength: 4 * coilCount * coilCount }).map((numbers) => {
    const pairCount = (coilCount * (coilCount + 1)) / 2;
    const cross = new Float64Array(4 * pairCount);
    for (let k = 0; k < 2; k += 1) {
      const a = (i: number, m: number): [number, number] => {
        const at = 2 * (k * coilCount * coilCount + i * coilCount + m);
        return [numbers[at] as number, numbers[at + 1] as number];
      };
      let trace = 0;
      for (let i = 0; i < coilCount; i += 1) {
        for (let j = i; j < coilCount; j += 1) {
          // (A·Aᴴ)_ij = Σ_m A_im·conj(A_jm)
          let re = 0;
          let im = 0;
          for (let m = 0; m < coilCount; m += 1) {
            const [ar, ai] = a(i, m);
            const [br, bi] = a(j, m);
            re += ar * br + ai * bi;
            im += ai * br - ar * bi;
          }
          const at = 2 * (k * pairCount + drivePairIndex(i, j, coilCount));
          cross[at] = re;
          cross[at + 1] = im;
          if (i === j) trace += re;
        }
      }
      const scale = trace > 0 ? coilCount / trace : 1;
      for (let p = 0; p < 2 * pairCount; p += 1) cross[2 * k * pairCount + p] = (cross[2 * k * pairCount + p] as number) * scale;
    }
    return { coilCount, pairCount, frequenciesHz: Float64Array.of(300, 6000), cross };
  });

const caseArbitrary = guitarArbitrary.chain((guitar) =>
  fc.record({ guitar: fc.constant(guitar), pick: fc.nat(), drive: driveArbitrary(guitar.coils.length) }).map(({ pick, drive }) => {
    const wirings = enumerateWirings(guitar.elements);
    return { guitar, drive, network: (wirings[pick % wirings.length] as { network: Network }).network };
  }),
);

/** The reference: R on the dense grid, read by test/support/dense-peak.ts. */
function denseReference(guitar: Guitar, network: Network, drive: CoilDrive): DensePeak {
  return readDensePeak(DENSE, solveDrivenResponse(prepareCircuit(guitar, DENSE), network, drive).values);
}

describe('resonance figures are finite or absent, and right (property test)', () => {
  it('Q is finite within 1 % of a dense reference wherever it finds a −3 dB bandwidth, null with a reason elsewhere', () => {
    fc.assert(
      fc.property(caseArbitrary, ({ guitar, drive, network }) => {
        const metrics = measureResonance(prepareCircuit(guitar, logSpacedFrequencies(20, 20_000, 200)), network, { drive });
        for (const value of [metrics.resonanceHz, metrics.peakDb, metrics.resonanceQ]) {
          if (value !== null && !Number.isFinite(value)) return false;
        }
        if ((metrics.resonanceHz === null) !== (metrics.resonanceHzReason !== null)) return false;
        if ((metrics.resonanceQ === null) !== (metrics.resonanceQReason !== null)) return false;
        if (metrics.resonanceHzReason?.startsWith('the coils cancel')) return true;
        const reference = denseReference(guitar, network, drive);
        if ((reference.peakHz === null) !== (metrics.resonanceHz === null)) return false;
        if (reference.peakHz !== null && Math.abs((metrics.resonanceHz as number) / reference.peakHz - 1) > FREQUENCY_TOLERANCE) return false;
        if (reference.q === null) return metrics.resonanceQ === null;
        return metrics.resonanceQ !== null && Math.abs(metrics.resonanceQ / reference.q - 1) <= Q_TOLERANCE;
      }),
      { numRuns: RUNS },
    );
  });
});
