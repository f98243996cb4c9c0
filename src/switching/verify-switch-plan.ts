/**
 * Every position of a plan checked by simulation: the circuit the lugs and
 * contacts make (plan-positions.ts) is solved by general nodal analysis
 * (circuit/solve-nodal.ts) and compared, coil by coil and frequency by
 * frequency, with the wanted wiring solved by the series–parallel engine
 * (circuit/solve-transfers.ts). Coils the wiring does not use must give
 * nothing. A position may realise the wiring with every coil reversed (the
 * same wiring in canonical form: the output is inverted, which is not
 * audible); the comparison then takes −T.
 */
import type { Guitar } from '../guitar/index.js';
import {
  type CircuitOverrides,
  AUDIO_BAND_HIGH_HZ,
  AUDIO_BAND_LOW_HZ,
  logSpacedFrequencies,
  prepareCircuit,
  solveNodalTransfers,
  solveTransfers,
} from '../circuit/index.js';
import { elementsOf } from '../wiring/index.js';
import type { PlanPosition } from './plan-positions.js';
import type { PositionWish } from './solve-switch-plan.js';

/** Frequencies checked: log-spaced over the audio band (our choice: 10 per third of an octave is far finer than any feature of a pickup circuit). */
export const VERIFY_POINTS = 301;
/** Tolerances of the check (an exact solve should agree to rounding; these are the published acceptance figures of the planner). */
export const VERIFY_TOLERANCE_DB = 0.001;
export const VERIFY_TOLERANCE_DEG = 0.01;
/** A coil's transfer counts as nothing below this fraction of the largest (float64 rounding of a 0 is far smaller). */
export const UNUSED_RELATIVE_LIMIT = 1e-12;

const DEGREES_PER_RADIAN = 180 / Math.PI;
const DB_PER_LOG10 = 20;

export interface PositionVerification {
  /** Kit position, 0-based. */
  readonly index: number;
  /** Largest level difference of a used coil's transfer, dB. */
  readonly maxDb: number;
  /** Largest phase difference, degrees. */
  readonly maxDeg: number;
  /** Largest transfer of a coil the wiring does not use, relative to the largest used one (0 for off). */
  readonly unusedRelative: number;
  /** The position gives the wiring with every coil reversed (inverted output). */
  readonly inverted: boolean;
  readonly passed: boolean;
}

function magnitude(array: Float64Array, i: number): number {
  return Math.hypot(array[i] as number, array[i + 1] as number);
}

/** Check each position that has a wished wiring or off. */
export function verifySwitchPlan(
  guitar: Guitar,
  positions: readonly PlanPosition[],
  wishes: readonly PositionWish[],
  overrides?: CircuitOverrides,
): PositionVerification[] {
  const frequencies = logSpacedFrequencies(AUDIO_BAND_LOW_HZ, AUDIO_BAND_HIGH_HZ, VERIFY_POINTS);
  const prepared = prepareCircuit(guitar, frequencies, overrides);
  const results: PositionVerification[] = [];
  wishes.forEach((wish, index) => {
    const position = positions[index];
    if (position === undefined || wish.kind === 'free') return;
    const nodal = solveNodalTransfers(prepared, position.circuit);
    const usedCoils = new Set<number>();
    let wanted: Float64Array[] | null = null;
    if (wish.kind === 'wiring') {
      wanted = solveTransfers(prepared, wish.network);
      for (const element of elementsOf(wish.network)) for (const coil of guitar.elements[element]?.coilIndices ?? []) usedCoils.add(coil);
    }
    let largest = 0;
    for (const array of wanted ?? []) for (let i = 0; i < array.length; i += 2) largest = Math.max(largest, magnitude(array, i));
    // Global sign: the one that brings the sums closer.
    let dot = 0;
    if (wanted) {
      for (const coil of usedCoils) {
        const a = nodal[coil] as Float64Array;
        const b = wanted[coil] as Float64Array;
        for (let i = 0; i < a.length; i += 2) dot += (a[i] as number) * (b[i] as number) + (a[i + 1] as number) * (b[i + 1] as number);
      }
    }
    const sign = dot < 0 ? -1 : 1;
    let maxDb = 0;
    let maxDeg = 0;
    let unused = 0;
    guitar.coils.forEach((_, coil) => {
      const a = nodal[coil] as Float64Array;
      if (!usedCoils.has(coil) || wanted === null) {
        for (let i = 0; i < a.length; i += 2) unused = Math.max(unused, magnitude(a, i));
        return;
      }
      const b = wanted[coil] as Float64Array;
      for (let i = 0; i < a.length; i += 2) {
        const ar = sign * (a[i] as number);
        const ai = sign * (a[i + 1] as number);
        const br = b[i] as number;
        const bi = b[i + 1] as number;
        // a/b = a·conj(b)/|b|²: its magnitude in dB and its angle.
        const qr = ar * br + ai * bi;
        const qi = ai * br - ar * bi;
        maxDb = Math.max(maxDb, Math.abs(DB_PER_LOG10 * Math.log10(Math.hypot(ar, ai) / Math.hypot(br, bi))));
        maxDeg = Math.max(maxDeg, Math.abs(Math.atan2(qi, qr) * DEGREES_PER_RADIAN));
      }
    });
    const unusedRelative = largest > 0 ? unused / largest : unused;
    results.push({
      index,
      maxDb,
      maxDeg,
      unusedRelative,
      inverted: sign < 0,
      passed: maxDb <= VERIFY_TOLERANCE_DB && maxDeg <= VERIFY_TOLERANCE_DEG && unusedRelative <= UNUSED_RELATIVE_LIMIT,
    });
  });
  return results;
}
