/**
 * The fold of a phase class's shape table (solve-wiring-spectra.ts), the
 * loop that `analyze`'s groups and a render's analysis run once per phase
 * class, as WebAssembly compiled from wasm/shape-table.ts: the same
 * operations in the same order as `foldShapeTable` below, so the same bits
 * (shape-table-kernel.test.ts compares the two number for number).
 *
 * Why: the fold's first calls in a process ran in V8's interpreter until its
 * optimising compiler caught up, several calls in (its compile took 11–21 ms
 * on the 2-core machine). The 17 classes of a cold three-coil `analyze`,
 * timed inside the process: 19–80 ms as JavaScript (eight runs), 1.7–9.2 ms
 * as WebAssembly, compiled before its first call (six runs; DEVELOPERS.md,
 * "Code the interpreter runs").
 *
 * Each prepared fold has an instance of its own (src/math/wasm-arena.ts),
 * holding the guitar's segments, cross-spectra and excitation weights, copied
 * in once; a class's transfers are copied in and its table out at each call.
 * The instance and its memory go with the fold when it is no longer used.
 */
import { F64_BYTES, type KernelHost, allocate, copyIn, instantiateArena, kernelHost, memoryView } from '../math/index.js';
import type { ExcitationSpread } from './design-excitation-spread.js';
import type { CrossSpectra } from './measure-cross-spectra.js';
import { SHAPE_TABLE_WASM } from './shape-table-wasm.js';

interface ShapeTableExports {
  foldShapeTable(
    table: number,
    transfers: number,
    segmentCount: number,
    bands: number,
    energy: number,
    moment: number,
    first: number,
    last: number,
    weights: number,
    coilCount: number,
    pairCount: number,
    bandCount: number,
    excitationRow: number,
    outerRow: number,
    momentRow: number,
  ): void;
}

/** Adds a class's table into `table` (rows × pairCount numbers, zeros when new) from its transfers (one array of 2·segments numbers per coil). */
export type ShapeTableFold = (transfers: readonly Float64Array[], table: Float64Array) => void;

/**
 * The fold for one guitar's segments, cross-spectra and excitation spread,
 * as WebAssembly where the host compiles it (`host` picks, for tests).
 */
export function prepareShapeTableFold(
  segments: readonly { readonly band: number }[],
  cross: Pick<CrossSpectra, 'energy' | 'moment'>,
  spread: ExcitationSpread,
  rows: TableRows,
  host: KernelHost = kernelHost(),
): ShapeTableFold {
  const arena = host === 'webassembly' ? instantiateArena<ShapeTableExports>(SHAPE_TABLE_WASM) : null;
  if (host === 'webassembly' && !arena) throw new Error('this host cannot compile WebAssembly');
  if (!arena) return (transfers, table) => foldShapeTable(table, transfers, segments, cross, spread, rows);
  const { coilCount, pairCount, bandCount, excitationRow, outerRow, momentRow } = rows;
  const segmentCount = segments.length;
  const bandsAt = copyIn(arena, Int32Array.from(segments, (segment) => segment.band));
  const energyAt = copyIn(arena, cross.energy);
  const momentAt = copyIn(arena, cross.moment);
  const firstAt = copyIn(arena, spread.first);
  const lastAt = copyIn(arena, spread.last);
  const weightsAt = copyIn(arena, spread.weights);
  const transfersAt = allocate(arena, 2 * coilCount * segmentCount, F64_BYTES);
  const transfersView = memoryView(arena.exports.memory, transfersAt, 2 * coilCount * segmentCount);
  const tableLength = (2 * bandCount + 2) * pairCount;
  const tableAt = allocate(arena, tableLength, F64_BYTES);
  const tableView = memoryView(arena.exports.memory, tableAt, tableLength);
  return (transfers, table) => {
    if (table.length !== tableLength) throw new RangeError(`foldShapeTable: the table must hold ${tableLength} numbers, got ${table.length}`);
    const inMemory = transfersView();
    transfers.forEach((transfer, coil) => inMemory.set(transfer.subarray(0, 2 * segmentCount), 2 * coil * segmentCount));
    tableView().set(table);
    arena.exports.foldShapeTable(tableAt, transfersAt, segmentCount, bandsAt, energyAt, momentAt, firstAt, lastAt, weightsAt, coilCount, pairCount, bandCount, excitationRow, outerRow, momentRow);
    table.set(tableView());
  };
}

/** Where a shape table's rows lie (prepareWiringSpectra). */
export interface TableRows {
  readonly coilCount: number;
  readonly pairCount: number;
  readonly bandCount: number;
  readonly excitationRow: number;
  readonly outerRow: number;
  readonly momentRow: number;
}

/**
 * A phase class's table from its transfers at the segments, in JavaScript:
 * per segment and coil pair, Re(T_i·conj(T_j)·C) added into the segment's
 * band row (or the outer row), its moment and its auditory filters'
 * excitation rows (wasm/shape-table.ts has the equations). Where the host
 * cannot compile WebAssembly, and the reference the WebAssembly is held to.
 * A function of its own, so that V8's code compiled for the running loop has
 * nothing after it to bail out on (seen with node --trace-deopt, once per
 * shape; src/math/real-fft.ts).
 */
export function foldShapeTable(
  table: Float64Array,
  transfers: readonly Float64Array[],
  segments: readonly { readonly band: number }[],
  cross: Pick<CrossSpectra, 'energy' | 'moment'>,
  spread: ExcitationSpread,
  { coilCount, pairCount, bandCount, excitationRow, outerRow, momentRow }: TableRows,
): void {
  const segmentCount = segments.length;
  // Every array in a local: the first calls run in V8's interpreter (until the optimising compiler has caught up,
  // several calls in), where each property read in the loop costs as much as the arithmetic.
  const { energy, moment } = cross;
  const { first, last, weights } = spread;
  for (let s = 0; s < segmentCount; s += 1) {
    const band = (segments[s] as { band: number }).band;
    const row = band >= 0 ? band : outerRow;
    const firstBand = first[s] as number;
    const lastBand = last[s] as number;
    let pair = 0;
    for (let i = 0; i < coilCount; i += 1) {
      const ti = transfers[i] as Float64Array;
      const ir = ti[2 * s] as number;
      const ii = ti[2 * s + 1] as number;
      for (let j = i; j < coilCount; j += 1) {
        const tj = transfers[j] as Float64Array;
        const jr = tj[2 * s] as number;
        const ji = tj[2 * s + 1] as number;
        // a = T_i·conj(T_j)
        const ar = ir * jr + ii * ji;
        const ai = ii * jr - ir * ji;
        const at = 2 * (s * pairCount + pair);
        const fold = i === j ? 1 : 2;
        // Re(a·C) = a_r·C_r − a_i·C_i
        table[row * pairCount + pair] = (table[row * pairCount + pair] as number) + fold * (ar * (energy[at] as number) - ai * (energy[at + 1] as number));
        if (band >= 0) {
          const segmentEnergy = fold * (ar * (energy[at] as number) - ai * (energy[at + 1] as number));
          table[momentRow * pairCount + pair] = (table[momentRow * pairCount + pair] as number) + fold * (ar * (moment[at] as number) - ai * (moment[at + 1] as number));
          // Excitation of each auditory filter b: Σ_s W_b(f_s)·P_s (design-excitation-spread.ts).
          for (let b = firstBand; b <= lastBand; b += 1) {
            const index = (excitationRow + b) * pairCount + pair;
            table[index] = (table[index] as number) + (weights[s * bandCount + b] as number) * segmentEnergy;
          }
        }
        pair += 1;
      }
    }
  }
}
