/**
 * The page's plotted curve is the response as the strings drive it when the
 * page carries the drive: its dot is the report's resonance (the same
 * definition, measure-resonance.ts, read on the analysis grid) and sits on
 * the curve (a drawn point of it). The drive travels as plain numbers through the page's JSON.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureCoilDrive, measureSpectralBasis } from '../analysis/index.js';
import { measureCircuitMetrics } from '../circuit/index.js';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { type PageCoilDrive, decodeCoilDrive, encodeCoilDrive } from './page-data.js';
import { responseCurve } from './response-curve.js';

const SAMPLE = join(import.meta.dirname, '..', '..', 'samples', 'humbucker-two-single-coil.json');
/** The curve's 96 points and the analysis grid's 200 refine to the same peak; 0.1 % covers the refinement's stopping tolerance many times over. */
const FREQUENCY_TOLERANCE = 1e-3;

describe('responseCurve with the page data drive', () => {
  const guitar = parseGuitarText(readFileSync(SAMPLE, 'utf8'), 'humbucker-two-single-coil.json');
  const drive = measureCoilDrive(measureSpectralBasis(guitar));
  const carried = decodeCoilDrive(JSON.parse(JSON.stringify(encodeCoilDrive(drive))) as PageCoilDrive);
  const wirings = enumerateWirings(guitar.elements).filter((wiring) => ['neck', 'mid + bridge_screw + bridge_slug', 'neck // (bridge_screw + bridge_slug)'].includes(wiring.expression));
  const report = measureCircuitMetrics(guitar, wirings, {}, { drive }).wirings;

  it('the drive survives the JSON of the page unchanged', () => {
    expect(Array.from(carried.cross)).toEqual(Array.from(drive.cross));
    expect(Array.from(carried.frequenciesHz)).toEqual(Array.from(drive.frequenciesHz));
  });

  it('plots the report resonance as its dot, on the curve', () => {
    expect(wirings).toHaveLength(3);
    let dots = 0;
    wirings.forEach((wiring, index) => {
      const curve = responseCurve(guitar, {}, wiring.network, carried);
      const figures = report[index];
      expect(curve.peakHz === null, wiring.expression).toBe(figures?.resonanceHz === null);
      if (curve.peakHz === null || curve.peakDb === null || figures?.resonanceHz == null) return;
      dots += 1;
      expect(Math.abs(curve.peakHz / figures.resonanceHz - 1), wiring.expression).toBeLessThan(FREQUENCY_TOLERANCE);
      // The dot is a drawn point of the curve (the refined peak is inserted between the grid points), and its neighbours lie below it.
      const at = curve.frequenciesHz.indexOf(curve.peakHz);
      expect(at, wiring.expression).toBeGreaterThan(0);
      expect(curve.responseDb[at], wiring.expression).toBe(curve.peakDb);
      expect(curve.responseDb[at - 1] as number, wiring.expression).toBeLessThanOrEqual(curve.peakDb + 1e-9);
      expect(curve.responseDb[at + 1] as number, wiring.expression).toBeLessThanOrEqual(curve.peakDb + 1e-9);
      expect(curve.frequenciesHz.every((hz, i) => i === 0 || hz > (curve.frequenciesHz[i - 1] as number)), wiring.expression).toBe(true);
    });
    expect(dots).toBeGreaterThanOrEqual(2);
  });
});
