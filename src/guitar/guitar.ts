/**
 * The validated guitar: every value in SI units, every default filled in,
 * every cross-reference resolved. Produced by `parseGuitar`; read by the rest
 * of the core.
 */

/** Winding sense seen from the top. */
export type Winding = 'cw' | 'ccw';
/** Magnet pole facing the strings. */
export type MagnetPole = 'north' | 'south';
/** Pot taper. */
export type Taper = 'audio' | 'linear';
/**
 * How a coil is built, which sets the defaults for its turns and losses
 * (docs/physics.md §1.6): "rod magnets" — the winding round magnet rods that
 * are the pole pieces (the usual single coil); "steel poles" — the winding
 * round steel pole pieces over a bar magnet (a humbucker's coil).
 */
export type CoilConstruction = 'rod magnets' | 'steel poles';
/** Where a coil's turns count came from: the file, or N ∝ √L from its inductance. */
export type TurnsSource = 'file' | 'inductance';

export interface Coil {
  readonly id: string;
  /** Declaration order, 0-based. */
  readonly index: number;
  /** Distance from the bridge saddle to the coil centre under the lowest string, metres. */
  readonly positionBassM: number;
  /** Same under the highest string (equal to the bass value for a straight coil), metres. */
  readonly positionTrebleM: number;
  readonly resistanceOhms: number;
  readonly inductanceH: number;
  /** Self-capacitance across the winding's leads, farads. */
  readonly capacitanceF: number;
  /** Width of the sensed strip of string, metres. */
  readonly apertureM: number;
  readonly winding: Winding;
  readonly magnet: MagnetPole;
  readonly construction: CoilConstruction;
  /** Turns of the winding: from the file, or derived from the inductance (`turnsSource`). */
  readonly turns: number;
  readonly turnsSource: TurnsSource;
  /**
   * Parallel loss resistance across the leads (core losses), ohms; null for
   * none (docs/physics.md §1.6).
   */
  readonly lossResistanceOhms: number | null;
  /** Share κ of the inductance that eddy currents take away at high frequency, 0 ≤ κ < 1 (§1.6). */
  readonly eddyShare: number;
  /** Resistance of the eddy-current branch, ohms: Re = 2π·f_e·κ·L for the corner frequency f_e (§1.6). */
  readonly eddyResistanceOhms: number;
  /** Relative string-signal sensitivity: the file's value, or turns / nominal turns of its construction. */
  readonly sensitivity: number;
  /** Relative sensitivity to a mains field (turns × area): the file's value, or turns / nominal turns. */
  readonly humSensitivity: number;
  /** True when `sensitivity` came from the file (a measured output), not from the turns. */
  readonly sensitivityGiven: boolean;
  /** Name of the pickup housing this coil, if any. */
  readonly pickup: string | undefined;
  readonly notes: string | undefined;
}

export interface Pickup {
  readonly name: string;
  /** 2: coils joined in series inside the cover, wired as one element; 4: every coil on its own leads. */
  readonly leads: 2 | 4;
  /** Coil indices in declaration order. */
  readonly coilIndices: readonly number[];
  /**
   * Magnetic coupling coefficient k between its coils (mutual inductance
   * M = k·√(L_a·L_b), sign from the windings; circuit/coil-coupling.ts).
   */
  readonly coupling: number;
}

/**
 * A thing the wiring enumeration places in a network: a coil on its own
 * leads, or a two-lead pickup whose coils are already joined in series with
 * their string signals in phase.
 */
export interface WiringElement {
  /** Name used in wiring expressions: the coil id, or the pickup name. */
  readonly id: string;
  /** Declaration order among elements, 0-based. */
  readonly index: number;
  readonly kind: 'coil' | 'two-lead pickup';
  /** Coils inside, in declaration order. */
  readonly coilIndices: readonly number[];
}

export interface OpenString {
  /** Position in the tuning list, 0 = lowest string. */
  readonly index: number;
  /** Trade numbering: 1 = highest (thinnest) string. */
  readonly number: number;
  readonly openHz: number;
  /** The note as written in the file, or its nearest equal-tempered name. */
  readonly name: string;
}

export interface Pot {
  readonly potOhms: number;
  /** Knob setting, 0 to 10. */
  readonly setting: number;
  readonly taper: Taper;
  /** Audio taper only: fraction of the track at setting 5. */
  readonly audioMidpoint: number;
}

export interface ToneControl extends Pot {
  readonly capacitorF: number;
}

export interface TrebleBleed {
  readonly capacitorF: number;
  readonly resistorOhms: number | undefined;
  readonly arrangement: 'parallel' | 'series';
}

export interface Controls {
  readonly volume: Pot;
  readonly tone: ToneControl | null;
  readonly trebleBleed: TrebleBleed | null;
}

export interface Cable {
  /** Total capacitance, farads. */
  readonly capacitanceF: number;
  /** When given as length × capacitance per metre. */
  readonly lengthM: number | undefined;
  readonly capacitancePerMetreF: number | undefined;
}

export interface Amp {
  readonly resistanceOhms: number;
  readonly capacitanceF: number;
}

export interface Guitar {
  readonly name: string;
  readonly notes: string | undefined;
  readonly scaleM: number;
  /** Lowest string first. */
  readonly strings: readonly OpenString[];
  readonly coils: readonly Coil[];
  readonly pickups: readonly Pickup[];
  /** What the wiring enumeration combines, in declaration order of their first coil. */
  readonly elements: readonly WiringElement[];
  readonly controls: Controls;
  readonly cable: Cable;
  readonly amp: Amp;
  /** Paths of fields that were missing and took their documented default ("coils[0].winding"). */
  readonly assumed: readonly string[];
}

/**
 * Distance from the bridge of a coil's centre under one string, metres.
 * A slanted coil is a straight line from its bass to its treble value, the
 * strings equally spaced across it (common practice: strings are evenly
 * spaced at the bridge).
 */
export function coilPositionAt(coil: Coil, stringIndex: number, stringCount: number): number {
  if (stringCount <= 1) return (coil.positionBassM + coil.positionTrebleM) / 2;
  const fraction = stringIndex / (stringCount - 1);
  return coil.positionBassM + (coil.positionTrebleM - coil.positionBassM) * fraction;
}
