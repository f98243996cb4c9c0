/** Frequency grids and the audio band the metrics look at. */

/** The band metrics look at: 20 Hz to 20 kHz (docs/design.md, metrics). */
export const AUDIO_BAND_LOW_HZ = 20;
export const AUDIO_BAND_HIGH_HZ = 20_000;
/** Reference frequency for peak heights and response curves (docs/design.md: "relative to … 100 Hz"). */
export const REFERENCE_FREQUENCY_HZ = 100;
/** Points of the grid `analyze` solves on before refining peaks (200 log-spaced points, as the bench measures). */
export const ANALYSIS_POINTS = 200;

/** `count` log-spaced frequencies from `lowHz` to `highHz` inclusive: f_k = low·(high/low)^(k/(count − 1)). */
export function logSpacedFrequencies(lowHz: number, highHz: number, count: number): Float64Array {
  if (!(lowHz > 0) || !(highHz > lowHz) || !Number.isInteger(count) || count < 2) {
    throw new RangeError(`logSpacedFrequencies: need 0 < low < high and count ≥ 2, got ${lowHz}, ${highHz}, ${count}`);
  }
  const grid = new Float64Array(count);
  const ratio = Math.log(highHz / lowHz);
  for (let k = 0; k < count; k += 1) grid[k] = lowHz * Math.exp((ratio * k) / (count - 1));
  grid[count - 1] = highHz;
  return grid;
}

/** The grid `analyze` uses: 200 log-spaced points over 20 Hz–20 kHz. */
export function analysisFrequencies(count: number = ANALYSIS_POINTS): Float64Array {
  return logSpacedFrequencies(AUDIO_BAND_LOW_HZ, AUDIO_BAND_HIGH_HZ, count);
}
