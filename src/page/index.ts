export type { ComparisonPageData, PageCoilDrive, PageCoilSignals, PageData, PageHum, PageSound } from './page-data.js';
export { encodeSignal, decodeSignal, encodeCoilDrive, decodeCoilDrive } from './page-data.js';
export {
  brightnessScale,
  describePeak,
  formatDb,
  formatHumDb,
  formatHz,
  humVerdict,
  topologyInWords,
  HUM_CANCELLING_DB,
  HUM_PARTLY_CANCELLING_DB,
  HUM_VERDICT_WORDS,
} from './page-words.js';
export type { BrightnessScale, HumVerdict } from './page-words.js';
export { binomialTailProbability, loopsByDefault, playbackGainDb, wrapPosition, MATCHED_LOUDNESS_LUFS, LOOP_BY_DEFAULT_MAX_S } from './page-math.js';
export { SUGGESTED_ROUNDS, LUCK_THRESHOLD } from './blind-test.js';
export { encodeWiringFigures, decodeWiringFigures, DB_DECIMALS, HZ_DECIMALS } from './wiring-figures.js';
export type { PageWiringFigures, WiringFigures } from './wiring-figures.js';
