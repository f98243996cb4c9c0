/**
 * The fold of one phase class's shape table (src/analysis/solve-wiring-spectra.ts),
 * written in AssemblyScript and compiled to WebAssembly (scripts/build-wasm.mjs):
 * the same operations in the same order as `foldShapeTable` in
 * src/analysis/shape-table-kernel.ts, so the same bits (WebAssembly's f64
 * arithmetic is IEEE 754 binary64 rounding to nearest, as JavaScript's is,
 * and neither fuses a multiply into an add). Per segment s and coil pair
 * (i ≤ j), with a = T_i·conj(T_j) and the fold factor 2 − δ_ij:
 *
 *   table[row(s)] += fold·Re(a·C_ij,s)          (the band's energy, or the outer row)
 *   table[moment] += fold·Re(a·M_ij,s)          (inside the band range)
 *   table[excitation + b] += W_b(s)·fold·Re(a·C_ij,s),  b = first(s) … last(s)
 *
 * Every array is a byte address in this module's memory, laid out by
 * src/analysis/shape-table-kernel.ts: `table` rows × pairCount f64 (row-major,
 * zeroed by the caller), `transfers` coilCount runs of 2·segmentCount f64
 * (interleaved complex), `bands` segmentCount i32 (a segment's band, −1
 * outside the band range), `energy` and `moment` 2·segmentCount·pairCount f64
 * (pair-major within a segment, interleaved complex), `first` and `last`
 * segmentCount i32, `weights` segmentCount·bandCount f64.
 */

import { at, put, whole } from './memory';

export function foldShapeTable(
  table: usize,
  transfers: usize,
  segmentCount: i32,
  bands: usize,
  energy: usize,
  moment: usize,
  first: usize,
  last: usize,
  weights: usize,
  coilCount: i32,
  pairCount: i32,
  bandCount: i32,
  excitationRow: i32,
  outerRow: i32,
  momentRow: i32,
): void {
  for (let s = 0; s < segmentCount; s += 1) {
    const band = whole(bands, s);
    const row = band >= 0 ? band : outerRow;
    const firstBand = whole(first, s);
    const lastBand = whole(last, s);
    let pair = 0;
    for (let i = 0; i < coilCount; i += 1) {
      const ti = transfers + ((<usize>(2 * i * segmentCount)) << 3);
      const ir = at(ti, 2 * s);
      const ii = at(ti, 2 * s + 1);
      for (let j = i; j < coilCount; j += 1) {
        const tj = transfers + ((<usize>(2 * j * segmentCount)) << 3);
        const jr = at(tj, 2 * s);
        const ji = at(tj, 2 * s + 1);
        // a = T_i·conj(T_j)
        const ar = ir * jr + ii * ji;
        const ai = ii * jr - ir * ji;
        const c = 2 * (s * pairCount + pair);
        const fold: f64 = i == j ? 1 : 2;
        // Re(a·C) = a_r·C_r − a_i·C_i
        put(table, row * pairCount + pair, at(table, row * pairCount + pair) + fold * (ar * at(energy, c) - ai * at(energy, c + 1)));
        if (band >= 0) {
          const segmentEnergy = fold * (ar * at(energy, c) - ai * at(energy, c + 1));
          put(table, momentRow * pairCount + pair, at(table, momentRow * pairCount + pair) + fold * (ar * at(moment, c) - ai * at(moment, c + 1)));
          for (let b = firstBand; b <= lastBand; b += 1) {
            const index = (excitationRow + b) * pairCount + pair;
            put(table, index, at(table, index) + at(weights, s * bandCount + b) * segmentEnergy);
          }
        }
        pair += 1;
      }
    }
  }
}
