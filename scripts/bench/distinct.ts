/**
 * Distinctness speed: the one-off band cross-spectra of the coil EMFs, then
 * every wiring's band spectrum, level and brightness, and the grouping, for
 * 47, 572 and 9997 wirings; a shortlist of five on each; the comparison of
 * the demo with its candidate set. Printed, never asserted.
 */
import { performance } from 'node:perf_hooks';
import {
  designBands,
  REFERENCE_TAIL_S,
  groupAlikeWirings,
  measureCrossSpectra,
  measureDistinctness,
  measureGuitarComparison,
  measureSpectralBasis,
  measureSpectralProfiles,
  measureWiringDistance,
  resolveAlikeThresholds,
  solveShortlist,
  solveWiringSpectra,
} from '../../src/analysis/index.js';
import { measureCircuitMetrics } from '../../src/circuit/index.js';
import { nextPowerOfTwo } from '../../src/math/index.js';
import { computeCoilSpectra, pickupDelaySamples } from '../../src/pickup/index.js';
import { builtInPhrase, renderPhrase } from '../../src/string/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { fiveCoilGuitar, sample } from './guitars.js';
import { heading, line, medianMs } from './timing.js';




function once<T>(work: () => T): { value: T; ms: number } {
  const start = performance.now();
  const value = work();
  return { value, ms: performance.now() - start };
}

export function benchDistinct(): void {
  const demo = sample('three-single-coil.json');
  const stringOptions = { tailS: REFERENCE_TAIL_S };
  const strings = renderPhrase(demo, builtInPhrase('strum', demo.strings.length), stringOptions);
  const size = nextPowerOfTwo(strings.length + pickupDelaySamples(demo, strings));
  const bands = designBands(strings.sampleRateHz);
  heading(
    `Distinctness: the one-off band cross-spectra (strum, 48 kHz, ${bands.bands.length} ERB bands × ${bands.options.segmentsPerBand} segments)`,
  );
  line('strings: render the strum (6 strings)', `${medianMs(() => renderPhrase(demo, builtInPhrase('strum', 6), stringOptions), 3).toFixed(0)} ms`);
  for (const [label, guitar] of [
    ['3 coils', demo],
    ['5 coils', fiveCoilGuitar()],
  ] as const) {
    const spectra = computeCoilSpectra(guitar, strings, size);
    const layout = designBands(strings.sampleRateHz);
    line(`${label}: coil EMF spectra (FFT size ${size})`, `${medianMs(() => computeCoilSpectra(guitar, strings, size), 3).toFixed(0)} ms`);
    line(`${label}: band cross-spectra of every coil pair`, `${medianMs(() => measureCrossSpectra(spectra, size, layout), 3).toFixed(0)} ms`);
  }

  heading('Distinctness: every wiring (spectra from the cross-spectra, profiles, grouping), and a shortlist of 5');
  const thresholds = resolveAlikeThresholds();
  for (const [label, guitar] of [
    ['3 coils', demo],
    ['4 coils', sample('humbucker-two-single-coil.json')],
    ['5 coils', fiveCoilGuitar()],
  ] as const) {
    const wirings = enumerateWirings(guitar.elements);
    const basis = measureSpectralBasis(guitar);
    const repeats = wirings.length > 1000 ? 1 : 3;
    const spectraMs = medianMs(() => solveWiringSpectra(guitar, basis, wirings), repeats);
    const spectra = solveWiringSpectra(guitar, basis, wirings);
    const profiles = measureSpectralProfiles(spectra);
    const groupMs = medianMs(() => groupAlikeWirings(profiles, thresholds), repeats);
    const total = once(() => measureDistinctness(guitar, wirings));
    line(`${label}: ${wirings.length} wirings, band spectra and levels`, `${spectraMs.toFixed(0)} ms`);
    line(`${label}: ${wirings.length} wirings, grouping (and nearest neighbours)`, `${groupMs.toFixed(0)} ms`);
    line(`${label}: ${wirings.length} wirings, all of it from the guitar file`, `${total.ms.toFixed(0)} ms, ${total.value.groups.groups.length} groups`);
    const circuit = measureCircuitMetrics(guitar, wirings).wirings;
    const list = wirings.map((wiring, index) => ({
      rank: wiring.number,
      levelDb: profiles.levelsDb[index] as number,
      humCancelling: circuit[index]?.humCancelling ?? false,
      elements: wiring.elements,
      expression: wiring.expression,
    }));
    const distance = (a: number, b: number): number => measureWiringDistance(profiles, a, profiles, b, thresholds);
    const request = { count: 5, humCancelling: false, elements: null, elementIds: guitar.elements.map((element) => element.id), include: [], levelWindowDb: null };
    const free = once(() => solveShortlist(list, distance, request));
    const windowed = once(() => solveShortlist(list, distance, { ...request, levelWindowDb: 3 }));
    line(`${label}: shortlist of 5 (${free.value.method})`, `${free.ms.toFixed(0)} ms, smallest difference ${free.value.minDistance.toFixed(2)}×`);
    line(`${label}: shortlist of 5 within 3 dB (${windowed.value.method})`, `${windowed.ms.toFixed(0)} ms, smallest difference ${windowed.value.minDistance.toFixed(2)}×`);
  }

  heading('Compare: the demo guitar against its candidate set (both analysed, 47 wirings matched)');
  const candidate = sample('three-single-coil-alt.json');
  const comparison = once(() => measureGuitarComparison(demo, candidate));
  line('compare, from two guitar files', `${comparison.ms.toFixed(0)} ms, ${comparison.value.wirings.filter((wiring) => wiring.audible).length} of 47 audibly changed`);
}
