/**
 * A wiring's output spectrum (wiring-spectrum.ts) as WebAssembly compiled from
 * wasm/synthesis-passes.ts: the series–parallel solve of its source factors
 * (the recursion of src/circuit/solve-series-parallel.ts over this module's
 * passes), the products with the coils' spectra, the load's gain and the
 * signed sum, each pass the same operations in the same order as its
 * JavaScript namesake, so the same bits (synthesis-kernel.test.ts compares
 * the two forms' renders number for number).
 *
 * Why: these passes run over every FFT bin (65,537 at the demo's length) for
 * each wiring shape and phase pattern, on the render's own thread. As
 * JavaScript, a process's first wirings ran them in V8's interpreter and its
 * first compiled code (DEVELOPERS.md, "Code the interpreter runs").
 *
 * Each synthesis has an instance and memory of its own (src/math/wasm-arena.ts):
 * per coil its k_i and Z_i, its spectrum E_i and its product P_i, copied in
 * on first need (a coil no wiring uses is never read, as the page wants);
 * the load's admittances, copied in when the knobs change; the solve's work
 * arrays. A wiring holding both coils of a coupled pair is solved by nodal
 * analysis (src/circuit/nodal-kernel.ts, a WebAssembly module of its own)
 * straight into this memory's S_i and Z.
 */
import {
  type PreparedCircuit,
  type SeriesParallelArrays,
  type SolvePasses,
  reduceSeriesParallel,
  solveSourceFactors,
  usesCoupledCoils,
} from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { F64_BYTES, I32_BYTES, type WasmArena, allocate, instantiateArena, memoryView } from '../math/index.js';
import type { Network } from '../wiring/index.js';
import { SYNTHESIS_PASSES_WASM } from './synthesis-passes-wasm.js';
import { type WiringSpectrum, preparing } from './wiring-spectrum.js';

interface SynthesisExports {
  clear(target: number, length: number): void;
  addCoil(source: number, z: number, sign: number, target: number, impedance: number, length: number): void;
  addInto(target: number, part: number, length: number): void;
  invertAndAdd(y: number, total: number, length: number): void;
  divideInPlace(y: number, total: number, length: number): void;
  invertInto(total: number, out: number, length: number): void;
  multiplyComplexInto(a: number, b: number, product: number, length: number): void;
  anyNonZero(values: number, length: number): number;
  loadGain(impedance: number, hot: number, outY: number, bridge: number, hasBridge: number, gain: number, length: number): void;
  sumSources(sources: number, weights: number, count: number, gain: number, output: number, length: number): void;
}

type Arena = WasmArena<SynthesisExports>;

/** The solve's passes over arrays of this arena (byte addresses); work arrays are allocated in it. */
function arenaPasses(arena: Arena): SolvePasses<number> {
  const { clear, addCoil, addInto, invertAndAdd, divideInPlace, invertInto, multiplyComplexInto } = arena.exports;
  return {
    make: (length) => allocate(arena, length, F64_BYTES),
    clear,
    addCoil,
    addInto,
    invertAndAdd,
    divideInPlace,
    multiplyInPlace: (target, factor, length) => multiplyComplexInto(target, factor, target, length),
    invertInto,
  };
}

/** A JavaScript array copied into the arena at `at`, if it is not the one already there. */
interface Resident {
  at: number;
  from: Float64Array | null;
}

/** The output spectra as WebAssembly, and the bytes its memory holds now. */
export interface SpectrumKernel extends WiringSpectrum {
  memoryBytes(): number;
}

/**
 * Most bytes a synthesis's kernel memory may take: half of the 4 GiB a WebAssembly memory can address (WebAssembly
 * Core Specification 2.0, memory32: 65,536 pages of 64 KiB), so its work arrays always find room (our choice).
 */
export const SPECTRUM_KERNEL_MAX_BYTES = 2 ** 31;

/**
 * Bytes the kernel's memory takes for `coilCount` coils and `bins` FFT bins, at most: per coil k_i, Z_i, E_i and P_i;
 * the impedance, gain, output and the load's three admittances; and the reduction's work arrays, two per coil at
 * most (a parallel group keeps one per part and one for the sum).
 */
export function spectrumKernelBytes(coilCount: number, bins: number): number {
  const arrays = 4 * coilCount + 6 + 2 * coilCount;
  return arrays * 2 * bins * F64_BYTES;
}

