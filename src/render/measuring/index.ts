/**
 * The parts of render/ that `analyze` needs: the reference phrase's audio
 * figures, on this thread or a worker, atomic file writes, and the pause
 * that lets Ctrl-C in during long work. None of them
 * imports the render pass, the effects chain or the pages, so the command
 * starts without loading them (render/index.ts re-exports the same).
 */
export { measureGraphAudio, measureWiringAudio, referLevels, REFERENCE_PHRASE } from '../measure-wiring-audio.js';
export type { AudioMetrics } from '../measure-wiring-audio.js';
export { measureFiguresOnThread, figuresThreadPays } from '../measure-figures-on-thread.js';
export { openFileAtomicSync, removeStaleTempFiles, writeFileAtomicSync } from '../write-file-atomic.js';
export type { AtomicFileStream } from '../write-file-atomic.js';
export { type Pause, PAUSE_INTERVAL_MS, createPause, runStepsPausing } from '../pause-for-signals.js';
