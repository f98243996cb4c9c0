/**
 * Ctrl-C (SIGINT) and SIGTERM at any moment: finished files are whole (they
 * are written under a temporary name and renamed), so an interrupt removes
 * the temporary file being written and the render's scratch audio, says how
 * to resume, and exits with status 130. The clean-up never throws: a worker
 * thread still writing into the scratch folder is retried, and whatever it
 * cannot remove is removed by the next run. A second Ctrl-C while the first
 * is being handled exits at once. Writes in flight are let reach a safe
 * point first (settleAtomicWrites: at most SETTLE_LIMIT_MS), so none creates
 * its temporary file after the clean-up.
 *
 * Node runs signal handlers between tasks, so long computations pause
 * every PAUSE_INTERVAL_MS (pause-for-signals.ts) to let the handler in.
 */
import { releaseFolderLocksSync, removePendingTempFilesSync, removeScratchFoldersSync, settleAtomicWrites } from '../render/leftovers/index.js';
import { EXIT_INTERRUPTED } from './describe-error.js';

/** Most time an interrupt waits for writes in flight to reach a safe point, ms (each is one open, write, fsync or rename: milliseconds; judgement). */
const SETTLE_LIMIT_MS = 2000;

/** The message printed on interruption. */
export const INTERRUPTED_MESSAGE =
  'coilbench: interrupted; no partial file is left. Run the same command again to finish: files already written are complete and are kept.';

export interface InterruptTarget {
  readonly on: (signal: 'SIGINT' | 'SIGTERM', handler: () => void) => void;
  readonly writeError: (text: string) => void;
  readonly exit: (status: number) => void;
}

/** Remove what an interrupted command leaves behind; never throws. Returns false when something could not be removed. */
export function removeLeftoversSync(): boolean {
  let clean = true;
  try {
    removePendingTempFilesSync();
  } catch {
    clean = false;
  }
  try {
    removeScratchFoldersSync();
  } catch {
    clean = false;
  }
  try {
    releaseFolderLocksSync();
  } catch {
    clean = false;
  }
  return clean;
}

/** Install the SIGINT and SIGTERM handlers on `target` (the process by default). */
export function installInterruptHandlers(
  target: InterruptTarget = {
    on: (signal, handler) => process.on(signal, handler),
    writeError: (text) => process.stderr.write(text),
    exit: (status) => process.exit(status),
  },
): void {
  let interrupting = false;
  const handle = (): void => {
    if (interrupting) {
      target.exit(EXIT_INTERRUPTED); // second signal: at once
      return;
    }
    interrupting = true;
    const finish = (): void => {
      const clean = removeLeftoversSync();
      target.writeError(`\n${INTERRUPTED_MESSAGE}${clean ? '' : ' (some scratch files were still in use; the next run removes them)'}\n`);
      target.exit(EXIT_INTERRUPTED);
    };
    // Writes in flight first reach a safe point (their temporary file removed or renamed), then the rest is removed.
    const limit = new Promise<void>((resolve) => setTimeout(resolve, SETTLE_LIMIT_MS).unref());
    void Promise.race([settleAtomicWrites(), limit]).then(finish, finish);
  };
  target.on('SIGINT', handle);
  target.on('SIGTERM', handle);
}
