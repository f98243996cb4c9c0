/**
 * The default strings: a six-string electric set of 0.010–0.046 in gauges
 * (plain E4 B3 G3, nickel-plated steel wound D3 A2 E2 on a steel core) and
 * the inharmonicity coefficient B each one has, derived from its wire.
 *
 * Stiffness (H. Fletcher, "Normal vibration frequencies of a stiff piano
 * string", J. Acoust. Soc. Am. 36(1), 203–209, 1964; N. H. Fletcher,
 * T. D. Rossing, *The Physics of Musical Instruments*, 2nd ed., Springer
 * 1998, §2.18):
 *
 *   f_n = n·f0·√(1 + B·n²),   B = π³·E·d⁴ / (64·T·L²)                    (1)
 *
 * with E Young's modulus, d the diameter of the wire that bends (for a wound
 * string its core: the wrap adds mass but, being a loose helix, almost no
 * bending stiffness — Fletcher 1964 §III), T the tension and L the vibrating
 * length. The tension follows from the string's mass per length μ and its
 * pitch (Mersenne's law, Fletcher & Rossing §2.2):
 *
 *   T = μ·(2·L·f0)²                                                       (2)
 *
 * and μ from the wire: a plain string μ = ρ·π·d²/4; a round wrap of
 * diameter w = (D − d)/2 close-wound on the core adds one turn per w of
 * length, each π·(d + w) long with section π·w²/4 (derived):
 *
 *   μ = ρ·π·d²/4 + ρ·π²·(d + w)·w/4                                        (3)
 *
 * So B needs only the gauges, the core diameters and the steel's E and ρ.
 * For a plain string (2) and (3) in (1) give B = π²·E·d²/(64·ρ·L⁴·f0²)
 * (derived). The tensions (2) and (3) give for this set — 72.6, 68.9,
 * 74.2, 82.5, 86.7 and 78.6 N from E4 down, 15.5 to 19.5 lbf — are what
 * string makers' charts list for such a set (from memory), a check on the
 * core diameters. The resulting B, lowest first: 1.28·10⁻⁴, 7.26·10⁻⁵,
 * 4.47·10⁻⁵, 1.08·10⁻⁴, 3.98·10⁻⁵, 1.32·10⁻⁵.
 *
 * Measured values could not be consulted: H. Fastl, F. Völk, "Inharmonicity
 * of sounds from electric guitars: physical flaw or musical asset?" (Proc.
 * 12th Int. Conf. Music Perception and Cognition, Thessaloniki 2012; venue
 * from memory) measured electric guitar strings, and only their abstract was
 * read: the low wound strings (E2, A2) have more inharmonicity than the high
 * E4, it grows with the core's diameter, and a plain G3 can have more than a
 * wound D3. The derived values agree with each of those statements (a test
 * checks it); A. J. M. Houtsma, "Inharmonicity of wound guitar strings",
 * J. Guitar Acoustics 6, 60–64, 1982, adds that an old, stretched wound
 * string has more than a new one, so these are values for new strings.
 */

/** Metres per inch (exact, by definition of the inch). */
const METRES_PER_INCH = 0.0254;
/** Young's modulus of steel music wire, Pa (from memory: 200–210 GPa in materials handbooks). */
export const STEEL_YOUNGS_MODULUS_PA = 200e9;
/** Density of steel, kg/m³ (from memory: carbon steel 7850; the nickel-plated steel wrap is taken the same). */
export const STEEL_DENSITY_KG_PER_M3 = 7850;

export interface StringWire {
  /** Open-string pitch, Hz (ISO 16 equal temperament, A4 = 440 Hz). */
  readonly openHz: number;
  /** Outside diameter (the gauge), metres. */
  readonly gaugeM: number;
  /** Diameter of the wire that bends: the whole string when plain, the core when wound, metres. */
  readonly coreM: number;
}

