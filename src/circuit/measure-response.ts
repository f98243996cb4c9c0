/**
 * A wiring's response for plots (the listening page's overlay): R(f), the
 * response as the strings drive it (driven-response.ts), in dB relative to
 * its value at 100 Hz, on the prepared grid. The same curve measureResonance
 * reads its peak from, so the resonance marker sits on it. Pure: runs in the
 * browser as well as in the CLI.
 */
import type { Network } from '../wiring/index.js';
import { type CoilDrive, incoherentCoilDrive } from './coil-drive.js';
import { amplitudeDb } from './decibels.js';
import { type DrivenResponseInputs, solveDrivenResponse } from './driven-response.js';
import type { PreparedCircuit } from './prepare-circuit.js';

/** Lowest value of a plotted response, dB: a cancellation notch is drawn down to here, not to −Infinity (a plot's floor, common practice). */
export const RESPONSE_FLOOR_DB = -100;

/**
 * 20·log10(R(f)/R(100 Hz)) at every grid frequency, or null when nothing
 * reaches the output (volume at 0) or the coils cancel at 100 Hz, so no
 * ±Infinity ever appears. `drive` defaults to D = I (the power sum).
 */
export function measureResponseDb(
  prepared: PreparedCircuit,
  network: Network,
  drive: CoilDrive = incoherentCoilDrive(prepared.guitar.coils.length),
  inputs: DrivenResponseInputs = {},
): Float64Array | null {
  if (prepared.load.silent) return null;
  const response = solveDrivenResponse(prepared, network, drive, inputs);
  if (response.referenceCancelled) return null;
  // R(100 Hz) = 1 by construction; a point where the coils cancel exactly reads as the floor, never −Infinity
  return response.values.map((value) => (value > 0 ? Math.max(RESPONSE_FLOOR_DB, amplitudeDb(value)) : RESPONSE_FLOOR_DB));
}
