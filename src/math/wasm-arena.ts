/**
 * An instance of one of our WebAssembly kernel modules (wasm/, compiled by
 * scripts/build-wasm.mjs) and the arrays laid out in its memory: the loader
 * side every kernel shares (src/math/fft-kernels.ts, src/analysis/shape-table-kernel.ts,
 * src/analysis/centroid-kernel.ts, src/render/synthesis-kernel.ts, sample-passes.ts, linear-stages.ts,
 * src/circuit/nodal-kernel.ts).
 *
 * The kernels allocate nothing themselves (compiled with the stub run-time):
 * the caller hands them byte addresses, laid out here one after another from
 * FIRST_FREE_BYTE. Memory only grows, and growing it detaches every view of
 * the old buffer, so a view is made again whenever `memory.buffer` has
 * changed (`memoryView`): take views anew after any allocation.
 */

/** Bytes per f64 and per i32 in WebAssembly memory. */
export const F64_BYTES = 8;
export const I32_BYTES = 4;
/** WebAssembly's page of memory, bytes (the unit `memory.grow` counts in). */
const WASM_PAGE_BYTES = 65536;
/** First byte the arrays use: past the module's own static data (it has none; one page kept clear). */
const FIRST_FREE_BYTE = WASM_PAGE_BYTES;

/** Which code runs a kernel: WebAssembly where the host compiles it, otherwise the JavaScript beside it. */
export type KernelHost = 'webassembly' | 'javascript';

/** The smallest WebAssembly module: the magic number and version 1 (WebAssembly Core Specification, "Binary Format", Modules). */
const EMPTY_MODULE = new Uint8Array([0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00]);

let host: KernelHost | undefined;

/** 'webassembly' where this host compiles WebAssembly (found once per thread), else 'javascript'. */
export function kernelHost(): KernelHost {
  if (host === undefined) {
    try {
      new WebAssembly.Module(EMPTY_MODULE);
      host = 'webassembly';
    } catch {
      host = 'javascript';
    }
  }
  return host;
}

export interface WasmArena<Exports> {
  readonly exports: Exports & { readonly memory: WebAssembly.Memory };
  /** Next free byte of the memory. */
  next: number;
}

const compiled = new Map<Uint8Array, WebAssembly.Module | null>();

/**
 * A new instance of the module `bytes` (compiled once per thread and kept),
 * with its own memory; null where the host cannot compile WebAssembly (none
 * is there, or a page's policy without 'wasm-unsafe-eval').
 */
export function instantiateArena<Exports>(bytes: Uint8Array<ArrayBuffer>): WasmArena<Exports> | null {
  let module = compiled.get(bytes);
  if (module === undefined) {
    try {
      module = new WebAssembly.Module(bytes);
    } catch {
      module = null;
    }
    compiled.set(bytes, module);
  }
  if (module === null) return null;
  return { exports: new WebAssembly.Instance(module, {}).exports as WasmArena<Exports>['exports'], next: FIRST_FREE_BYTE };
}

/** Every array starts at a multiple of this many bytes, so a Float64Array can view any of them. */
const ALIGNMENT_BYTES = F64_BYTES;

/** `count` f64s (or i32s) of the arena's memory, grown if need be: the byte address (a multiple of 8). */
export function allocate(arena: WasmArena<unknown>, count: number, bytesEach: number): number {
  const at = Math.ceil(arena.next / ALIGNMENT_BYTES) * ALIGNMENT_BYTES;
  arena.next = at;
  arena.next += count * bytesEach;
  const shortBytes = arena.next - arena.exports.memory.buffer.byteLength;
  if (shortBytes > 0) arena.exports.memory.grow(Math.ceil(shortBytes / WASM_PAGE_BYTES));
  return at;
}

/** A Float64Array over `length` numbers at byte `at`, made again after the memory has grown. */
export function memoryView(memory: WebAssembly.Memory, at: number, length: number): () => Float64Array {
  let buffer = memory.buffer;
  let view = new Float64Array(buffer, at, length);
  return () => {
    if (memory.buffer !== buffer) {
      buffer = memory.buffer;
      view = new Float64Array(buffer, at, length);
    }
    return view;
  };
}

/** `values` copied into a new array of the arena: its byte address. */
export function copyIn(arena: WasmArena<unknown>, values: Float64Array | Int32Array): number {
  const at = allocate(arena, values.length, values.BYTES_PER_ELEMENT);
  const target = values instanceof Float64Array ? new Float64Array(arena.exports.memory.buffer, at, values.length) : new Int32Array(arena.exports.memory.buffer, at, values.length);
  target.set(values);
  return at;
}

/**
 * The form a kernel takes in this thread, chosen by `host`: `javascript` as
 * it is, or the WebAssembly form `make` builds over one instance of `bytes`,
 * made on the first call that asks for it and kept for the thread (the
 * kernels whose memory holds one signal at a time: src/render/sample-passes.ts,
 * src/render/linear-stages.ts). Asking for WebAssembly where the host cannot
 * compile it throws.
 */
export function formPerThread<Exports, Form>(bytes: Uint8Array<ArrayBuffer>, javascript: Form, make: (arena: WasmArena<Exports>) => Form): (host?: KernelHost) => Form {
  let made: Form | null | undefined;
  return (host = kernelHost()) => {
    if (host === 'javascript') return javascript;
    if (made === undefined) {
      const arena = instantiateArena<Exports>(bytes);
      made = arena === null ? null : make(arena);
    }
    if (made === null) throw new Error('this host cannot compile WebAssembly');
    return made;
  };
}
