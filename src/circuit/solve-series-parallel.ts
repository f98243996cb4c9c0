/**
 * The series–parallel reduction of a wiring (steps 1 and 2 of
 * solve-transfers.ts): its Thevenin source factors S_i(f) and impedance Z(f),
 * by recursion over the wiring's tree.
 *
 *   Element: its coils' terms, S_i = p_i·k_i, Z = Σ Z_i (a two-lead pickup's
 *   coils are in series, in phase).
 *   Series: Z = Σ Z_k (Kirchhoff's voltage law); the sources pass unchanged.
 *   Parallel (Millman's theorem): Y_k = 1/Z_k, each part's sources times
 *   Y_k/ΣY, Z = 1/ΣY.
 *
 * The recursion is written once over `SolvePasses<B>`, the passes over every
 * frequency, for two kinds of arrays: JavaScript Float64Arrays
 * (`JAVASCRIPT_PASSES`, below, every solve of the analysis) and byte
 * addresses in a WebAssembly kernel's memory (src/render/synthesis-kernel.ts,
 * a render's syntheses). Both do the same operations in the same order, so
 * the same bits.
 */
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { multiplyComplexInPlace } from '../math/index.js';

/**
 * The passes over `length` numbers (interleaved complex) the reduction makes,
 * on arrays of type B.
 */
export interface SolvePasses<B> {
  /** A new work array of `length` numbers. */
  make(length: number): B;
  /** target = 0. */
  clear(target: B, length: number): void;
  /** A coil's terms: target = sign·source (its source factor with its phase), impedance += z. */
  addCoil(source: B, z: B, sign: number, target: B, impedance: B, length: number): void;
  /** target += part (series impedances add). */
  addInto(target: B, part: B, length: number): void;
  /** y ← 1/y (a part's impedance to its admittance), complex, and total += the admittance. */
  invertAndAdd(y: B, total: B, length: number): void;
  /** y ← y/total, complex. */
  divideInPlace(y: B, total: B, length: number): void;
  /** target ← target·factor, complex. */
  multiplyInPlace(target: B, factor: B, length: number): void;
  /** out = 1/total, complex. */
  invertInto(total: B, out: B, length: number): void;
}

/** The reduction's scratch: work arrays used as a stack, and its bookkeeping of coils (sized for the guitar's coils). */
export interface SolveWorkspace<B> {
  /** Work arrays of the grid's length, used as a stack (made on first need, kept). */
  readonly buffers: B[];
  top: number;
  /** Coil indices in the order the solver meets them. */
  readonly coilStack: Int32Array;
  /** Coil-stack positions where the parts of parallel groups begin. */
  readonly boundaryStack: number[];
  /** 1 for each coil the wiring uses. */
  readonly used: Uint8Array;
}

/** What one reduction reads and writes. */
export interface SeriesParallelArrays<B> {
  readonly passes: SolvePasses<B>;
  readonly workspace: SolveWorkspace<B>;
  /** Per coil, k_i and Z_i (prepare-circuit.ts). */
  readonly coilSource: readonly B[];
  readonly coilImpedance: readonly B[];
  /** Numbers per array: 2 per frequency. */
  readonly length: number;
}

interface SolveState<B> extends SeriesParallelArrays<B> {
  readonly guitar: Guitar;
  readonly out: readonly B[];
  coilCount: number;
  boundaryCount: number;
}

function acquire<B>(state: SolveState<B>): B {
  const { workspace } = state;
  const buffer = workspace.buffers[workspace.top] ?? state.passes.make(state.length);
  workspace.buffers[workspace.top] = buffer;
  workspace.top += 1;
  return buffer;
}

/** Writes the network's impedance into `impedance` and each of its coils' source factors into `out`. */
function evaluate<B>(state: SolveState<B>, node: Network, impedance: B): void {
  const { passes, out, length, workspace } = state;
  if (node.kind === 'element') {
    const element = state.guitar.elements[node.element];
    if (element === undefined) throw new RangeError(`solveTransfers: no element ${node.element} in this guitar`);
    const sign = node.inverted ? -1 : 1;
    passes.clear(impedance, length);
    // A two-lead pickup: its coils in series, string signals in phase; the element's phase applies to each.
    for (const c of element.coilIndices) {
      if (workspace.used[c] === 1) throw new RangeError(`solveTransfers: coil ${c} used twice`);
      workspace.used[c] = 1;
      workspace.coilStack[state.coilCount] = c;
      state.coilCount += 1;
      passes.addCoil(state.coilSource[c] as B, state.coilImpedance[c] as B, sign, out[c] as B, impedance, length);
    }
    return;
  }
  const mark = workspace.top;
  if (node.kind === 'series') {
    const part = acquire(state);
    passes.clear(impedance, length);
    for (const child of node.parts) {
      evaluate(state, child, part);
      passes.addInto(impedance, part, length);
    }
    workspace.top = mark;
    return;
  }
  // Parallel (Millman): keep each part's admittance until the sum is known.
  const total = acquire(state);
  passes.clear(total, length);
  const firstBoundary = state.boundaryCount;
  // Part k's admittance lives in buffers[partBase + k]: each child releases what it acquires.
  const partBase = workspace.top;
  const partCount = node.parts.length;
  for (let k = 0; k < partCount; k += 1) {
    workspace.boundaryStack[state.boundaryCount] = state.coilCount;
    state.boundaryCount += 1;
    const y = acquire(state);
    evaluate(state, node.parts[k] as Network, y);
    passes.invertAndAdd(y, total, length);
  }
  const end = state.coilCount;
  for (let k = 0; k < partCount; k += 1) {
    const y = workspace.buffers[partBase + k] as B;
    const from = workspace.boundaryStack[firstBoundary + k] as number;
    const to = k + 1 < partCount ? (workspace.boundaryStack[firstBoundary + k + 1] as number) : end;
    // factor Y_k / ΣY, written over y
    passes.divideInPlace(y, total, length);
    for (let s = from; s < to; s += 1) passes.multiplyInPlace(out[workspace.coilStack[s] as number] as B, y, length);
  }
  // Z = 1/ΣY
  passes.invertInto(total, impedance, length);
  state.boundaryCount = firstBoundary;
  workspace.top = mark;
}

