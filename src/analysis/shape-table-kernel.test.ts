import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import { phaseClassKey, phaseClassNetwork, prepareCircuit, solveTransfers } from '../circuit/index.js';
import { parseGuitar } from '../guitar/index.js';
import { type KernelHost, createRandom, kernelHost } from '../math/index.js';
import { iterateWirings } from '../wiring/index.js';
import { designExcitationSpread } from './design-excitation-spread.js';
import { measureSpectralBasis } from './measure-spectral-basis.js';
import { type TableRows, foldShapeTable, prepareShapeTableFold } from './shape-table-kernel.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

describe('the shape table fold', () => {
  it('runs as WebAssembly in Node', () => {
    expect(kernelHost()).toBe('webassembly');
  });

  // Three bundled guitars: three single coils, a humbucker and two single coils, two humbuckers (47, 572 and 572 wirings), every phase class.
  it.each(['three-single-coil.json', 'humbucker-two-single-coil.json', 'two-humbucker.json'])(
    '%s: every phase class folds to the same bits as WebAssembly and as JavaScript, from zeros and onto a table already holding numbers',
    (file) => {
      const guitar = parseGuitar(JSON.parse(readFileSync(join(SAMPLES, file), 'utf8')));
      const basis = measureSpectralBasis(guitar);
      const { layout, cross } = basis;
      const bandCount = layout.bands.length;
      const pairCount = cross.pairCount;
      const rows: TableRows = { coilCount: guitar.coils.length, pairCount, bandCount, excitationRow: bandCount, outerRow: 2 * bandCount, momentRow: 2 * bandCount + 1 };
      const spread = designExcitationSpread(layout);
      const prepared = prepareCircuit(guitar, layout.frequenciesHz);
      const fold = prepareShapeTableFold(layout.segments, cross, spread, rows, 'webassembly');
      const transfers = guitar.coils.map(() => new Float64Array(2 * layout.segments.length));
      const seen = new Set<string>();
      const random = createRandom(5);
      for (const wiring of iterateWirings(guitar.elements)) {
        const key = phaseClassKey(guitar, wiring.network);
        if (seen.has(key)) continue;
        seen.add(key);
        solveTransfers(prepared, phaseClassNetwork(guitar, wiring.network), transfers);
        const start = seen.size % 2 === 0 ? new Float64Array((2 * bandCount + 2) * pairCount) : Float64Array.from({ length: (2 * bandCount + 2) * pairCount }, () => random() - 0.5);
        const want = start.slice();
        foldShapeTable(want, transfers, layout.segments, cross, spread, rows);
        const got = start.slice();
        fold(transfers, got);
        expect(firstBitDifference(want, got), `class ${key}`).toBe(-1);
      }
      expect(seen.size).toBeGreaterThan(10);
    },
    60_000,
  );

  it('gives the same numbers whichever host runs it, and refuses a table of the wrong size', () => {
    const guitar = parseGuitar(JSON.parse(readFileSync(join(SAMPLES, 'three-single-coil.json'), 'utf8')));
    const { layout, cross } = measureSpectralBasis(guitar);
    const bandCount = layout.bands.length;
    const rows: TableRows = { coilCount: 3, pairCount: cross.pairCount, bandCount, excitationRow: bandCount, outerRow: 2 * bandCount, momentRow: 2 * bandCount + 1 };
    const spread = designExcitationSpread(layout);
    const random = createRandom(9);
    const transfers = [0, 1, 2].map(() => Float64Array.from({ length: 2 * layout.segments.length }, () => (random() - 0.5) * 10 ** Math.floor(6 * random() - 3)));
    const tables = (['webassembly', 'javascript'] as const satisfies readonly KernelHost[]).map((host) => {
      const table = new Float64Array((2 * bandCount + 2) * cross.pairCount);
      prepareShapeTableFold(layout.segments, cross, spread, rows, host)(transfers, table);
      return table;
    });
    expect(firstBitDifference(tables[0] as Float64Array, tables[1] as Float64Array)).toBe(-1);
    expect(() => prepareShapeTableFold(layout.segments, cross, spread, rows, 'webassembly')(transfers, new Float64Array(3))).toThrow(/must hold/);
  });
});
