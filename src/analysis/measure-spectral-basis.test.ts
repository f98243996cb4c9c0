import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { builtInPhrase } from '../string/index.js';
import { measureSpectralBasis, spectralBasisFftSize } from './measure-spectral-basis.js';

const sample = (name: string) => parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', name), 'utf8'));

describe('spectralBasisFftSize', () => {
  it('is the FFT size the basis takes, planned without rendering the strings', () => {
    for (const name of ['three-single-coil.json', 'humbucker-two-single-coil.json']) {
      const guitar = sample(name);
      expect(spectralBasisFftSize(guitar), name).toBe(measureSpectralBasis(guitar).fftSize);
    }
    // A phrase and ring-out long enough to need the next size up, and a short one at another rate.
    const guitar = sample('three-single-coil.json');
    const long = { phrase: builtInPhrase('strum', guitar.strings.length), strings: { tailS: 4, sampleRateHz: 44100 } };
    const short = { phrase: builtInPhrase('strum', guitar.strings.length), strings: { tailS: 0.2, sampleRateHz: 22050 } };
    expect(spectralBasisFftSize(guitar, long)).toBe(measureSpectralBasis(guitar, long).fftSize);
    expect(spectralBasisFftSize(guitar, short)).toBe(measureSpectralBasis(guitar, short).fftSize);
    expect(spectralBasisFftSize(guitar, long)).toBeGreaterThan(spectralBasisFftSize(guitar));
    expect(spectralBasisFftSize(guitar, short)).toBeLessThan(spectralBasisFftSize(guitar));
    // A render that ends a sample short of 2^17: the pickups' delay (tens of samples) takes the frame to 2^18.
    const phrase = builtInPhrase('strum', guitar.strings.length);
    const lastS = phrase.notes.reduce((latest, note) => Math.max(latest, note.timeS), 0);
    const sampleRateHz = 48000;
    const edge = { phrase, strings: { tailS: (2 ** 17 - 1) / sampleRateHz - lastS, sampleRateHz } };
    expect(measureSpectralBasis(guitar, edge).phraseSamples).toBe(2 ** 17 - 1);
    expect(spectralBasisFftSize(guitar, edge)).toBe(measureSpectralBasis(guitar, edge).fftSize);
    expect(spectralBasisFftSize(guitar, edge)).toBe(2 ** 18);
  });
});
