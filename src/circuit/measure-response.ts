/**
 * A wiring's response for plots (the listening page's overlay): the power
 * sum in dB relative to its value at 100 Hz, on the prepared grid.
 */
import type { Network } from '../wiring/index.js';
import { amplitudeDb } from './decibels.js';
import { REFERENCE_FREQUENCY_HZ } from './frequency-grid.js';
import { powerSumAt, solvePowerSumAt, solvePowerSumAtFixed } from './power-sum.js';
import type { PreparedCircuit } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';


/**
 * 20·log10(P(f)/P(100 Hz)) at every grid frequency, or null when nothing
 * reaches the output (volume at 0), so no −Infinity ever appears.
 */
export function measureResponseDb(
  prepared: PreparedCircuit,
  network: Network,
  transfers?: readonly Float64Array[],
): Float64Array | null {
  if (prepared.load.silent) return null;
  const solved = transfers ?? solveTransfers(prepared, network);
  const reference = solvePowerSumAtFixed(prepared, network, REFERENCE_FREQUENCY_HZ);
  const count = prepared.frequenciesHz.length;
  const result = new Float64Array(count);
  for (let k = 0; k < count; k += 1) {
    result[k] = amplitudeDb(powerSumAt(solved, k) / reference);
  }
  return result;
}
