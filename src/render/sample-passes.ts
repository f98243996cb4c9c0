/**
 * The passes over a render's samples that every wiring's file takes: the
 * check that every sample is finite (effects-chain.ts), its peak
 * (render-pass.ts), its file's gain (encode-final-wav.ts) and its mono 24-bit
 * PCM (wav-file.ts). Two forms give the same numbers and bytes: the
 * JavaScript here, and WebAssembly compiled from wasm/sample-passes.ts, which
 * does the same operations in the same order (sample-passes.test.ts compares
 * them): a float32 sample is read as the binary64 number it is, and a product
 * stored into a float32 array is rounded to nearest as JavaScript's store
 * rounds it.
 *
 * Why WebAssembly: each pass is a loop over 125,000 samples a wiring at the
 * demo's length, which a process's first wirings ran in V8's interpreter and
 * its first compiled code (DEVELOPERS.md, "Code the interpreter runs").
 *
 * One instance per thread, its memory holding one render's samples and their
 * PCM bytes: the samples are copied in for each pass and the results copied
 * out (memory copies, tens of microseconds a wiring). Where the host cannot
 * compile WebAssembly the JavaScript runs.
 */
import { type KernelHost, type WasmArena, allocate, formPerThread } from '../math/index.js';
import { pcmValue } from './pcm-value.js';
import { SAMPLE_PASSES_WASM } from './sample-passes-wasm.js';

/** The passes over one channel of samples. */
export interface SamplePasses<Samples extends Float32Array | Float64Array = Float32Array> {
  /** Σ x·0 over the samples: a zero exactly when every sample is finite (x·0 is NaN for an infinity or NaN). */
  finiteSum(samples: Samples): number;
  /** Largest |x| of the samples (a NaN sample is passed over). */
  peak(samples: Samples): number;
  /** samples[n] ← samples[n]·gain, in place. */
  scale(samples: Samples, gain: number): void;
  /**
   * Mono 24-bit PCM, little-endian, of the samples into bytes[first … first + 3·length − 1] (pcmValue: clipped,
   * scaled to `fullScale`, rounded half away from zero). Returns Σ (x − x): NaN when a sample is not finite.
   */
  writeMonoPcm24(samples: Samples, bytes: Uint8Array, first: number, fullScale: number): number;
}

/** Bytes of a float32 sample, and of a 24-bit PCM sample. */
const F32_BYTES = 4;
const PCM24_BYTES = 3;
const BITS_PER_BYTE = 8;

/*
 * The JavaScript loops, each a function of its own, so V8's compiled code for
 * the running loop has nothing after it to bail out on (DEVELOPERS.md, "Code
 * the compiler keeps compiled").
 */

/** Two running sums, so the additions overlap: 0.5 → 0.25 ms for 124,800 samples on the 2-core machine. */
function finiteSum(samples: Float32Array | Float64Array): number {
  let even = 0;
  let odd = 0;
  const pairs = samples.length - (samples.length % 2);
  for (let i = 0; i < pairs; i += 2) {
    even += (samples[i] as number) * 0;
    odd += (samples[i + 1] as number) * 0;
  }
  if (pairs < samples.length) even += (samples[pairs] as number) * 0;
  return even + odd;
}

function peakOf(samples: Float32Array | Float64Array): number {
  let peak = 0;
  for (let n = 0; n < samples.length; n += 1) {
    const magnitude = Math.abs(samples[n] as number);
    if (magnitude > peak) peak = magnitude;
  }
  return peak;
}

function scaleInPlace(samples: Float32Array | Float64Array, gain: number): void {
  for (let n = 0; n < samples.length; n += 1) samples[n] = (samples[n] as number) * gain;
}

/**
 * The first `count` samples as 32-bit little-endian stores 3 bytes apart, each store's top byte overwritten by
 * the next sample's (samples are stored in address order): one store a sample instead of three.
 */
function writePcm24Words(samples: Float32Array | Float64Array, view: DataView, first: number, count: number, fullScale: number): number {
  let unfinite = 0;
  let offset = first;
  for (let n = 0; n < count; n += 1) {
    const sample = samples[n] as number;
    unfinite += sample - sample;
    view.setInt32(offset, pcmValue(sample, fullScale), true);
    offset += PCM24_BYTES;
  }
  return unfinite;
}

/** Mono 24-bit PCM: every sample but the last by writePcm24Words, the last byte by byte so nothing is written past the data. */
function writeMonoPcm24(samples: Float32Array | Float64Array, bytes: Uint8Array, first: number, fullScale: number): number {
  const last = samples.length - 1;
  if (last < 0) return 0;
  const unfinite = writePcm24Words(samples, new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength), first, last, fullScale);
  const sample = samples[last] as number;
  const value = pcmValue(sample, fullScale);
  const offset = first + last * PCM24_BYTES;
  bytes[offset] = value;
  bytes[offset + 1] = value >> BITS_PER_BYTE;
  bytes[offset + 2] = value >> (2 * BITS_PER_BYTE);
  return unfinite + (sample - sample);
}

/** The passes in JavaScript, for float32 or float64 samples. */
export const JAVASCRIPT_SAMPLE_PASSES: SamplePasses<Float32Array | Float64Array> = Object.freeze({ finiteSum, peak: peakOf, scale: scaleInPlace, writeMonoPcm24 });

interface SampleExports {
  finiteSum(samples: number, count: number): number;
  peak(samples: number, count: number): number;
  scale(samples: number, count: number, gain: number): void;
  writeMonoPcm24(samples: number, count: number, bytes: number, fullScale: number): number;
}

/** The passes for float32 samples in the form `host` runs (by default WebAssembly where the host compiles it; one instance per thread). */
export const samplePasses: (host?: KernelHost) => SamplePasses = formPerThread(SAMPLE_PASSES_WASM, JAVASCRIPT_SAMPLE_PASSES, webassemblyPasses);

function webassemblyPasses(arena: WasmArena<SampleExports>): SamplePasses {
  const { memory, finiteSum: sumFinite, peak, scale, writeMonoPcm24: writeWords } = arena.exports;
  // Room for `capacity` samples and their PCM bytes, grown when a longer render comes (memory is never given back).
  let capacity = 0;
  let samplesAt = 0;
  let bytesAt = 0;
  const copyIn = (samples: Float32Array): number => {
    if (samples.length > capacity) {
      capacity = samples.length;
      samplesAt = allocate(arena, capacity, F32_BYTES);
      // One byte more than the PCM: each sample's 32-bit store reaches a byte past its own three.
      bytesAt = allocate(arena, PCM24_BYTES * capacity + 1, 1);
    }
    new Float32Array(memory.buffer, samplesAt, samples.length).set(samples);
    return samplesAt;
  };
  return {
    finiteSum: (samples) => sumFinite(copyIn(samples), samples.length),
    peak: (samples) => peak(copyIn(samples), samples.length),
    scale(samples, gain) {
      scale(copyIn(samples), samples.length, gain);
      samples.set(new Float32Array(memory.buffer, samplesAt, samples.length));
    },
    writeMonoPcm24(samples, bytes, first, fullScale) {
      const unfinite = writeWords(copyIn(samples), samples.length, bytesAt, fullScale);
      bytes.set(new Uint8Array(memory.buffer, bytesAt, PCM24_BYTES * samples.length), first);
      return unfinite;
    },
  };
}
