import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { createRandom } from './random.js';
import { realFft } from './real-fft.js';

/** Direct DFT, X[k] = Σ x[n]·e^(−j2πkn/N), as the independent reference. */
function dft(x: readonly number[], k: number): [number, number] {
  let re = 0;
  let im = 0;
  for (let n = 0; n < x.length; n += 1) {
    const angle = (-2 * Math.PI * k * n) / x.length;
    re += (x[n] ?? 0) * Math.cos(angle);
    im += (x[n] ?? 0) * Math.sin(angle);
  }
  return [re, im];
}

describe('realFft', () => {
  it('matches a direct DFT and inverts exactly', () => {
    const random = createRandom(7);
    for (const size of [4, 16, 256]) {
      const x = Array.from({ length: size }, () => random() * 2 - 1);
      const fft = realFft(size);
      const spectrum = fft.forward(x);
      for (let k = 0; k <= size / 2; k += 1) {
        const [re, im] = dft(x, k);
        expect(spectrum[2 * k]).toBeCloseTo(re, 9);
        expect(spectrum[2 * k + 1]).toBeCloseTo(im, 9);
      }
      const back = fft.inverse(spectrum);
      for (let n = 0; n < size; n += 1) expect(back[n]).toBeCloseTo(x[n] ?? 0, 12);
    }
  });

  it('forwardPacked (one N/2-point complex FFT) matches the direct DFT, windowed and zero padded', () => {
    const random = createRandom(11);
    for (const size of [4, 16, 256]) {
      const length = size - 3;
      const x = Array.from({ length }, () => random() * 2 - 1);
      const window = Array.from({ length }, () => random());
      const fft = realFft(size);
      const out = new Float64Array(2 * fft.bins);
      fft.forwardPacked(x, out, window);
      const windowed = [...x.map((value, n) => value * (window[n] ?? 0)), 0, 0, 0];
      for (let k = 0; k <= size / 2; k += 1) {
        const [re, im] = dft(windowed, k);
        expect(out[2 * k]).toBeCloseTo(re, 9);
        expect(out[2 * k + 1]).toBeCloseTo(im, 9);
      }
      fft.forwardPacked(x.slice(0, 2), out);
      for (let k = 0; k <= size / 2; k += 1) expect(out[2 * k]).toBeCloseTo(dft([x[0] ?? 0, x[1] ?? 0, ...new Array(size - 2).fill(0)], k)[0], 12);
    }
  });

  // Reference: fft.js 4.0.4 built by its own constructor. realFft builds its engines' twiddle
  // tables itself (one table shared by the full- and half-size engines) and must give its bits.
  it("gives the bits of fft.js's own engine", () => {
    const random = createRandom(5);
    for (const size of [4, 8, 32, 512, 4096]) {
      const x = Float64Array.from({ length: size }, () => random() * 2 - 1);
      const fft = realFft(size);
      fft.forwardPacked(x, new Float64Array(2 * fft.bins)); // the half-size engine first, so the full one comes after it
      const reference = new FFT(size);
      const full = reference.createComplexArray() as number[];
      reference.realTransform(full, Array.from(x));
      const spectrum = fft.forward(x);
      for (let i = 0; i < 2 * fft.bins; i += 1) expect(Object.is(spectrum[i], full[i]), `size ${size}, index ${i}`).toBe(true);
    }
  });

  // Reference: fft.js 4.0.4's own inverseTransform (which divides by its size after the transform), after the
  // packing read at `scale`. realFft.inverse folds that division into the packing (a power of two, exact) and
  // writes into the caller's array: the same bits into a frame, a view of a longer array, a longer array (its tail
  // untouched) and the spectrum's own array; a shorter one is refused.
  it("inverts with the bits of fft.js's own inverse, scaled or not, into a frame or a view", () => {
    const random = createRandom(9);
    for (const size of [4, 8, 64, 2048]) {
      const fft = realFft(size);
      const half = size / 2;
      const reference = new FFT(half);
      // Spectra over many orders of magnitude, and scales that round (1/3, 0.02) or not (1, 8).
      const spectrum = Float64Array.from({ length: size + 2 }, () => (random() - 0.5) * 10 ** (random() * 12 - 6));
      for (const scale of [1, 0.02, 1 / 3, 8]) {
        // The packing of real-fft.ts with the spectrum read times `scale`, then fft.js's inverse as it ships.
        const packed = reference.createComplexArray() as number[];
        for (let k = 0; k < half; k += 1) {
          const ar = (spectrum[2 * k] as number) * scale;
          const ai = (spectrum[2 * k + 1] as number) * scale;
          const br = (spectrum[2 * (half - k)] as number) * scale;
          const bi = -((spectrum[2 * (half - k) + 1] as number) * scale);
          const [er, ei, dr, di] = [(ar + br) / 2, (ai + bi) / 2, (ar - br) / 2, (ai - bi) / 2];
          const angle = (Math.PI * 2 * k) / size;
          const [wr, wi] = [Math.cos(angle), Math.sin(angle)];
          packed[2 * k] = er - (dr * wi + di * wr);
          packed[2 * k + 1] = ei + (dr * wr - di * wi);
        }
        const expected = reference.createComplexArray() as number[];
        reference.inverseTransform(expected, packed);
        const frame = fft.inverse(spectrum, new Float64Array(size), scale);
        const view = fft.inverse(spectrum, new Float64Array(size + 6).subarray(3, size + 3), scale);
        const longer = fft.inverse(spectrum, new Float64Array(size + 6).fill(7), scale);
        const own = fft.inverse(Float64Array.from(spectrum), undefined, scale);
        const inPlace = Float64Array.from(spectrum);
        fft.inverse(inPlace, inPlace, scale);
        for (let n = 0; n < size; n += 1) {
          expect(Object.is(frame[n], expected[n]), `size ${size}, scale ${scale}, sample ${n}`).toBe(true);
          expect(Object.is(view[n], expected[n]), `view: size ${size}, scale ${scale}, sample ${n}`).toBe(true);
          expect(Object.is(longer[n], expected[n]), `longer: size ${size}, scale ${scale}, sample ${n}`).toBe(true);
          expect(Object.is(own[n], expected[n]), `default: size ${size}, scale ${scale}, sample ${n}`).toBe(true);
          expect(Object.is(inPlace[n], expected[n]), `in place: size ${size}, scale ${scale}, sample ${n}`).toBe(true);
        }
        expect(Array.from(longer.subarray(size))).toEqual([7, 7, 7, 7, 7, 7]);
        expect(() => fft.inverse(spectrum, new Float64Array(size - 1), scale)).toThrow(RangeError);
      }
    }
  });

  it('zero pads short input and refuses sizes that are not powers of two', () => {
    const spectrum = realFft(8).forward([1]);
    for (let k = 0; k <= 4; k += 1) expect(spectrum[2 * k]).toBeCloseTo(1, 12);
    expect(() => realFft(12)).toThrow(RangeError);
    // An inverse needs bins 0 … N/2: a spectrum one number short is refused, not read past its end.
    expect(() => realFft(8).inverse(new Float64Array(9))).toThrow(/10 numbers/);
  });

  it('gives the same stream for the same seed', () => {
    const a = createRandom(42);
    const b = createRandom(42);
    for (let i = 0; i < 10; i += 1) expect(a()).toBe(b());
  });
});
