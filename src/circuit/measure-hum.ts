/**
 * Hum from a mains field with a gradient (docs/design.md, metrics;
 * docs/physics.md §6 and §6.1).
 *
 * Each coil picks up an EMF h_i·B(x_i) from start to finish with the sign of
 * its winding: h_i ∝ turns × area (the coil's humSensitivity) and B(x) the
 * field at its centre x_i along the strings, B(x) = exp(γ·(x − x̄)) with γ
 * the field's relative gradient (load.humGradientPerM) and x̄ the mean coil
 * position (so the field averages 1 over the guitar). Connected with
 * c_i = p_i·w_i·m_i the coil's hum enters the network with sign
 * c_i·w_i = p_i·m_i. Since T_i already carries p_i, the hum at the output is
 * H(f) = Σ_i m_i·h_i·B(x_i)·T_i(f) per unit field.
 *
 * humDb = 20·log10(|H(mains)| / reference), the reference being the mean |H|
 * of the single elements that do not cancel hum by themselves (a two-lead
 * humbucker must not lower it), floored at HUM_FLOOR_DB: the model cannot
 * honestly claim more rejection than that (turns matched to about 1 %, from
 * memory; §6: 1 % → 40 dB).
 */
import { type Coil, type Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { amplitudeDb } from './decibels.js';
import { leaf } from '../wiring/index.js';
import type { CircuitLoad } from './circuit-load.js';
import { magnetSign } from './coil-signs.js';
import { type PreparedCircuit, fixedProbeAt, probeTransfers } from './prepare-circuit.js';
import { solveTransfers } from './solve-transfers.js';

/**
 * Lowest humDb reported, dB: about what a 1 % turns mismatch leaves (§6), the
 * best match a winder holds (from memory). Deeper figures are printed as
 * "≤ −40", never as a number the model cannot stand behind.
 */
export const HUM_FLOOR_DB = -40;
/** A wiring cancels hum when humDb ≤ −20 (docs/design.md). */
export const HUM_CANCELLING_DB = -20;
/** A wiring reduces hum when humDb ≤ −6, half the hum amplitude or less (our own threshold). */
export const HUM_REDUCING_DB = -6;
/** An element counts as not cancelling hum by itself when it keeps more than this share of its coils' summed hum (half: −6 dB, as HUM_REDUCING_DB). */
const OWN_HUM_SHARE = 0.5;

/** Plain category of a hum figure. */
export type HumCategory = 'cancels' | 'reduces' | 'noisy';

/**
 * The two ways the field can change along the strings: growing towards the
 * neck (+1) or towards the bridge (−1). Which one a player meets depends on
 * where the amplifier, transformer or lamp stands, which a guitar file does
 * not say, so humDb is the worse of the two (`worseHumDb`): coils of unequal
 * hum sensitivity can cancel deeply in one field only because the gradient
 * happens to make up their mismatch, a rejection the player cannot count on.
 */
export const FIELD_DIRECTIONS: readonly (1 | -1)[] = Object.freeze([1, -1]);

/**
 * Each coil's hum weight m_i·h_i·B(x_i) for the load's field gradient:
 * B(x) = exp(d·γ·(x − x̄)), x_i the coil's centre (mean of its bass and treble
 * positions), x̄ the mean over the guitar's coils, d the field's direction
 * (FIELD_DIRECTIONS; default +1, the field the renders' hum mix uses).
 */
export function humFieldWeights(guitar: Guitar, load: Pick<CircuitLoad, 'humGradientPerM'>, direction: 1 | -1 = 1): Float64Array {
  const centres = guitar.coils.map((coil: Coil) => (coil.positionBassM + coil.positionTrebleM) / 2);
  const mean = centres.reduce((sum, x) => sum + x, 0) / Math.max(1, centres.length);
  return Float64Array.from(guitar.coils, (coil, c) => magnetSign(coil.magnet) * coil.humSensitivity * Math.exp(direction * load.humGradientPerM * ((centres[c] as number) - mean)));
}

/** Hum weights and reference for each field direction (FIELD_DIRECTIONS order). */
export interface HumFields {
  readonly weights: readonly Float64Array[];
  readonly references: readonly number[];
}

export function prepareHumFields(prepared: PreparedCircuit): HumFields {
  return {
    weights: FIELD_DIRECTIONS.map((direction) => humFieldWeights(prepared.guitar, prepared.load, direction)),
    references: FIELD_DIRECTIONS.map((direction) => measureHumReference(prepared, direction)),
  };
}

/**
 * humDb of a wiring whose coils' transfers at the mains frequency are
 * `transfers` (interleaved, T_i at 2i, 2i + 1, signs included): the worse
 * (higher) of the two field directions, each against its own reference.
 */
export function worseHumDb(fields: HumFields, transfers: Float64Array): number {
  let worst = -Infinity;
  fields.weights.forEach((weights, d) => {
    let re = 0;
    let im = 0;
    for (let c = 0; c < weights.length; c += 1) {
      re += (weights[c] as number) * (transfers[2 * c] as number);
      im += (weights[c] as number) * (transfers[2 * c + 1] as number);
    }
    worst = Math.max(worst, humDecibels(Math.hypot(re, im), fields.references[d] as number));
  });
  return worst;
}

/** |H| at grid index `index` of solved transfers, for hum weights from `humFieldWeights`. */
export function humMagnitudeAt(weights: Float64Array, transfers: readonly Float64Array[], index: number): number {
  let re = 0;
  let im = 0;
  for (let c = 0; c < weights.length; c += 1) {
    const weight = weights[c] as number;
    const transfer = transfers[c] as Float64Array;
    re += weight * (transfer[2 * index] as number);
    im += weight * (transfer[2 * index + 1] as number);
  }
  return Math.hypot(re, im);
}

/** Σ_i |w_i·T_i|: the hum the coils would give if none cancelled another. */
function summedHumAt(weights: Float64Array, transfers: readonly Float64Array[], index: number): number {
  let sum = 0;
  for (let c = 0; c < weights.length; c += 1) {
    const transfer = transfers[c] as Float64Array;
    sum += Math.abs(weights[c] as number) * Math.hypot(transfer[2 * index] as number, transfer[2 * index + 1] as number);
  }
  return sum;
}

/** |H(mains)| of a wiring per unit field (the load's mains frequency), solved exactly at that frequency. */
export function measureHum(prepared: PreparedCircuit, network: Network, direction: 1 | -1 = 1): number {
  const probe = fixedProbeAt(prepared, prepared.load.mainsHz);
  return humMagnitudeAt(humFieldWeights(prepared.guitar, prepared.load, direction), solveTransfers(probe, network, probeTransfers(prepared)), 0);
}

/**
 * The reference: mean |H(mains)| over the single elements that do not cancel
 * hum by themselves (every coil on its own leads; a two-lead pickup only when
 * it keeps more than half its coils' summed hum). When every element cancels
 * (a guitar of two-lead humbuckers only), one coil's worth of hum through each
 * element: Σ_i |w_i·T_i| / (coils in it), averaged.
 */
export function measureHumReference(prepared: PreparedCircuit, direction: 1 | -1 = 1): number {
  const probe = fixedProbeAt(prepared, prepared.load.mainsHz);
  const weights = humFieldWeights(prepared.guitar, prepared.load, direction);
  const buffers = probeTransfers(prepared);
  let sum = 0;
  let count = 0;
  let fallback = 0;
  for (const element of prepared.guitar.elements) {
    const transfers = solveTransfers(probe, leaf(element.index), buffers);
    const hum = humMagnitudeAt(weights, transfers, 0);
    const summed = summedHumAt(weights, transfers, 0);
    fallback += summed / element.coilIndices.length;
    if (element.kind === 'coil' || hum > OWN_HUM_SHARE * summed) {
      sum += hum;
      count += 1;
    }
  }
  const elements = prepared.guitar.elements.length;
  return count > 0 ? sum / count : fallback / Math.max(1, elements);
}

/** humDb from |H| and the reference, floored; a zero reference (no coil picks up hum) reads as the floor. */
export function humDecibels(hum: number, reference: number): number {
  if (!(reference > 0) || !(hum > 0)) return HUM_FLOOR_DB;
  return Math.max(HUM_FLOOR_DB, amplitudeDb(hum / reference));
}

/** Hum figures are printed to whole decibels (the model claims no finer); the category follows the printed figure, so "−20" never reads "reduces". */
const HUM_PRINTED_STEP_DB = 1;

/** Plain category of a hum figure, judged on the figure as printed (rounded to HUM_PRINTED_STEP_DB). */
export function humCategory(humDb: number): HumCategory {
  const printed = Math.round(humDb / HUM_PRINTED_STEP_DB) * HUM_PRINTED_STEP_DB;
  if (printed <= HUM_CANCELLING_DB) return 'cancels';
  return printed <= HUM_REDUCING_DB ? 'reduces' : 'noisy';
}

export function isHumCancelling(humDb: number): boolean {
  return humCategory(humDb) === 'cancels';
}
