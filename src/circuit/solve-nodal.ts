/**
 * Each coil's transfer T_i(f) from its string EMF to the amplifier input for
 * ANY connection of coil leads (a `CircuitGraph`): complex modified nodal
 * analysis, one small dense system per frequency (docs/physics.md §12).
 *
 * Elements (docs/physics.md §1.1 for the coil, circuit-load.ts for the load):
 * - Each coil: its EMF e in series with its inductive branch Z_b, shunted by
 *   its self-capacitance across its two leads. The coil model lives in
 *   prepare-circuit.ts as a Thevenin pair per frequency: k = open-circuit
 *   voltage / EMF and Z = impedance seen at the leads. The same coil as a
 *   Norton source (Norton's theorem) is an admittance 1/Z between its leads
 *   with a current k·e/Z pushed into its finish node, and the split of 1/Z
 *   into the inductive branch and the shunt is
 *     Y_b = 1/Z_b = k/Z,  Y_shunt = (1 − k)/Z
 *   (from k = Y_b/(Y_b + Y_shunt), Z = 1/(Y_b + Y_shunt)). Reading them from
 *   the prepared pair keeps one coil model for both solvers.
 * - Coupled coils (coil-coupling.ts): the branch currents i of a group obey
 *     (v_s − v_f) + e = Z_g·i,  Z_g = diag(Z_b) + jω·M
 *   so i = Y_g·((v_s − v_f) + e) with Y_g = Z_g⁻¹, a symmetric admittance
 *   block stamped between the leads (the coupled-inductor stamp).
 * - The load: Y_h from hot to ground (tone branch), Y_ho from hot to out
 *   (volume track above the wiper, treble bleed), Y_o from out to ground
 *   (track below the wiper, cable, amplifier). With the volume fully up, out
 *   is hot.
 *
 * Kirchhoff's current law at every node that is not grounded gives
 * A·v = Σ_i b_i·e_i with A symmetric (a reciprocal network). The output is
 * v_out = u_outᵀ·A⁻¹·b_i·e_i, so one solve of A·x = u_out (A = Aᵀ) gives every
 * coil's transfer T_i = xᵀ·b_i (the adjoint method). Dense complex Gaussian
 * elimination with partial pivoting; the systems have a handful of nodes.
 *
 * Conventions as solveTransfers (solve-transfers.ts, coil-signs.ts): the
 * string EMF from start to finish is w·m·E_i, so T_i includes the sign w·m
 * and the orientation in which the graph places the coil.
 *
 * Nodes that only floating leads touch, and parts of the circuit with no
 * conductive path to ground, carry no current to the output: each such part
 * gets one node fixed at 0 V (its potential is arbitrary), so a floating coil
 * contributes nothing, while a closed loop of coils elsewhere still acts on a
 * coil it is magnetically coupled to.
 */
import type { Coil } from '../guitar/index.js';
import type { CircuitGraph } from './circuit-graph.js';
import { magnetSign, windingSign } from './coil-signs.js';
import { type CoilCoupling, coilCouplings } from './coil-coupling.js';
import type { PreparedCircuit } from './prepare-circuit.js';
import { type BlockScratch, type EliminationSteps, createBlockScratch, eliminationPattern, eliminationSteps, imagAt, realAt, solveBlock } from './solve-blocked.js';

const TWO_PI = 2 * Math.PI;

/** One coil as the solver stamps it. */
export interface ActiveCoil {
  readonly coil: number;
  /** Unknown index of the start and finish nodes, −1 when fixed at 0 V. */
  readonly start: number;
  readonly finish: number;
  /** w·m: sign of the string EMF from start to finish. */
  readonly stringSign: number;
  /** Index of its coupling group, −1 when it is coupled to nothing present. */
  readonly group: number;
  /** Its row in the group's admittance block. */
  readonly slot: number;
}

export interface CouplingGroup {
  /** Positions in the active-coil list. */
  readonly members: readonly number[];
  /** Mutual inductance M_jk in henries, g×g row-major, zero diagonal. */
  readonly mutualH: Float64Array;
  /** Branch admittance Y_g per frequency, g×g complex (interleaved), refilled per frequency. */
  readonly admittance: Float64Array;
  /** Scratch for the inversion: g×2g complex, then a g×g work matrix and a column. */
  readonly scratch: Float64Array;
}

/**
 * Bins solved together (solve-blocked.ts): the elimination's small loops are
 * paid once per block, and a block's matrix (at most a few hundred kB for
 * the largest graphs) stays in the processor's cache. A tuning choice,
 * measured on the four-coil sample's humbucker wirings: 64 to 1024 bins
 * are within 10 % of each other.
 */
export const BLOCK_BINS = 256;

/** Buffers reused from solve to solve (one solve runs at a time on a thread), grown when a bigger system comes along. */
interface BlockWorkspace {
  unknowns: number;
  coils: number;
  /** A, n×n complex runs of BLOCK_BINS. */
  matrix: Float64Array;
  /** b, then x: n complex runs. */
  rhs: Float64Array;
  scratch: BlockScratch;
  /** Per active coil: 1/Z (the coil's admittance at its leads), then Y_b = k/Z (its inductive branch). */
  admittance: Float64Array;
  branch: Float64Array;
  /** Per coupling group: Y_g, g×g complex runs. */
  readonly groups: Float64Array[];
  /** A run of BLOCK_BINS zeros: the potential of a node fixed at 0 V. */
  readonly zeros: Float64Array;
}

let shared: BlockWorkspace | null = null;

