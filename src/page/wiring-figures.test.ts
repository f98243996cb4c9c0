import { describe, expect, it } from 'vitest';
import { makeExampleReport } from '../../test/support/example-report.js';
import type { ReportWiring } from '../report/index.js';
import { formatDb, formatHz } from './page-words.js';
import { DB_DECIMALS, HZ_DECIMALS, decodeWiringFigures, encodeWiringFigures } from './wiring-figures.js';

describe('the wirings\' figures as the page carries them', () => {
  const report = makeExampleReport(['neck', 'middle', 'bridge']);
  // Figures with many digits, a missing resonance and a non-finite level, as reports hold them.
  const wirings: ReportWiring[] = report.wirings.map((wiring, k) => ({
    ...wiring,
    levelDb: k === 3 ? Number.NaN : wiring.levelDb + Math.PI / 1000,
    centroidHz: wiring.centroidHz + Math.E / 7,
    resonanceHz: k === 5 ? null : (wiring.resonanceHz as number) + 1 / 3,
    humDb: -0.0001,
  }));
  const decoded = decodeWiringFigures(JSON.parse(JSON.stringify(encodeWiringFigures(wirings))));

  it('gives every wiring back, in order, within half a unit of the kept digits', () => {
    expect(decoded.map((wiring) => wiring.id)).toEqual(wirings.map((wiring) => wiring.id));
    decoded.forEach((figures, k) => {
      const wiring = wirings[k] as ReportWiring;
      expect(figures.coilCount).toBe(wiring.coils.length);
      expect(figures.humCancelling).toBe(wiring.humCancelling);
      if (k === 3) expect(figures.levelDb).toBeNaN();
      else expect(Math.abs(figures.levelDb - wiring.levelDb)).toBeLessThanOrEqual(0.5 * 10 ** -DB_DECIMALS + 1e-12);
      expect(Math.abs(figures.loudnessLufs - wiring.loudnessLufs)).toBeLessThanOrEqual(0.5 * 10 ** -DB_DECIMALS + 1e-12);
      expect(Math.abs(figures.centroidHz - wiring.centroidHz)).toBeLessThanOrEqual(0.5 * 10 ** -HZ_DECIMALS + 1e-9);
      if (k === 5) expect(figures.resonanceHz).toBeNull();
      else expect(Math.abs((figures.resonanceHz as number) - (wiring.resonanceHz as number))).toBeLessThanOrEqual(0.5 * 10 ** -HZ_DECIMALS + 1e-9);
      expect(Object.is(figures.humDb, -0)).toBe(false);
      // The page prints no more digits than it is given.
      expect(formatHz(figures.centroidHz)).toBe(formatHz(wiring.centroidHz));
      expect(formatDb(figures.peakDb)).toBe(formatDb(wiring.peakDb));
    });
  });

  it('carries ids that are not w<number>', () => {
    const renamed = wirings.map((wiring) => ({ ...wiring, id: `x${wiring.number}` }));
    expect(decodeWiringFigures(encodeWiringFigures(renamed)).map((wiring) => wiring.id)).toEqual(renamed.map((wiring) => wiring.id));
    expect(encodeWiringFigures(wirings).ids).toBeUndefined();
  });
});
