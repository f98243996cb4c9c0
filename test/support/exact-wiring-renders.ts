/**
 * The slow, direct way to a wiring's output, for checking the band
 * cross-spectra shortcut: every wiring's transfers solved at every FFT bin,
 * Y_k = Σ_i T_i(f_k)·E_i(f_k), its energy by Parseval and its time signal by
 * an inverse FFT (the direct chain's render before any gain).
 */
import { REFERENCE_TAIL_S } from '../../src/analysis/index.js';
import { type CircuitOverrides, prepareCircuit, solveTransfers } from '../../src/circuit/index.js';
import type { Guitar } from '../../src/guitar/index.js';
import { nextPowerOfTwo, realFft } from '../../src/math/index.js';
import { computeCoilSpectra, pickupDelaySamples } from '../../src/pickup/index.js';
import { builtInPhrase, renderPhrase } from '../../src/string/index.js';
import type { Network } from '../../src/wiring/index.js';

export interface ExactRenders {
  readonly sampleRateHz: number;
  /** Σ y[n]² of each wiring's output. */
  readonly energies: number[];
  /** Each output over the phrase plus the pickup delay (where it is not silent). */
  readonly renders: Float64Array[];
}

export function renderWiringsExactly(guitar: Guitar, networks: readonly Network[], overrides?: CircuitOverrides, keepRenders = true): ExactRenders {
  const strings = renderPhrase(guitar, builtInPhrase('strum', guitar.strings.length), { tailS: REFERENCE_TAIL_S });
  const delay = pickupDelaySamples(guitar, strings);
  const size = nextPowerOfTwo(strings.length + delay);
  const spectra = computeCoilSpectra(guitar, strings, size);
  const bins = size / 2 + 1;
  const frequencies = Float64Array.from({ length: bins }, (_, k) => (k * strings.sampleRateHz) / size);
  const prepared = prepareCircuit(guitar, frequencies, overrides);
  const fft = realFft(size);
  const output = new Float64Array(2 * bins);
  const transfers = guitar.coils.map(() => new Float64Array(2 * bins));
  const energies: number[] = [];
  const renders: Float64Array[] = [];
  for (const network of networks) {
    solveTransfers(prepared, network, transfers);
    let energy = 0;
    for (let k = 0; k < bins; k += 1) {
      let re = 0;
      let im = 0;
      spectra.forEach((spectrum, c) => {
        const t = transfers[c] as Float64Array;
        const tr = t[2 * k] as number;
        const ti = t[2 * k + 1] as number;
        const er = spectrum[2 * k] as number;
        const ei = spectrum[2 * k + 1] as number;
        re += tr * er - ti * ei;
        im += tr * ei + ti * er;
      });
      output[2 * k] = re;
      output[2 * k + 1] = im;
      energy += ((k === 0 || k === bins - 1 ? 1 : 2) / size) * (re * re + im * im);
    }
    energies.push(energy);
    if (keepRenders) renders.push(fft.inverse(output).slice(0, strings.length + delay));
  }
  return { sampleRateHz: strings.sampleRateHz, energies, renders };
}
