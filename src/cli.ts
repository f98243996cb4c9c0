#!/usr/bin/env node
/** Entry point for the `coilbench` command. */
import { main, processIo } from './cli/index.js';
import { releaseFolderLocksSync, removePendingTempFilesSync, removeScratchFoldersSync } from './render/index.js';

/** Exit status after an interrupt (128 + SIGINT's number 2, the shell convention). */
const INTERRUPTED_STATUS = 130;

// A reader that stops early (`coilbench wirings … | head`) is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

// Ctrl-C: finished files are whole (written under a temporary name, then renamed);
// remove the temporary file being written, and let the next run complete the set.
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    removePendingTempFilesSync();
    removeScratchFoldersSync();
    releaseFolderLocksSync();
    process.stderr.write('\ncoilbench: interrupted; files already written are complete, and the next run finishes the rest\n');
    process.exit(INTERRUPTED_STATUS);
  });
}

const status = await main(process.argv.slice(2), processIo());
process.exitCode = status;
