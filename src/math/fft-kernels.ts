/**
 * The loops of the real FFT (src/math/real-fft.ts): fft.js 4.0.4's radix-4
 * butterflies (`_transform4`, `_realTransform4`), the packing of a real
 * signal into a complex transform of half the size and its unpacking, and the
 * tables. They run as WebAssembly compiled from wasm/fft-kernels.ts: the same
 * operations in the same order, so the same bits (src/math/fft-kernels.test.ts
 * compares the butterflies with fft.js itself and the packing with the
 * JavaScript here, number for number). WebAssembly's f64 arithmetic is IEEE
 * 754 binary64 rounding to nearest, like JavaScript's, and neither fuses a
 * multiply into an add.
 *
 * Why: JavaScript's first transforms in each thread run in V8's interpreter
 * until its optimising compiler has caught up, boxing every intermediate
 * number, and each thread pays again; WebAssembly is compiled before its first
 * call (docs/design.md, "The FFT kernels", has the figures).
 *
 * Where a host cannot compile WebAssembly (none is there, or a page's policy
 * forbids it), the JavaScript here and fft.js's own run instead: the same
 * numbers, only slower to start.
 *
 * Memory: a size's tables and work arrays live in the WebAssembly memory of
 * its thread, for the life of the thread (as realFft keeps its arrays). The
 * memory only grows, and growing it detaches every view of the old buffer, so
 * views are made again whenever `memory.buffer` has changed: take them anew
 * for each transform.
 */
import FFT from 'fft.js';
import { FFT_KERNELS_WASM } from './fft-kernels-wasm.js';
import { F64_BYTES, I32_BYTES, type KernelHost, type WasmArena, allocate, copyIn, instantiateArena, memoryView } from './wasm-arena.js';

/** Which code runs the kernels: WebAssembly when the host compiles it, otherwise JavaScript. */
export type FftKernelHost = KernelHost;

/** One complex FFT size's butterflies (fft.js's engine). */
export interface FftKernel {
  /** Complex points of the transform (fft.js's `size`). */
  readonly points: number;
  /** Where the transforms read: 2·points numbers (the real transform reads the first `points`). */
  input(): Float64Array;
  /** Where the last transform wrote: 2·points numbers. */
  output(): Float64Array;
  /** fft.js `transform` (inverse false) or its `inverseTransform` without the division by `points` (inverse true). */
  transform(inverse: boolean): void;
  /** fft.js `realTransform` of the first `points` input numbers: output bins 0 … points/2 (fft.js's completeSpectrum would fill the rest). */
  realTransform(): void;
}

/** The real FFT of one size N: its three transforms, reading and writing arrays they own (views: take them anew each time). */
export interface RealFftKernels {
  readonly size: number;
  /** Where `forward` reads the real signal: N numbers. */
  forwardInput(): Float64Array;
  /** Bins 0 … N/2 of `forwardInput()` by fft.js's full-size real transform, into out[0 … N + 1]. */
  forward(out: Float64Array): void;
  /** Where `forwardPacked` reads the real signal: N numbers. */
  packedInput(): Float64Array;
  /** Bins 0 … N/2 of `packedInput()` by one complex transform of N/2 points, into out[0 … N + 1]. */
  forwardPacked(out: Float64Array): void;
  /**
   * The packing of halfSpectrum[i]·scale (bins 0 … N/2) run through the complex inverse transform of N/2 points,
   * without fft.js's division by N/2: the real signal times N/2 (N numbers, a view valid until the next transform).
   */
  inverse(halfSpectrum: Float64Array, scale: number): Float64Array;
}

interface KernelExports {
  transform4(out: number, data: number, table: number, bitrev: number, size: number, width: number, inverse: number): void;
  realTransform4(out: number, data: number, table: number, bitrev: number, size: number, width: number, inverse: number): void;
  packInverse(spectrum: number, twiddles: number, half: number, scale: number, packed: number): void;
  unpackForward(packed: number, twiddles: number, half: number, out: number): void;
  digitReversal(bitrev: number, width: number): void;
  halveTable(table: number, points: number, out: number): void;
}

type Instance = WasmArena<KernelExports>;

/** This thread's instance; null when the host cannot compile WebAssembly. */
let instance: Instance | null | undefined;

