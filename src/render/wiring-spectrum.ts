/**
 * A wiring's output spectrum Y(f) = G(f)·Σ_i p_i·S_i(f)·E_i(f), the part of a
 * synthesis that runs over every FFT bin before the inverse transform
 * (synthesize-wirings.ts). A wiring's transfers are T_i = p_i·S_i·G
 * (src/circuit/solve-transfers.ts): the source factors S_i and the wiring's
 * impedance Z depend on the coils alone, the load's gain G on the knobs,
 * cable and amplifier. So the products P_i = S_i·E_i of a wiring shape (its
 * phase class, src/circuit/phase-class.ts) are kept across its phase
 * patterns and knob settings; a knob move costs G, and each phase pattern a
 * signed sum.
 *
 * Two forms give the same bits: the JavaScript here, and WebAssembly
 * (synthesis-kernel.ts) where the host compiles it.
 */
import { type PreparedCircuit, solveLoadGain, solveSourceFactors } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { anyNonZero, multiplyComplexInPlace } from '../math/index.js';
import type { Network } from '../wiring/index.js';

/** The output spectra of one guitar's wirings, at any knob setting (one prepared circuit at a time). */
export interface WiringSpectrum {
  /**
   * Readies the shape `shape` (its phase-class representative `representative`) on `circuit`: its products P_i,
   * solved when the shape changes, and its load's gain, solved when the shape or the circuit changes.
   */
  prepare(circuit: PreparedCircuit, representative: Network, shape: string): void;
  /** Y per bin for the prepared shape with the coils' signs p_i (interleaved complex; the form's own array, valid until the next call). */
  sum(signs: Float64Array): Float64Array;
}

/**
 * A form's `prepare` from its two solves: the products when the shape changed, the gain when the shape or the circuit
 * did, so phase patterns and repeated knob settings reuse them. A solve that fails leaves the shape unsolved, so the
 * next call solves it again.
 */
export function preparing(solveProducts: (circuit: PreparedCircuit, representative: Network) => void, solveGain: (circuit: PreparedCircuit) => void): WiringSpectrum['prepare'] {
  let solvedShape = '';
  let solvedCircuit: PreparedCircuit | null = null;
  return (circuit, representative, shape) => {
    const products = solvedShape !== shape;
    const gain = products || solvedCircuit !== circuit;
    solvedShape = shape;
    solvedCircuit = circuit;
    try {
      if (products) solveProducts(circuit, representative);
      if (gain) solveGain(circuit);
    } catch (error) {
      solvedShape = '';
      throw error;
    }
  };
}

/** The form in JavaScript: hosts without WebAssembly, and the tests' reference. */
export function javascriptSpectrum(guitar: Guitar, spectra: readonly Float64Array[], bins: number): WiringSpectrum {
  const complexLength = 2 * bins;
  const products = guitar.coils.map(() => new Float64Array(complexLength));
  const used = new Uint8Array(guitar.coils.length);
  const impedance = new Float64Array(complexLength);
  const gain = new Float64Array(complexLength);
  const output = new Float64Array(complexLength);
  return {
    prepare: preparing(
      (circuit, representative) => {
        // Wirings holding both coils of a coupled pair get their S_i and Z by nodal analysis (solveSourceFactors).
        solveSourceFactors(circuit, representative, products, impedance);
        multiplySpectra(products, spectra, used);
      },
      (circuit) => solveLoadGain(circuit, impedance, gain),
    ),
    sum(signs) {
      sumSources(products, used, signs, gain, output, complexLength);
      return output;
    },
  };
}

/**
 * A_i(f) ← A_i(f)·E_i(f) in place, complex product per bin, for every coil whose A_i is not all zero; marks those
 * coils in `used`. A coil the wiring leaves out is not read from `spectra` at all (the page computes a coil's
 * spectrum on first need). Each bin's factor is read before its product is written (multiplyComplexInPlace), so the
 * numbers are those of a product into a separate array.
 */
