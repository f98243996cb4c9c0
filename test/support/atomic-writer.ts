/**
 * Child process for the kill test of writeFileAtomic: writes `path` over and
 * over with files of `megabytes` MB, each filled with one byte value (1, 2, 3,
 * …), printing "writing N" as each write starts, until it is killed.
 * Usage: node --import tsx atomic-writer.ts PATH MEGABYTES
 */
import { writeFileAtomic } from '../../src/render/index.js';

const [path, megabytes] = process.argv.slice(2);
if (!path || !megabytes) throw new Error('usage: atomic-writer.ts PATH MEGABYTES');
const size = Number(megabytes) * 1024 * 1024;
for (let round = 1; ; round += 1) {
  const bytes = new Uint8Array(size).fill(round % 256);
  process.stdout.write(`writing ${round}\n`);
  await writeFileAtomic(path, bytes);
}
