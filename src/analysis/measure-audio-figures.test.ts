/**
 * The centroid pass of the audio figures (measure-audio-figures.ts) takes
 * the band's bins a chunk at a time; the chunk's size is a tuning choice and
 * must not change a single bit of any figure. Each pattern's sums take the
 * bins in order whatever the size, so a chunk of one bin, an odd size that
 * leaves a short last chunk, the default and one chunk for the whole band
 * must all agree exactly. A chunk edge read wrongly (a bin skipped or taken
 * twice, a product read from the wrong coil's run) breaks the agreement.
 *
 * The guitars: the four-coil sample (patterns that flip no coil, one or two)
 * and six uncoupled single coils (the three-coil sample with three more
 * coils, invented values), whose wirings of all six flip three (the general
 * loop; coupled coils flip in pairs, so the six-coil sample of three
 * humbuckers never does). The figures' agreement with each wiring's own
 * render is test/audio-figures.test.ts; the six-coil patterns, which no
 * sample there reaches, are checked against their renders here with the
 * same bound.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { prepareReferenceSynthesis, renderReferenceCoils } from '../render/measure-wiring-audio.js';
import { type Network, enumerateWirings, parseWiring, vocabularyOf } from '../wiring/index.js';
import { DEFAULT_AUDIO_FIGURE_OPTIONS, phaseClassesOf, prepareAudioFigures } from './measure-audio-figures.js';
import { measureCentroid } from './measure-centroid.js';

/** test/audio-figures.test.ts's bound for the centroid from cross-spectra against the render's own. */
const CENTROID_FRACTION = 0.001;
const RATE_HZ = 48_000;

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

/** A bundled sample, or SIX_SINGLE_COILS. */
function loadSample(name: string) {
  if (name === SIX_SINGLE_COILS) {
    const raw = JSON.parse(readFileSync(join(SAMPLES, 'three-single-coil.json'), 'utf8')) as { name: string; coils: Record<string, unknown>[] };
    raw.name = 'Six single coils (invented values, for this test)';
    const extra = [
      { id: 'neck_two', position: '140mm', resistance: '5.7k', inductance: '2.2H', winding: 'ccw', magnet: 'south' },
      { id: 'mid_two', position: '80mm', resistance: '6.0k', inductance: '2.4H', winding: 'cw', magnet: 'north' },
      { id: 'bridge_two', position: '60mm', resistance: '6.6k', inductance: '2.7H', winding: 'ccw', magnet: 'south' },
    ];
    for (const coil of extra) raw.coils.push({ capacitance: '115p', aperture: '20mm', ...coil });
    return parseGuitarText(JSON.stringify(raw), name);
  }
  const path = join(SAMPLES, name);
  return parseGuitarText(readFileSync(path, 'utf8'), path);
}

/** Every figure of `networks`, measured class by class with the given chunk size, as one flat list of numbers. */
function figuresWith(name: string, networks: (guitar: ReturnType<typeof loadSample>) => Network[], chunks: readonly number[]): number[][] {
  const guitar = loadSample(name);
  const coils = renderReferenceCoils(guitar);
  const chosen = networks(guitar);
  return chunks.map((centroidChunkBins) => {
    const meter = prepareAudioFigures(guitar, coils, {}, { centroidChunkBins });
    return phaseClassesOf(guitar, chosen).flatMap((members) =>
      meter.measureClass(members.map((index) => chosen[index] as Network)).flatMap((figures) => [figures.energy, figures.loudnessLufs, figures.centroidHz]),
    );
  });
}

/** 7 leaves a short last chunk; 1e9 is one chunk for the whole band. */
const SIX_SINGLE_COILS = 'six single coils';

const CHUNKS = [DEFAULT_AUDIO_FIGURE_OPTIONS.centroidChunkBins, 1, 7, 1e9];

describe('the centroid pass in chunks', () => {
  it('gives the same bits for every chunk size: four coils, every thirteenth wiring', () => {
    const [reference, ...others] = figuresWith('humbucker-two-single-coil.json', (guitar) => enumerateWirings(guitar.elements).filter((_, index) => index % 13 === 0).map((wiring) => wiring.network), CHUNKS);
    expect(reference?.length).toBeGreaterThan(120);
    for (const figures of others) expect(figures).toEqual(reference);
  });

  // Three flips, three again, two, one, none.
  const SIX_COIL_PATTERNS = [
    'neck + ~neck_two + mid + ~mid_two + bridge + ~bridge_two',
    '(neck // ~mid) + (~bridge // neck_two) + (~mid_two // bridge_two)',
    'neck + neck_two + mid + ~mid_two + ~bridge + bridge_two',
    'neck + ~neck_two + mid + mid_two + bridge + bridge_two',
    'neck + neck_two + mid + mid_two + bridge + bridge_two',
  ];

  it('gives the same bits for every chunk size: six single coils, patterns flipping up to three', () => {
    const [reference, ...others] = figuresWith(SIX_SINGLE_COILS, (guitar) => SIX_COIL_PATTERNS.map((text) => parseWiring(text, vocabularyOf(guitar))), CHUNKS);
    expect(reference).toHaveLength(3 * SIX_COIL_PATTERNS.length);
    for (const figures of others) expect(figures).toEqual(reference);
  });

  it("matches the renders' centroids for the six-coil patterns", () => {
    const guitar = loadSample(SIX_SINGLE_COILS);
    const coils = renderReferenceCoils(guitar);
    const meter = prepareAudioFigures(guitar, coils, {});
    const synthesis = prepareReferenceSynthesis(guitar, {}, coils);
    for (const text of SIX_COIL_PATTERNS) {
      const network = parseWiring(text, vocabularyOf(guitar));
      const rendered = measureCentroid(synthesis.synthesize(network), RATE_HZ);
      expect(Math.abs(meter.measure(network).centroidHz / rendered - 1)).toBeLessThan(CENTROID_FRACTION);
    }
  });

  it('refuses a chunk that is not a whole number of bins', () => {
    const guitar = loadSample('three-single-coil.json');
    const coils = renderReferenceCoils(guitar);
    expect(() => prepareAudioFigures(guitar, coils, {}, { centroidChunkBins: 0 })).toThrow(/centroidChunkBins/);
    expect(() => prepareAudioFigures(guitar, coils, {}, { centroidChunkBins: 2.5 })).toThrow(/centroidChunkBins/);
  });
});
