/**
 * The offline effects chain: the same processing for every wiring's render,
 * so that only the wiring changes between files.
 *
 *   renderEffectsChain(samples, sampleRateHz, 'drive', { inputGain: 1 })
 *
 * - direct: the output jack as is (a copy of the input; no context is made).
 * - clean: amplifier-like tone stack and speaker cabinet (tone-stack.ts,
 *   speaker-cabinet.ts).
 * - drive: drive gain, asymmetric soft clipper with 4× oversampling
 *   (drive-curve.ts), tone stack, cabinet.
 * - compressed: a 4:1 compressor (compressor-settings.ts, our own code in
 *   render-compressor.ts) before the clean stages.
 *
 * The output has the input's length and lines up with it sample for sample
 * (the fixed delay of node-web-audio-api's oversampler is removed; the
 * compressor looks at no sample ahead). Two renders of the same input are identical.
 */
import { InputError } from '../errors/index.js';
import { designEffectsChain } from './chain-design.js';
import { type ChainName, parseChainName } from './chain-name.js';
import { type ChainOptions, resolveChainOptions } from './chain-options.js';
import { renderChainDesign } from './render-chain-design.js';
import { samplePasses } from './sample-passes.js';

/** Lowest sample rate accepted, Hz: the cabinet's 5 kHz roll-off needs room below the Nyquist frequency (our choice: the CD rate's half). */
export const MIN_SAMPLE_RATE_HZ = 22_050;
/** Highest sample rate accepted, Hz (common practice: the highest rate of audio interfaces). */
export const MAX_SAMPLE_RATE_HZ = 192_000;

function validateInput(samples: Float32Array, sampleRateHz: number): void {
  if (!(samples instanceof Float32Array)) throw InputError.at('samples', 'a Float32Array of samples', typeof samples);
  if (!Number.isInteger(sampleRateHz) || sampleRateHz < MIN_SAMPLE_RATE_HZ || sampleRateHz > MAX_SAMPLE_RATE_HZ) {
    throw InputError.at('sampleRateHz', `a whole number of Hz from ${MIN_SAMPLE_RATE_HZ} to ${MAX_SAMPLE_RATE_HZ}`, sampleRateHz);
  }
  // Σ x·0 is a zero exactly when every sample is finite (sample-passes.ts); otherwise the first bad sample is found,
  // for the message.
  if (samplePasses().finiteSum(samples) === 0) return;
  for (let i = 0; i < samples.length; i += 1) {
    const value = samples[i];
    if (!Number.isFinite(value)) throw new InputError([{ path: `samples[${i}]`, expected: 'a finite sample value', got: String(value) }]);
  }
}

/**
 * Render mono `samples` at `sampleRateHz` through `chain`. Resolves to a new
 * array of the same length; the input is not modified.
 */
export async function renderEffectsChain(
  samples: Float32Array,
  sampleRateHz: number,
  chain: ChainName,
  options: Partial<ChainOptions> = {},
): Promise<Float32Array> {
  const name = parseChainName(chain, 'chain');
  const resolved = resolveChainOptions(options);
  validateInput(samples, sampleRateHz);
  if (name === 'direct') return Float32Array.from(samples);
  return renderChainDesign(samples, designEffectsChain(name, resolved, sampleRateHz));
}