/** The WebAssembly kernels of this thread, compiled on first use; null where the host cannot (no WebAssembly, or a policy without 'wasm-unsafe-eval'). */
function kernelInstance(): Instance | null {
  if (instance === undefined) instance = instantiateArena<KernelExports>(FFT_KERNELS_WASM);
  return instance;
}

/** The host the kernels run on in this thread. */
export function fftKernelHost(): FftKernelHost {
  return kernelInstance() ? 'webassembly' : 'javascript';
}

/**
 * fft.js's twiddle table for `size` complex points into `table` (2·size
 * numbers): entry k holds cos(π·2k/size) and −sin(π·2k/size) at 2k and 2k + 1,
 * the very numbers its constructor computes (the same angle expression, so
 * the same bits; JavaScript's Math.cos and Math.sin, which WebAssembly does
 * not have).
 */
function fillTwiddleTable(size: number, table: Float64Array): Float64Array {
  for (let i = 0; i < 2 * size; i += 2) {
    const angle = (Math.PI * i) / size;
    table[i] = Math.cos(angle);
    table[i + 1] = -Math.sin(angle);
  }
  return table;
}

/**
 * Every second entry of a twiddle table: the table for half the size, to the
 * last bit (π·2(2k)/N = π·2k/(N/2) exactly, since scaling by two is exact).
 */
function halveTwiddleTable(table: Float64Array): Float64Array {
  const half = new Float64Array(table.length / 2);
  for (let k = 0; 2 * k < half.length; k += 1) {
    half[2 * k] = table[4 * k] as number;
    half[2 * k + 1] = table[4 * k + 1] as number;
  }
  return half;
}

/** fft.js's initial width: full radix-4 starts with len = 8 (width one less), otherwise len = 4 (its constructor). */
function initialWidth(points: number): number {
  let power = 0;
  for (let t = 1; points > t; t <<= 1) power += 1;
  return power % 2 === 0 ? power - 1 : power;
}

/** fft.js's digit-reversal offsets for `width` (its constructor's loop). */
function digitReversal(width: number): Int32Array {
  const bitrev = new Int32Array(1 << width);
  for (let j = 0; j < bitrev.length; j += 1) {
    let reversed = 0;
    for (let shift = 0; shift < width; shift += 2) reversed |= ((j >>> shift) & 3) << (width - shift - 2);
    bitrev[j] = reversed;
  }
  return bitrev;
}

/*
 * The JavaScript loops below are each a function of its own: V8 compiles a
 * long loop while it runs (on-stack replacement), and code after the loop that
 * had not yet run when it did made that compiled code bail out on every later
 * call (seen with node --trace-deopt). A function that is only its loop has
 * nothing after it to bail out on.
 */

/**
 * The packing of a real signal's inverse transform into one complex inverse FFT of length M = N/2 (the standard
 * packing; e.g. Numerical Recipes, 3rd ed., §12.3): E[k] = (X[k] + conj(X[M−k]))/2 is the spectrum of the even
 * samples and O[k] = (X[k] − conj(X[M−k]))/(2·W^k) that of the odd ones (W = e^{−j2π/N}); z = IDFT_M(E + jO)
 * gives x[2m] = Re z[m], x[2m+1] = Im z[m]. The spectrum is read as halfSpectrum[i]·scale.
 */
function packInverseInto(halfSpectrum: Float64Array, twiddles: Float64Array, half: number, scale: number, packed: Float64Array): void {
  for (let k = 0; k < half; k += 1) {
    // x·(s/M) rounds as x·s does, scaled exactly by the power of two 1/M (realFft's inverse, see there)
    const ar = (halfSpectrum[2 * k] as number) * scale;
    const ai = (halfSpectrum[2 * k + 1] as number) * scale;
    const br = (halfSpectrum[2 * (half - k)] as number) * scale; // X[M−k], conjugated below
    const bi = -((halfSpectrum[2 * (half - k) + 1] as number) * scale);
    const er = (ar + br) / 2;
    const ei = (ai + bi) / 2;
    const dr = (ar - br) / 2;
    const di = (ai - bi) / 2;
    // O = D / W^k = D · conj(W^k)
    const wr = twiddles[2 * k] as number;
    const wi = -(twiddles[2 * k + 1] as number);
    const or = dr * wr - di * wi;
    const oi = dr * wi + di * wr;
    packed[2 * k] = er - oi; // E + jO
    packed[2 * k + 1] = ei + or;
  }
}

