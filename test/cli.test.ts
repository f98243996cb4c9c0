import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';

const samples = join(import.meta.dirname, '..', 'samples');

async function run(...argv: string[]) {
  const io = captureIo(samples);
  const status = await main(argv, io);
  return { status, out: io.out(), err: io.err() };
}

describe('coilbench wirings', () => {
  it.each([
    ['three-single-coil.json', 47],
    ['humbucker-two-single-coil.json', 572],
    ['two-humbucker.json', 572],
    ['two-lead-humbucker.json', 6],
  ])('%s has %d wirings in --json', async (file, count) => {
    const { status, out, err } = await run('wirings', file, '--json');
    expect(status).toBe(0);
    expect(err).toBe('');
    const document = JSON.parse(out) as { guitar: string; count: number; wirings: Array<Record<string, unknown>> };
    expect(document.count).toBe(count);
    expect(document.wirings).toHaveLength(count);
    expect(Object.keys(document.wirings[0] ?? {})).toEqual(['id', 'expression', 'coils', 'topology', 'outOfPhase', 'description']);
  });

  it('prints a readable table', async () => {
    const { status, out } = await run('wirings', 'three-single-coil.json');
    expect(status).toBe(0);
    expect(out).toContain('47 distinct wirings');
    expect(out).toMatch(/w9\s+neck \+ ~bridge\s+2\s+series\s+bridge\s+neck and bridge in series, bridge out of phase/u);
  });
});

describe('coilbench check', () => {
  it('summarises a valid file', async () => {
    const { status, out } = await run('check', 'three-single-coil.json');
    expect(status).toBe(0);
    expect(out).toContain('47 distinct wirings');
    expect(out).toContain('48→38 mm');
    expect(out.trimEnd().endsWith('three-single-coil.json: OK')).toBe(true);
  });

  it('refuses a missing file with status 2', async () => {
    const { status, err } = await run('check', 'no-such-guitar.json');
    expect(status).toBe(2);
    expect(err).toBe('coilbench: no-such-guitar.json: expected a readable guitar file (JSON), got no such file\n');
  });
});

describe('command line errors', () => {
  it('refuses an unknown command with status 2', async () => {
    const { status, err } = await run('solder');
    expect(status).toBe(2);
    expect(err).toMatch(/^coilbench: command: expected a command listed by coilbench --help( \(did you mean \w+\?\))?, got "solder"\n$/u);
  });

  it('refuses an unknown option with status 2', async () => {
    const { status, err } = await run('wirings', 'three-single-coil.json', '--jsn');
    expect(status).toBe(2);
    expect(err).toMatch(/^coilbench: --jsn: expected an option listed by coilbench wirings --help \(did you mean --json\?\), got an unknown option\n$/u);
  });

  it('says how to give several values of a repeatable option when a second one reads as an extra argument', async () => {
    const { status, err } = await run('render', 'three-single-coil.json', '--only', 'neck + mid', 'neck // ~bridge', '-o', 'never-written');
    expect(status).toBe(2);
    expect(err).toBe('coilbench: arguments: expected 1 argument (see coilbench render --help); --only takes one value each time, so repeat it for more (--only "…" --only "…"), got 2 arguments\n');
    const plain = await run('check', 'three-single-coil.json', 'two-humbucker.json');
    expect(plain.status).toBe(2);
    expect(plain.err).toBe('coilbench: arguments: expected 1 argument (see coilbench check --help), got 2 arguments\n');
  });

  it('prints the version of package.json', async () => {
    const { version } = JSON.parse(readFileSync(join(import.meta.dirname, '..', 'package.json'), 'utf8')) as { version: string };
    const { status, out } = await run('--version');
    expect(status).toBe(0);
    expect(out.trim()).toBe(version);
  });

  it('prints help with status 0', async () => {
    const { status, out } = await run('--help');
    expect(status).toBe(0);
    expect(out).toContain('wirings');
  });
});
