import { describe, expect, it } from 'vitest';
import { coilSpectraOfSignals } from '../render/portable/index.js';
import { decodeSignal, encodeSignal } from './page-data.js';
import { lazyCoilSpectra } from './wiring-engine.js';

describe('lazyCoilSpectra', () => {
  const fftSize = 64;
  const signals = [0, 1, 2].map((coil) => Float32Array.from({ length: 40 }, (_, n) => Math.sin(0.3 * n * (coil + 1)) * Math.exp(-n / 9)));
  const coils = { sampleRateHz: 48000, length: 40, delay: 0, fftSize, signals: signals.map(encodeSignal) };

  it('gives each coil the spectrum the command line computes from the same float32 signal', () => {
    const lazy = lazyCoilSpectra(coils);
    const eager = coilSpectraOfSignals({ ...coils, signals: coils.signals.map(decodeSignal) });
    expect(lazy.length).toBe(3);
    // Read out of order: each coil on its own.
    for (const coil of [2, 0, 1]) expect(Array.from(lazy[coil] as Float64Array)).toEqual(Array.from(eager[coil] as Float64Array));
    expect(lazy[1]).toBe(lazy[1]);
  });
});
