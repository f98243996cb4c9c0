import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { realFft } from '../math/index.js';
import { centsBetween, midiToHz } from '../units/index.js';
import { builtInPhrase } from './built-in-phrase.js';
import { partialRatio } from './dispersion-allpass.js';
import { renderPhrase } from './render-phrase.js';
import { TYPICAL_INHARMONICITY } from './typical-string-set.js';

const demo = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8'));
const FS = 48000;

/** SHA-256 of every wave's bytes, lowest string first. */
function digest(waves: readonly Float64Array[]): string {
  const hash = createHash('sha256');
  for (const wave of waves) hash.update(new Uint8Array(wave.buffer, wave.byteOffset, wave.byteLength));
  return hash.digest('hex');
}

/** Half spectrum of the first `size` samples under a Hann window. */
function hannSpectrum(wave: Float64Array, size: number): Float64Array {
  return realFft(size).forward(Float64Array.from({ length: size }, (_, n) => (wave[n] ?? 0) * (0.5 - 0.5 * Math.cos((2 * Math.PI * n) / size))));
}

/** Frequency of the largest Hann-windowed FFT peak within `searchHz` of `nearHz`, refined by a parabola through the log magnitudes of the three top bins (Smith, SASP, "Quadratic Interpolation of Spectral Peaks"). */
function peakHz(spectrum: Float64Array, size: number, nearHz: number, searchHz: number): number {
  const binHz = FS / size;
  const magnitude = (k: number): number => Math.log(Math.hypot(spectrum[2 * k] as number, spectrum[2 * k + 1] as number));
  let best = Math.round((nearHz - searchHz) / binHz);
  for (let k = best; k <= Math.round((nearHz + searchHz) / binHz); k += 1) if (magnitude(k) > magnitude(best)) best = k;
  const [a, b, c] = [magnitude(best - 1), magnitude(best), magnitude(best + 1)];
  return (best + (0.5 * (a - c)) / (a - 2 * b + c)) * binHz;
}

describe('stiffness dispersion in the string loop', () => {
  it('B = 0 gives, bit for bit, the flexible-string render (SHA-256 of the render before stiffness was added)', () => {
    const render = renderPhrase(demo, builtInPhrase('open-strings'), { inharmonicity: 0 });
    expect(digest(render.waves)).toBe(GOLDEN_FLEXIBLE_DIGEST);
  });

  it('the peak estimator finds the partials of a synthetic stretched tone (B = 3·10⁻⁴) within 0.05 cent', () => {
    const size = 2 ** 17;
    const b = 3e-4;
    const f1Hz = midiToHz(40);
    const tone = Float64Array.from({ length: size }, (_, n) => {
      let sum = 0;
      for (let k = 1; k <= 10; k += 1) sum += (Math.exp(-n / FS) * Math.sin((2 * Math.PI * f1Hz * partialRatio(k, b) * n) / FS)) / k;
      return sum;
    });
    const spectrum = hannSpectrum(tone, size);
    for (let k = 1; k <= 8; k += 1) {
      expect(Math.abs(centsBetween(peakHz(spectrum, size, f1Hz * partialRatio(k, b), f1Hz / 4), f1Hz * partialRatio(k, b)))).toBeLessThan(0.05);
    }
  });

  // ISO 16 pitches: E2 A2 D3 G3 B3 E4 = MIDI 40 45 50 55 59 64, f = 440·2^((m − 69)/12); fretted: A2, G4.
  it.each([
    [6, 0, 40],
    [5, 0, 45],
    [4, 0, 50],
    [3, 0, 55],
    [2, 0, 59],
    [1, 0, 64],
    [6, 5, 45],
    [3, 12, 67],
  ])('with typical B, string %i fret %i: the fundamental partial is MIDI %i within ±1 cent', (string, fret, midi) => {
    const size = 2 ** 17;
    const phrase = { name: 'one note', notes: [{ timeS: 0, string, fret, velocity: 1 }] };
    const render = renderPhrase(demo, phrase, { tailS: size / FS, fadeOutS: 0, inharmonicity: 'typical' });
    const spectrum = hannSpectrum(render.waves[6 - string] ?? new Float64Array(), size);
    const f1Hz = midiToHz(midi);
    expect(Math.abs(centsBetween(peakHz(spectrum, size, f1Hz, f1Hz / 4), f1Hz))).toBeLessThan(1);
  });

  it('the low E partials follow f_n/f_1 = n·√((1 + B·n²)/(1 + B)) within 0.5 cent for n = 2…8 (Fletcher & Rossing ch. 2), 7 cents off harmonic at n = 8', () => {
    const b = TYPICAL_INHARMONICITY[0]?.b ?? 0;
    const phrase = { name: 'low E', notes: [{ timeS: 0, string: 6, fret: 0, velocity: 1 }] };
    const size = 2 ** 18; // 5.5 s at 48 kHz: bins of 0.18 Hz
    const render = renderPhrase(demo, phrase, { inharmonicity: b, tailS: size / FS, pluckShape: 'ideal', t60S: 20, fadeOutS: 0 });
    const wave = render.waves[0] ?? new Float64Array();
    const spectrum = hannSpectrum(wave, size);
    const f1Hz = midiToHz(40);
    const measured1 = peakHz(spectrum, size, f1Hz, f1Hz / 4);
    for (let n = 2; n <= 8; n += 1) {
      const expectedRatio = partialRatio(n, b);
      const measured = peakHz(spectrum, size, f1Hz * expectedRatio, f1Hz / 4);
      expect(Math.abs(centsBetween(measured / measured1, expectedRatio))).toBeLessThan(0.5);
    }
    // B = 1.28·10⁻⁴: 600·log2((1 + 64·B)/(1 + B)) = 6.97 cents, fourteen times the tolerance above.
    expect(centsBetween(partialRatio(8, b), 8)).toBeGreaterThan(6.9);
  });
});

/** Computed once from the flexible-string loop (render model 2), default options, the open-strings phrase on the three-single-coil sample. */
const GOLDEN_FLEXIBLE_DIGEST = 'b6a877e44bfb9009dae583a85a4adb4146f8c0082c059e0a6e8b1983818a66b5';
