/**
 * The distinctness analysis computes each wiring's level and brightness from
 * band cross-spectra, without rendering. Here they meet the render
 * pipeline's own figures for the same reference render (src/render:
 * measureWiringAudio, DESIGN.md's levelDb and centroidHz).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REFERENCE_TAIL_S, measureDistinctness } from '../src/analysis/index.js';
import { parseGuitarText } from '../src/guitar/index.js';
import { RENDER_TAIL_S, measureWiringAudio } from '../src/render/index.js';
import { enumerateWirings } from '../src/wiring/index.js';

const samples = join(import.meta.dirname, '..', 'samples');

describe('distinctness figures against the rendered audio', () => {
  it('describes the same reference render', () => {
    expect(REFERENCE_TAIL_S).toBe(RENDER_TAIL_S);
  });

  it.each(['three-single-coil.json', 'two-lead-humbucker.json'])('%s: every level within 0.05 dB of the render\'s levelDb', (file) => {
    const guitar = parseGuitarText(readFileSync(join(samples, file), 'utf8'), file);
    const wirings = enumerateWirings(guitar.elements);
    const audio = measureWiringAudio(guitar, wirings, wirings, {});
    const { profiles } = measureDistinctness(guitar, wirings);
    let worst = 0;
    wirings.forEach((wiring, index) => {
      worst = Math.max(worst, Math.abs((profiles.levelsDb[index] as number) - (audio.get(wiring.id)?.levelDb ?? Number.NaN)));
    });
    expect(worst).toBeLessThan(0.05);
  });

  it('brightness moves with the render\'s centroidHz (log ratios: correlation ≥ 0.9, slope 1.2–1.7)', () => {
    const guitar = parseGuitarText(readFileSync(join(samples, 'three-single-coil.json'), 'utf8'), 'demo');
    const wirings = enumerateWirings(guitar.elements);
    const audio = measureWiringAudio(guitar, wirings, wirings, {});
    const { profiles } = measureDistinctness(guitar, wirings);
    const centroid = wirings.map((wiring) => audio.get(wiring.id)?.centroidHz ?? Number.NaN);
    let xy = 0;
    let xx = 0;
    let yy = 0;
    for (let a = 0; a < wirings.length; a += 1) {
      for (let b = a + 1; b < wirings.length; b += 1) {
        const x = Math.log((centroid[a] as number) / (centroid[b] as number));
        const y = Math.log((profiles.brightnessHz[a] as number) / (profiles.brightnessHz[b] as number));
        xy += x * y;
        xx += x * x;
        yy += y * y;
      }
    }
    expect(xy / Math.sqrt(xx * yy)).toBeGreaterThan(0.9);
    expect(xy / xx).toBeGreaterThan(1.2);
    expect(xy / xx).toBeLessThan(1.7);
  });
});
