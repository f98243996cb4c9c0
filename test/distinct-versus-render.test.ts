/**
 * The distinctness analysis computes each wiring's level and brightness from
 * band cross-spectra, without rendering. Here they meet the render
 * pipeline's own figures for the same reference render (src/render:
 * measureWiringAudio, docs/design.md's levelDb and centroidHz).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fitLogRatios } from './support/log-ratio-fit.js';
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
    const { slope, correlation } = fitLogRatios(centroid, Array.from(profiles.brightnessHz));
    expect(correlation).toBeGreaterThan(0.9);
    expect(slope).toBeGreaterThan(1.2);
    expect(slope).toBeLessThan(1.7);
  });
});
