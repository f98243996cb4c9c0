import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { testFolder } from '../../test/support/temporary-folder.js';

const ROOT = join(import.meta.dirname, '..', '..');
const SAMPLE = join(ROOT, 'samples', 'three-single-coil.json');
/** Wirings rendered: 12 through the clean chain's 7 biquad sections are 84 calls of renderBiquad. */
const ONLY = ['w1', 'w2', 'w3', 'w4', 'w5', 'w6', 'w7', 'w8', 'w9', 'w10', 'w11', 'w12'];
const SECTION_CALLS = ONLY.length * 7;
/**
 * Most bailouts of renderBiquad allowed: with feedback kept from the first call there were 2–3 in every run seen;
 * without, in two runs of three, one per call (a bailout where the compiled loop ends, src/cli/eager-feedback.ts).
 */
const MOST_BAILOUTS = 10;

describe('the command line keeps type feedback from each function\'s first call', () => {
  it('so the biquad loop compiled during its first call is not thrown away on every later call', () => {
    const folder = testFolder('eager-feedback');
    // Without WebAssembly (V8's --no-expose-wasm), so the biquads run as JavaScript: the form a host without it runs,
    // and the one this flag is for (src/render/linear-stages.ts runs them as WebAssembly where it can).
    const args = ['--no-expose-wasm', '--trace-deopt', '--trace-opt', '--import', 'tsx', join(ROOT, 'src', 'cli.ts'), 'render', SAMPLE, '--chain', 'clean', '-o', join(folder, 'out')];
    for (const wiring of ONLY) args.push('--only', wiring);
    const child = spawnSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 1 << 26, cwd: ROOT });
    expect(child.status, child.stderr.slice(-2000)).toBe(0);
    // A V8 without the flag would say so on stderr at every run (V8 prints it itself; setFlagsFromString does not throw).
    expect(child.stderr).not.toContain('unrecognized flag');
    const bailouts = child.stdout.split('\n').filter((line) => line.startsWith('[bailout') && line.includes('<JSFunction renderBiquad ')).length;
    expect(SECTION_CALLS).toBeGreaterThan(5 * MOST_BAILOUTS);
    // The JavaScript biquad ran, hot enough to be compiled.
    expect(child.stdout.split('\n').some((line) => line.startsWith('[completed optimizing') && line.includes('<JSFunction renderBiquad '))).toBe(true);
    expect(bailouts).toBeLessThanOrEqual(MOST_BAILOUTS);
  }, 60_000);
});