/**
 * The half spectrum of a real signal from Z = DFT_M(z), z[m] = x[2m] + j·x[2m+1], M = N/2; with Z[M] = Z[0]
 * E[k] = (Z[k] + conj(Z[M−k]))/2, O[k] = (Z[k] − conj(Z[M−k]))/(2j),
 * X[k] = E[k] + W^k·O[k], W = e^{−j2π/N}, k = 0 … M (Numerical Recipes, 3rd ed., §12.3).
 */
function unpackForwardInto(packed: Float64Array, twiddles: Float64Array, half: number, out: Float64Array): void {
  for (let k = 0; k <= half; k += 1) {
    const a = k % half;
    const b = (half - k) % half;
    const zr = packed[2 * a] as number;
    const zi = packed[2 * a + 1] as number;
    const cr = packed[2 * b] as number; // conj(Z[M−k])
    const ci = -(packed[2 * b + 1] as number);
    const er = (zr + cr) / 2;
    const ei = (zi + ci) / 2;
    const or = (zi - ci) / 2; // (Z − conj Z_{M−k}) / (2j)
    const oi = -(zr - cr) / 2;
    const wr = k < half ? (twiddles[2 * k] as number) : -1;
    const wi = k < half ? (twiddles[2 * k + 1] as number) : 0;
    out[2 * k] = er + wr * or - wi * oi;
    out[2 * k + 1] = ei + wr * oi + wi * or;
  }
}

function checkKernelSize(points: number, least: number): void {
  if (!Number.isInteger(Math.log2(points)) || points < least) throw new RangeError(`FFT kernel size must be a power of two ≥ ${least}, got ${points}`);
}

function wasmOrThrow(host: FftKernelHost): Instance | null {
  const wasm = host === 'webassembly' ? kernelInstance() : null;
  if (host === 'webassembly' && !wasm) throw new Error('this host cannot compile WebAssembly');
  return wasm;
}

/**
 * A complex kernel for `points` points (a power of two ≥ 2) over `table`,
 * fft.js's twiddle table for that size (2·points numbers: cos and −sin of
 * π·2k/points). `host` picks the code (tests); by default WebAssembly where
 * the host compiles it.
 */
export function createFftKernel(points: number, table: Float64Array, host: FftKernelHost = fftKernelHost()): FftKernel {
  checkKernelSize(points, 2);
  if (table.length !== 2 * points) throw new RangeError(`FFT kernel table must hold ${2 * points} numbers, got ${table.length}`);
  const wasm = wasmOrThrow(host);
  if (!wasm) return javascriptKernel(points, table, initialWidth(points), digitReversal(initialWidth(points)));
  const tableAt = copyIn(wasm, table);
  return wasmKernel(wasm, points, tableAt);
}

/** The butterflies of `points` points in WebAssembly over the twiddle table already at byte `tableAt`; their offsets, input and output allocated here. */
function wasmKernel(wasm: Instance, points: number, tableAt: number): FftKernel {
  const { memory, transform4, realTransform4, digitReversal: fillDigitReversal } = wasm.exports;
  const size = 2 * points;
  const width = initialWidth(points);
  const bitrevAt = allocate(wasm, 1 << width, I32_BYTES);
  fillDigitReversal(bitrevAt, width);
  const inputAt = allocate(wasm, size, F64_BYTES);
  const outputAt = allocate(wasm, size, F64_BYTES);
  return {
    points,
    input: memoryView(memory, inputAt, size),
    output: memoryView(memory, outputAt, size),
    transform(inverse) {
      transform4(outputAt, inputAt, tableAt, bitrevAt, size, width, inverse ? 1 : 0);
    },
    realTransform() {
      realTransform4(outputAt, inputAt, tableAt, bitrevAt, size, width, 0);
    },
  };
}

/**
 * fft.js's own engine over the same table and offsets, without computing them
 * again: what `new FFT(points)` builds (fft.js 4.0.4, pinned: the fields its
 * prototype's transforms read). Its constructor fills a plain Array one cosine
 * at a time, tens of milliseconds at 2^17 points.
 */
