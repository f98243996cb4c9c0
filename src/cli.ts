#!/usr/bin/env -S MALLOC_MMAP_THRESHOLD_=1048576 MALLOC_TRIM_THRESHOLD_=2097152 node
/**
 * Entry point for the `coilbench` command.
 *
 * The first line starts Node with glibc's mmap threshold fixed at 1 MiB and
 * its trim threshold at twice that, the ratio glibc keeps when it moves the
 * threshold itself (mallopt(3), M_MMAP_THRESHOLD and M_TRIM_THRESHOLD; `env
 * -S` splits the line, GNU coreutils 8.30 or later, or BSD/macOS env).
 *
 * Why fixed: left to itself, glibc raises the threshold to the size of each
 * large block freed (up to 32 MiB), so the spectra and tables of a render
 * (1–3 MB) come from per-thread arenas that keep their pages once the thread
 * that used them is done. Why not lower: below the threshold a freed block
 * is reused by the next one of its size, where a block of its own costs the
 * kernel's zeroing of every page on first touch (0.4–0.5 MB of audio or WAV
 * bytes a wiring, 1.3 ms each on the 2-core machine). Measured there, five
 * coils, 9,997 wirings rendered direct: at 128 KiB 58 s (72–82 s with other
 * work beside it) and 367–381 MB peak, at this setting 49–54 s and
 * 365–371 MB, at 4 MiB 51–56 s and 397–411 MB (DEVELOPERS.md has the rest). Elsewhere (another C library, or
 * `node dist/cli.js` started by hand) the variables are ignored or absent,
 * and only the speed and memory figures change.
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
