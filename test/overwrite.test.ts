/**
 * Inputs are never written: every option that writes (`analyze --csv`,
 * `render -o`, `shortlist --render -o`, `compare --render -o`) pointed at an
 * input (directly, through a symbolic link, or so that a file the command
 * writes inside its folder is an input) is refused with exit status 2 before
 * anything is written, and the input keeps its bytes.
 */
import { copyFileSync, mkdirSync, readFileSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { temporaryFolder } from './support/temporary-folder.js';

const samples = join(import.meta.dirname, '..', 'samples');

function setUp(): string {
  const folder = temporaryFolder('overwrite');
  copyFileSync(join(samples, 'three-single-coil.json'), join(folder, 'guitar.json'));
  copyFileSync(join(samples, 'three-single-coil-alt.json'), join(folder, 'other.json'));
  symlinkSync(join(folder, 'guitar.json'), join(folder, 'link.json'));
  mkdirSync(join(folder, 'out', 'wav'), { recursive: true });
  copyFileSync(join(samples, 'three-single-coil.json'), join(folder, 'out', 'wav', 'inside.json'));
  copyFileSync(join(samples, 'three-single-coil.json'), join(folder, 'out', 'report.json'));
  mkdirSync(join(folder, 'phrase-out'));
  writeFileSync(join(folder, 'phrase-out', 'report.json'), JSON.stringify({ notes: [{ time: 0, string: 6, fret: 0, velocity: 1 }] }));
  return folder;
}

const folder = setUp();
const snapshot = (): string[] =>
  readdirSync(folder, { recursive: true, encoding: 'utf8' })
    .sort()
    .map((name) => {
      try {
        return `${name}:${readFileSync(join(folder, name)).length}`;
      } catch {
        return name; // a folder
      }
    });

describe('no command writes over its input', () => {
  it.each([
    ['analyze --csv onto the guitar file', ['analyze', 'guitar.json', '--no-audio', '--csv', 'guitar.json'], '--csv'],
    ['analyze --csv onto it through a link', ['analyze', 'link.json', '--no-audio', '--csv', 'guitar.json'], '--csv'],
    ['analyze --csv onto a link to it', ['analyze', 'guitar.json', '--no-audio', '--csv', 'link.json'], '--csv'],
    ['analyze --csv onto it by another spelling', ['analyze', 'guitar.json', '--no-audio', '--csv', './out/../guitar.json'], '--csv'],
    ['render -o onto the guitar file', ['render', 'guitar.json', '-o', 'guitar.json', '--only', 'w1'], '--output'],
    ['render -o where wav/ would hold it', ['render', 'out/wav/inside.json', '-o', 'out', '--only', 'w1'], '--output'],
    ['render -o where report.json is the guitar', ['render', 'out/report.json', '-o', 'out', '--only', 'w1'], '--output'],
    ['render -o where report.json is the phrase', ['render', 'guitar.json', '--phrase', 'phrase-out/report.json', '-o', 'phrase-out', '--only', 'w1'], '--output'],
    ['shortlist --render -o onto the guitar', ['shortlist', 'guitar.json', '--count', '2', '--render', '-o', 'guitar.json'], '--output'],
    ['compare --render -o onto a candidate', ['compare', 'guitar.json', 'other.json', '--render', '-o', 'other.json'], '--output'],
  ])('%s is refused, exit 2, nothing written', async (_, argv, option) => {
    const before = snapshot();
    const bytes = readFileSync(join(folder, 'guitar.json'));
    const io = captureIo(folder);
    const status = await main(argv as string[], io);
    expect(status, io.err()).toBe(2);
    expect(io.err()).toMatch(new RegExp(`^coilbench: ${option}`, 'u'));
    expect(io.err()).not.toMatch(/\n\s+at /u);
    expect(snapshot()).toEqual(before);
    expect(readFileSync(join(folder, 'guitar.json')).equals(bytes)).toBe(true);
  });
});
