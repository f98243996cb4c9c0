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
 * quoted by Koch [P61]; 2.5 H within the 2.2–3 H of §1.3); small eddy share,
 * high corner (alnico rods conduct poorly; from memory).
 * Steel-pole coil over a bar magnet (one coil of a humbucker): 5000 turns at
 * 2.3 H (from memory; two in series ≈ 4.7 H, common practice, §1.3); eddy
 * share 0.4 (40–50 % of L from core and eddy effects, from memory, §1.3),
 * corner 3 kHz (from memory).
 */
export const CONSTRUCTION_DEFAULTS: Readonly<Record<CoilConstruction, ConstructionDefaults>> = Object.freeze({
  'rod magnets': Object.freeze({
    nominalTurns: 8000,
    nominalInductanceH: 2.5,
    eddyShare: 0.15,
    eddyCornerHz: 8000,
    source: 'turns: Koch [P61]; losses: from memory',
  }),
  'steel poles': Object.freeze({
    nominalTurns: 5000,
    nominalInductanceH: 2.3,
    eddyShare: 0.4,
    eddyCornerHz: 3000,
    source: 'from memory (docs/physics.md §1.3)',
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
