/**
 * The curve the page plots for a wiring: whatever src/circuit exports as a
 * wiring's response (the response as the strings drive it, R(f) relative
 * to 100 Hz, `measureResponseDb`, with the resonant peak of
 * `measureResonance` read from the same curve), computed here with the
 * knobs' circuit. `drive` is the reference phrase's coil drive
 * (`measureCoilDrive` in src/analysis, plain numbers that can travel in the
 * page's data); without it the curve is the power sum (D = I). The one place
 * to change what the plot shows.
 */
import { type CircuitOverrides, type CoilDrive, logSpacedFrequencies, measureResonance, measureResponseDb, prepareCircuit, AUDIO_BAND_HIGH_HZ, AUDIO_BAND_LOW_HZ } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';

/** Points of a plotted curve (log-spaced over the audio band; the render's report uses the same count), plus the resonant peak's own point. */
export const CURVE_POINTS = 96;

export interface ResponseCurve {
  readonly frequenciesHz: readonly number[];
  readonly responseDb: readonly number[];
  readonly peakHz: number | null;
  readonly peakDb: number | null;
}

export function responseCurve(guitar: Guitar, overrides: CircuitOverrides, network: Network, drive?: CoilDrive): ResponseCurve {
  const grid = logSpacedFrequencies(AUDIO_BAND_LOW_HZ, AUDIO_BAND_HIGH_HZ, CURVE_POINTS);
  const circuit = prepareCircuit(guitar, grid, overrides);
  const response = measureResponseDb(circuit, network, drive);
  const resonance = measureResonance(circuit, network, drive === undefined ? {} : { drive });
  const frequenciesHz = Array.from(grid);
  const responseDb = response ? Array.from(response) : [];
  const peakHz = resonance.resonanceHz;
  const peakDb = peakHz === null ? null : resonance.peakDb;
  // The refined peak lies between grid points; drawn as a point of its own it keeps the dot on the curve
  // however sharp the peak (a straight chord between grid points can cut a sharp peak by most of a decibel).
  if (peakHz !== null && peakDb !== null && responseDb.length === frequenciesHz.length) {
    const at = frequenciesHz.findIndex((hz) => hz >= peakHz);
    if (at > 0 && frequenciesHz[at] !== peakHz) {
      frequenciesHz.splice(at, 0, peakHz);
      responseDb.splice(at, 0, peakDb);
    }
  }
  return { frequenciesHz, responseDb, peakHz, peakDb };
}
