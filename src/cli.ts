#!/usr/bin/env node
/** Entry point for the `coilbench` command. */
import { main, processIo } from './cli/index.js';
import { installInterruptHandlers } from './cli/interrupt.js';

// A reader that stops early (`coilbench wirings … | head`) is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

// Ctrl-C and SIGTERM: no partial file, no scratch, a message saying how to resume (src/cli/interrupt.ts).
installInterruptHandlers();

const status = await main(process.argv.slice(2), processIo());
process.exitCode = status;