function multiplySpectra(factors: readonly Float64Array[], spectra: readonly Float64Array[], used: Uint8Array): void {
  factors.forEach((factor, coil) => {
    const any = anyNonZero(factor) ? 1 : 0;
    used[coil] = any;
    if (any === 1) multiplyComplexInPlace(factor, spectra[coil] as Float64Array);
  });
}

/**
 * output = G·Σ_i p_i·P_i per bin, in one pass over the bins: the used coils'
 * products added in coil order from 0, then the complex product by G,
 * (a + jb)(c + jd) = (ac − bd) + j(ad + bc) — the same operations in the same
 * order as adding coil by coil over the whole spectrum and multiplying after
 * (math/multiply-complex.ts), so the same numbers, with one pass over memory
 * instead of one per coil and two more. Up to SUMMED_IN_ONE_LOOP sources go
 * to a loop that holds each as a variable of its own (sumFewSources).
 */
function sumSources(products: readonly Float64Array[], used: Uint8Array, signs: Float64Array, gain: Float64Array, output: Float64Array, complexLength: number): void {
  const sources: Float64Array[] = [];
  const weights: number[] = [];
  products.forEach((product, coil) => {
    if (!used[coil]) return;
    sources.push(product);
    weights.push(signs[coil] as number);
  });
  const count = sources.length;
  if (count <= SUMMED_IN_ONE_LOOP) {
    sumFewSources(
      count,
      sources[0] ?? NO_SOURCE,
      weights[0] ?? 0,
      sources[1] ?? NO_SOURCE,
      weights[1] ?? 0,
      sources[2] ?? NO_SOURCE,
      weights[2] ?? 0,
      sources[3] ?? NO_SOURCE,
      weights[3] ?? 0,
      gain,
      output,
      complexLength,
    );
    return;
  }
  for (let k = 0; k < complexLength; k += 2) {
    let re = 0;
    let im = 0;
    for (let u = 0; u < count; u += 1) {
      const product = sources[u] as Float64Array;
      const sign = weights[u] as number;
      re += sign * (product[k] as number);
      im += sign * (product[k + 1] as number);
    }
    const gr = gain[k] as number;
    const gi = gain[k + 1] as number;
    output[k] = re * gr - im * gi;
    output[k + 1] = re * gi + im * gr;
  }
}

/** Most sources sumFewSources takes: four, the coils of two humbuckers or of a humbucker and two single coils. */
const SUMMED_IN_ONE_LOOP = 4;
/** The array standing for a source sumFewSources does not read. */
const NO_SOURCE = new Float64Array(0);

/**
 * sumSources for `count` ≤ 4 sources p0 … p3 with weights w0 … w3 (the first
 * `count` are read): the same additions in the same order, with each source
 * a variable of the loop rather than an entry of an array of arrays, so the
 * compiled loop keeps their storage at hand (a third less time in one
 * process, counts 1–4 alike).
 */
function sumFewSources(
  count: number,
  p0: Float64Array,
  w0: number,
  p1: Float64Array,
  w1: number,
  p2: Float64Array,
  w2: number,
  p3: Float64Array,
  w3: number,
  gain: Float64Array,
  output: Float64Array,
  complexLength: number,
): void {
  for (let k = 0; k < complexLength; k += 2) {
    let re = 0;
    let im = 0;
    if (count > 0) {
      re += w0 * (p0[k] as number);
      im += w0 * (p0[k + 1] as number);
    }
    if (count > 1) {
      re += w1 * (p1[k] as number);
      im += w1 * (p1[k + 1] as number);
    }
    if (count > 2) {
      re += w2 * (p2[k] as number);
      im += w2 * (p2[k + 1] as number);
    }
    if (count > 3) {
      re += w3 * (p3[k] as number);
      im += w3 * (p3[k + 1] as number);
    }
    const gr = gain[k] as number;
    const gi = gain[k + 1] as number;
    output[k] = re * gr - im * gi;
    output[k + 1] = re * gi + im * gr;
  }
}
