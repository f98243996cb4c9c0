/**
 * Defaults by coil construction: nominal turns and inductance (the reference
 * for turns derived from inductance and for relative sensitivity) and the
 * eddy-current loss branch (docs/physics.md §1.6).
 */
import type { CoilConstruction } from './guitar.js';

export interface ConstructionDefaults {
  /** Turns of a nominal coil of this construction. */
  readonly nominalTurns: number;
  /** Inductance of that nominal coil, henries. */
  readonly nominalInductanceH: number;
  /** Share κ of the inductance lost to eddy currents at high frequency. */
  readonly eddyShare: number;
  /** Corner frequency of the eddy branch f_e = Re/(2π·κ·L), hertz. */
  readonly eddyCornerHz: number;
  /** Where these values come from. */
  readonly source: string;
}

/**
 * Rod-magnet single coil: 8000 turns at 2.5 H (turns within the 7000–10 000
 * quoted by Koch [P61]; 2.5 H within the 2.2–3 H of §1.3). Steel-pole coil
 * over a bar magnet (one coil of a humbucker): 5000 turns at 2.3 H (from
 * memory; two in series ≈ 4.7 H, common practice, §1.3).
 * Eddy branch (share κ, corner f_e): fitted to published exciter-coil
 * measurements of real pickups (strayr/pickupAnalyseR-data; test/data/published/,
 * docs/physics.md §1.6), DC resistance held at its measured value, both loads
 * fitted together and rounded to two figures — rod magnets from a bridge
 * single coil on rod magnets with a steel base plate (κ 0.232, f_e 1275 Hz),
 * steel poles from a humbucker (κ 0.320, f_e 2608 Hz). One pickup each; a
 * single coil without a base plate probably loses less (from memory).
 */
export const CONSTRUCTION_DEFAULTS: Readonly<Record<CoilConstruction, ConstructionDefaults>> = Object.freeze({
  'rod magnets': Object.freeze({
    nominalTurns: 8000,
    nominalInductanceH: 2.5,
    eddyShare: 0.23,
    eddyCornerHz: 1300,
    source: 'turns: Koch [P61]; losses: fitted to a published measurement (docs/physics.md §1.6)',
  }),
  'steel poles': Object.freeze({
    nominalTurns: 5000,
    nominalInductanceH: 2.3,
    eddyShare: 0.32,
    eddyCornerHz: 2600,
    source: 'turns: from memory (docs/physics.md §1.3); losses: fitted to a published measurement (docs/physics.md §1.6)',
  }),
});

/** Turns derived from inductance for a coil of known construction: N = N0·√(L/L0) (L ∝ N² for one bobbin and core, docs/physics.md §1.6). */
export function turnsFromInductance(inductanceH: number, construction: CoilConstruction): number {
  const nominal = CONSTRUCTION_DEFAULTS[construction];
  return nominal.nominalTurns * Math.sqrt(inductanceH / nominal.nominalInductanceH);
}

/** Eddy-branch resistance from its corner frequency: Re = 2π·f_e·κ·L (the branch κL ∥ Re turns over at f_e). */
export function eddyResistanceFromCorner(cornerHz: number, eddyShare: number, inductanceH: number): number {
  return 2 * Math.PI * cornerHz * eddyShare * inductanceH;
}
