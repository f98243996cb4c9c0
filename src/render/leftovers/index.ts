/**
 * What a render or a write in progress leaves behind and the interrupt
 * handler removes (temporary files, parked audio, folder locks), without
 * loading anything else of render/ (render/index.ts re-exports the same).
 */
export { removePendingTempFilesSync, settleAtomicWrites } from '../write-file-atomic.js';
export { releaseFolderLocksSync } from '../folder-claim.js';
export { removeScratchFoldersSync } from '../scratch-folders.js';
