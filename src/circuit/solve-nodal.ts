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

const TWO_PI = 2 * Math.PI;

/** One coil as the solver stamps it. */
interface ActiveCoil {
  readonly coil: number;
  /** Unknown index of the start and finish nodes, −1 when fixed at 0 V. */
  readonly start: number;
  readonly finish: number;
  /** w·m: sign of the string EMF from start to finish. */
  readonly stringSign: number;
  /** Index of its coupling group, −1 when it is coupled to nothing present. */
  readonly group: number;
}

interface CouplingGroup {
  /** Positions in the active-coil list. */
  readonly members: readonly number[];
  /** Mutual inductance M_jk in henries, g×g row-major, zero diagonal. */
  readonly mutualH: Float64Array;
  /** Branch admittance Y_g per frequency, g×g complex (interleaved), refilled per frequency. */
  readonly admittance: Float64Array;
  /** Scratch for the inversion: g×2g complex. */
  readonly scratch: Float64Array;
}

/** Buffers reused from call to call (grown when a bigger system comes along). */
interface NodalWorkspace {
  matrix: Float64Array;
  rhs: Float64Array;
}

const workspaces = new WeakMap<PreparedCircuit, NodalWorkspace>();

function workspaceFor(prepared: PreparedCircuit, unknowns: number): NodalWorkspace {
  let workspace = workspaces.get(prepared);
  if (workspace === undefined || workspace.rhs.length < 2 * unknowns) {
    workspace = { matrix: new Float64Array(2 * unknowns * unknowns), rhs: new Float64Array(2 * unknowns) };
    workspaces.set(prepared, workspace);
  }
  return workspace;
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
interface NodalPlan {
  readonly unknowns: number;
  readonly hot: number;
  /** Unknown index of the output node (equal to `hot` with the volume fully up). */
  readonly out: number;
  readonly coils: readonly ActiveCoil[];
  readonly groups: readonly CouplingGroup[];
}

function planGraph(prepared: PreparedCircuit, graph: CircuitGraph): NodalPlan | null {
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
  join(graph.hot, graph.ground);
  for (const placed of connected) join(placed.start as number, placed.finish as number);
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
  const out = prepared.bridgeAdmittance === null ? hot : unknowns;
  if (prepared.bridgeAdmittance !== null) unknowns += 1;

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
    };
  });
  return { unknowns, hot, out, coils, groups };
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
  return { members, mutualH, admittance: new Float64Array(2 * size * size), scratch: new Float64Array(4 * size * size) };
}

/** A[row][col] += (re, im); a fixed node (−1) has no row or column. */
function add(matrix: Float64Array, n: number, row: number, col: number, re: number, im: number): void {
  if (row < 0 || col < 0) return;
  const at = 2 * (row * n + col);
  matrix[at] = (matrix[at] as number) + re;
  matrix[at + 1] = (matrix[at + 1] as number) + im;
}

/** The two-terminal stamp of an admittance Y between nodes a and b. */
function stampAdmittance(matrix: Float64Array, n: number, a: number, b: number, re: number, im: number): void {
  add(matrix, n, a, a, re, im);
  add(matrix, n, b, b, re, im);
  add(matrix, n, a, b, -re, -im);
  add(matrix, n, b, a, -re, -im);
}

/**
 * Invert the g×g complex matrix held in the left half of `scratch` (g rows of
 * 2g complex entries, right half ignored) into `target`, by Gauss–Jordan
 * elimination with partial pivoting.
 */
