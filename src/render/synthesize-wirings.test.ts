/**
 * A note at t = 0 keeps its whole attack: the centred pickup response
 * (src/pickup/compute-coil-spectra.ts) starts up to D samples before the
 * note, and the render keeps those samples. Checked by Parseval (Oppenheim &
 * Schafer, §8.5): the render's energy Σ y[n]² equals the energy of the whole
 * linear output Σ_k w_k·|Y_k|², Y_k = Σ_i T_i(f_k)·E_i(f_k) solved here bin
 * by bin, so nothing before the note (nor after it) is lost. Cutting the
 * first D samples, as a render aligned on the phrase's t = 0 did, loses part
 * of the attack and fails this.
 */
import { describe, expect, it } from 'vitest';
import { parseGuitarText } from '../guitar/index.js';
import { prepareCircuit, solveTransfers } from '../circuit/index.js';
import { computeCoilSpectra, pickupDelaySamples } from '../pickup/index.js';
import { type Phrase, renderPhrase } from '../string/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { COIL_VOLTS_PER_METRE_PER_SECOND, prepareWiringSynthesis } from './synthesize-wirings.js';

const SAMPLE = join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json');
const SAMPLE_RATE_HZ = 48_000;
const TAIL_S = 0.5;
const RELATIVE_TOLERANCE = 1e-6;

describe('a phrase with a note at t = 0', () => {
  const guitar = parseGuitarText(readFileSync(SAMPLE, 'utf8'), 'three-single-coil.json');
  const phrase: Phrase = { name: 'one note at t = 0', notes: [{ timeS: 0, string: 6, fret: 0, velocity: 1 }] };
  const options = { sampleRateHz: SAMPLE_RATE_HZ, seed: 1, overrides: {}, strings: { tailS: TAIL_S } };

  it.each(['neck', 'bridge', 'neck + ~bridge'])('%s: the render holds the whole output, the pickup response before the note included', (expression) => {
    const wiring = enumerateWirings(guitar.elements).find((candidate) => candidate.expression === expression);
    if (wiring === undefined) throw new Error(`no wiring ${expression}`);
    const synthesis = prepareWiringSynthesis(guitar, phrase, options);
    const rendered = synthesis.synthesize(wiring.network);
    let renderedEnergy = 0;
    for (const sample of rendered) renderedEnergy += sample * sample;

    const strings = renderPhrase(guitar, phrase, { tailS: TAIL_S, sampleRateHz: SAMPLE_RATE_HZ, seed: 1 });
    const delay = pickupDelaySamples(guitar, strings);
    expect(delay).toBeGreaterThan(0);
    const size = synthesis.fftSize;
    const spectra = computeCoilSpectra(guitar, strings, size);
    const bins = size / 2 + 1;
    const transfers = solveTransfers(prepareCircuit(guitar, Float64Array.from({ length: bins }, (_, k) => (k * SAMPLE_RATE_HZ) / size)), wiring.network);
    let frameEnergy = 0;
    for (let k = 0; k < bins; k += 1) {
      let re = 0;
      let im = 0;
      transfers.forEach((transfer, c) => {
        const spectrum = spectra[c] as Float64Array;
        const tr = transfer[2 * k] as number;
        const ti = transfer[2 * k + 1] as number;
        re += tr * (spectrum[2 * k] as number) - ti * (spectrum[2 * k + 1] as number);
        im += tr * (spectrum[2 * k + 1] as number) + ti * (spectrum[2 * k] as number);
      });
      frameEnergy += ((k === 0 || k === bins - 1 ? 1 : 2) / size) * (re * re + im * im);
    }
    frameEnergy *= COIL_VOLTS_PER_METRE_PER_SECOND ** 2;
    expect(Math.abs(renderedEnergy / frameEnergy - 1)).toBeLessThan(RELATIVE_TOLERANCE);
    // and the samples before the note's own time carry signal
    let leadIn = 0;
    for (let n = 0; n < delay; n += 1) leadIn += (rendered[n] as number) ** 2;
    expect(leadIn).toBeGreaterThan(RELATIVE_TOLERANCE * frameEnergy);
  });
});