/**
 * The thread's buffers, large enough for `unknowns` and `coils`. They are
 * made at first for the largest graph of a guitar of `guitarCoils` coils
 * (each coil's two leads and the output: 2·coils + 1 nodes), so a thread
 * keeps one set: replacing it would also discard the compiled code of every
 * function that read the old one (measured: a humbucker wiring's first
 * solve 43–59 ms instead of 17–24 ms when the buffers grew under it).
 */
function blockWorkspace(unknowns: number, coils: number, guitarCoils: number): BlockWorkspace {
  if (shared !== null && shared.unknowns >= unknowns && shared.coils >= coils) return shared;
  const n = Math.max(unknowns, 2 * guitarCoils + 1, shared?.unknowns ?? 0);
  const c = Math.max(coils, guitarCoils, shared?.coils ?? 0);
  shared = {
    unknowns: n,
    coils: c,
    matrix: new Float64Array(2 * n * n * BLOCK_BINS),
    rhs: new Float64Array(2 * n * BLOCK_BINS),
    scratch: createBlockScratch(n, BLOCK_BINS),
    admittance: new Float64Array(2 * c * BLOCK_BINS),
    branch: new Float64Array(2 * c * BLOCK_BINS),
    groups: [],
    zeros: new Float64Array(BLOCK_BINS),
  };
  return shared;
}

function groupBuffer(workspace: BlockWorkspace, index: number, size: number): Float64Array {
  const known = workspace.groups[index];
  if (known !== undefined && known.length >= 2 * size * size * BLOCK_BINS) return known;
  const buffer = new Float64Array(2 * size * size * BLOCK_BINS);
  workspace.groups[index] = buffer;
  return buffer;
}

/** Union–find root with path halving. */
function root(parent: Int32Array, node: number): number {
  let n = node;
  while (parent[n] !== n) {
    const up = parent[parent[n] as number] as number;
    parent[n] = up;
    n = up;
  }
  return n;
}

function checkNode(graph: CircuitGraph, value: number | null, what: string): void {
  if (value === null) return;
  if (!Number.isInteger(value) || value < 0 || value >= graph.nodeCount) {
    throw new RangeError(`solveNodalTransfers: ${what} must be a node from 0 to ${graph.nodeCount - 1}, got ${value}`);
  }
}

/** The structure of one graph on one guitar: which unknown each node is, the coils and coupling groups. */
export interface NodalPlan {
  readonly unknowns: number;
  readonly hot: number;
  /** Unknown index of the output node (equal to `hot` with the volume fully up). */
  readonly out: number;
  readonly coils: readonly ActiveCoil[];
  readonly groups: readonly CouplingGroup[];
  /** The elimination's steps over where A and its factors may be nonzero (`eliminationSteps`, solve-blocked.ts). */
  readonly steps: EliminationSteps;
}

/**
 * How the load enters a plan: "loaded" hangs the controls off hot (with out a
 * node of its own when the volume is not fully up); "coils" leaves them off,
 * to read the coils' own impedance between hot and ground.
 */
type PlanMode = 'loaded' | 'loaded-bridged' | 'coils';

/** Plans already made, by graph (a plan depends on the guitar and the mode). */
const plans = new WeakMap<CircuitGraph, { readonly guitar: PreparedCircuit['guitar']; readonly mode: PlanMode; readonly plan: NodalPlan | null }>();

function planFor(prepared: PreparedCircuit, graph: CircuitGraph, withLoad: boolean): NodalPlan | null {
  const mode: PlanMode = !withLoad ? 'coils' : prepared.bridgeAdmittance === null ? 'loaded' : 'loaded-bridged';
  const known = plans.get(graph);
  if (known !== undefined && known.guitar === prepared.guitar && known.mode === mode) return known.plan;
  const plan = planGraph(prepared, graph, mode);
  plans.set(graph, { guitar: prepared.guitar, mode, plan });
  return plan;
}

