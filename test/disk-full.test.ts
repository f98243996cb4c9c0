/**
 * A full disk, on a small tmpfs (mounting needs root; where it is not
 * permitted the test is skipped with a message saying so): a render that
 * would not fit is refused before anything is written, with the space it
 * needs; a CSV written onto a disk that is already full fails with a clear
 * line (exit status 1), leaves no temporary file and no partial CSV.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { temporaryFolder } from './support/temporary-folder.js';

const GUITAR = join(import.meta.dirname, '..', 'samples', 'three-single-coil.json');
/** Size of the small disk, bytes: room for a few files, not for a 47-wiring render (about 65 MB). */
const DISK_BYTES = 4 * 1024 * 1024;

const base = temporaryFolder('disk-full');
const disk = join(base, 'disk');
mkdirSync(disk);
let mounted = false;
let reason = '';
try {
  execFileSync('mount', ['-t', 'tmpfs', '-o', `size=${DISK_BYTES}`, 'tmpfs', disk], { stdio: 'pipe' });
  mounted = true;
} catch (error) {
  reason = error instanceof Error ? error.message.split('\n')[0] ?? '' : String(error);
  console.info(`disk-full test skipped: mounting a tmpfs is not permitted here (${reason}); run as root to include it`);
}
afterAll(() => {
  if (mounted) execFileSync('umount', [disk]);
});

describe.runIf(mounted)('a full disk', () => {
  it('a render that would not fit is refused before writing, saying how much it needs', async () => {
    const io = captureIo(base);
    const status = await main(['render', GUITAR, '-o', join(disk, 'out'), '--chain', 'direct'], io);
    expect(status).toBe(1);
    expect(io.err()).toMatch(/^coilbench: .*out: not enough free disk space: this render needs about \d+ MB .*, \d+ (MB|kB) available\n$/u);
    expect(existsSync(join(disk, 'out'))).toBe(false);
  });

  it('a CSV onto a full disk fails with one clear line and leaves nothing behind', async () => {
    // Fill the disk to the last block.
    try {
      writeFileSync(join(disk, 'filler'), Buffer.alloc(DISK_BYTES));
    } catch {
      // ENOSPC once full: what we want
    }
    const io = captureIo(base);
    const status = await main(['analyze', GUITAR, '--no-audio', '--csv', join(disk, 'out.csv')], io);
    expect(status).toBe(1);
    expect(io.err()).toMatch(/coilbench: could not write .*out\.csv: no space left on the disk \(ENOSPC\)\n$/u);
    expect(io.err()).not.toMatch(/\n\s+at /u);
    expect(readdirSync(disk)).toEqual(['filler']);
  });
});
