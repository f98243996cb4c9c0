import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import {
  analysisFrequencies,
  humDecibels,
  measureCircuitMetrics,
  measureHum,
  measureHumReference,
  measureResonance,
  prepareCircuit,
} from './index.js';

describe('measureCircuitMetrics shares figures between phase patterns', () => {
  it('gives what solving every wiring on its own gives (four-coil sample, 572 wirings)', () => {
    const file = join(import.meta.dirname, '..', '..', 'samples', 'humbucker-two-single-coil.json');
    const guitar = parseGuitarText(readFileSync(file, 'utf8'));
    const wirings = enumerateWirings(guitar.elements);
    const shared = measureCircuitMetrics(guitar, wirings, { mainsHz: 50 });
    const prepared = prepareCircuit(guitar, analysisFrequencies(), { mainsHz: 50 });
    const reference = measureHumReference(prepared);
    wirings.forEach((wiring, index) => {
      const direct = measureResonance(prepared, wiring.network);
      const metrics = shared.wirings[index];
      expect(metrics?.resonanceHz).toBe(direct.resonanceHz);
      expect(metrics?.peakDb).toBe(direct.peakDb);
      expect(metrics?.resonanceQ).toBe(direct.resonanceQ);
      expect(Math.abs((metrics?.humDb as number) - humDecibels(measureHum(prepared, wiring.network), reference))).toBeLessThan(1e-9);
    });
  });
});
