#!/usr/bin/env node
/** Entry point for the `coilbench` command. */
import { main, processIo } from './cli/index.js';

// A reader that stops early (`coilbench wirings … | head`) is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

const status = await main(process.argv.slice(2), processIo());
process.exitCode = status;
