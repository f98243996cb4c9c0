export { renderEffectsChain, MIN_SAMPLE_RATE_HZ, MAX_SAMPLE_RATE_HZ } from './effects-chain.js';
export { CHAIN_NAMES, describeChain, isChainName, parseChainName } from './chain-name.js';
export type { ChainName } from './chain-name.js';
export { DEFAULT_CHAIN_OPTIONS, resolveChainOptions } from './chain-options.js';
export type { ChainOptions } from './chain-options.js';
export { designEffectsChain } from './chain-design.js';
export type { ChainDesign, ChainStage } from './chain-design.js';
export { measureChainResponse } from './chain-response.js';
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
  createDeferredSync,
  writeFileAtomic,
  writeFileAtomicSync,
  settleAtomicWrites,
  openFileAtomicSync,
  removeStaleTempFiles,
  removePendingTempFilesSync,
  TEMP_FILE_PREFIX,
  STALE_TEMP_FILE_AGE_MS,
} from './write-file-atomic.js';
export type { AtomicFileStream } from './write-file-atomic.js';
export type { DeferredSync } from './write-file-atomic.js';
export { type Pause, PAUSE_INTERVAL_MS, createPause, runStepsPausing } from './pause-for-signals.js';
export { defaultOutputRoot, outputFolder, wavFileName, netlistFileName } from './output-folder.js';
export { claimOutputFolder, ownNamesOf, releaseFolderLocksSync, FOLDER_MARKER, FOLDER_LOCK } from './folder-claim.js';
export type { ClaimRequest, FolderClaim, FolderPurpose } from './folder-claim.js';
export { guitarFolderName } from './folder-name.js';
export type { OutputFolder } from './output-folder.js';
export { renderGuitar, RENDER_MODEL_VERSION } from './render-guitar.js';
export { RESPONSE_POINTS } from './render-analysis.js';
export { removeScratchFoldersSync } from './scratch-folders.js';
export { writeJsonFileAtomicSync } from './write-json-file.js';
export type { HumMix, RenderEvents, RenderOutcome, RenderRequest, RenderedWiring } from './render-guitar.js';
export { measureGraphAudio, measureWiringAudio, measureRawAudio, referLevels, prepareReferenceSynthesis, REFERENCE_PHRASE, REFERENCE_SAMPLE_RATE_HZ, RENDER_TAIL_S } from './measure-wiring-audio.js';
export type { AudioMetrics, RawAudioMetrics } from './measure-wiring-audio.js';
export { measureFiguresOnThread, figuresThreadPays, FIGURES_THREAD_MIN_WIRINGS } from './measure-figures-on-thread.js';
export { prepareWiringSynthesis, assertAudible, COIL_VOLTS_PER_METRE_PER_SECOND, HUM_HARMONICS } from './synthesize-wirings.js';
export type { SynthesisOptions, WiringSynthesis } from './synthesize-wirings.js';
export { planTrueLevelGain, planMatchedGains, PEAK_CEILING_DB } from './plan-gains.js';
export { hashOf, readManifest, MANIFEST_VERSION } from './render-manifest.js';
export { runRenderPassOnThreads, splitByShape, MIN_ITEMS_PER_THREAD } from './run-render-pass.js';
export { defaultThreadCount, startWorkerModule } from './worker-threads.js';
export { createWiringRenderer, runRenderPass, peakOf } from './render-pass.js';
export type { AudioSettings, PassItem, PassResult, WiringRenderer } from './render-pass.js';
export { writeComparisonPage } from './write-comparison-page.js';
