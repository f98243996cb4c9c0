/**
 * The audio figures of docs/design.md (level, BS.1770 loudness, centroid) two
 * ways, in this process: from the coils' cross-spectra (what the commands
 * use, src/analysis/measure-audio-figures.ts) and from each wiring's own
 * render (synthesis, inverse FFT, measureEnergy/measureLoudness/
 * measureCentroid: the route they replaced). Medians of 3; the ratio between
 * the two is the figure to quote on a busy machine, with the reference
 * computation of the commands section (20 inverse FFTs of 2^17 points).
 */
import { measureFiguresByClass } from '../../src/analysis/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { realFft } from '../../src/math/index.js';
import { measureRawAudio, prepareReferenceFigures, prepareReferenceSynthesis, renderReferenceCoils } from '../../src/render/measure-wiring-audio.js';
import { fiveCoilGuitar, sample } from './guitars.js';
import { heading, line, medianMs } from './timing.js';

/** Wirings rendered one by one for the old route's per-wiring cost. */
const RENDERED_WIRINGS = 24;

function referenceMs(): number {
  const fft = realFft(2 ** 17);
  const spectrum = new Float64Array(2 ** 17 + 2).map((_, index) => Math.sin(index));
  const out = new Float64Array(2 ** 17);
  return medianMs(() => {
    for (let i = 0; i < 20; i += 1) fft.inverse(spectrum, out);
  }, 3);
}

export function benchFigures(): void {
  heading('Audio figures of every wiring: from cross-spectra vs from each render (median of 3, in this process)');
  const reference = referenceMs();
  line('reference computation (20 inverse FFTs of 2^17 points)', `${reference.toFixed(1)} ms ("ref")`);
  const guitars = [
    ['three single coils (47)', sample('three-single-coil.json')],
    ['humbucker and two single coils (572)', sample('humbucker-two-single-coil.json')],
    ...(process.env.BENCH_BIG === '1' ? [['five coils (9,997)', fiveCoilGuitar()] as const] : []),
  ] as const;
  for (const [label, guitar] of guitars) {
    const wirings = enumerateWirings(guitar.elements);
    const networks = wirings.map((wiring) => wiring.network);
    const coils = renderReferenceCoils(guitar);
    const prepareMs = medianMs(() => prepareReferenceFigures(guitar, {}, coils), 3);
    const meter = prepareReferenceFigures(guitar, {}, coils);
    const allMs = medianMs(() => measureFiguresByClass(guitar, meter, networks), 2);
    const synthesis = prepareReferenceSynthesis(guitar, {}, coils);
    const picked = wirings.filter((_, index) => index % Math.max(1, Math.floor(wirings.length / RENDERED_WIRINGS)) === 0).slice(0, RENDERED_WIRINGS);
    const renderedMs = medianMs(() => picked.forEach((wiring) => measureRawAudio(synthesis.synthesize(wiring.network), synthesis.sampleRateHz)), 2) / picked.length;
    const figuresPerWiring = allMs / wirings.length;
    line(
      label,
      `prepare ${prepareMs.toFixed(0)} ms, every wiring ${allMs.toFixed(0)} ms (${(figuresPerWiring * 1000).toFixed(0)} µs a wiring; ${((prepareMs + allMs) / reference).toFixed(1)} ref); ` +
        `from renders ${renderedMs.toFixed(1)} ms a wiring (${((renderedMs * wirings.length) / 1000).toFixed(1)} s for all): ${(renderedMs / figuresPerWiring).toFixed(0)}× faster a wiring`,
    );
  }
}
