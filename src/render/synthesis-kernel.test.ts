/**
 * The synthesis's per-bin passes as WebAssembly (synthesis-kernel.ts,
 * wasm/synthesis-passes.ts) against the same passes in JavaScript
 * (wiring-spectrum.ts, src/circuit/solve-series-parallel.ts): both forms do
 * the same IEEE 754 operations in the same order, so every render must be the
 * same to the last bit. Every wiring of three bundled guitars (three single
 * coils; a humbucker and two single coils; two humbuckers, whose coupled
 * coils take the nodal path), then knobs moved back and forth as the page
 * moves them, and the volume at 0.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { firstBitDifference } from '../../test/support/bit-difference.js';
import { phaseClassKey, phaseClassNetwork, phaseClassSigns, prepareCircuit, retuneCircuit, usesCoupledCoils } from '../circuit/index.js';
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import type { Phrase } from '../string/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { type WiringSynthesis, createWiringSynthesis, renderCoilSpectra } from './synthesize-wirings.js';
import { createSpectrumKernel, spectrumKernelBytes } from './synthesis-kernel.js';
import { type WiringSpectrum, javascriptSpectrum } from './wiring-spectrum.js';

const SAMPLE_RATE_HZ = 22_050;
const PHRASE: Phrase = {
  name: 'two notes',
  notes: [
    { timeS: 0, string: 6, fret: 0, velocity: 1 },
    { timeS: 0.05, string: 2, fret: 3, velocity: 0.7 },
  ],
};
const STRINGS = { tailS: 0.15 };
/** Knobs away from the file's: the volume below full (a bridge admittance in the load), the tone turned, a longer cable. */
const KNOBS = Object.freeze({ volumeSetting: 6, toneSetting: 3, cableCapacitanceF: 1.2e-9 });

function loadSample(name: string): Guitar {
  return parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', name), 'utf8'), name);
}

function coilSpectraOf(guitar: Guitar) {
  return { ...renderCoilSpectra(guitar, PHRASE, { sampleRateHz: SAMPLE_RATE_HZ, seed: 1, strings: STRINGS }), sampleRateHz: SAMPLE_RATE_HZ };
}

/** Both forms of one guitar's synthesis over the same coil spectra. */
function bothForms(guitar: Guitar): { javascript: WiringSynthesis; webassembly: WiringSynthesis } {
  const coils = coilSpectraOf(guitar);
  return { javascript: createWiringSynthesis(guitar, coils, {}, 'javascript'), webassembly: createWiringSynthesis(guitar, coils, {}, 'webassembly') };
}

describe('the output spectra as WebAssembly are the JavaScript form’s to the last bit (binary64, before any rounding to float32)', () => {
  it.each([
    ['three-single-coil.json', {}],
    ['two-humbucker.json', KNOBS],
    ['humbucker-two-single-coil.json', KNOBS],
  ])('%s, every wiring, at the file’s knobs and then at %o', (sample, knobs) => {
    const guitar = loadSample(sample);
    const { spectra, fftSize } = coilSpectraOf(guitar);
    const bins = fftSize / 2 + 1;
    const binsHz = Float64Array.from({ length: bins }, (_, k) => (k * SAMPLE_RATE_HZ) / fftSize);
    const circuit = prepareCircuit(guitar, binsHz, {});
    const circuits = [circuit, retuneCircuit(circuit, guitar, knobs)];
    const kernel = createSpectrumKernel(guitar, spectra, bins);
    if (kernel === null) throw new Error('this host cannot compile WebAssembly');
    const forms: [WiringSpectrum, WiringSpectrum] = [javascriptSpectrum(guitar, spectra, bins), kernel];
    const signs = new Float64Array(guitar.coils.length);
    for (const wiring of enumerateWirings(guitar.elements)) {
      const shape = phaseClassKey(guitar, wiring.network);
      const representative = phaseClassNetwork(guitar, wiring.network);
      phaseClassSigns(guitar, wiring.network, signs);
      for (const prepared of circuits) {
        const [expected, got] = forms.map((form) => {
          form.prepare(prepared, representative, shape);
          return Float64Array.from(form.sum(signs));
        }) as [Float64Array, Float64Array];
        expect(firstBitDifference(expected, got), wiring.expression).toBe(-1);
      }
    }
    // The memory the kernel took for every wiring stays within the estimate that decides whether a render uses it
    // (one page of 64 KiB kept clear at the start, src/math/wasm-arena.ts).
    expect(kernel.memoryBytes()).toBeLessThanOrEqual(spectrumKernelBytes(guitar.coils.length, bins) + 65_536);
  });
});

describe('the synthesis passes as WebAssembly give the JavaScript form’s renders to the last bit', () => {
  // Every wiring of the three single coils; the coupled humbuckers' nodal path is rendered in the knobs test below
  // (and compared for every wiring at the spectra's level above).
  it.each([['three-single-coil.json', false]])('%s: every wiring', (sample, coupled) => {
    const guitar = loadSample(sample);
    const { javascript, webassembly } = bothForms(guitar);
    const wirings = enumerateWirings(guitar.elements);
    let nodal = 0;
    let audible = 0;
    for (const wiring of wirings) {
      if (usesCoupledCoils(guitar, wiring.network)) nodal += 1;
      const expected = javascript.synthesize(wiring.network);
      const got = webassembly.synthesize(wiring.network);
      expect(firstBitDifference(expected, got), wiring.expression).toBe(-1);
      if (expected.some((sample) => sample !== 0)) audible += 1;
    }
    expect(audible).toBe(wirings.length);
    expect(nodal > 0).toBe(coupled);
  });

  it('with the knobs moved and moved back, and with the volume at 0', () => {
    const guitar = loadSample('two-humbucker.json');
    const { javascript, webassembly } = bothForms(guitar);
    const forms = [javascript, webassembly].map((synthesis) => ({
      first: synthesis,
      turned: synthesis.retune(guitar, KNOBS),
      silent: synthesis.retune(guitar, { volumeSetting: 0 }),
    }));
    const [js, wasm] = forms as [(typeof forms)[0], (typeof forms)[0]];
    const wirings = enumerateWirings(guitar.elements).filter((_, index) => index % 13 === 0);
    expect(wirings.some((wiring) => usesCoupledCoils(guitar, wiring.network))).toBe(true);
    for (const wiring of wirings) {
      for (const setting of ['turned', 'first', 'silent', 'turned'] as const) {
        const expected = js[setting].synthesize(wiring.network);
        const got = wasm[setting].synthesize(wiring.network);
        expect(firstBitDifference(expected, got), `${wiring.expression} (${setting})`).toBe(-1);
        if (setting === 'silent') expect(got.every((sample) => sample === 0)).toBe(true);
      }
    }
    // The knobs change the sound, so the settings above were not one render compared with itself.
    const wiring = wirings[1];
    if (wiring === undefined) throw new Error('no wiring');
    const first = Float32Array.from(wasm.first.synthesize(wiring.network));
    expect(firstBitDifference(first, wasm.turned.synthesize(wiring.network))).toBeGreaterThanOrEqual(0);
  });
});
