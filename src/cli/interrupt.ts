/**
 * Ctrl-C (SIGINT) and SIGTERM at any moment: finished files are whole (they
 * are written under a temporary name and renamed), so an interrupt removes
 * the temporary file being written and the render's scratch audio, says how
 * to resume, and exits with status 130. The clean-up never throws: a worker
 * thread still writing into the scratch folder is retried, and whatever it
 * cannot remove is removed by the next run. A second Ctrl-C while the first
 * is being handled exits at once.
 *
 * Limits: Node runs signal handlers between tasks, so during a long
 * synchronous computation (a big `analyze`) the interrupt takes effect when
 * that step ends; nothing is being written then, so nothing can be left half
 * done.
 */
import { releaseFolderLocksSync, removePendingTempFilesSync, removeScratchFoldersSync } from '../render/index.js';
import { EXIT_INTERRUPTED } from './describe-error.js';

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
    const clean = removeLeftoversSync();
    target.writeError(`\n${INTERRUPTED_MESSAGE}${clean ? '' : ' (some scratch files were still in use; the next run removes them)'}\n`);
    target.exit(EXIT_INTERRUPTED);
  };
  target.on('SIGINT', handle);
  target.on('SIGTERM', handle);
}