function planGraph(prepared: PreparedCircuit, graph: CircuitGraph, mode: PlanMode): NodalPlan | null {
  const guitar = prepared.guitar;
  if (!Number.isInteger(graph.nodeCount) || graph.nodeCount < 1) {
    throw new RangeError(`solveNodalTransfers: nodeCount must be a positive integer, got ${graph.nodeCount}`);
  }
  checkNode(graph, graph.hot, 'hot');
  checkNode(graph, graph.ground, 'ground');
  const seen = new Set<number>();
  for (const placed of graph.coils) {
    if (!Number.isInteger(placed.coil) || guitar.coils[placed.coil] === undefined) {
      throw new RangeError(`solveNodalTransfers: no coil ${placed.coil} in this guitar`);
    }
    if (seen.has(placed.coil)) throw new RangeError(`solveNodalTransfers: coil ${placed.coil} placed twice`);
    seen.add(placed.coil);
    checkNode(graph, placed.start, `coil ${placed.coil} start`);
    checkNode(graph, placed.finish, `coil ${placed.coil} finish`);
  }
  if (graph.hot === graph.ground) return null;

  // A coil with a floating lead carries no current: it is left out.
  const connected = graph.coils.filter((placed) => placed.start !== null && placed.finish !== null);
  // Conductive parts: coils join their leads' nodes; the load joins hot to ground.
  const parent = Int32Array.from({ length: graph.nodeCount }, (_, n) => n);
  const join = (a: number, b: number): void => {
    const ra = root(parent, a);
    const rb = root(parent, b);
    if (ra !== rb) parent[ra] = rb;
  };
  if (mode !== 'coils') join(graph.hot, graph.ground);
  for (const placed of connected) join(placed.start as number, placed.finish as number);
  // The coils alone: hot with no path to ground is an open circuit.
  if (mode === 'coils' && root(parent, graph.hot) !== root(parent, graph.ground)) return null;
  // Fixed at 0 V: ground, and one node of every part with no path to ground.
  const fixed = new Uint8Array(graph.nodeCount);
  fixed[graph.ground] = 1;
  const groundRoot = root(parent, graph.ground);
  for (let n = 0; n < graph.nodeCount; n += 1) if (n === root(parent, n) && n !== groundRoot) fixed[n] = 1;
  // Nodes no connected coil touches (other than hot) have no equation: fix them too.
  const touched = new Uint8Array(graph.nodeCount);
  touched[graph.hot] = 1;
  for (const placed of connected) {
    touched[placed.start as number] = 1;
    touched[placed.finish as number] = 1;
  }
  const unknownOf = new Int32Array(graph.nodeCount).fill(-1);
  let unknowns = 0;
  for (let n = 0; n < graph.nodeCount; n += 1) {
    if (fixed[n] === 0 && touched[n] === 1) {
      unknownOf[n] = unknowns;
      unknowns += 1;
    }
  }
  const hot = unknownOf[graph.hot] as number;
  const out = mode === 'loaded-bridged' ? unknowns : hot;
  if (mode === 'loaded-bridged') unknowns += 1;

  // Coupling groups among the coils present (connected components of the coupling pairs).
  const position = new Map<number, number>();
  connected.forEach((placed, k) => position.set(placed.coil, k));
  const couplings = coilCouplings(guitar).filter((pair) => position.has(pair.first) && position.has(pair.second));
  const groupParent = Int32Array.from({ length: connected.length }, (_, k) => k);
  for (const pair of couplings) {
    const a = root(groupParent, position.get(pair.first) as number);
    const b = root(groupParent, position.get(pair.second) as number);
    if (a !== b) groupParent[a] = b;
  }
  const groupOfRoot = new Map<number, number>();
  const memberLists: number[][] = [];
  for (const pair of couplings) {
    const r = root(groupParent, position.get(pair.first) as number);
    if (!groupOfRoot.has(r)) {
      groupOfRoot.set(r, memberLists.length);
      memberLists.push([]);
    }
  }
  connected.forEach((_, k) => {
    const g = groupOfRoot.get(root(groupParent, k));
    if (g !== undefined) (memberLists[g] as number[]).push(k);
  });
  const groups = memberLists.map((members) => makeGroup(guitar.coils, connected.map((placed) => placed.coil), members, couplings));
  const coils = connected.map((placed, k): ActiveCoil => {
    const coil = guitar.coils[placed.coil] as Coil;
    return {
      coil: placed.coil,
      start: unknownOf[placed.start as number] as number,
      finish: unknownOf[placed.finish as number] as number,
      stringSign: windingSign(coil.winding) * magnetSign(coil.magnet),
      group: groupOfRoot.get(root(groupParent, k)) ?? -1,
      slot: memberLists[groupOfRoot.get(root(groupParent, k)) ?? -1]?.indexOf(k) ?? -1,
    };
  });
  return { unknowns, hot, out, coils, groups, steps: eliminationSteps(eliminationPattern(patternOf(unknowns, hot, out, mode, coils, groups), unknowns), unknowns) };
}

/** Where the stamps of `mode`'s load, the coils and their groups put entries in the n×n nodal matrix. */
function patternOf(n: number, hot: number, out: number, mode: PlanMode, coils: readonly ActiveCoil[], groups: readonly CouplingGroup[]): Uint8Array {
  const pattern = new Uint8Array(n * n);
  const mark = (row: number, col: number): void => {
    if (row >= 0 && col >= 0) pattern[row * n + col] = 1;
  };
  const pair = (a: number, b: number): void => {
    mark(a, a);
    mark(b, b);
    mark(a, b);
    mark(b, a);
  };
  if (mode !== 'coils') pair(hot, out);
  for (const coil of coils) pair(coil.start, coil.finish);
  for (const group of groups) {
    for (const j of group.members) {
      for (const k of group.members) {
        const a = coils[j] as ActiveCoil;
        const b = coils[k] as ActiveCoil;
        mark(a.start, b.start);
        mark(a.finish, b.finish);
        mark(a.start, b.finish);
        mark(a.finish, b.start);
      }
    }
  }
  return pattern;
}

function makeGroup(
  coils: readonly Coil[],
  coilAt: readonly number[],
  members: readonly number[],
  couplings: readonly CoilCoupling[],
): CouplingGroup {
  const size = members.length;
  const mutualH = new Float64Array(size * size);
  const slot = new Map<number, number>();
  members.forEach((member, j) => slot.set(coilAt[member] as number, j));
  for (const pair of couplings) {
    const a = slot.get(pair.first);
    const b = slot.get(pair.second);
    if (a === undefined || b === undefined) continue;
    const first = coils[pair.first] as Coil;
    const second = coils[pair.second] as Coil;
    const mutual = pair.sign * pair.coefficient * Math.sqrt(first.inductanceH * second.inductanceH);
    mutualH[a * size + b] = mutual;
    mutualH[b * size + a] = mutual;
  }
  return { members, mutualH, admittance: new Float64Array(2 * size * size), scratch: new Float64Array(6 * size * size + 2 * size) };
}

/**
 * Invert the g×g complex matrix held in the left half of `scratch` (g rows of
 * 2g complex entries) into `target`, one column at a time with `solveDense`
 * (`scratch` holds a work matrix and a column after the g×2g rows). For
 * groups of three or more coupled coils; two use `invertTwo`.
 */
