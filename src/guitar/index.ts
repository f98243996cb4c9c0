export type {
  Amp,
  Cable,
  Coil,
  CoilConstruction,
  Controls,
  Guitar,
  MagnetPole,
  OpenString,
  Pickup,
  Pot,
  Taper,
  ToneControl,
  TrebleBleed,
  TurnsSource,
  Winding,
  WiringElement,
} from './guitar.js';
export { CONSTRUCTION_DEFAULTS, eddyResistanceFromCorner, turnsFromInductance } from './coil-construction.js';
export type { ConstructionDefaults } from './coil-construction.js';
export { coilPositionAt } from './guitar.js';
export { parseGuitar, parseGuitarText, MAX_WIRING_ELEMENTS } from './parse-guitar.js';
export { parseJsonText, lineAndColumn } from './parse-json.js';
export { renderGuitarSchema, SCHEMA_PATH } from './json-schema.js';
export { GUITAR_SPEC, listDefaults, STANDARD_TUNING, KNOB_MIN, KNOB_MAX, CABLE_CAPACITANCE_MIN_F, CABLE_CAPACITANCE_MAX_F } from './guitar-spec.js';
export { slugify } from './slugify.js';
