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
import { prepareCircuit, solveTransfers, usesCoupledCoils } from '../circuit/index.js';
import { computeCoilSpectra, pickupDelaySamples } from '../pickup/index.js';
import { type Phrase, renderPhrase } from '../string/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { maxOf } from '../math/index.js';
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

/**
 * A knob move retunes the synthesis (only the load is solved again, the open-circuit products are shared): every
 * eleventh wiring of the two-humbucker sample (coupled coils included, solved by nodal analysis) at other knobs must sound
 * as a synthesis prepared from scratch at those knobs (whose coils' Thevenin pairs are computed anew). The page's
 * knob renders are also checked against the Node render in chromium (test/listening-page.browser.test.ts).
 */
describe('retuning a synthesis to other knobs', () => {
  const four = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'two-humbucker.json'), 'utf8'), 'two-humbucker.json');
  const phrase: Phrase = { name: 'one note', notes: [{ timeS: 0, string: 5, fret: 0, velocity: 1 }] };
  const options = { sampleRateHz: 22_050, seed: 1, overrides: {}, strings: { tailS: 0.2 } };
  const knobs = { volumeSetting: 6, toneSetting: 3, cableCapacitanceF: 1.2e-9 };
  const tone = four.controls.tone;
  if (tone === null || tone === undefined) throw new Error('the sample has a tone control');
  const otherCapacitor = { ...four, controls: { ...four.controls, tone: { ...tone, capacitorF: 47e-9 } } };

  it('sounds as a synthesis prepared at those knobs, every eleventh wiring, within 1e-12 of its peak', () => {
    const first = prepareWiringSynthesis(four, phrase, options);
    const fresh = prepareWiringSynthesis(otherCapacitor, phrase, { ...options, overrides: knobs });
    const retuned = first.retune(otherCapacitor, knobs);
    let worst = 0;
    let coupled = 0;
    for (const wiring of enumerateWirings(four.elements).filter((_, index) => index % 11 === 0)) {
      if (usesCoupledCoils(four, wiring.network)) coupled += 1;
      first.synthesize(wiring.network); // leave the shared products of another setting behind, as a page does
      const expected = fresh.synthesize(wiring.network);
      const got = retuned.synthesize(wiring.network);
      let peak = 0;
      let error = 0;
      for (let n = 0; n < expected.length; n += 1) {
        peak = Math.max(peak, Math.abs(expected[n] as number));
        error = Math.max(error, Math.abs((expected[n] as number) - (got[n] as number)));
      }
      if (peak > 0) worst = Math.max(worst, error / peak);
    }
    expect(worst).toBeLessThan(1e-12);
    expect(coupled).toBeGreaterThan(0); // the nodal path was taken too
  });

  it('changes the sound (volume 6, tone 3, 47 nF darken the neck humbucker)', () => {
    const first = prepareWiringSynthesis(four, phrase, options);
    const wiring = enumerateWirings(four.elements)[0];
    if (wiring === undefined) throw new Error('no wiring');
    const before = Float32Array.from(first.synthesize(wiring.network));
    const after = first.retune(otherCapacitor, knobs).synthesize(wiring.network);
    let difference = 0;
    for (let n = 0; n < before.length; n += 1) difference = Math.max(difference, Math.abs((before[n] as number) - (after[n] as number)));
    expect(difference).toBeGreaterThan(1e-4 * maxOf(Array.from(before, Math.abs)));
  });
});
