export {
  parseQuantity,
  formatEngineering,
  QuantityError,
  QUANTITY_EXAMPLES,
  METRES_PER_INCH,
} from './parse-quantity.js';
export type { QuantityKind } from './parse-quantity.js';
export { formatCount } from './format-count.js';
export {
  midiToHz,
  hzToMidi,
  centsBetween,
  parseNoteName,
  noteName,
  A4_HZ,
  A4_MIDI,
  SEMITONES_PER_OCTAVE,
  CENTS_PER_SEMITONE,
} from './pitch.js';