function invertSmall(scratch: Float64Array, size: number, target: Float64Array): void {
  const width = 2 * size;
  const matrixEnd = 4 * size * size;
  const work = scratch.subarray(matrixEnd, matrixEnd + 2 * size * size);
  const column = scratch.subarray(matrixEnd + 2 * size * size, matrixEnd + 2 * size * size + 2 * size);
  for (let c = 0; c < size; c += 1) {
    for (let r = 0; r < size; r += 1) {
      for (let k = 0; k < size; k += 1) {
        work[2 * (r * size + k)] = scratch[2 * (r * width + k)] as number;
        work[2 * (r * size + k) + 1] = scratch[2 * (r * width + k) + 1] as number;
      }
    }
    column.fill(0);
    column[2 * c] = 1;
    solveDense(work, column, size);
    for (let r = 0; r < size; r += 1) {
      target[2 * (r * size + c)] = column[2 * r] as number;
      target[2 * (r * size + c) + 1] = column[2 * r + 1] as number;
    }
  }
}

function swapRows(matrix: Float64Array, width: number, a: number, b: number): void {
  for (let c = 0; c < 2 * width; c += 1) {
    const x = 2 * a * width + c;
    const y = 2 * b * width + c;
    const t = matrix[x] as number;
    matrix[x] = matrix[y] as number;
    matrix[y] = t;
  }
}

/**
 * Solve A·x = rhs in place (A n×n complex, row-major, destroyed; x written
 * over rhs) by Gaussian elimination with partial pivoting. Throws when A is
 * singular, which a graph of positive impedances never is.
 */
function solveDense(matrix: Float64Array, rhs: Float64Array, n: number): void {
  for (let col = 0; col < n; col += 1) {
    let pivot = col;
    let best = -1;
    for (let r = col; r < n; r += 1) {
      const at = 2 * (r * n + col);
      const magnitude = Math.abs(matrix[at] as number) + Math.abs(matrix[at + 1] as number);
      if (magnitude > best) {
        best = magnitude;
        pivot = r;
      }
    }
    if (!(best > 0)) throw new RangeError('solveNodalTransfers: singular nodal matrix');
    if (pivot !== col) {
      swapRows(matrix, n, pivot, col);
      const t0 = rhs[2 * pivot] as number;
      const t1 = rhs[2 * pivot + 1] as number;
      rhs[2 * pivot] = rhs[2 * col] as number;
      rhs[2 * pivot + 1] = rhs[2 * col + 1] as number;
      rhs[2 * col] = t0;
      rhs[2 * col + 1] = t1;
    }
    const pAt = 2 * (col * n + col);
    const pr = matrix[pAt] as number;
    const pi = matrix[pAt + 1] as number;
    const pn = pr * pr + pi * pi;
    const ir = pr / pn;
    const ii = -pi / pn;
    for (let r = col + 1; r < n; r += 1) {
      const fAt = 2 * (r * n + col);
      const ar = matrix[fAt] as number;
      const ai = matrix[fAt + 1] as number;
      if (ar === 0 && ai === 0) continue;
      const fr = ar * ir - ai * ii; // factor = A[r][col] / pivot
      const fi = ar * ii + ai * ir;
      for (let c = col + 1; c < n; c += 1) {
        const src = 2 * (col * n + c);
        const dst = 2 * (r * n + c);
        const sr = matrix[src] as number;
        const si = matrix[src + 1] as number;
        matrix[dst] = (matrix[dst] as number) - (fr * sr - fi * si);
        matrix[dst + 1] = (matrix[dst + 1] as number) - (fr * si + fi * sr);
      }
      const br = rhs[2 * col] as number;
      const bi = rhs[2 * col + 1] as number;
      rhs[2 * r] = (rhs[2 * r] as number) - (fr * br - fi * bi);
      rhs[2 * r + 1] = (rhs[2 * r + 1] as number) - (fr * bi + fi * br);
    }
  }
  for (let r = n - 1; r >= 0; r -= 1) {
    let sr = rhs[2 * r] as number;
    let si = rhs[2 * r + 1] as number;
    for (let c = r + 1; c < n; c += 1) {
      const at = 2 * (r * n + c);
      const ar = matrix[at] as number;
      const ai = matrix[at + 1] as number;
      const xr = rhs[2 * c] as number;
      const xi = rhs[2 * c + 1] as number;
      sr -= ar * xr - ai * xi;
      si -= ar * xi + ai * xr;
    }
    const pAt = 2 * (r * n + r);
    const pr = matrix[pAt] as number;
    const pi = matrix[pAt + 1] as number;
    const pn = pr * pr + pi * pi;
    rhs[2 * r] = (sr * pr + si * pi) / pn;
    rhs[2 * r + 1] = (si * pr - sr * pi) / pn;
  }
}

/**
 * One interleaved complex array (re, im, …; length 2·F) per guitar coil, in
 * `guitar.coils` order: T_i(f) from coil i's string EMF (acoustic polarity
 * +1) to the amplifier input, for the connection `graph`. Zeros for coils
 * the graph leaves disconnected or floating, and for every coil when the
 * volume is at 0 or hot is ground. Writes into `out` when given.
 */
export function solveNodalTransfers(prepared: PreparedCircuit, graph: CircuitGraph, out?: Float64Array[]): Float64Array[] {
  const result = checkedOutput(prepared, out);
  const plan = planFor(prepared, graph, true);
  if (plan === null || prepared.load.silent || plan.coils.length === 0) return result;
  solvePlan(prepared, plan, true, result, null);
  return result;
}

