/**
 * The page's plotted curve is the response as the strings drive it when the
 * page carries the drive: its dot is the report's resonance (the same
 * definition, measure-resonance.ts, read on the analysis grid) and sits on
 * the curve. The drive travels as plain numbers through the page's JSON.
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
/** Between two curve points the curve is drawn straight in ln f; the refined peak may stand this far above that line (dB). */
const DOT_ABOVE_CURVE_DB = 0.5;

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
      const above = curve.frequenciesHz.findIndex((hz) => hz >= (curve.peakHz as number));
      const [lowHz, highHz] = [curve.frequenciesHz[above - 1] as number, curve.frequenciesHz[above] as number];
      const t = Math.log((curve.peakHz as number) / lowHz) / Math.log(highHz / lowHz);
      const line = (curve.responseDb[above - 1] as number) * (1 - t) + (curve.responseDb[above] as number) * t;
      expect(curve.peakDb - line, wiring.expression).toBeGreaterThanOrEqual(-1e-9);
      expect(curve.peakDb - line, wiring.expression).toBeLessThan(DOT_ABOVE_CURVE_DB);
    });
    expect(dots).toBeGreaterThanOrEqual(2);
  });
});
