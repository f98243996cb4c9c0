import { describe, expect, it } from 'vitest';
import { createRandom, realFft } from '../math/index.js';
import { designBands } from './design-bands.js';
import { measureCrossSpectra, pairIndex } from './measure-cross-spectra.js';

describe('measureCrossSpectra', () => {
  const size = 4096;
  const sampleRateHz = 48_000;
  const random = createRandom(7);
  const signals = [0, 1, 2].map(() => Float64Array.from({ length: size }, () => random() - 0.5));
  const fft = realFft(size);
  const spectra = signals.map((signal) => fft.forward(signal));
  const layout = designBands(sampleRateHz);
  const cross = measureCrossSpectra(spectra, size, layout);

  it('numbers the pairs (0,0), (0,1), (0,2), (1,1), (1,2), (2,2)', () => {
    expect([pairIndex(0, 0, 3), pairIndex(0, 1, 3), pairIndex(0, 2, 3), pairIndex(1, 1, 3), pairIndex(1, 2, 3), pairIndex(2, 2, 3)]).toEqual([0, 1, 2, 3, 4, 5]);
    expect(cross.pairCount).toBe(6);
  });

  it('sums to the time-domain energy and cross-energy in its real part (Parseval)', () => {
    for (let i = 0; i < 3; i += 1) {
      for (let j = i; j < 3; j += 1) {
        let timeDomain = 0;
        for (let n = 0; n < size; n += 1) timeDomain += (signals[i]?.[n] as number) * (signals[j]?.[n] as number);
        let re = 0;
        for (let s = 0; s < cross.segmentCount; s += 1) re += cross.energy[2 * (s * cross.pairCount + pairIndex(i, j, 3))] as number;
        // Σ x_i[n]·x_j[n] = (1/N)·Σ_k X_i·conj(X_j) over the full spectrum = the real part of the weighted half-spectrum sum
        // (bins k and N − k are complex conjugates). The imaginary part stays: it meets complex transfers.
        expect(re).toBeCloseTo(timeDomain, 9);
      }
    }
  });

  it('puts each bin in its segment, with its frequency in the first moment', () => {
    // A single bin at 1 kHz: all its energy lands in the segment holding 1 kHz, moment = 1000 Hz × energy.
    const bin = Math.round((1000 * size) / sampleRateHz);
    const spectrum = new Float64Array(2 * (size / 2 + 1));
    spectrum[2 * bin] = 3;
    const single = measureCrossSpectra([spectrum], size, layout);
    const frequency = (bin * sampleRateHz) / size;
    const segment = layout.segments.findIndex((candidate) => frequency >= candidate.lowHz && frequency < candidate.highHz);
    for (let s = 0; s < single.segmentCount; s += 1) {
      const expected = s === segment ? (2 / size) * 9 : 0;
      expect(single.energy[2 * s]).toBeCloseTo(expected, 15);
      expect(single.moment[2 * s]).toBeCloseTo(expected * frequency, 12);
    }
  });
});
