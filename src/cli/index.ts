export { main, EXIT_OK, EXIT_FAILURE, EXIT_BAD_INPUT } from './main.js';
export { captureIo, processIo } from './io.js';
export type { Io, CapturedIo } from './io.js';
