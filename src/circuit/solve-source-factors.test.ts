/**
 * The wiring as a Thevenin source (S_i and Z with the load left off) times
 * the load's gain G against the loaded solve, on every wiring of the
 * coupled samples (coupled pairs solved by nodal analysis) at several knob
 * settings: T_i = S_i·G is Thevenin's theorem, and the loaded nodal solve
 * stamps the load in its own matrix, an independent formulation.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { type CircuitOverrides, analysisFrequencies, prepareCircuit, solveLoadGain, solveSourceFactors, solveTransfers, usesCoupledCoils } from './index.js';
import { multiplyComplexInPlace } from '../math/index.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');
/** Agreement asked: 1e-9 of the largest transfer at that frequency (as solve-nodal.test.ts). */
const RELATIVE_TOLERANCE = 1e-9;
const SETTINGS: readonly CircuitOverrides[] = [{}, { volumeSetting: 10, toneSetting: 10 }, { volumeSetting: 6.5, toneSetting: 2, cableCapacitanceF: 1.2e-9 }];

describe.each(['two-humbucker.json', 'humbucker-two-single-coil.json', 'two-lead-humbucker.json'])('S_i·G against the loaded solve: %s', (file) => {
  const guitar = parseGuitarText(readFileSync(join(SAMPLES, file), 'utf8'), file);
  const frequencies = analysisFrequencies();
  const length = 2 * frequencies.length;
  const wirings = enumerateWirings(guitar.elements);

  it.each(SETTINGS.map((overrides, index) => [index, overrides] as const))('every wiring, setting %i', (_index, overrides) => {
    const prepared = prepareCircuit(guitar, frequencies, overrides);
    const factors = guitar.coils.map(() => new Float64Array(length));
    const impedance = new Float64Array(length);
    const gain = new Float64Array(length);
    let coupled = 0;
    let worst = 0;
    for (const wiring of wirings) {
      if (usesCoupledCoils(guitar, wiring.network)) coupled += 1;
      const loaded = solveTransfers(prepared, wiring.network).map((transfer) => Float64Array.from(transfer));
      solveSourceFactors(prepared, wiring.network, factors, impedance);
      solveLoadGain(prepared, impedance, gain);
      for (const factor of factors) multiplyComplexInPlace(factor, gain, length);
      for (let f = 0; f < frequencies.length; f += 1) {
        let scale = 0;
        for (const transfer of loaded) scale = Math.max(scale, Math.hypot(transfer[2 * f] as number, transfer[2 * f + 1] as number));
        if (scale === 0) continue;
        guitar.coils.forEach((_coil, c) => {
          const a = loaded[c] as Float64Array;
          const b = factors[c] as Float64Array;
          worst = Math.max(worst, Math.hypot((a[2 * f] as number) - (b[2 * f] as number), (a[2 * f + 1] as number) - (b[2 * f + 1] as number)) / scale);
        });
      }
    }
    expect(coupled).toBeGreaterThan(0);
    expect(worst).toBeLessThan(RELATIVE_TOLERANCE);
  });
});