/**
 * The reduction of `network` (no coupled pair in it): each coil's source
 * factor S_i into `out` (zeros for the coils it does not use) and the
 * wiring's impedance into `impedance`. Returns which coils it uses (1) or not
 * (0): the workspace's own array, valid until its next solve. Work arrays
 * are taken from the workspace's stack above `workspace.top` and given back.
 */
export function reduceSeriesParallel<B>(guitar: Guitar, network: Network, arrays: SeriesParallelArrays<B>, out: readonly B[], impedance: B): Uint8Array {
  const { workspace, passes, length } = arrays;
  workspace.used.fill(0);
  const state: SolveState<B> = {
    passes,
    workspace,
    coilSource: arrays.coilSource,
    coilImpedance: arrays.coilImpedance,
    length,
    guitar,
    out,
    coilCount: 0,
    boundaryCount: 0,
  };
  evaluate(state, network, impedance);
  for (let c = 0; c < guitar.coils.length; c += 1) if (workspace.used[c] === 0) passes.clear(out[c] as B, length);
  return workspace.used;
}

/*
 * The JavaScript passes, each loop a function of its own: V8 compiles a long
 * loop while it runs (on-stack replacement), and a loop inside a larger
 * function left that compiled code bailing out on the code after it, call
 * after call (src/math/real-fft.ts). A function that is only its loop is
 * compiled once and stays compiled.
 */

function addCoil(source: Float64Array, z: Float64Array, sign: number, target: Float64Array, impedance: Float64Array, length: number): void {
  for (let i = 0; i < length; i += 1) {
    target[i] = sign * (source[i] as number);
    impedance[i] = (impedance[i] as number) + (z[i] as number);
  }
}

function addInto(target: Float64Array, part: Float64Array, length: number): void {
  for (let i = 0; i < length; i += 1) target[i] = (target[i] as number) + (part[i] as number);
}

function invertAndAdd(y: Float64Array, total: Float64Array, length: number): void {
  for (let i = 0; i < length; i += 2) {
    const zr = y[i] as number;
    const zi = y[i + 1] as number;
    const norm = zr * zr + zi * zi;
    const yr = zr / norm;
    const yi = -zi / norm;
    y[i] = yr;
    y[i + 1] = yi;
    total[i] = (total[i] as number) + yr;
    total[i + 1] = (total[i + 1] as number) + yi;
  }
}

/** (a + jb)/(c + jd) = ((ac + bd) + j(bc − ad))/(c² + d²). */
function divideInPlace(y: Float64Array, total: Float64Array, length: number): void {
  for (let i = 0; i < length; i += 2) {
    const ar = y[i] as number;
    const ai = y[i + 1] as number;
    const br = total[i] as number;
    const bi = total[i + 1] as number;
    const norm = br * br + bi * bi;
    y[i] = (ar * br + ai * bi) / norm;
    y[i + 1] = (ai * br - ar * bi) / norm;
  }
}

function invertInto(total: Float64Array, out: Float64Array, length: number): void {
  for (let i = 0; i < length; i += 2) {
    const br = total[i] as number;
    const bi = total[i + 1] as number;
    const norm = br * br + bi * bi;
    out[i] = br / norm;
    out[i + 1] = -bi / norm;
  }
}

/** The passes over JavaScript arrays: every solve outside a render's syntheses, and theirs where WebAssembly does not run. */
export const JAVASCRIPT_PASSES: SolvePasses<Float64Array> = Object.freeze({
  make: (length: number) => new Float64Array(length),
  clear: (target: Float64Array, length: number) => {
    target.fill(0, 0, length);
  },
  addCoil,
  addInto,
  invertAndAdd,
  divideInPlace,
  multiplyInPlace: multiplyComplexInPlace,
  invertInto,
});