/**
 * The connection `graph` as a Thevenin source seen from hot and ground with
 * the controls, cable and amplifier disconnected: per coil the factor S_i(f)
 * taking its string EMF to the open-circuit voltage at hot (written into
 * `out`, zeros for coils the graph leaves out), and the impedance Z(f)
 * between hot and ground with the EMFs off (written into `impedance`).
 * The loaded transfers are then T_i = S_i·G with the load's gain G of Z
 * (`solveLoadGain`, solve-transfers.ts; Thevenin's theorem: the load sees
 * only V = Σ S_i·E_i behind Z), so a knob move costs G alone. One adjoint
 * solve per frequency gives both: with A the nodal matrix of the coils and
 * x = A⁻¹·u_hot, Z = x_hot (1 A into hot) and S_i = xᵀ·b_i (A = Aᵀ).
 * Where the coils leave hot with no path to ground (an open circuit) every
 * S_i is 0 and Z is Infinity (real part).
 */
export function solveNodalSourceFactors(prepared: PreparedCircuit, graph: CircuitGraph, out: Float64Array[], impedance: Float64Array): void {
  const plan = sourceFactorPlan(prepared, graph, out, impedance);
  if (plan !== null) solveSourceFactorPlan(prepared, plan, out, impedance);
}

/**
 * The first half of `solveNodalSourceFactors`: checks `out` and `impedance`;
 * where no solve is needed (hot is ground, or the coils leave hot open)
 * writes the answer (zeros; Z = 0 or Infinity) and returns null; otherwise
 * returns the plan to solve, `out` and `impedance` as they came
 * (`solveSourceFactorPlan`, or the WebAssembly form in nodal-kernel.ts,
 * which writes every number).
 */
export function sourceFactorPlan(prepared: PreparedCircuit, graph: CircuitGraph, out: Float64Array[], impedance: Float64Array): NodalPlan | null {
  checkedOutput(prepared, out, false);
  if (impedance.length !== 2 * prepared.frequenciesHz.length) throw new RangeError(`solveNodalSourceFactors: impedance must have length ${2 * prepared.frequenciesHz.length}`);
  const plan = graph.hot === graph.ground ? null : planFor(prepared, graph, false);
  if (plan !== null) return plan;
  for (const array of out) array.fill(0);
  impedance.fill(0);
  if (graph.hot === graph.ground) planGraph(prepared, graph, 'coils'); // validates the graph
  else for (let i = 0; i < impedance.length; i += 2) impedance[i] = Infinity;
  return null;
}

/** The second half of `solveNodalSourceFactors`, in JavaScript: the plan's S_i into `out` (zeros for coils it leaves out) and Z into `impedance`. */
export function solveSourceFactorPlan(prepared: PreparedCircuit, plan: NodalPlan, out: Float64Array[], impedance: Float64Array): void {
  for (const array of out) array.fill(0);
  impedance.fill(0);
  solvePlan(prepared, plan, false, out, impedance);
}

/** `out`, or new arrays, of the grid's length, cleared (`clear`) or as they are. */
function checkedOutput(prepared: PreparedCircuit, out: Float64Array[] | undefined, clear = true): Float64Array[] {
  const length = 2 * prepared.frequenciesHz.length;
  const coilCount = prepared.guitar.coils.length;
  const result = out ?? Array.from({ length: coilCount }, () => new Float64Array(length));
  let fits = result.length === coilCount;
  for (let c = 0; fits && c < coilCount; c += 1) fits = (result[c] as Float64Array).length === length;
  if (!fits) throw new RangeError(`solveNodalTransfers: out must hold ${coilCount} arrays of length ${length}`);
  if (clear) for (const array of result) array.fill(0);
  return result;
}

/**
 * Block by block of frequencies: stamp the plan (with the load when
 * `withLoad`), solve A·x = u for the output node (out when loaded, hot
 * otherwise), write each coil's T_i = w·m·xᵀ·b_i into `result` when given,
 * and x at the output (the impedance seen there) into `impedance` when given.
 */
function solvePlan(prepared: PreparedCircuit, plan: NodalPlan, withLoad: boolean, result: Float64Array[] | null, impedance: Float64Array | null): void {
  const bins = prepared.frequenciesHz.length;
  const n = plan.unknowns;
  const workspace = blockWorkspace(n, plan.coils.length, prepared.guitar.coils.length);
  const output = withLoad ? plan.out : plan.hot;
  // A grid smaller than a block (the one-frequency probes) is one block of its own size: nothing to clear beyond it.
  const stride = Math.min(BLOCK_BINS, bins);
  for (let first = 0; first < bins; first += stride) {
    const length = Math.min(stride, bins - first);
    const { matrix, rhs } = workspace;
    matrix.fill(0, 0, 2 * n * n * stride);
    rhs.fill(0, 0, 2 * n * stride);
    if (withLoad) stampLoad(matrix, n, prepared, plan, first, length, stride);
    stampCoils(matrix, n, prepared, plan, workspace, first, length, stride);
    // Adjoint solve: A·x = u_out.
    rhs.fill(1, realAt(output, stride), realAt(output, stride) + length);
    solveBlock(matrix, rhs, plan.steps, length, stride, workspace.scratch);
    if (impedance !== null) {
      const xr = realAt(output, stride);
      const xi = imagAt(output, stride);
      for (let b = 0; b < length; b += 1) {
        impedance[2 * (first + b)] = rhs[xr + b] as number;
        impedance[2 * (first + b) + 1] = rhs[xi + b] as number;
      }
    }
    if (result !== null) writeTransfers(plan, workspace, result, first, length, stride);
  }
}

