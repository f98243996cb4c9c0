/**
 * The source factors of a wiring holding a coupled pair
 * (`solveNodalSourceFactors`, solve-nodal.ts) with each block's stamping,
 * elimination and read-out as WebAssembly compiled from wasm/nodal-block.ts:
 * the same operations in the same order, two bins at a time in 128-bit
 * lanes, so the same bits (nodal-kernel.test.ts compares the two forms for
 * every such wiring of the bundled guitars).
 *
 * Why: a render solves one of these per phase class holding both coils of a
 * humbucker, over every FFT bin (65,537 at the demo's length), and as
 * JavaScript they were most of a 572-wiring render's time (4.7 s of 7.6 s of
 * its thread's syntheses in one profile).
 *
 * What stays the same from solve to solve on one grid is worked out once, in
 * JavaScript by solve-nodal.ts's own functions, and kept in the module's
 * memory: per coil its branch admittance Y_b = k/Z and what is stamped
 * between its leads (1/Z uncoupled, 1/Z − Y_b coupled), per coupling group
 * its Y_g, each block by block as the solver's block arrays hold them. A
 * solve then hands over its plan as lists of byte addresses (which runs are
 * added to which matrix entries, in solve-nodal.ts's order; the elimination's
 * steps; which drops and products make each S_i) and the kernel runs every
 * block. One grid is kept per thread; another grid starts the memory's
 * layout again.
 *
 * The JavaScript form runs where the host has no WebAssembly or no 128-bit
 * SIMD (the module then does not compile), for one-block grids (the
 * analysis' probes), and for grids over NODAL_KERNEL_MAX_BINS bins.
 */
import { F64_BYTES, I32_BYTES, type KernelHost, type WasmArena, allocate, instantiateArena, kernelHost } from '../math/index.js';
import type { CircuitGraph } from './circuit-graph.js';
import { NODAL_BLOCK_WASM } from './nodal-block-wasm.js';
import type { PreparedCircuit } from './prepare-circuit.js';
import { type ActiveCoil, BLOCK_BINS, type CouplingGroup, type NodalPlan, fillCoilRuns, fillGroupAdmittance, solveSourceFactorPlan, sourceFactorPlan } from './solve-nodal.js';

interface NodalExports {
  solveGrid(
    bins: number, n: number, output: number,
    matrix: number, rhs: number, inverses: number, factor: number, norms: number, drop: number,
    stamps: number, stampCount: number,
    rowStart: number, rows: number, columnStart: number, columns: number,
    drops: number, dropCount: number,
    products: number, signs: number, productCount: number,
    impedance: number,
  ): number;
}

/**
 * Most bins of a grid the kernel takes: the synthesis grid of the demo's
 * 2^17-point frame (phrases up to about 2.7 s at 48 kHz, 2.9 s at 44.1 kHz).
 * What it keeps is 16 bytes a bin for a coil of a coupled pair, 32 for any
 * other coil, 64 for a coupled pair's Y_g, and 16 a coil for the results:
 * 17 MB a thread for two humbuckers at this size. Longer grids solve as
 * JavaScript, which keeps nothing, so a render's peak stays where it was
 * (our choice; measured, 572 wirings of two humbuckers on two threads: a
 * 4.5 s phrase with the kernel at twice this size 16.7 → 12.4–13.3 s but
 * peaks 347 → 425 MB, a 6.5 s phrase at four times 531 → 722 MB).
 */
export const NODAL_KERNEL_MAX_BINS = 2 ** 16 + 1;

/** Numbers in one run of a block (solve-blocked.ts: a complex quantity is two runs). */
const RUN = BLOCK_BINS;
/** Bytes of one run. */
const RUN_BYTES = RUN * F64_BYTES;

