import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import {
  FIELD_DIRECTIONS,
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
    const references = FIELD_DIRECTIONS.map((direction) => measureHumReference(prepared, direction));
    // humDb: the worse of the two field directions, each wiring solved on its own at the mains frequency.
    const humOnItsOwn = (network: (typeof wirings)[number]['network']): number =>
      FIELD_DIRECTIONS.reduce((worst, direction, d) => Math.max(worst, humDecibels(measureHum(prepared, network, direction), references[d] as number)), -Infinity);
    wirings.forEach((wiring, index) => {
      const direct = measureResonance(prepared, wiring.network);
      const metrics = shared.wirings[index];
      expect(metrics?.resonanceHz).toBe(direct.resonanceHz);
      expect(metrics?.peakDb).toBe(direct.peakDb);
      expect(metrics?.resonanceQ).toBe(direct.resonanceQ);
      expect(Math.abs((metrics?.humDb as number) - humOnItsOwn(wiring.network))).toBeLessThan(1e-9);
    });
  });
});
