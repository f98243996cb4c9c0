#!/usr/bin/env -S MALLOC_ARENA_MAX=1 MALLOC_MMAP_THRESHOLD_=2097152 MALLOC_TRIM_THRESHOLD_=4194304 GLIBC_TUNABLES=glibc.malloc.hugetlb=1 node
/**
 * Entry point for the `coilbench` command.
 *
 * The first line starts Node with glibc's allocator set for this program:
 * one arena for all threads (M_ARENA_MAX), the mmap threshold fixed at
 * 2 MiB and the trim threshold at twice that, the ratio glibc keeps when it
 * moves the threshold itself (mallopt(3): M_ARENA_MAX, M_MMAP_THRESHOLD,
 * M_TRIM_THRESHOLD and their environment variables), and transparent huge
 * pages asked for the memory malloc maps and for its heap as it grows
 * (glibc 2.35 and later, the tunable glibc.malloc.hugetlb=1:
 * madvise(MADV_HUGEPAGE)). `env -S` splits the line (GNU coreutils 8.30 or
 * later, or BSD/macOS env).
 *
 * Why: much of a render's time goes to the kernel's first touch of fresh
 * memory, which it zeroes page by page: on the 2-core machine a 4 KiB page
 * costs about 11 µs, so every megabyte allocated anew costs about 2.7 ms;
 * a 47-wiring render took 45,000 such faults, half a second across its
 * threads. Below the threshold a freed block is reused by the next of its
 * size, its pages already touched; 2 MiB takes in the complex spectra of
 * 2^16 + 1 bins and the FFT's work arrays of 2^17 doubles (1 MiB each),
 * which at 1 MiB were each a mapping of their own, faulted in anew every
 * time. Huge pages fault in 2 MiB at a time. One arena: with one per
 * thread, blocks a thread freed stayed in its own arena for nobody else,
 * and a large render peaked over 400 MB. Above the threshold blocks go back
 * to the system when freed, which bounds a large render's peak. Measured
 * there (DEVELOPERS.md, "Memory", has the rest): five coils, 9,997 wirings
 * rendered direct, at 1 MiB alone 48 s and 366 MB; 2 MiB with huge pages
 * 54–56 s and 362–390 MB, one run 446 MB; this setting 48–50 s and
 * 353–369 MB. Elsewhere (another C library, an older glibc, which ignores a
 * tunable it does not know, or `node dist/cli.js` started by hand) the
 * variables are ignored or absent, and only the speed and memory figures
 * change.
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