/** The layout of the module's memory for one grid. */
interface GridLayout {
  /** The grid's coil arrays (prepared.coilImpedance), shared by a circuit and its retuned copies. */
  readonly key: readonly Float64Array[];
  readonly bins: number;
  readonly blocks: number;
  /** Largest n the work arrays hold. */
  readonly unknowns: number;
  readonly matrix: number;
  readonly rhs: number;
  readonly inverses: number;
  readonly factor: number;
  readonly norms: number;
  readonly drop: number;
  /** A complex run of zeros: the potential of a lead fixed at 0 V. */
  readonly zeros: number;
  readonly stamps: number;
  readonly rowStart: number;
  readonly rows: number;
  readonly columnStart: number;
  readonly columns: number;
  readonly drops: number;
  readonly products: number;
  readonly signs: number;
  readonly impedance: number;
  /** Per guitar coil, its S_i (interleaved complex, 2·bins). */
  readonly results: readonly number[];
  /** Per guitar coil and CoilRun (key "coil run"): `blocks` complex runs, made on first need. */
  readonly coilRuns: Map<string, number>;
  /** Per coupling group (its coils and mutual inductances): Y_g, g² complex runs a block, made on first need. */
  readonly groupRuns: Map<string, number>;
}

interface NodalKernel {
  readonly arena: WasmArena<NodalExports>;
  /** The first byte a grid's layout may use. */
  readonly base: number;
  grid: GridLayout | null;
}

let kernel: NodalKernel | null | undefined;

/** This thread's kernel, made on first need; null where the host cannot compile it (no WebAssembly, or no SIMD). */
function nodalKernel(): NodalKernel | null {
  if (kernel === undefined) {
    const arena = instantiateArena<NodalExports>(NODAL_BLOCK_WASM);
    kernel = arena === null ? null : { arena, base: arena.next, grid: null };
  }
  return kernel;
}

/** Does this host run the WebAssembly form (it compiles the module)? */
export function nodalKernelCompiles(): boolean {
  return nodalKernel() !== null;
}

/** Bins of the grid the kernel last solved on this thread (its memory's layout), null before any: which grids it takes. */
export function nodalKernelGridBins(): number | null {
  return kernel?.grid?.bins ?? null;
}

/**
 * `solveNodalSourceFactors` (solve-nodal.ts) in the form `host` runs: the
 * WebAssembly kernel where it compiles and the grid suits it (see the file
 * comment), JavaScript otherwise. The same numbers either way.
 */
export function solveCoupledSourceFactors(prepared: PreparedCircuit, graph: CircuitGraph, out: Float64Array[], impedance: Float64Array, host: KernelHost = kernelHost()): void {
  const plan = sourceFactorPlan(prepared, graph, out, impedance);
  if (plan === null) return;
  const bins = prepared.frequenciesHz.length;
  const kernel = host === 'webassembly' && bins > BLOCK_BINS && bins <= NODAL_KERNEL_MAX_BINS ? nodalKernel() : null;
  if (kernel === null) {
    solveSourceFactorPlan(prepared, plan, out, impedance);
    return;
  }
  solveInKernel(kernel, prepared, plan, out, impedance);
}

