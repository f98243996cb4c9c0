/**
 * Every guitar file in test/malformed/ has exactly one mistake. Each must be
 * refused with one clear message naming the path of the mistake, through both
 * the core parser and the command line (exit status 2, no stack trace,
 * nothing on stdout).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { InputError, formatProblem } from '../src/errors/index.js';
import { parseGuitarText } from '../src/guitar/index.js';

interface Case {
  readonly file: string;
  readonly path: string;
  readonly contains: string;
}

const folder = join(import.meta.dirname, 'malformed');
const { cases } = JSON.parse(readFileSync(join(folder, 'expected.json'), 'utf8')) as { cases: Case[] };

describe('malformed guitar files, one mistake each', () => {
  it('has at least 30 cases', () => {
    expect(cases.length).toBeGreaterThanOrEqual(30);
  });

  it.each(cases)('$file is refused at $path', (testCase) => {
    const text = readFileSync(join(folder, testCase.file), 'utf8');
    let caught: unknown;
    try {
      parseGuitarText(text, `malformed/${testCase.file}`);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InputError);
    const problems = (caught as InputError).problems;
    expect(problems, problems.map(formatProblem).join('\n')).toHaveLength(1);
    const [problem] = problems;
    expect(problem?.path.startsWith(testCase.path), `path ${problem?.path}`).toBe(true);
    expect(formatProblem(problem!)).toContain(testCase.contains);
    expect(formatProblem(problem!)).toMatch(/^[^\n]+: expected [^\n]+, got [^\n]+$/u);
  });

  it.each(cases)('coilbench check $file exits 2 with one line and no stack', async (testCase) => {
    const io = captureIo(folder);
    const status = await main(['check', testCase.file], io);
    expect(status).toBe(2);
    expect(io.out()).toBe('');
    const lines = io.err().trimEnd().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^coilbench: /u);
    expect(io.err()).not.toMatch(/\n\s+at /u);
  });

  it('reports every problem of a file with several mistakes at once', () => {
    const text = JSON.stringify({
      name: 'several',
      coils: [
        { id: 'neck', position: '700mm', resistance: '-1k', inductance: '2H' },
        { id: 'neck', position: '100mm', resistance: '6k', inductance: 'lots' },
      ],
      controls: { volume: { setting: 12 } },
    });
    try {
      parseGuitarText(text);
      expect.unreachable();
    } catch (error) {
      const paths = (error as InputError).problems.map((problem) => problem.path).sort();
      expect(paths).toEqual(
        ['coils[0].position', 'coils[0].resistance', 'coils[1].id', 'coils[1].inductance', 'controls.volume.setting'].sort(),
      );
    }
  });
});