/**
 * A 0.010–0.046 in set, lowest first (common practice: the gauges of the
 * most common electric set). Wound cores 0.018, 0.016 and 0.014 in (from
 * memory: hexagonal cores of nickel-wound sets; checked by the tensions
 * they give, above).
 */
export const TYPICAL_STRING_SET: readonly StringWire[] = Object.freeze(
  [
    { openHz: 82.4069, gauge: 0.046, core: 0.018 },
    { openHz: 110.0, gauge: 0.036, core: 0.016 },
    { openHz: 146.8324, gauge: 0.026, core: 0.014 },
    { openHz: 195.9977, gauge: 0.017, core: 0.017 },
    { openHz: 246.9417, gauge: 0.013, core: 0.013 },
    { openHz: 329.6276, gauge: 0.01, core: 0.01 },
  ].map(({ openHz, gauge, core }) => Object.freeze({ openHz, gaugeM: gauge * METRES_PER_INCH, coreM: core * METRES_PER_INCH })),
);

/** Scale length the set is tuned on, metres (common practice: 25.5 in, 647.7 mm, rounded). */
export const TYPICAL_STRING_SET_SCALE_M = 0.648;

/** Mass per length of a string, kg/m: equation (3). */
export function stringMassPerLength(wire: StringWire, densityKgPerM3: number = STEEL_DENSITY_KG_PER_M3): number {
  const core = (densityKgPerM3 * Math.PI * wire.coreM ** 2) / 4;
  const wrapM = (wire.gaugeM - wire.coreM) / 2;
  return core + (densityKgPerM3 * Math.PI ** 2 * (wire.coreM + wrapM) * wrapM) / 4;
}

/** Tension of a string tuned to its open pitch on a scale of `lengthM`, newtons: equation (2). */
export function stringTension(wire: StringWire, lengthM: number, densityKgPerM3: number = STEEL_DENSITY_KG_PER_M3): number {
  return stringMassPerLength(wire, densityKgPerM3) * (2 * lengthM * wire.openHz) ** 2;
}

/** Inharmonicity B = π³·E·d⁴/(64·T·L²): equation (1). */
export function stiffStringInharmonicity(youngsModulusPa: number, coreM: number, tensionN: number, lengthM: number): number {
  return (Math.PI ** 3 * youngsModulusPa * coreM ** 4) / (64 * tensionN * lengthM ** 2);
}

/** B of a wire of the set tuned to `openHz` on a scale of `scaleM`: (1) with (2) and (3). */
function wireInharmonicity(wire: StringWire, openHz: number, scaleM: number): number {
  const tensionN = stringTension({ ...wire, openHz }, scaleM);
  return stiffStringInharmonicity(STEEL_YOUNGS_MODULUS_PA, wire.coreM, tensionN, scaleM);
}

/** B of each string of the typical set at its own pitch on its own scale, lowest first. */
export const TYPICAL_INHARMONICITY: readonly { readonly openHz: number; readonly b: number }[] = Object.freeze(
  TYPICAL_STRING_SET.map((wire) => Object.freeze({ openHz: wire.openHz, b: wireInharmonicity(wire, wire.openHz, TYPICAL_STRING_SET_SCALE_M) })),
);

/**
 * B of an open string at `openHz` on a scale of `scaleM`: the set's string of the nearest open pitch (in
 * log frequency), tuned to `openHz` on that scale. With (2) the tension grows as (L·f0)², so the same
 * wire's B falls as 1/(L⁴·f0²) (derived): a 24.75 in scale gives 1.13 times the 25.5 in value.
 */
export function typicalInharmonicity(openHz: number, scaleM: number): number {
  let best: StringWire | undefined;
  for (const wire of TYPICAL_STRING_SET) {
    if (best === undefined || Math.abs(Math.log(wire.openHz / openHz)) < Math.abs(Math.log(best.openHz / openHz))) best = wire;
  }
  return best === undefined ? 0 : wireInharmonicity(best, openHz, scaleM);
}