/** The load's admittances for bins first … first + length − 1: Y_h hot–ground, Y_o out–ground, the bridge hot–out. */
function stampLoad(matrix: Float64Array, n: number, prepared: PreparedCircuit, plan: NodalPlan, first: number, length: number, stride: number): void {
  const { hot, out } = plan;
  addRun(matrix, hot * n + hot, stride, prepared.hotAdmittance, first, length, 1);
  addRun(matrix, out * n + out, stride, prepared.outAdmittance, first, length, 1);
  const bridge = prepared.bridgeAdmittance;
  if (bridge === null) return;
  addRun(matrix, hot * n + hot, stride, bridge, first, length, 1);
  addRun(matrix, out * n + out, stride, bridge, first, length, 1);
  addRun(matrix, hot * n + out, stride, bridge, first, length, -1);
  addRun(matrix, out * n + hot, stride, bridge, first, length, -1);
}

/** Entry `entry` of the block += sign·values[first + b] for b < length (`values` interleaved complex over the whole grid). */
function addRun(matrix: Float64Array, entry: number, stride: number, values: Float64Array, first: number, length: number, sign: number): void {
  const re = realAt(entry, stride);
  const im = imagAt(entry, stride);
  for (let b = 0; b < length; b += 1) {
    matrix[re + b] = (matrix[re + b] as number) + sign * (values[2 * (first + b)] as number);
    matrix[im + b] = (matrix[im + b] as number) + sign * (values[2 * (first + b) + 1] as number);
  }
}

/** Entry (row, col) of the block += sign·(values run at `from`, a block array); nothing where a node is fixed (−1). */
function addBlockRun(matrix: Float64Array, n: number, row: number, col: number, stride: number, values: Float64Array, from: number, length: number, sign: number): void {
  if (row < 0 || col < 0) return;
  const re = realAt(row * n + col, stride);
  const im = imagAt(row * n + col, stride);
  for (let b = 0; b < length; b += 1) {
    matrix[re + b] = (matrix[re + b] as number) + sign * (values[from + b] as number);
    matrix[im + b] = (matrix[im + b] as number) + sign * (values[from + stride + b] as number);
  }
}

/** The two-terminal stamp of the admittance run at `from` (a block array) between nodes a and b. */
function stampBlockAdmittance(matrix: Float64Array, n: number, a: number, b: number, stride: number, values: Float64Array, from: number, length: number): void {
  stampCross(matrix, n, a, b, a, b, stride, values, from, length);
}

/**
 * The run at `from` (a block array) added to entries (r1, c1) and (r2, c2),
 * subtracted from (r1, c2) and (r2, c1), in that order: the stamp of a branch
 * between r1 and r2 seen from c1 and c2 (a two-terminal admittance has
 * r = c). With all four nodes unknown, one loop does the four entries a bin
 * at a time, each entry's additions in the order of four loops one after the
 * other (an entry met twice, where nodes coincide, too), so the same numbers
 * with the run read once; otherwise, a loop per entry not on a fixed node.
 */
function stampCross(matrix: Float64Array, n: number, r1: number, r2: number, c1: number, c2: number, stride: number, values: Float64Array, from: number, length: number): void {
  if (r1 < 0 || r2 < 0 || c1 < 0 || c2 < 0) {
    addBlockRun(matrix, n, r1, c1, stride, values, from, length, 1);
    addBlockRun(matrix, n, r2, c2, stride, values, from, length, 1);
    addBlockRun(matrix, n, r1, c2, stride, values, from, length, -1);
    addBlockRun(matrix, n, r2, c1, stride, values, from, length, -1);
    return;
  }
  addFourRuns(matrix, realAt(r1 * n + c1, stride), realAt(r2 * n + c2, stride), realAt(r1 * n + c2, stride), realAt(r2 * n + c1, stride), stride, values, from, length);
}

/** Entries at p and q of the block += the run at `from`, at m and w −= it, bin by bin in that order (stampCross). */
function addFourRuns(matrix: Float64Array, p: number, q: number, m: number, w: number, stride: number, values: Float64Array, from: number, length: number): void {
  for (let b = 0; b < length; b += 1) {
    const vr = values[from + b] as number;
    const vi = values[from + stride + b] as number;
    matrix[p + b] = (matrix[p + b] as number) + vr;
    matrix[p + stride + b] = (matrix[p + stride + b] as number) + vi;
    matrix[q + b] = (matrix[q + b] as number) + vr;
    matrix[q + stride + b] = (matrix[q + stride + b] as number) + vi;
    matrix[m + b] = (matrix[m + b] as number) - vr;
    matrix[m + stride + b] = (matrix[m + stride + b] as number) - vi;
    matrix[w + b] = (matrix[w + b] as number) - vr;
    matrix[w + stride + b] = (matrix[w + stride + b] as number) - vi;
  }
}

/**
 * Every coil's stamps for the block: an uncoupled coil 1/Z between its leads;
 * a coupled one its shunt (1 − k)/Z, and its group's block. Leaves each
 * coil's branch admittance Y_b = k/Z in `workspace.branch`.
 */
function stampCoils(matrix: Float64Array, n: number, prepared: PreparedCircuit, plan: NodalPlan, workspace: BlockWorkspace, first: number, length: number, stride: number): void {
  const { coils, groups } = plan;
  const { admittance, branch } = workspace;
  for (let j = 0; j < coils.length; j += 1) {
    const coil = coils[j] as ActiveCoil;
    const yAt = realAt(j, stride);
    fillCoilRuns(prepared, coil.coil, coil.group >= 0 ? 1 : 0, admittance, branch, yAt, first, length, stride);
    stampBlockAdmittance(matrix, n, coil.start, coil.finish, stride, admittance, yAt, length);
  }
  groups.forEach((group, index) => {
    const values = groupBuffer(workspace, index, group.members.length);
    fillGroupAdmittance(prepared, group, branch, values, first, length, stride);
    stampGroup(matrix, n, coils, group, values, length, stride);
  });
}

