import { describe, expect, it } from 'vitest';
import { estimateRender, isTooBig } from './estimate-work.js';

describe('estimateRender', () => {
  it('costs each chain at its own measured rate', () => {
    const [direct, clean, compressed, drive] = (['direct', 'clean', 'compressed', 'drive'] as const).map((chain) => estimateRender(572, 2.6, 48_000, 'pcm24', chain).seconds);
    // 572 wirings of 2.6 s through direct took 11.7 s on the 2-core machine in a slow hour (the rate's own measurement).
    expect(direct).toBeCloseTo(572 * 2.6 * 0.008, 6);
    expect(direct).toBeLessThan(clean as number);
    expect(clean).toBeLessThan(compressed as number);
    expect(compressed).toBeLessThan(drive as number);
  });

  it('counts the WAV bytes from the format and the scratch audio as float32, and writes nothing with --no-wav', () => {
    const frames = Math.ceil(2.6 * 48_000);
    const estimate = estimateRender(10, 2.6, 48_000, 'pcm24', 'clean');
    expect(estimate.bytes).toBe(10 * (512 + 3 * frames));
    expect(estimate.peakBytes).toBe(estimate.bytes + 10 * 4 * frames);
    expect(estimateRender(10, 2.6, 48_000, 'pcm24', 'clean', false).bytes).toBe(0);
  });

  it('still asks for --yes before a render of every wiring of five coils (its disk use, not its time)', () => {
    const estimate = estimateRender(9_997, 2.6, 48_000, 'pcm24', 'clean');
    expect(estimate.seconds).toBeLessThan(600);
    expect(isTooBig(estimate)).toBe(true);
  });
});