function solveInKernel(kernel: NodalKernel, prepared: PreparedCircuit, plan: NodalPlan, out: Float64Array[], impedance: Float64Array): void {
  const grid = gridLayout(kernel, prepared, plan.unknowns);
  const { arena } = kernel;
  const n = plan.unknowns;
  const { coils, groups } = plan;
  const blockBytes = 2 * RUN_BYTES;

  // What is stamped, in stampCoils' order: each coil between its leads, then each group's block.
  const stamps: number[] = [];
  const cross = (r1: number, r2: number, c1: number, c2: number, source: number, step: number): void => {
    // stampCross: (r1, c1) and (r2, c2) added, (r1, c2) and (r2, c1) subtracted, none on a node fixed at 0 V.
    const entry = (row: number, col: number, sign: number): void => {
      if (row >= 0 && col >= 0) stamps.push(2 * (row * n + col) * RUN_BYTES, source, step, sign);
    };
    entry(r1, c1, 1);
    entry(r2, c2, 1);
    entry(r1, c2, -1);
    entry(r2, c1, -1);
  };
  coils.forEach((coil) => {
    const stamped = coilRuns(kernel, grid, prepared, coil.coil, coil.group >= 0 ? 'coupled' : 'uncoupled');
    cross(coil.start, coil.finish, coil.start, coil.finish, stamped, blockBytes);
  });
  const groupBase = groups.map((group, index) => groupRuns(kernel, grid, prepared, plan, groupKey(plan, group), index));
  groups.forEach((group, index) => {
    const size = group.members.length;
    for (let j = 0; j < size; j += 1) {
      const a = coils[group.members[j] as number] as ActiveCoil;
      for (let k = 0; k < size; k += 1) {
        const b = coils[group.members[k] as number] as ActiveCoil;
        cross(a.finish, a.start, b.finish, b.start, (groupBase[index] as number) + 2 * (j * size + k) * RUN_BYTES, size * size * blockBytes);
      }
    }
  });

  // The drops d_j = x_finish − x_start, and the products making each S_i (writeTransfers' order).
  const lead = (node: number): number => (node < 0 ? grid.zeros : grid.rhs + 2 * node * RUN_BYTES);
  const drops = coils.flatMap((coil) => [lead(coil.finish), lead(coil.start)]);
  const products: number[] = [];
  const signs: number[] = [];
  coils.forEach((coil, j) => {
    const target = grid.results[coil.coil] as number;
    if (coil.group < 0) {
      products.push(target, coilRuns(kernel, grid, prepared, coil.coil, 'branch'), blockBytes, j, 0);
      signs.push(coil.stringSign);
      return;
    }
    const group = groups[coil.group] as CouplingGroup;
    const size = group.members.length;
    for (let m = 0; m < size; m += 1) {
      products.push(target, (groupBase[coil.group] as number) + 2 * (m * size + coil.slot) * RUN_BYTES, size * size * blockBytes, group.members[m] as number, m === 0 ? 0 : 1);
      signs.push(coil.stringSign);
    }
  });

  const buffer = arena.exports.memory.buffer;
  new Int32Array(buffer, grid.stamps, stamps.length).set(stamps);
  const { rowStart, rows, columnStart, columns } = plan.steps;
  new Int32Array(buffer, grid.rowStart, rowStart.length).set(rowStart);
  new Int32Array(buffer, grid.rows, rows.length).set(rows);
  new Int32Array(buffer, grid.columnStart, columnStart.length).set(columnStart);
  new Int32Array(buffer, grid.columns, columns.length).set(columns);
  new Int32Array(buffer, grid.drops, drops.length).set(drops);
  new Int32Array(buffer, grid.products, products.length).set(products);
  new Float64Array(buffer, grid.signs, signs.length).set(signs);
  const failed = arena.exports.solveGrid(
    grid.bins, n, plan.hot,
    grid.matrix, grid.rhs, grid.inverses, grid.factor, grid.norms, grid.drop,
    grid.stamps, stamps.length / 4,
    grid.rowStart, grid.rows, grid.columnStart, grid.columns,
    grid.drops, coils.length,
    grid.products, grid.signs, signs.length,
    grid.impedance,
  );
  if (failed !== 0) throw new RangeError('solveNodalTransfers: singular nodal matrix');
  const length = 2 * grid.bins;
  const used = new Uint8Array(out.length);
  for (const coil of coils) {
    used[coil.coil] = 1;
    (out[coil.coil] as Float64Array).set(new Float64Array(buffer, grid.results[coil.coil] as number, length));
  }
  out.forEach((array, coil) => {
    if (used[coil] === 0) array.fill(0);
  });
  impedance.set(new Float64Array(buffer, grid.impedance, length));
}

/**
 * Which group's Y_g a plan's group needs, whatever graph it came from: its guitar coils in slot order and their
 * mutual inductances (a circuit retuned with another coupling keeps the coils' arrays, and so this grid).
 */
function groupKey(plan: NodalPlan, group: CouplingGroup): string {
  const coils = group.members.map((member) => (plan.coils[member] as ActiveCoil).coil);
  return `${coils.join(',')} ${group.mutualH.join(' ')}`;
}

