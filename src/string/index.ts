export { renderPhrase, planPhrase, checkPhraseFits, checkPhraseFitsGuitar, FULL_PLUCK_DISPLACEMENT_M } from './render-phrase.js';
export type { StringRender } from './render-phrase.js';
export type { Phrase, PhraseNote } from './phrase.js';
export { MAX_FRET, MAX_PHRASE_TIME_S } from './phrase.js';
export { builtInPhrase, BUILT_IN_PHRASES } from './built-in-phrase.js';
export type { BuiltInPhraseName } from './built-in-phrase.js';
export { parsePhrase, MAX_PHRASE_NOTES } from './parse-phrase.js';
export {
  DEFAULT_STRING_OPTIONS,
  resolveStringOptions,
  t60ByPitchS,
  T60_AT_LOW_E_S,
  T60_AT_HIGH_E_S,
  MAX_INHARMONICITY,
} from './string-options.js';
export {
  TYPICAL_INHARMONICITY,
  TYPICAL_STRING_SET,
  TYPICAL_STRING_SET_SCALE_M,
  STEEL_YOUNGS_MODULUS_PA,
  STEEL_DENSITY_KG_PER_M3,
  typicalInharmonicity,
  stiffStringInharmonicity,
  stringMassPerLength,
  stringTension,
} from './typical-string-set.js';
export type { StringWire } from './typical-string-set.js';
export type { StringOptions, ResolvedStringOptions } from './string-options.js';
export { designStringLoop, T60_LEVEL } from './design-string-loop.js';
export type { StringLoop, StringLoopRequest } from './design-string-loop.js';
export { runStringLoop } from './run-string-loop.js';
export type { StringVoice } from './run-string-loop.js';
export { renderExcitation } from './render-excitation.js';
export type { ExcitationRequest, PickDirection, PluckShape } from './render-excitation.js';
export { dampingFilterGain, dampingFilterPhaseDelay, stretchForBrightness, PLAIN_KARPLUS_STRONG_STRETCH } from './damping-filter.js';
export { allpassCoefficient, allpassPhaseDelay, MIN_ALLPASS_DELAY } from './tuning-allpass.js';
export { designDispersionAllpass, partialRatio, NO_DISPERSION, DISPERSION_SECTIONS, DISPERSION_FIT_MAX_HZ, DISPERSION_FIT_MAX_PARTIAL, DISPERSION_FIT_TOLERANCE_CENTS } from './dispersion-allpass.js';
export type { DispersionAllpass } from './dispersion-allpass.js';
