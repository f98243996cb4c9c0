import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

/** Long enough for a cold start under load; a thread that kept the process alive would wait for ever. */
const EXIT_WAIT_MS = 60_000;

describe('measureFiguresOnThread', () => {
  it('does not keep the process alive while it waits for a basis that never comes (a caller that failed first)', () => {
    const module = join(import.meta.dirname, 'measure-figures-on-thread.ts');
    const guitarModule = join(import.meta.dirname, '..', 'guitar', 'index.ts');
    const wiringModule = join(import.meta.dirname, '..', 'wiring', 'index.ts');
    const sample = join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json');
    const code = `
      import { readFileSync } from 'node:fs';
      const { measureFiguresOnThread } = await import(${JSON.stringify(module)});
      const { parseGuitarText } = await import(${JSON.stringify(guitarModule)});
      const { enumerateWirings } = await import(${JSON.stringify(wiringModule)});
      const guitar = parseGuitarText(readFileSync(${JSON.stringify(sample)}, 'utf8'));
      measureFiguresOnThread(guitar, enumerateWirings(guitar.elements).slice(0, 3), {});
      console.log('left without starting it');
    `;
    const child = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', code], { encoding: 'utf8', timeout: EXIT_WAIT_MS });
    expect(child.stderr).toBe('');
    expect(child.stdout.trim()).toBe('left without starting it');
    expect(child.status).toBe(0);
  });
});
