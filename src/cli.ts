#!/usr/bin/env -S MALLOC_MMAP_THRESHOLD_=131072 node
/**
 * Entry point for the `coilbench` command.
 *
 * The first line starts Node with glibc's mmap threshold fixed at its default,
 * 128 KiB (mallopt(3), M_MMAP_THRESHOLD; `env -S` splits the line, GNU
 * coreutils 8.30 or later, or BSD/macOS env). Left to itself, glibc raises
 * the threshold to the size of each large block freed, so the render's audio
 * buffers and spectra (0.4–3 MB) come from per-thread arenas that keep their
 * pages once the thread that used them is done; fixed, each such buffer is
 * its own mapping, given back when freed. Measured on the 2-core machine,
 * five coils, 9,997 wirings rendered direct: 431–475 MB peak without it,
 * DEVELOPERS.md has the figures with it. Elsewhere (another C library, or
 * `node dist/cli.js` started by hand) the variable is ignored or absent, and
 * only the memory figures change.
 */
import { main, processIo } from './cli/index.js';
import { installInterruptHandlers } from './cli/interrupt.js';
import { allocateFeedbackEagerly } from './cli/eager-feedback.js';

// Before any work: V8 keeps type feedback from each function's first call, so long loops compiled while they run
// are not thrown away on every later call (src/cli/eager-feedback.ts).
allocateFeedbackEagerly();

// A reader that stops early (`coilbench wirings … | head`) is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

// Ctrl-C and SIGTERM: no partial file, no scratch, a message saying how to resume (src/cli/interrupt.ts).
installInterruptHandlers();

const status = await main(process.argv.slice(2), processIo());
process.exitCode = status;
