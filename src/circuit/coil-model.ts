/**
 * The coil as a circuit element, in one place for every solver and netlist
 * (docs/physics.md §1.1 and §1.6):
 *
 *   start ─ EMF ─ L·(1−κ) ─ [κ·L ∥ Re] ─ R ─ finish,   C and Rp from start to finish
 *
 * - series branch Z_s(ω) = R + jωL(1−κ) + (jωκL ∥ Re): the winding resistance,
 *   the inductance, and an eddy-current branch that takes the share κ of the
 *   inductance away above the corner ω_e = Re/(κL) and turns it into loss
 *   (a shorted secondary reflected into the winding: jωL1 + ω²M²/(R2 + jωL2)
 *   = jωL1(1−k²) + (jωL1k² ∥ R2·L1k²/L2), standard transformer algebra);
 * - shunt admittance Y_p(ω) = jωC + 1/Rp: the self-capacitance and a parallel
 *   loss resistance Rp (none: 1/Rp = 0).
 *
 * Seen from its leads the coil is a Thevenin source: open-circuit voltage
 * k·EMF with k = 1/(1 + Z_s·Y_p) (divider of Z_s into 1/Y_p) and impedance
 * Z = Z_s ∥ 1/Y_p = Z_s·k.
 */
import type { Coil } from '../guitar/index.js';

/** The parts of a coil's model at one angular frequency (all complex values as re/im pairs). */
export interface CoilPhasors {
  seriesRe: number;
  seriesIm: number;
  shuntRe: number;
  shuntIm: number;
  sourceRe: number;
  sourceIm: number;
  impedanceRe: number;
  impedanceIm: number;
}

/** The element values of a coil's model, SI units (what `coilModelOf` reads from a guitar's coil). */
export interface CoilModel {
  readonly resistanceOhms: number;
  readonly inductanceH: number;
  readonly capacitanceF: number;
  /** Parallel loss resistance across the leads; null for none. */
  readonly lossResistanceOhms: number | null;
  /** Share κ of L in the eddy branch, 0 ≤ κ < 1. */
  readonly eddyShare: number;
  /** Resistance Re of the eddy branch (ignored when κ = 0). */
  readonly eddyResistanceOhms: number;
}

export function createCoilPhasors(): CoilPhasors {
  return { seriesRe: 0, seriesIm: 0, shuntRe: 0, shuntIm: 0, sourceRe: 0, sourceIm: 0, impedanceRe: 0, impedanceIm: 0 };
}

/** The model values of a guitar's coil. */
export function coilModelOf(coil: Coil): CoilModel {
  return coil;
}

/** Z_s(ω) = R + jωL(1−κ) + (jωκL ∥ Re), written into target.series*. */
export function coilSeriesImpedance(coil: CoilModel, omega: number, target: CoilPhasors): void {
  const kappa = coil.eddyShare;
  let re = coil.resistanceOhms;
  let im = omega * coil.inductanceH * (1 - kappa);
  if (kappa > 0) {
    // jωκL ∥ Re = (a²·Re + j·a·Re²)/(Re² + a²) with a = ωκL
    const a = omega * kappa * coil.inductanceH;
    const r = coil.eddyResistanceOhms;
    const norm = r * r + a * a;
    if (norm > 0) {
      re += (a * a * r) / norm;
      im += (a * r * r) / norm;
    }
  }
  target.seriesRe = re;
  target.seriesIm = im;
}

/** Every part of the coil's model at angular frequency ω (rad/s), written into `target`. */
export function evaluateCoil(coil: CoilModel, omega: number, target: CoilPhasors): CoilPhasors {
  coilSeriesImpedance(coil, omega, target);
  const yr = coil.lossResistanceOhms === null ? 0 : 1 / coil.lossResistanceOhms;
  const yi = omega * coil.capacitanceF;
  target.shuntRe = yr;
  target.shuntIm = yi;
  // k = 1/(1 + Z_s·Y_p)
  const sr = target.seriesRe;
  const si = target.seriesIm;
  const dr = 1 + sr * yr - si * yi;
  const di = sr * yi + si * yr;
  const norm = dr * dr + di * di;
  const kr = dr / norm;
  const ki = -di / norm;
  target.sourceRe = kr;
  target.sourceIm = ki;
  // Z = Z_s·k
  target.impedanceRe = sr * kr - si * ki;
  target.impedanceIm = sr * ki + si * kr;
  return target;
}

/** The coil's impedance seen at its leads at frequency f (Hz), as [re, im] (for fits and sweeps). */
export function coilImpedanceAt(coil: CoilModel, frequencyHz: number): [number, number] {
  const phasors = evaluateCoil(coil, 2 * Math.PI * frequencyHz, createCoilPhasors());
  return [phasors.impedanceRe, phasors.impedanceIm];
}
