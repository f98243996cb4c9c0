/**
 * `npm run bench`: prints speed figures for the main stages on this machine.
 * Nothing here is asserted; quote the figures in issue notes.
 */
import { cpus } from 'node:os';
import { benchEnumerate } from './bench/enumerate.js';
import { benchListeningPage } from './bench/listening-page.js';

console.log(`coilbench bench — node ${process.version}, ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown cpu'})`);
benchEnumerate();
benchListeningPage();