/**
 * Guitar coil `coil`'s runs for bins first … first + length − 1, at `at` of
 * `admittance` and `branch` (block arrays): its branch admittance Y_b = k/Z,
 * and what is stamped between its leads, 1/Z − coupled·Y_b: 1/Z for an
 * uncoupled coil (coupled 0), the shunt (1 − k)/Z for a coupled one
 * (coupled 1). A factor, not a branch in the loop, so the loop's compiled
 * code serves both (y − 0·Y_b = y exactly).
 */
export function fillCoilRuns(prepared: PreparedCircuit, coil: number, coupled: number, admittance: Float64Array, branch: Float64Array, yAt: number, first: number, length: number, stride: number): void {
  const impedance = prepared.coilImpedance[coil] as Float64Array;
  const source = prepared.coilSource[coil] as Float64Array;
  for (let b = 0; b < length; b += 1) {
    const re = 2 * (first + b);
    const zr = impedance[re] as number;
    const zi = impedance[re + 1] as number;
    const kr = source[re] as number;
    const ki = source[re + 1] as number;
    const zn = zr * zr + zi * zi;
    const yr = zr / zn; // 1/Z
    const yi = -zi / zn;
    const br = kr * yr - ki * yi; // Y_b = k/Z
    const bi = kr * yi + ki * yr;
    branch[yAt + b] = br;
    branch[yAt + stride + b] = bi;
    // What is stamped between the leads: 1/Z, or the shunt (1 − k)/Z = 1/Z − Y_b of a coupled coil.
    admittance[yAt + b] = yr - coupled * br;
    admittance[yAt + stride + b] = yi - coupled * bi;
  }
}

/** Y_g = (diag(Z_b) + jω·M)⁻¹ with Z_b = 1/Y_b, per bin of the block, into `values` (g×g complex runs). */
export function fillGroupAdmittance(prepared: PreparedCircuit, group: CouplingGroup, branch: Float64Array, values: Float64Array, first: number, length: number, stride: number): void {
  const size = group.members.length;
  const frequencies = prepared.frequenciesHz;
  if (size === 2) {
    invertTwoRuns(group, branch, values, frequencies, first, length, stride);
    return;
  }
  const width = 2 * size;
  const { scratch, admittance, mutualH } = group;
  for (let b = 0; b < length; b += 1) {
    const omega = TWO_PI * (frequencies[first + b] as number);
    for (let j = 0; j < size; j += 1) {
      for (let k = 0; k < size; k += 1) {
        const at = 2 * (j * width + k);
        scratch[at] = 0;
        scratch[at + 1] = omega * (mutualH[j * size + k] as number);
      }
      const member = group.members[j] as number;
      const br = branch[realAt(member, stride) + b] as number;
      const bi = branch[imagAt(member, stride) + b] as number;
      const bn = br * br + bi * bi;
      const at = 2 * (j * width + j);
      scratch[at] = br / bn;
      scratch[at + 1] = -bi / bn;
    }
    invertSmall(scratch, size, admittance);
    for (let e = 0; e < size * size; e += 1) {
      values[realAt(e, stride) + b] = admittance[2 * e] as number;
      values[imagAt(e, stride) + b] = admittance[2 * e + 1] as number;
    }
  }
}

/**
 * The usual humbucker, two coupled coils, in closed form per bin:
 * [a m; m d]⁻¹ = [d −m; −m a]/(a·d − m²), a = 1/Y_b1, d = 1/Y_b2, m = jωM.
 */
function invertTwoRuns(group: CouplingGroup, branch: Float64Array, values: Float64Array, frequencies: Float64Array, first: number, length: number, stride: number): void {
  const mutual = group.mutualH[1] as number;
  const one = realAt(group.members[0] as number, stride);
  const two = realAt(group.members[1] as number, stride);
  // Entries (0,0), (0,1), (1,0), (1,1) of Y_g.
  const aR = realAt(0, stride);
  const aI = imagAt(0, stride);
  const bR = realAt(1, stride);
  const bI = imagAt(1, stride);
  const cR = realAt(2, stride);
  const cI = imagAt(2, stride);
  const dR = realAt(3, stride);
  const dI = imagAt(3, stride);
  for (let b = 0; b < length; b += 1) {
    const mi = TWO_PI * (frequencies[first + b] as number) * mutual; // m = j·mi
    const y1r = branch[one + b] as number;
    const y1i = branch[one + stride + b] as number;
    const y2r = branch[two + b] as number;
    const y2i = branch[two + stride + b] as number;
    const n1 = y1r * y1r + y1i * y1i;
    const n2 = y2r * y2r + y2i * y2i;
    const ar = y1r / n1; // a = 1/Y_b1
    const ai = -y1i / n1;
    const dr = y2r / n2; // d = 1/Y_b2
    const di = -y2i / n2;
    // a·d − m² = a·d + mi²
    const detR = ar * dr - ai * di + mi * mi;
    const detI = ar * di + ai * dr;
    const norm = detR * detR + detI * detI;
    const ir = detR / norm;
    const ii = -detI / norm;
    values[aR + b] = dr * ir - di * ii;
    values[aI + b] = dr * ii + di * ir;
    // −m/det = −j·mi·(ir + j·ii) = mi·ii − j·mi·ir
    values[bR + b] = mi * ii;
    values[bI + b] = -mi * ir;
    values[cR + b] = mi * ii;
    values[cI + b] = -mi * ir;
    values[dR + b] = ar * ir - ai * ii;
    values[dI + b] = ar * ii + ai * ir;
  }
}