/**
 * The output spectra of `guitar`'s wirings over `spectra` (E_i of `bins` FFT bins each; read on first need), as
 * WebAssembly; null where the host cannot compile it.
 */
export function createSpectrumKernel(guitar: Guitar, spectra: readonly Float64Array[], bins: number): SpectrumKernel | null {
  const arena = instantiateArena<SynthesisExports>(SYNTHESIS_PASSES_WASM);
  if (arena === null) return null;
  const { memory, anyNonZero, multiplyComplexInto, loadGain, sumSources, clear } = arena.exports;
  const length = 2 * bins;
  const coilCount = guitar.coils.length;
  const array = (): number => allocate(arena, length, F64_BYTES);
  const resident = (): Resident => ({ at: array(), from: null });
  const source = guitar.coils.map(resident);
  const impedanceOf = guitar.coils.map(resident);
  const spectrum = guitar.coils.map(resident);
  const products = guitar.coils.map(array);
  const impedance = array();
  const gain = array();
  const output = array();
  const hot = resident();
  const outY = resident();
  const bridge = resident();
  const sources = allocate(arena, coilCount, I32_BYTES);
  const weights = allocate(arena, coilCount, F64_BYTES);
  const outputView = memoryView(memory, output, length);
  const used = new Uint8Array(coilCount);
  const arrays: SeriesParallelArrays<number> = {
    passes: arenaPasses(arena),
    workspace: { buffers: [], top: 0, coilStack: new Int32Array(coilCount), boundaryStack: [], used: new Uint8Array(coilCount) },
    coilSource: source.map((entry) => entry.at),
    coilImpedance: impedanceOf.map((entry) => entry.at),
    length,
  };
  /** Makes sure `entry` holds `values` (compared by identity: a circuit's arrays do not change once prepared). */
  const hold = (entry: Resident, values: Float64Array): void => {
    if (entry.from === values) return;
    new Float64Array(memory.buffer, entry.at, length).set(values.subarray(0, length));
    entry.from = values;
  };

  const solveProducts = (circuit: PreparedCircuit, representative: Network): void => {
    if (usesCoupledCoils(guitar, representative)) {
      // Solved straight into this memory (the nodal solve allocates nothing here, so the views stay valid).
      const view = (at: number): Float64Array => new Float64Array(memory.buffer, at, length);
      solveSourceFactors(circuit, representative, products.map(view), view(impedance));
    } else {
      for (let coil = 0; coil < coilCount; coil += 1) {
        hold(source[coil] as Resident, circuit.coilSource[coil] as Float64Array);
        hold(impedanceOf[coil] as Resident, circuit.coilImpedance[coil] as Float64Array);
      }
      arrays.workspace.top = 0;
      reduceSeriesParallel(guitar, representative, arrays, products, impedance);
    }
    // P_i = S_i·E_i for every coil whose S_i is not all zero (wiring-spectrum.ts, multiplySpectra).
    for (let coil = 0; coil < coilCount; coil += 1) {
      const product = products[coil] as number;
      const any = anyNonZero(product, length);
      used[coil] = any;
      if (any === 1) {
        const entry = spectrum[coil] as Resident;
        hold(entry, spectra[coil] as Float64Array);
        multiplyComplexInto(product, entry.at, product, length);
      }
    }
  };

  const solveGain = (circuit: PreparedCircuit): void => {
    if (circuit.load.silent) {
      clear(gain, length);
      return;
    }
    hold(hot, circuit.hotAdmittance);
    hold(outY, circuit.outAdmittance);
    if (circuit.bridgeAdmittance !== null) hold(bridge, circuit.bridgeAdmittance);
    loadGain(impedance, hot.at, outY.at, bridge.at, circuit.bridgeAdmittance === null ? 0 : 1, gain, length);
  };

  return {
    memoryBytes: () => memory.buffer.byteLength,
    prepare: preparing(solveProducts, solveGain),
    sum(signs) {
      let count = 0;
      const places = new Int32Array(memory.buffer, sources, coilCount);
      const signed = new Float64Array(memory.buffer, weights, coilCount);
      for (let coil = 0; coil < coilCount; coil += 1) {
        if (used[coil] !== 1) continue;
        places[count] = products[coil] as number;
        signed[count] = signs[coil] as number;
        count += 1;
      }
      sumSources(sources, weights, count, gain, output, length);
      return outputView();
    },
  };
}
