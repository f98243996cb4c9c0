import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { WorkError } from '../errors/index.js';
import { writeJsonFileAtomicSync } from './write-json-file.js';

describe('writeJsonFileAtomicSync', () => {
  let folder = '';
  beforeEach(() => {
    folder = mkdtempSync(join(tmpdir(), 'coilbench-json-file-'));
  });
  afterEach(() => rmSync(folder, { recursive: true, force: true }));

  // Reference: JSON.stringify(value, null, 2) and a newline, the bytes report.json had when written whole.
  it('writes the bytes of JSON.stringify(value, null, 2) and a newline, long arrays included', () => {
    const report = {
      generator: 'coilbench test',
      nothing: undefined,
      wirings: Array.from({ length: 3000 }, (_, index) => ({
        id: `w${index + 1}`,
        levelDb: index % 7 === 0 ? Number.NaN : -index / 3,
        responseDb: Array.from({ length: 40 }, (_, point) => Math.sin(index + point)),
        group: index % 5 === 0 ? null : index % 11,
        missing: undefined,
      })),
      groups: { summary: 'a "quoted" name, é and ~', members: [['w1', 'w2']] },
    };
    const path = join(folder, 'report.json');
    writeJsonFileAtomicSync(path, report);
    expect(readFileSync(path, 'utf8')).toBe(`${JSON.stringify(report, null, 2)}\n`);
    expect(readdirSync(folder)).toEqual(['report.json']);
  });

  it('fails with a WorkError and leaves no file when the folder is missing', () => {
    const path = join(folder, 'absent', 'report.json');
    expect(() => writeJsonFileAtomicSync(path, { a: 1 })).toThrow(WorkError);
    expect(readdirSync(folder)).toEqual([]);
  });
});