/** The layout for `prepared`'s grid, kept from the last solve when it is the same grid and its work arrays hold n = `unknowns`. */
function gridLayout(kernel: NodalKernel, prepared: PreparedCircuit, unknowns: number): GridLayout {
  const known = kernel.grid;
  const bins = prepared.frequenciesHz.length;
  if (known !== null && known.key === prepared.coilImpedance && known.bins === bins && known.unknowns >= unknowns) return known;
  const { arena } = kernel;
  arena.next = kernel.base;
  const coilCount = prepared.guitar.coils.length;
  // Every node of a wiring's layout but ground (layout-wiring.ts: two leads a coil and hot).
  const n = Math.max(unknowns, 2 * coilCount + 1);
  // Stamps: four a coil and four an entry of each group's g×g block, at most g = every coil.
  const stampMost = 4 * (coilCount + coilCount * coilCount);
  const productMost = coilCount * coilCount;
  const f64 = (count: number): number => allocate(arena, count, F64_BYTES);
  const i32 = (count: number): number => allocate(arena, count, I32_BYTES);
  const grid: GridLayout = {
    key: prepared.coilImpedance,
    bins,
    blocks: Math.ceil(bins / RUN),
    unknowns: n,
    matrix: f64(2 * n * n * RUN),
    rhs: f64(2 * n * RUN),
    inverses: f64(2 * n * RUN),
    factor: f64(2 * RUN),
    norms: f64(RUN),
    drop: f64(2 * coilCount * RUN),
    zeros: f64(2 * RUN),
    stamps: i32(4 * stampMost),
    rowStart: i32(n + 1),
    rows: i32(n * n),
    columnStart: i32(n + 1),
    columns: i32(n * n),
    drops: i32(2 * coilCount),
    products: i32(5 * productMost),
    signs: f64(productMost),
    impedance: f64(2 * bins),
    results: prepared.guitar.coils.map(() => f64(2 * bins)),
    coilRuns: new Map(),
    groupRuns: new Map(),
  };
  new Float64Array(arena.exports.memory.buffer, grid.zeros, 2 * RUN).fill(0);
  kernel.grid = grid;
  return grid;
}

/** What a coil's kept runs hold (GridLayout.coilRuns): 1/Z, 1/Z − Y_b (stamped uncoupled and coupled), or Y_b. */
type CoilRun = 'uncoupled' | 'coupled' | 'branch';

/**
 * Guitar coil `coil`'s kept runs of kind `run` (`blocks` complex runs), worked out by fillCoilRuns block by block on
 * first need: a coil of a coupled pair needs only its stamped shunt, any other coil its 1/Z and Y_b.
 */
function coilRuns(kernel: NodalKernel, grid: GridLayout, prepared: PreparedCircuit, coil: number, run: CoilRun): number {
  const key = `${coil} ${run}`;
  const known = grid.coilRuns.get(key);
  if (known !== undefined) return known;
  const runs = grid.blocks * 2 * RUN;
  const at = allocate(kernel.arena, runs, F64_BYTES);
  const view = new Float64Array(kernel.arena.exports.memory.buffer, at, runs).fill(0);
  const other = new Float64Array(2 * RUN);
  for (let block = 0; block < grid.blocks; block += 1) {
    const first = block * RUN;
    const length = Math.min(RUN, grid.bins - first);
    const target = view.subarray(2 * RUN * block, 2 * RUN * (block + 1));
    if (run === 'branch') fillCoilRuns(prepared, coil, 0, other, target, 0, first, length, RUN);
    else fillCoilRuns(prepared, coil, run === 'coupled' ? 1 : 0, target, other, 0, first, length, RUN);
  }
  grid.coilRuns.set(key, at);
  return at;
}

/** A coupling group's kept Y_g (see GridLayout.groupRuns), worked out by fillGroupAdmittance block by block on first need. */
function groupRuns(kernel: NodalKernel, grid: GridLayout, prepared: PreparedCircuit, plan: NodalPlan, key: string, index: number): number {
  const known = grid.groupRuns.get(key);
  if (known !== undefined) return known;
  const group = plan.groups[index] as CouplingGroup;
  const size = group.members.length;
  const perBlock = 2 * size * size * RUN;
  const at = allocate(kernel.arena, grid.blocks * perBlock, F64_BYTES);
  const view = new Float64Array(kernel.arena.exports.memory.buffer, at, grid.blocks * perBlock).fill(0);
  // The members' branch admittances at their places in the plan's coil list, as fillGroupAdmittance reads them.
  const branch = new Float64Array(2 * plan.coils.length * RUN);
  const unused = new Float64Array(2 * plan.coils.length * RUN);
  for (let block = 0; block < grid.blocks; block += 1) {
    const first = block * RUN;
    const length = Math.min(RUN, grid.bins - first);
    for (const member of group.members) fillCoilRuns(prepared, (plan.coils[member] as ActiveCoil).coil, 1, unused, branch, 2 * RUN * member, first, length, RUN);
    fillGroupAdmittance(prepared, group, branch, view.subarray(block * perBlock, (block + 1) * perBlock), first, length, RUN);
  }
  grid.groupRuns.set(key, at);
  return at;
}
