import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { KERNELS, compileKernel, kernelModuleText } from '../../scripts/build-wasm.mjs';
import { FFT_KERNELS_WASM } from './fft-kernels-wasm.js';
import { F64_BYTES, I32_BYTES, allocate, copyIn, formPerThread, instantiateArena, memoryView } from './wasm-arena.js';

const ROOT = join(import.meta.dirname, '..', '..');
/** Largest module a page's main thread may compile synchronously in Chromium (fft-kernels.test.ts names the sources). */
const SYNCHRONOUS_COMPILE_LIMIT_BYTES = 4096;

describe('the WebAssembly kernel modules', () => {
  it.each(KERNELS.map((kernel) => [kernel.source, kernel] as const))('%s: the committed bytes are what the source compiles to now', async (_, kernel) => {
    const bytes = await compileKernel(join(ROOT, kernel.source), kernel.enable);
    // The committed module is what `npm run build:wasm` writes from the source now: edit wasm/, then run it.
    expect(readFileSync(join(ROOT, kernel.target), 'utf8')).toBe(kernelModuleText(kernel, bytes));
    // Small enough for a page to compile on its main thread (the FFT's, the synthesis's and the sample passes run
    // there): Chromium refuses a synchronous compile over 4 KB on that thread (fft-kernels.test.ts has the sources).
    expect(bytes.length).toBeLessThanOrEqual(SYNCHRONOUS_COMPILE_LIMIT_BYTES);
  }, 30_000);
});

describe('a kernel arena', () => {
  it('lays arrays out one after another, copies them in, and keeps views valid as the memory grows', () => {
    const arena = instantiateArena<Record<string, never>>(FFT_KERNELS_WASM);
    if (!arena) throw new Error('Node compiles WebAssembly');
    const numbers = Float64Array.from([1.5, -0, Number.MIN_VALUE, 1e300]);
    const numbersAt = copyIn(arena, numbers);
    const counts = Int32Array.from([7, -3]);
    const countsAt = copyIn(arena, counts);
    expect(countsAt).toBe(numbersAt + numbers.length * F64_BYTES);
    const view = memoryView(arena.exports.memory, numbersAt, numbers.length);
    const before = view().buffer;
    // A megabyte more: the memory grows and the old buffer is detached.
    allocate(arena, 1 << 17, F64_BYTES);
    expect(view().buffer).not.toBe(before);
    expect(Array.from(view()).map((value) => Object.is(value, -0) ? '-0' : value)).toEqual([1.5, '-0', Number.MIN_VALUE, 1e300]);
    expect(Array.from(new Int32Array(arena.exports.memory.buffer, countsAt, 2))).toEqual([7, -3]);
    // An odd count of i32s leaves the next array on a multiple of 8 all the same, where a Float64Array can view it.
    allocate(arena, 3, I32_BYTES);
    expect(allocate(arena, 1, F64_BYTES) % F64_BYTES).toBe(0);
  });

  it('gives each instance its own memory', () => {
    const one = instantiateArena<Record<string, never>>(FFT_KERNELS_WASM);
    const two = instantiateArena<Record<string, never>>(FFT_KERNELS_WASM);
    expect(one && two && one.exports.memory !== two.exports.memory).toBe(true);
  });
});

describe('a form per thread', () => {
  it('gives the JavaScript form as it is, and builds the WebAssembly form once, on its first request', () => {
    const javascript = { form: 'javascript' };
    let builds = 0;
    const formOf = formPerThread<Record<string, never>, object>(FFT_KERNELS_WASM, javascript, (arena) => {
      builds += 1;
      return { form: 'webassembly', memory: arena.exports.memory };
    });
    expect(formOf('javascript')).toBe(javascript);
    expect(builds).toBe(0);
    const first = formOf('webassembly');
    expect(first).not.toBe(javascript);
    expect(formOf('webassembly')).toBe(first);
    expect(formOf()).toBe(first); // Node compiles WebAssembly, so that is the default
    expect(builds).toBe(1);
  });
});
