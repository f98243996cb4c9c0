export { applyBiquad } from './biquad.js';
export type { Biquad } from './biquad.js';
export {
  designKWeighting,
  resampleBiquad,
  BS1770_TABLE_RATE_HZ,
  BS1770_PRE_FILTER_48K,
  BS1770_RLB_FILTER_48K,
} from './k-weighting.js';
export {
  measureLoudness,
  DEFAULT_LOUDNESS_OPTIONS,
  LOUDNESS_FLOOR_LUFS,
  ABSOLUTE_GATE_LUFS,
  RELATIVE_GATE_LU,
  GATING_BLOCK_S,
  GATING_BLOCK_OVERLAP,
  LOUDNESS_OFFSET_DB,
} from './measure-loudness.js';
export type { LoudnessOptions } from './measure-loudness.js';
export { measureCentroid, DEFAULT_CENTROID_OPTIONS, SILENCE_CENTROID_HZ } from './measure-centroid.js';
export type { CentroidOptions, HannWindowKind } from './measure-centroid.js';
export { measureEnergy, measureLevelDb, LEVEL_FLOOR_DB } from './measure-energy.js';
