/**
 * The radix-4 kernels of fft.js 4.0.4 (`_transform4`, `_realTransform4`) run
 * as WebAssembly compiled from wasm/fft-kernels.ts: the same operations in
 * the same order, so the same bits (src/math/fft-kernels.test.ts compares
 * them with fft.js itself, number for number). WebAssembly's f64 arithmetic is
 * IEEE 754 binary64 rounding to nearest, like JavaScript's, and neither fuses
 * a multiply into an add.
 *
 * Why: JavaScript's first transforms in each thread run in V8's interpreter
 * until its optimising compiler has caught up, boxing every intermediate
 * number: on the 2-core machine the first 2^17-point forward transform of a
 * render took 42 ms against 3 ms warm, the first inverse 17 ms against 2 ms,
 * each thread paying again (docs/design.md, "The FFT kernels"). WebAssembly is
 * compiled before its first call.
 *
 * Where a host cannot compile WebAssembly (none is there, or a page's policy
 * forbids it), fft.js's own JavaScript runs instead: the same numbers, only
 * slower to start.
 *
 * Memory: each kernel keeps its twiddle table, digit-reversal offsets, input
 * and output in the WebAssembly memory of its thread, for the life of the
 * thread (as realFft keeps its arrays). The memory only grows; a kernel's
 * `input()` and `output()` are views made again after any growth, so take
 * them anew for each transform.
 */
import FFT from 'fft.js';
import { FFT_KERNELS_WASM_BASE64 } from './fft-kernels-wasm.js';

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

/** Which code runs the kernels: WebAssembly when the host compiles it, otherwise fft.js's JavaScript. */
export type FftKernelHost = 'webassembly' | 'javascript';

interface KernelExports {
  readonly memory: WebAssembly.Memory;
  transform4(out: number, data: number, table: number, bitrev: number, size: number, width: number, inverse: number): void;
  realTransform4(out: number, data: number, table: number, bitrev: number, size: number, width: number, inverse: number): void;
}

/** Bytes per f64 and per i32 in WebAssembly memory. */
const F64_BYTES = 8;
const I32_BYTES = 4;
/** WebAssembly's page of memory, bytes (the unit `memory.grow` counts in). */
const WASM_PAGE_BYTES = 65536;
/** First byte the kernels' arrays use: past the module's own static data (it has none; one page kept clear). */
const FIRST_FREE_BYTE = WASM_PAGE_BYTES;

/** This thread's instance and the next free byte of its memory; null when the host cannot compile WebAssembly. */
let instance: { readonly exports: KernelExports; next: number } | null | undefined;

function decodeBase64(text: string): Uint8Array<ArrayBuffer> {
  const binary = atob(text);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i += 1) bytes[i] = binary.charCodeAt(i);
  return bytes;
}

/** The WebAssembly kernels of this thread, compiled on first use; null where the host cannot (no WebAssembly, or a policy without 'wasm-unsafe-eval'). */
function kernelInstance(): { readonly exports: KernelExports; next: number } | null {
  if (instance !== undefined) return instance;
  try {
    const module = new WebAssembly.Module(decodeBase64(FFT_KERNELS_WASM_BASE64));
    instance = { exports: new WebAssembly.Instance(module, {}).exports as unknown as KernelExports, next: FIRST_FREE_BYTE };
  } catch {
    instance = null;
  }
  return instance;
}

/** The host the kernels run on in this thread. */
export function fftKernelHost(): FftKernelHost {
  return kernelInstance() ? 'webassembly' : 'javascript';
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

/**
 * A kernel for `points` complex points (a power of two ≥ 2) over `table`,
 * fft.js's twiddle table for that size (2·points numbers: cos and −sin of
 * π·2k/points). `host` picks the code (tests); by default WebAssembly where
 * the host compiles it.
 */
export function createFftKernel(points: number, table: Float64Array, host: FftKernelHost = fftKernelHost()): FftKernel {
  if (!Number.isInteger(Math.log2(points)) || points < 2) throw new RangeError(`FFT kernel size must be a power of two ≥ 2, got ${points}`);
  if (table.length !== 2 * points) throw new RangeError(`FFT kernel table must hold ${2 * points} numbers, got ${table.length}`);
  const width = initialWidth(points);
  const bitrev = digitReversal(width);
  const wasm = host === 'webassembly' ? kernelInstance() : null;
  if (host === 'webassembly' && !wasm) throw new Error('this host cannot compile WebAssembly');
  return wasm ? wasmKernel(wasm, points, table, width, bitrev) : javascriptKernel(points, table, width, bitrev);
}

function wasmKernel(wasm: { readonly exports: KernelExports; next: number }, points: number, table: Float64Array, width: number, bitrev: Int32Array): FftKernel {
  const { memory, transform4, realTransform4 } = wasm.exports;
  const size = 2 * points;
  const tableAt = wasm.next;
  const inputAt = tableAt + size * F64_BYTES;
  const outputAt = inputAt + size * F64_BYTES;
  const bitrevAt = outputAt + size * F64_BYTES;
  wasm.next = bitrevAt + bitrev.length * I32_BYTES;
  const shortBytes = wasm.next - memory.buffer.byteLength;
  if (shortBytes > 0) memory.grow(Math.ceil(shortBytes / WASM_PAGE_BYTES));
  new Float64Array(memory.buffer, tableAt, size).set(table);
  new Int32Array(memory.buffer, bitrevAt, bitrev.length).set(bitrev);
  let buffer = memory.buffer;
  let input = new Float64Array(buffer, inputAt, size);
  let output = new Float64Array(buffer, outputAt, size);
  /** Views made again when a later kernel has grown the memory (growing detaches the old buffer). */
  const refresh = (): void => {
    if (memory.buffer === buffer) return;
    buffer = memory.buffer;
    input = new Float64Array(buffer, inputAt, size);
    output = new Float64Array(buffer, outputAt, size);
  };
  return {
    points,
    input() {
      refresh();
      return input;
    },
    output() {
      refresh();
      return output;
    },
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
    size: number;
    _csize: number;
    table: Float64Array;
    _width: number;
    _bitrev: Int32Array;
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
