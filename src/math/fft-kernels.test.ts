import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { type FftKernel, type FftKernelHost, createFftKernel, createRealFftKernels, fftKernelHost } from './fft-kernels.js';
import { FFT_KERNELS_WASM } from './fft-kernels-wasm.js';
import { createRandom } from './random.js';

const HOSTS: readonly FftKernelHost[] = ['webassembly', 'javascript'];

/**
 * Largest module a browser is sure to compile synchronously on its main thread, bytes. MDN, "WebAssembly.Module()
 * constructor": some browsers throw a RangeError for large buffers on the UI thread; Chromium's limit is 4 KB (from
 * memory; the same 4 KB is named in the W3C ServiceWorker issue 1499, "Size limits with synchronous WebAssembly
 * functions"). The page compiles its kernels synchronously, on its main thread.
 */
const SYNCHRONOUS_COMPILE_LIMIT_BYTES = 4096;

type Engine = FFT & { _out: unknown; _data: unknown; _inv: number; _transform4(): void };

/** Samples that exercise the arithmetic: varied exponents and signs, exact zeros of both signs, subnormals, huge values. */
function awkwardNumbers(count: number, seed: number): Float64Array {
  const random = createRandom(seed);
  return Float64Array.from({ length: count }, (_, index) => {
    if (index % 31 === 0) return 0;
    if (index % 37 === 0) return -0;
    if (index % 41 === 0) return (random() - 0.5) * 1e-310; // subnormal
    if (index % 43 === 0) return (random() - 0.5) * 1e300;
    return (random() - 0.5) * 10 ** Math.floor(random() * 12 - 6);
  });
}

/** The first `count` numbers of `got` and `want` are the same doubles (Object.is: −0 apart from 0, NaN equal to NaN). */
function firstDifference(got: ArrayLike<number>, want: ArrayLike<number>, count: number): string | null {
  for (let i = 0; i < count; i += 1) if (!Object.is(got[i], want[i])) return `index ${i}: ${got[i]} against fft.js ${want[i]}`;
  return null;
}

describe('FFT kernels (fft.js 4.0.4 radix-4, as WebAssembly and as JavaScript)', () => {
  it('run as WebAssembly in Node', () => {
    expect(fftKernelHost()).toBe('webassembly');
  });

  it("give fft.js's bits, complex forward and inverse and real, every size from 2 to 2^16 points", () => {
    for (let power = 1; power <= 16; power += 1) {
      const points = 2 ** power;
      const reference = new FFT(points) as Engine;
      const table = Float64Array.from(reference.table as unknown as number[]);
      const data = awkwardNumbers(2 * points, power);
      const want = { forward: new Float64Array(2 * points), inverse: new Float64Array(2 * points), real: new Float64Array(2 * points) };
      reference.transform(want.forward, data);
      // fft.js's inverseTransform without its division by the size (the kernels leave that to the caller).
      Object.assign(reference, { _out: want.inverse, _data: data, _inv: 1 });
      reference._transform4();
      const real = data.subarray(0, points);
      reference.realTransform(want.real, real);
      for (const host of HOSTS) {
        const kernel = createFftKernel(points, table, host);
        kernel.input().set(data);
        kernel.transform(false);
        expect(firstDifference(kernel.output(), want.forward, 2 * points), `${host} forward, ${points} points`).toBeNull();
        kernel.input().set(data);
        kernel.transform(true);
        expect(firstDifference(kernel.output(), want.inverse, 2 * points), `${host} inverse, ${points} points`).toBeNull();
        kernel.input().set(real);
        kernel.realTransform();
        // realTransform fills bins 0 … points/2; completeSpectrum would fill the rest by symmetry.
        expect(firstDifference(kernel.output(), want.real, points + 2), `${host} real, ${points} points`).toBeNull();
      }
    }
  });

  it('pack and unpack real signals to the same bits in both hosts, every size from 4 to 2^17', () => {
    for (let power = 2; power <= 17; power += 1) {
      const size = 2 ** power;
      const half = size / 2;
      const signal = awkwardNumbers(size, 100 + power);
      const spectrum = awkwardNumbers(size + 2, 200 + power);
      const results = HOSTS.map((host) => {
        const kernels = createRealFftKernels(size, host);
        kernels.forwardInput().set(signal);
        const forward = new Float64Array(size + 2);
        kernels.forward(forward);
        kernels.packedInput().set(signal);
        const packed = new Float64Array(size + 2);
        kernels.forwardPacked(packed);
        // Scales as realFft passes them: 1/M, and a factor that is not a power of two over M.
        const inverse = Float64Array.from(kernels.inverse(spectrum, 1 / half));
        const scaled = Float64Array.from(kernels.inverse(spectrum, 0.37 / half));
        return { forward, packed, inverse, scaled };
      });
      const [wasm, javascript] = results;
      if (!wasm || !javascript) throw new Error('two hosts');
      for (const key of ['forward', 'packed', 'inverse', 'scaled'] as const) {
        expect(firstDifference(wasm[key], javascript[key], wasm[key].length), `${key}, ${size} points`).toBeNull();
      }
    }
  });

  it('keep working when a later kernel grows the memory under them', () => {
    const small = 16;
    const table = Float64Array.from(new FFT(small).table as unknown as number[]);
    const kernel = createFftKernel(small, table);
    const data = awkwardNumbers(2 * small, 3);
    const run = (target: FftKernel): Float64Array => {
      target.input().set(data);
      target.transform(false);
      return Float64Array.from(target.output());
    };
    const before = run(kernel);
    // 2^20 points: 48 MB of table, input and output, past anything made so far, so the memory grows.
    const big = 2 ** 20;
    createFftKernel(big, new Float64Array(2 * big));
    expect(kernel.input().length).toBe(2 * small);
    expect(firstDifference(run(kernel), before, 2 * small)).toBeNull();
  });

  it('refuse a size that is not a power of two, or a table of the wrong length', () => {
    expect(() => createFftKernel(12, new Float64Array(24))).toThrow(/power of two/);
    expect(() => createFftKernel(16, new Float64Array(16))).toThrow(/32 numbers/);
  });

  it('are small enough to compile synchronously in a page (their bytes are checked against wasm/ by wasm-arena.test.ts)', () => {
    expect(FFT_KERNELS_WASM.length).toBeLessThanOrEqual(SYNCHRONOUS_COMPILE_LIMIT_BYTES);
  });
});
