export {
  encodeWav,
  pcmFullScale,
  quantizeSample,
  DEFAULT_WAV_OPTIONS,
  WAV_FORMATS,
  WAVE_FORMAT_PCM,
  WAVE_FORMAT_IEEE_FLOAT,
} from './wav-file.js';
export type { AudioChannels, WavFormat, WavInfo, WavOptions } from './wav-file.js';
export {
  writeFileAtomic,
  writeFileAtomicSync,
  removeStaleTempFiles,
  removePendingTempFilesSync,
  TEMP_FILE_PREFIX,
  STALE_TEMP_FILE_AGE_MS,
} from './write-file-atomic.js';
