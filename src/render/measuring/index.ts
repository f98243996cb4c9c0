/**
 * The parts of render/ that `analyze` needs: the reference phrase's audio
 * figures, on this thread or a worker, and atomic file writes. None of them
 * imports the render pass, the effects chain or the pages, so the command
 * starts without loading them (render/index.ts re-exports the same).
 */
export { measureGraphAudio, measureWiringAudio, referLevels, REFERENCE_PHRASE } from '../measure-wiring-audio.js';
export type { AudioMetrics } from '../measure-wiring-audio.js';
export { measureFiguresOnThread, figuresThreadPays } from '../measure-figures-on-thread.js';
export { openFileAtomicSync, removeStaleTempFiles, writeFileAtomicSync } from '../write-file-atomic.js';
export type { AtomicFileStream } from '../write-file-atomic.js';
