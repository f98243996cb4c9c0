/**
 * Hum from a uniform mains field (docs/design.md, metrics; docs/physics.md §6).
 * Each coil picks up an EMF h_i·(field) from start to finish with the sign of
 * its winding; connected with c_i = p_i·w_i·m_i it enters the network with
 * sign c_i·w_i = p_i·m_i. Since T_i already carries p_i, the hum at the
 * output is H(f) = Σ_i m_i·h_i·T_i(f) per unit field.
 *
 * humDb = 20·log10(|H(mains)| / mean over the single-element wirings of |H|),
 * floored at HUM_FLOOR_DB so that perfect cancellation reads as a number, not
 * −Infinity.
 */
import type { Coil } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { amplitudeDb } from './decibels.js';
import { leaf } from '../wiring/index.js';
import { magnetSign } from './coil-signs.js';
import { type PreparedCircuit, fixedProbeAt, probeTransfers } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

/** Lowest humDb reported: −120 dB stands for "cancelled as far as the model can tell" (our floor, well below any audible residue). */
export const HUM_FLOOR_DB = -120;
/** A wiring is hum cancelling when humDb ≤ −20 (docs/design.md). */
export const HUM_CANCELLING_DB = -20;

/** |H| at grid index `index` of solved transfers. */
export function humMagnitudeAt(prepared: PreparedCircuit, transfers: readonly Float64Array[], index: number): number {
  let re = 0;
  let im = 0;
  const coils = prepared.guitar.coils;
  for (let c = 0; c < coils.length; c += 1) {
    const coil = coils[c] as Coil;
    const weight = magnetSign(coil.magnet) * coil.humSensitivity;
    const transfer = transfers[c] as Float64Array;
    re += weight * (transfer[2 * index] as number);
    im += weight * (transfer[2 * index + 1] as number);
  }
  return Math.hypot(re, im);
}

/** |H(mains)| of a wiring per unit field (the load's mains frequency), solved exactly at that frequency. */
export function measureHum(prepared: PreparedCircuit, network: Network): number {
  const probe = fixedProbeAt(prepared, prepared.load.mainsHz);
  return humMagnitudeAt(probe, solveTransfers(probe, network, probeTransfers(prepared)), 0);
}

/** The reference: mean |H(mains)| over the single-element wirings (each element alone, in phase). */
export function measureHumReference(prepared: PreparedCircuit): number {
  const elements = prepared.guitar.elements;
  let sum = 0;
  for (const element of elements) sum += measureHum(prepared, leaf(element.index));
  return sum / elements.length;
}

/** humDb from |H| and the reference, floored; a zero reference (no coil picks up hum) reads as the floor. */
export function humDecibels(hum: number, reference: number): number {
  if (!(reference > 0) || !(hum > 0)) return HUM_FLOOR_DB;
  return Math.max(HUM_FLOOR_DB, amplitudeDb(hum / reference));
}

export function isHumCancelling(humDb: number): boolean {
  return humDb <= HUM_CANCELLING_DB;
}
