/**
 * Scratch folders of renders in progress (parked first-pass audio), kept
 * apart from the render itself so that the interrupt handler can remove them
 * without loading the render pipeline.
 */
import { rmSync } from 'node:fs';

/** Attempts to remove a scratch folder that a worker thread is still writing into (Node's rmSync retries ENOTEMPTY and EBUSY). */
const SCRATCH_REMOVE_RETRIES = 5;

/** Scratch folders of renders in progress, so an interrupt handler can remove their parked audio. */
export const activeScratchFolders = new Set<string>();

/** Remove the parked audio of every render in progress (for a SIGINT handler; the next run starts afresh). */
export function removeScratchFoldersSync(): void {
  for (const folder of activeScratchFolders) {
    // A worker thread may still be adding a file: retry (ENOTEMPTY), and leave the rest to the next run rather than throw.
    try {
      rmSync(folder, { recursive: true, force: true, maxRetries: SCRATCH_REMOVE_RETRIES });
    } catch {
      // best effort while exiting; the next run removes the folder first
    }
  }
  activeScratchFolders.clear();
}
