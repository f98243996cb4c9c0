import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureCircuitMetrics, prepareCircuitMetrics } from '../circuit/index.js';
import { parseGuitarText, wiringCountFor } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { measureCoilDrive } from './measure-coil-drive.js';
import { measureSpectralBasis } from './measure-spectral-basis.js';
import { type WiringFigures, measureWiringFigures } from './measure-wiring-figures.js';
import { solveWiringSpectra } from './solve-wiring-spectra.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');

describe('measureWiringFigures (streamed, structure by structure)', () => {
  // The streamed route (subset plans, one structure's tables at a time) against the whole-list route analyze uses for smaller guitars.
  it.each(['humbucker-two-single-coil.json'])('%s: the same wirings in the same order with the same figures as the whole-list route', (file) => {
    const guitar = parseGuitarText(readFileSync(join(samples, file), 'utf8'), file);
    const basis = measureSpectralBasis(guitar);
    const drive = measureCoilDrive(basis);
    const wirings = enumerateWirings(guitar.elements);
    const circuit = measureCircuitMetrics(guitar, wirings, undefined, { drive });
    const spectra = solveWiringSpectra(guitar, basis, wirings);
    const streamed: WiringFigures[] = [];
    let lastProgress = 0;
    for (const step of measureWiringFigures(guitar, { circuit: prepareCircuitMetrics(guitar, undefined, { drive }), basis, overrides: undefined, total: wiringCountFor(guitar.elements.length) })) {
      if (step.kind === 'wiring') streamed.push(step.figures);
      else {
        expect(step.done).toBeGreaterThan(lastProgress);
        lastProgress = step.done;
      }
    }
    expect(lastProgress).toBe(wirings.length);
    expect(streamed.map((row) => row.wiring)).toEqual(wirings);
    expect(streamed.map((row) => row.circuit)).toEqual(circuit.wirings);
    expect(Float64Array.from(streamed, (row) => row.levelDb ?? Number.NaN)).toEqual(spectra.levelsDb);
    expect(Float64Array.from(streamed, (row) => row.brightnessHz ?? Number.NaN)).toEqual(spectra.brightnessHz);
  });

  it('volume at 0: every figure null, none invented', () => {
    const guitar = parseGuitarText(readFileSync(join(samples, 'three-single-coil.json'), 'utf8'), 'three-single-coil.json');
    const basis = measureSpectralBasis(guitar);
    const steps = [...measureWiringFigures(guitar, { circuit: prepareCircuitMetrics(guitar, { volumeSetting: 0 }, { drive: measureCoilDrive(basis) }), basis, overrides: { volumeSetting: 0 }, total: 47 })];
    const rows = steps.flatMap((step) => (step.kind === 'wiring' ? [step.figures] : []));
    expect(rows).toHaveLength(47);
    for (const row of rows) expect([row.levelDb, row.brightnessHz, row.circuit.peakDb, row.circuit.humDb]).toEqual([null, null, null, null]);
  });
});
