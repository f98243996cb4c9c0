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
  integrateGatedLoudness,
  layoutGatingBlocks,
  HOPS_PER_GATING_BLOCK,
  DEFAULT_LOUDNESS_OPTIONS,
  LOUDNESS_FLOOR_LUFS,
  ABSOLUTE_GATE_LUFS,
  RELATIVE_GATE_LU,
  GATING_BLOCK_S,
  GATING_BLOCK_OVERLAP,
  LOUDNESS_OFFSET_DB,
} from './measure-loudness.js';
export type { GatingBlocks, LoudnessOptions } from './measure-loudness.js';
export { measureCentroid, DEFAULT_CENTROID_OPTIONS, SILENCE_CENTROID_HZ } from './measure-centroid.js';
export type { CentroidOptions, HannWindowKind } from './measure-centroid.js';
export { measureEnergy, measureLevelDb, LEVEL_FLOOR_DB } from './measure-energy.js';
export { erbBandwidthHz, erbNumber, erbNumberToHz } from './erb-scale.js';
export { designBands, resolveBandOptions, DEFAULT_BAND_OPTIONS } from './design-bands.js';
export type { Band, BandLayout, BandOptions, BandSegment } from './design-bands.js';
export { designExcitationSpread, roexWeight } from './design-excitation-spread.js';
export type { ExcitationSpread } from './design-excitation-spread.js';
export { measureCrossSpectra, pairIndex } from './measure-cross-spectra.js';
export type { CrossSpectra } from './measure-cross-spectra.js';
export { measureCoilDrive, SMOOTHING_ERB } from './measure-coil-drive.js';
export { measureSpectralBasis, spectralBasisFftSize, DEFAULT_SPECTRAL_BASIS_OPTIONS, REFERENCE_TAIL_S } from './measure-spectral-basis.js';
export type { SpectralBasis, SpectralBasisOptions } from './measure-spectral-basis.js';
export { solveWiringSpectra, solveWiringSpectraSteps, prepareWiringSpectra, energyLevelDb } from './solve-wiring-spectra.js';
export type { WiringSpectra, WiringSpectraSolver, WiringSpectrumFigures } from './solve-wiring-spectra.js';
export { resolveAlikeThresholds, DEFAULT_ALIKE_THRESHOLDS } from './alike-thresholds.js';
export type { AlikeThresholds } from './alike-thresholds.js';
export { measureSpectralProfiles, SPECIFIC_LOUDNESS_EXPONENT, DYNAMIC_RANGE_DB } from './measure-spectral-profiles.js';
export type { SpectralProfiles } from './measure-spectral-profiles.js';
export { measureWiringDifference, measureWiringDistance, measureSpectrumDistance, distanceLowerBound } from './measure-wiring-difference.js';
export type { WiringDifference } from './measure-wiring-difference.js';
export { groupAlikeWirings, groupAlikeWiringsSteps, MAX_SPREAD_MEMBERS } from './group-alike-wirings.js';
export type { WiringGroup, WiringGroups } from './group-alike-wirings.js';
export { solveMaxMinSubset, DEFAULT_MAX_MIN_SUBSET_OPTIONS } from './solve-max-min-subset.js';
export type { MaxMinSubsetOptions, MaxMinSubsetProblem, MaxMinSubsetResult } from './solve-max-min-subset.js';
export { solveShortlist } from './solve-shortlist.js';
export type { Shortlist, ShortlistRequest, ShortlistWiring } from './solve-shortlist.js';
export { matchElements, matchWirings } from './match-wirings.js';
export { measureComparison, RESONANCE_CHANGE_PERCENT } from './measure-comparison.js';
export type { ComparisonOptions, ComparisonSet, FigurePair, WiringComparison } from './measure-comparison.js';
export { measureDistinctness, measureDistinctnessSteps } from './measure-distinctness.js';
export type { DistinctGroups, Distinctness, DistinctnessOptions } from './measure-distinctness.js';
export { measureGuitarComparison } from './measure-guitar-comparison.js';
export type { ComparedGuitar, GuitarComparison, GuitarComparisonOptions } from './measure-guitar-comparison.js';
export { measureWiringFigures } from './measure-wiring-figures.js';
export type { WiringFigures, WiringFiguresOptions, WiringFiguresStep } from './measure-wiring-figures.js';
export { prepareAudioFigures, measureFiguresByClass, measureClassInto, phaseClassesOf, designFigureGrid, GRID_POINTS_PER_OCTAVE, GRID_LOWEST_HZ, BLOCK_PADDING_S } from './measure-audio-figures.js';
export type { AudioFigureMeter, CoilRecording, RawAudioFigures } from './measure-audio-figures.js';
