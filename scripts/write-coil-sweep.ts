/** Writes samples/coil-sweep.csv, the worked example for `coilbench fit-coil` (invented values from a known model). Run with `npx tsx scripts/write-coil-sweep.ts`. */
import { renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { renderSampleSweep } from '../src/circuit/index.js';

const target = join(import.meta.dirname, '..', 'samples', 'coil-sweep.csv');
writeFileSync(`${target}.tmp`, renderSampleSweep());
renameSync(`${target}.tmp`, target);
console.log('wrote samples/coil-sweep.csv');
