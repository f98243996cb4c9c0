/**
 * The curve the page plots for a wiring: whatever src/circuit exports as a
 * wiring's response (today the power-sum response relative to 100 Hz,
 * `measureResponseDb`, with the resonant peak of `measureResonance`),
 * computed here with the knobs' circuit. The one place to change what the
 * plot shows.
 */
import { type CircuitOverrides, logSpacedFrequencies, measureResonance, measureResponseDb, prepareCircuit, AUDIO_BAND_HIGH_HZ, AUDIO_BAND_LOW_HZ } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';

/** Points of a plotted curve (log-spaced over the audio band; the render's report uses the same count). */
export const CURVE_POINTS = 96;

export interface ResponseCurve {
  readonly frequenciesHz: readonly number[];
  readonly responseDb: readonly number[];
  readonly peakHz: number | null;
  readonly peakDb: number | null;
}

export function responseCurve(guitar: Guitar, overrides: CircuitOverrides, network: Network): ResponseCurve {
  const grid = logSpacedFrequencies(AUDIO_BAND_LOW_HZ, AUDIO_BAND_HIGH_HZ, CURVE_POINTS);
  const circuit = prepareCircuit(guitar, grid, overrides);
  const response = measureResponseDb(circuit, network);
  const resonance = measureResonance(circuit, network);
  return {
    frequenciesHz: Array.from(grid),
    responseDb: response ? Array.from(response) : [],
    peakHz: resonance.resonanceHz,
    peakDb: resonance.resonanceHz === null ? null : resonance.peakDb,
  };
}
