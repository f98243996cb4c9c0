export type {
  Amp,
  Cable,
  Coil,
  Controls,
  Guitar,
  MagnetPole,
  OpenString,
  Pickup,
  Pot,
  Taper,
  ToneControl,
  TrebleBleed,
  Winding,
  WiringElement,
} from './guitar.js';
export { coilPositionAt } from './guitar.js';
export { parseGuitar, parseGuitarText, MAX_WIRING_ELEMENTS, wiringCountFor } from './parse-guitar.js';
export { MAX_JSON_CHARACTERS, MAX_JSON_DEPTH, parseJsonText, lineAndColumn } from './parse-json.js';
export { renderGuitarSchema, SCHEMA_PATH } from './json-schema.js';
export { GUITAR_SPEC, listDefaults, STANDARD_TUNING, KNOB_MIN, KNOB_MAX } from './guitar-spec.js';
export { slugify } from './slugify.js';