function javascriptKernel(points: number, table: Float64Array, width: number, bitrev: Int32Array): FftKernel {
  const size = 2 * points;
  const input = new Float64Array(size);
  const output = new Float64Array(size);
  const engine = Object.create(FFT.prototype as object) as {
    _out: Float64Array | null;
    _data: Float64Array | null;
    _inv: number;
    _transform4(): void;
    _realTransform4(): void;
  };
  Object.assign(engine, { size: points, _csize: size, table, _width: width, _bitrev: bitrev, _out: null, _data: null, _inv: 0 });
  const run = (inverse: number, real: boolean): void => {
    engine._out = output;
    engine._data = input;
    engine._inv = inverse;
    if (real) engine._realTransform4();
    else engine._transform4();
    engine._out = null;
    engine._data = null;
  };
  return {
    points,
    input: () => input,
    output: () => output,
    transform: (inverse) => run(inverse ? 1 : 0, false),
    realTransform: () => run(0, true),
  };
}

/**
 * The kernels of the real FFT of size N (a power of two ≥ 4): one table of N
 * twiddles W^k = e^{−j2πk/N}, interleaved (cos, −sin), is fft.js's table for
 * N points (the full-size kernel of `forward`, made on its first call), its
 * first half the packing's twiddles, every second entry the half-size
 * kernel's table.
 */
export function createRealFftKernels(size: number, host: FftKernelHost = fftKernelHost()): RealFftKernels {
  checkKernelSize(size, 4);
  const wasm = wasmOrThrow(host);
  return wasm ? wasmRealKernels(wasm, size) : javascriptRealKernels(size);
}

/** `forward` of size N by the full-size kernel that `full` makes on first need: its input, and bins 0 … N/2 of its real transform. */
function fullSizeForward(full: () => FftKernel, size: number): Pick<RealFftKernels, 'forwardInput' | 'forward'> {
  return {
    forwardInput: () => full().input().subarray(0, size),
    forward(out) {
      const kernel = full();
      kernel.realTransform();
      out.set(kernel.output().subarray(0, size + 2));
    },
  };
}

function wasmRealKernels(wasm: Instance, size: number): RealFftKernels {
  const { memory, packInverse, unpackForward, halveTable } = wasm.exports;
  const half = size / 2;
  const bins = half + 1;
  const twiddlesAt = allocate(wasm, 2 * size, F64_BYTES);
  fillTwiddleTable(size, memoryView(memory, twiddlesAt, 2 * size)());
  const halfTableAt = allocate(wasm, size, F64_BYTES);
  halveTable(twiddlesAt, size, halfTableAt);
  const halfKernel = wasmKernel(wasm, half, halfTableAt);
  const spectrumAt = allocate(wasm, 2 * bins, F64_BYTES);
  const spectrum = memoryView(memory, spectrumAt, 2 * bins);
  const unpackedAt = allocate(wasm, 2 * bins, F64_BYTES);
  const unpacked = memoryView(memory, unpackedAt, 2 * bins);
  const packedInput = halfKernel.input;
  const inputAt = packedInput().byteOffset;
  const outputAt = halfKernel.output().byteOffset;
  let fullKernel: FftKernel | undefined;
  const full = (): FftKernel => (fullKernel ??= wasmKernel(wasm, size, twiddlesAt));
  return {
    size,
    ...fullSizeForward(full, size),
    packedInput,
    forwardPacked(out) {
      halfKernel.transform(false);
      unpackForward(outputAt, twiddlesAt, half, unpackedAt);
      out.set(unpacked());
    },
    inverse(halfSpectrum, scale) {
      spectrum().set(halfSpectrum.subarray(0, 2 * bins));
      packInverse(spectrumAt, twiddlesAt, half, scale, inputAt);
      halfKernel.transform(true);
      return halfKernel.output();
    },
  };
}

function javascriptRealKernels(size: number): RealFftKernels {
  const half = size / 2;
  const twiddles = fillTwiddleTable(size, new Float64Array(2 * size));
  const halfKernel = createFftKernel(half, halveTwiddleTable(twiddles), 'javascript');
  let fullKernel: FftKernel | undefined;
  const full = (): FftKernel => (fullKernel ??= createFftKernel(size, twiddles, 'javascript'));
  return {
    size,
    ...fullSizeForward(full, size),
    packedInput: halfKernel.input,
    forwardPacked(out) {
      halfKernel.transform(false);
      unpackForwardInto(halfKernel.output(), twiddles, half, out);
    },
    inverse(halfSpectrum, scale) {
      // The packing reads the whole spectrum before the transform runs.
      packInverseInto(halfSpectrum, twiddles, half, scale, halfKernel.input());
      halfKernel.transform(true);
      return halfKernel.output();
    },
  };
}
