/**
 * The power sum √(Σ_i |T_i(f)|²) of a wiring's coil-to-output transfers
 * (docs/design.md, metrics): the curve whose shape the network's poles set,
 * whatever the coils' phases.
 */
import type { Network } from '../wiring/index.js';
import { type PreparedCircuit, fixedProbeAt, probeAt, probeTransfers } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

/** Power sum at grid index `index` of a set of transfers. */
export function powerSumAt(transfers: readonly Float64Array[], index: number): number {
  let sum = 0;
  const re = 2 * index;
  for (const transfer of transfers) {
    const r = transfer[re] as number;
    const i = transfer[re + 1] as number;
    sum += r * r + i * i;
  }
  return Math.sqrt(sum);
}

/** Power sum over the whole grid, written into `out` when given. */
export function solvePowerSum(transfers: readonly Float64Array[], frequencyCount: number, out?: Float64Array): Float64Array {
  const result = out ?? new Float64Array(frequencyCount);
  for (let k = 0; k < frequencyCount; k += 1) result[k] = powerSumAt(transfers, k);
  return result;
}

/** Power sum at any frequency, solved exactly there (not interpolated). */
export function solvePowerSumAt(prepared: PreparedCircuit, network: Network, frequencyHz: number): number {
  const probe = probeAt(prepared, frequencyHz);
  return powerSumAt(solveTransfers(probe, network, probeTransfers(prepared)), 0);
}

/** Power sum at a frequency used for every wiring (100 Hz), on a probe kept at that frequency. */
export function solvePowerSumAtFixed(prepared: PreparedCircuit, network: Network, frequencyHz: number): number {
  const probe = fixedProbeAt(prepared, frequencyHz);
  return powerSumAt(solveTransfers(probe, network, probeTransfers(prepared)), 0);
}