/** i_j = Σ_k Y_jk·(v_s_k − v_f_k + e_k) leaves the branch at f_j: the coupled-inductor stamp, per bin of the block. */
function stampGroup(matrix: Float64Array, n: number, coils: readonly ActiveCoil[], group: CouplingGroup, values: Float64Array, length: number, stride: number): void {
  const size = group.members.length;
  for (let j = 0; j < size; j += 1) {
    const a = coils[group.members[j] as number] as ActiveCoil;
    for (let k = 0; k < size; k += 1) {
      const b = coils[group.members[k] as number] as ActiveCoil;
      stampCross(matrix, n, a.finish, a.start, b.finish, b.start, stride, values, realAt(j * size + k, stride), length);
    }
  }
}

/**
 * T_i = w·m·xᵀ·b_i per coil from the adjoint solution x in `workspace.rhs`:
 * b = Y_b·(u_finish − u_start) for an uncoupled coil, b_k = Σ_m Y_mk·(u_finish_m − u_start_m)
 * for a coupled one, so T = Y·d with d = x_finish − x_start (held per coil in
 * `workspace.admittance`, free once the block is stamped).
 */
function writeTransfers(plan: NodalPlan, workspace: BlockWorkspace, result: Float64Array[], first: number, length: number, stride: number): void {
  const { coils, groups } = plan;
  const { rhs, branch } = workspace;
  const drop = workspace.admittance;
  // A lead on a node fixed at 0 V reads a run of zeros: no branch in the loop, so its compiled code serves every graph.
  const zeros = workspace.zeros;
  for (let j = 0; j < coils.length; j += 1) {
    const coil = coils[j] as ActiveCoil;
    const dr = realAt(j, stride);
    const di = imagAt(j, stride);
    const finish = coil.finish < 0 ? zeros : rhs;
    const start = coil.start < 0 ? zeros : rhs;
    const fr = coil.finish < 0 ? 0 : realAt(coil.finish, stride);
    const fi = coil.finish < 0 ? 0 : imagAt(coil.finish, stride);
    const sr = coil.start < 0 ? 0 : realAt(coil.start, stride);
    const si = coil.start < 0 ? 0 : imagAt(coil.start, stride);
    for (let b = 0; b < length; b += 1) {
      drop[dr + b] = (finish[fr + b] as number) - (start[sr + b] as number);
      drop[di + b] = (finish[fi + b] as number) - (start[si + b] as number);
    }
  }
  for (let j = 0; j < coils.length; j += 1) {
    const coil = coils[j] as ActiveCoil;
    const target = result[coil.coil] as Float64Array;
    const sign = coil.stringSign;
    const offset = 2 * first;
    if (coil.group < 0) {
      accumulateProduct(target, offset, sign, branch, realAt(j, stride), drop, realAt(j, stride), length, stride, 0);
      continue;
    }
    const group = groups[coil.group] as CouplingGroup;
    const values = workspace.groups[coil.group] as Float64Array;
    const size = group.members.length;
    for (let m = 0; m < size; m += 1) {
      const member = group.members[m] as number;
      accumulateProduct(target, offset, sign, values, realAt(m * size + coil.slot, stride), drop, realAt(member, stride), length, stride, m === 0 ? 0 : 1);
    }
  }
}

/**
 * target (interleaved complex from `offset`) ← kept·target + sign·y·d per bin, y and d block runs at `yAt` and
 * `dAt`: kept = 0 starts the sum (0·target is not read: the first term is added to 0, as to a cleared target,
 * 0 + x keeping −0 out), kept = 1 adds to it.
 */
function accumulateProduct(target: Float64Array, offset: number, sign: number, y: Float64Array, yAt: number, d: Float64Array, dAt: number, length: number, stride: number, kept: number): void {
  for (let b = 0; b < length; b += 1) {
    const yr = y[yAt + b] as number;
    const yi = y[yAt + stride + b] as number;
    const dr = d[dAt + b] as number;
    const di = d[dAt + stride + b] as number;
    const at = offset + 2 * b;
    const re = kept === 0 ? 0 : (target[at] as number);
    const im = kept === 0 ? 0 : (target[at + 1] as number);
    target[at] = re + sign * (yr * dr - yi * di);
    target[at + 1] = im + sign * (yr * di + yi * dr);
  }
}

/**
 * The impedance of the coils alone between hot and ground, per frequency
 * (interleaved complex, length 2·F): controls, cable and amplifier
 * disconnected, EMFs off, as an impedance meter across the harness's hot and
 * ground leads reads it. Nodal analysis with 1 A driven into hot: Z = v_hot.
 * 0 where hot is ground; Infinity (real part) where the coils leave hot with
 * no path to ground.
 */
export function solveCoilsImpedance(prepared: PreparedCircuit, graph: CircuitGraph): Float64Array {
  const frequencies = prepared.frequenciesHz;
  const result = new Float64Array(2 * frequencies.length);
  if (graph.hot === graph.ground) {
    planGraph(prepared, graph, 'coils'); // validates the graph
    return result;
  }
  const plan = planFor(prepared, graph, false);
  if (plan === null) {
    for (let f = 0; f < frequencies.length; f += 1) result[2 * f] = Infinity;
    return result;
  }
  solvePlan(prepared, plan, false, null, result);
  return result;
}