function invertSmall(scratch: Float64Array, size: number, target: Float64Array): void {
  const width = 2 * size;
  for (let r = 0; r < size; r += 1) {
    for (let c = 0; c < size; c += 1) {
      const at = 2 * (r * width + size + c);
      scratch[at] = r === c ? 1 : 0;
      scratch[at + 1] = 0;
    }
  }
  for (let col = 0; col < size; col += 1) {
    let pivot = col;
    let best = -1;
    for (let r = col; r < size; r += 1) {
      const at = 2 * (r * width + col);
      const magnitude = Math.hypot(scratch[at] as number, scratch[at + 1] as number);
      if (magnitude > best) {
        best = magnitude;
        pivot = r;
      }
    }
    if (pivot !== col) swapRows(scratch, width, pivot, col);
    const pAt = 2 * (col * width + col);
    const pr = scratch[pAt] as number;
    const pi = scratch[pAt + 1] as number;
    const pn = pr * pr + pi * pi;
    const ir = pr / pn;
    const ii = -pi / pn;
    for (let c = 0; c < width; c += 1) {
      const at = 2 * (col * width + c);
      const ar = scratch[at] as number;
      const ai = scratch[at + 1] as number;
      scratch[at] = ar * ir - ai * ii;
      scratch[at + 1] = ar * ii + ai * ir;
    }
    for (let r = 0; r < size; r += 1) {
      if (r === col) continue;
      const fAt = 2 * (r * width + col);
      const fr = scratch[fAt] as number;
      const fi = scratch[fAt + 1] as number;
      if (fr === 0 && fi === 0) continue;
      for (let c = 0; c < width; c += 1) {
        const src = 2 * (col * width + c);
        const dst = 2 * (r * width + c);
        const sr = scratch[src] as number;
        const si = scratch[src + 1] as number;
        scratch[dst] = (scratch[dst] as number) - (fr * sr - fi * si);
        scratch[dst + 1] = (scratch[dst + 1] as number) - (fr * si + fi * sr);
      }
    }
  }
  for (let r = 0; r < size; r += 1) {
    for (let c = 0; c < size; c += 1) {
      const from = 2 * (r * width + size + c);
      const to = 2 * (r * size + c);
      target[to] = scratch[from] as number;
      target[to + 1] = scratch[from + 1] as number;
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

/** x_a − x_b, with a fixed node (−1) at 0 V. */
function difference(x: Float64Array, a: number, b: number, part: 0 | 1): number {
  return (a < 0 ? 0 : (x[2 * a + part] as number)) - (b < 0 ? 0 : (x[2 * b + part] as number));
}

/**
 * One interleaved complex array (re, im, …; length 2·F) per guitar coil, in
 * `guitar.coils` order: T_i(f) from coil i's string EMF (acoustic polarity
 * +1) to the amplifier input, for the connection `graph`. Zeros for coils
 * the graph leaves disconnected or floating, and for every coil when the
 * volume is at 0 or hot is ground. Writes into `out` when given.
 */
export function solveNodalTransfers(prepared: PreparedCircuit, graph: CircuitGraph, out?: Float64Array[]): Float64Array[] {
  const frequencies = prepared.frequenciesHz;
  const length = 2 * frequencies.length;
  const coilCount = prepared.guitar.coils.length;
  const result = out ?? Array.from({ length: coilCount }, () => new Float64Array(length));
  let fits = result.length === coilCount;
  for (let c = 0; fits && c < coilCount; c += 1) fits = (result[c] as Float64Array).length === length;
  if (!fits) throw new RangeError(`solveNodalTransfers: out must hold ${coilCount} arrays of length ${length}`);
  for (const array of result) array.fill(0);
  const plan = planGraph(prepared, graph);
  if (plan === null || prepared.load.silent || plan.coils.length === 0) return result;

  const n = plan.unknowns;
  const { matrix, rhs } = workspaceFor(prepared, n);
  const { hot, out: output, coils, groups } = plan;
  const bridge = prepared.bridgeAdmittance;
  for (let f = 0; f < frequencies.length; f += 1) {
    const re = 2 * f;
    const im = re + 1;
    const omega = TWO_PI * (frequencies[f] as number);
    matrix.fill(0, 0, 2 * n * n);
    rhs.fill(0, 0, 2 * n);
    // The load.
    add(matrix, n, hot, hot, prepared.hotAdmittance[re] as number, prepared.hotAdmittance[im] as number);
    add(matrix, n, output, output, prepared.outAdmittance[re] as number, prepared.outAdmittance[im] as number);
    if (bridge !== null) stampAdmittance(matrix, n, hot, output, bridge[re] as number, bridge[im] as number);
    // Uncoupled coils: 1/Z between the leads.
    for (const coil of coils) {
      const zr = prepared.coilImpedance[coil.coil]?.[re] as number;
      const zi = prepared.coilImpedance[coil.coil]?.[im] as number;
      const zn = zr * zr + zi * zi;
      if (coil.group < 0) {
        stampAdmittance(matrix, n, coil.start, coil.finish, zr / zn, -zi / zn);
        continue;
      }
      // Coupled coil: its shunt (1 − k)/Z here, its branch in the group's block below.
      const kr = prepared.coilSource[coil.coil]?.[re] as number;
      const ki = prepared.coilSource[coil.coil]?.[im] as number;
      const ar = 1 - kr;
      const ai = -ki;
      stampAdmittance(matrix, n, coil.start, coil.finish, (ar * zr + ai * zi) / zn, (ai * zr - ar * zi) / zn);
    }
    for (const group of groups) fillGroupAdmittance(prepared, coils, group, f, omega);
    for (const group of groups) stampGroup(matrix, n, coils, group);
    // Adjoint solve: A·x = u_out.
    rhs[2 * output] = 1;
    solveDense(matrix, rhs, n);
    for (const coil of coils) {
      const target = result[coil.coil] as Float64Array;
      let tr: number;
      let ti: number;
      if (coil.group < 0) {
        // b = (k/Z)·(u_finish − u_start)
        const zr = prepared.coilImpedance[coil.coil]?.[re] as number;
        const zi = prepared.coilImpedance[coil.coil]?.[im] as number;
        const kr = prepared.coilSource[coil.coil]?.[re] as number;
        const ki = prepared.coilSource[coil.coil]?.[im] as number;
        const zn = zr * zr + zi * zi;
        const yr = (kr * zr + ki * zi) / zn;
        const yi = (ki * zr - kr * zi) / zn;
        const dr = difference(rhs, coil.finish, coil.start, 0);
        const di = difference(rhs, coil.finish, coil.start, 1);
        tr = yr * dr - yi * di;
        ti = yr * di + yi * dr;
      } else {
        // b_k = Σ_j Y_jk·(u_finish_j − u_start_j)
        const group = groups[coil.group] as CouplingGroup;
        const size = group.members.length;
        const k = group.members.indexOf(coils.indexOf(coil));
        tr = 0;
        ti = 0;
        for (let j = 0; j < size; j += 1) {
          const member = coils[group.members[j] as number] as ActiveCoil;
          const at = 2 * (j * size + k);
          const yr = group.admittance[at] as number;
          const yi = group.admittance[at + 1] as number;
          const dr = difference(rhs, member.finish, member.start, 0);
          const di = difference(rhs, member.finish, member.start, 1);
          tr += yr * dr - yi * di;
          ti += yr * di + yi * dr;
        }
      }
      target[re] = coil.stringSign * tr;
      target[im] = coil.stringSign * ti;
    }
  }
  return result;
}

/** Y_g = (diag(Z_b) + jω·M)⁻¹ with Z_b = Z/k, for one frequency. */
function fillGroupAdmittance(prepared: PreparedCircuit, coils: readonly ActiveCoil[], group: CouplingGroup, f: number, omega: number): void {
  const size = group.members.length;
  const width = 2 * size;
  const scratch = group.scratch;
  const re = 2 * f;
  const im = re + 1;
  for (let j = 0; j < size; j += 1) {
    for (let k = 0; k < size; k += 1) {
      const at = 2 * (j * width + k);
      scratch[at] = 0;
      scratch[at + 1] = omega * (group.mutualH[j * size + k] as number);
    }
    const coil = (coils[group.members[j] as number] as ActiveCoil).coil;
    const zr = prepared.coilImpedance[coil]?.[re] as number;
    const zi = prepared.coilImpedance[coil]?.[im] as number;
    const kr = prepared.coilSource[coil]?.[re] as number;
    const ki = prepared.coilSource[coil]?.[im] as number;
    const kn = kr * kr + ki * ki;
    const at = 2 * (j * width + j);
    scratch[at] = (zr * kr + zi * ki) / kn;
    scratch[at + 1] = (zi * kr - zr * ki) / kn;
  }
  invertSmall(scratch, size, group.admittance);
}

/** i_j = Σ_k Y_jk·(v_s_k − v_f_k + e_k) leaves the branch at f_j: the coupled-inductor stamp. */
function stampGroup(matrix: Float64Array, n: number, coils: readonly ActiveCoil[], group: CouplingGroup): void {
  const size = group.members.length;
  for (let j = 0; j < size; j += 1) {
    const a = coils[group.members[j] as number] as ActiveCoil;
    for (let k = 0; k < size; k += 1) {
      const b = coils[group.members[k] as number] as ActiveCoil;
      const at = 2 * (j * size + k);
      const yr = group.admittance[at] as number;
      const yi = group.admittance[at + 1] as number;
      add(matrix, n, a.finish, b.finish, yr, yi);
      add(matrix, n, a.start, b.start, yr, yi);
      add(matrix, n, a.finish, b.start, -yr, -yi);
      add(matrix, n, a.start, b.finish, -yr, -yi);
    }
  }
}
