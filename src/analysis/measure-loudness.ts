/**
 * Integrated loudness per ITU-R BS.1770-4 (Annex 1), in LUFS (the standard's
 * LKFS; EBU R 128 calls the same unit LUFS):
 *
 * 1. K-weight every channel (designKWeighting).
 * 2. Cut the signal into gating blocks of T_g = 400 ms overlapping by 75 %
 *    (a new block every 100 ms); only whole blocks count.
 * 3. Block loudness l_j = −0.691 + 10·log10(Σ_i G_i·z_ij), z_ij the mean
 *    square of channel i in block j, G_i the channel weight (eq. 2 and 4).
 * 4. Absolute gate: keep blocks with l_j > Γa = −70 LUFS.
 * 5. Relative gate: Γr = −0.691 + 10·log10(Σ_i G_i·mean_j(z_ij)) − 10 over the
 *    blocks kept in 4; keep blocks with l_j > Γr as well.
 * 6. L_K = −0.691 + 10·log10(Σ_i G_i·mean_j(z_ij)) over the blocks kept in 5.
 *
 * Silence, and anything shorter than one block or with no block above the
 * absolute gate, has no integrated loudness; it reads LOUDNESS_FLOOR_LUFS
 * (−70, the absolute gate itself). Every measured value lies strictly above
 * the gate (it is a mean of block powers each above it), so −70 only ever
 * means "below the gate": finite, never −Infinity or NaN.
 */
import { InputError } from '../errors/index.js';
import { applyBiquad } from './biquad.js';
import { designKWeighting } from './k-weighting.js';

/** Gating block length T_g, s (ITU-R BS.1770-4, Annex 1, §4). */
export const GATING_BLOCK_S = 0.4;
/** Overlap of consecutive gating blocks (ITU-R BS.1770-4, Annex 1, §4: 75 %). */
export const GATING_BLOCK_OVERLAP = 0.75;
/** Absolute gate Γa, LUFS (ITU-R BS.1770-4, Annex 1, §5). */
export const ABSOLUTE_GATE_LUFS = -70;
/** Relative gate, LU below the absolutely gated loudness (ITU-R BS.1770-4, Annex 1, §5). */
export const RELATIVE_GATE_LU = -10;
/** The constant in the loudness equation, dB (ITU-R BS.1770-4, Annex 1, eq. 2: it makes a 1 kHz sine read its own level). */
export const LOUDNESS_OFFSET_DB = -0.691;
/** What a signal with no block above the absolute gate reads, LUFS: the gate itself (see above). */
export const LOUDNESS_FLOOR_LUFS = ABSOLUTE_GATE_LUFS;

/** Hops of 100 ms in one 400 ms block: 1 / (1 − overlap) = 4. */
const HOPS_PER_BLOCK = Math.round(1 / (1 - GATING_BLOCK_OVERLAP));
const DECIBELS_PER_DECADE = 10;

export interface LoudnessOptions {
  /**
   * Weight G_i per channel, in channel order; null means 1 for every channel.
   * ITU-R BS.1770-4, Annex 1, Table 3: 1.0 for left, right and centre, 1.41
   * for the left and right surround channels; the LFE channel is left out.
   * Each weight finite and ≥ 0. Default null.
   */
  readonly channelWeights: readonly number[] | null;
}

export const DEFAULT_LOUDNESS_OPTIONS: LoudnessOptions = Object.freeze({ channelWeights: null });

/** Power (Σ G·z) of a loudness value: 10^((L + 0.691)/10). */
function powerOfLoudness(lufs: number): number {
  return 10 ** ((lufs - LOUDNESS_OFFSET_DB) / DECIBELS_PER_DECADE);
}

function loudnessOfPower(power: number): number {
  return LOUDNESS_OFFSET_DB + DECIBELS_PER_DECADE * Math.log10(power);
}

function validate(channels: readonly ArrayLike<number>[], sampleRateHz: number, options: Partial<LoudnessOptions>): readonly number[] {
  if (channels.length === 0) throw InputError.at('channels', 'at least one channel of samples', []);
  const length = channels[0]?.length ?? 0;
  channels.forEach((channel, index) => {
    if (channel.length !== length) throw InputError.at(`channels[${index}]`, `${length} samples like channel 0`, `${channel.length} samples`);
  });
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) throw InputError.at('sampleRateHz', 'a positive sample rate in Hz', sampleRateHz);
  const weights = options.channelWeights ?? DEFAULT_LOUDNESS_OPTIONS.channelWeights ?? channels.map(() => 1);
  if (weights.length !== channels.length) throw InputError.at('channelWeights', `one weight per channel (${channels.length})`, weights);
  weights.forEach((weight, index) => {
    if (!Number.isFinite(weight) || weight < 0) throw InputError.at(`channelWeights[${index}]`, 'a finite weight ≥ 0', weight);
  });
  return weights;
}

/** Where the gating blocks of a signal lie (steps 2 of the file comment). */
export interface GatingBlocks {
  /** Hops of 100 ms that fit whole in the signal. */
  readonly hopCount: number;
  /** Whole blocks of four hops (0 when the signal is shorter than one block). */
  readonly blockCount: number;
  /** First sample of hop `hop`: round(hop·T_g/4·fs); block j covers [boundary(j), boundary(j + 4)). */
  boundary(hop: number): number;
}

/** The gating blocks of a signal of `length` samples at `sampleRateHz` (every loudness measure here cuts blocks this way). */
export function layoutGatingBlocks(length: number, sampleRateHz: number): GatingBlocks {
  const hopSamples = (GATING_BLOCK_S / HOPS_PER_BLOCK) * sampleRateHz;
  // Hop k covers samples [round(k·hop), round((k+1)·hop)); block j is hops j … j+3.
  const boundary = (hop: number): number => Math.round(hop * hopSamples);
  let hopCount = Math.floor(length / hopSamples);
  while (boundary(hopCount + 1) <= length) hopCount += 1;
  return { hopCount, blockCount: hopCount - HOPS_PER_BLOCK + 1, boundary };
}

/** Hops in one gating block (4). */
export const HOPS_PER_GATING_BLOCK = HOPS_PER_BLOCK;

/**
 * Steps 4–6 of the file comment: the gated loudness of block powers
 * Σ_i G_i·z_ij (mean squares of the K-weighted channels over each block),
 * LUFS; LOUDNESS_FLOOR_LUFS when no block passes the absolute gate.
 */
export function integrateGatedLoudness(blockPower: ArrayLike<number>): number {
  const meanAbove = (threshold: number): { mean: number; count: number } => {
    let sum = 0;
    let count = 0;
    for (let block = 0; block < blockPower.length; block += 1) {
      const power = blockPower[block] as number;
      if (power > threshold) {
        sum += power;
        count += 1;
      }
    }
    return { mean: count > 0 ? sum / count : 0, count };
  };
  const absolutelyGated = meanAbove(powerOfLoudness(ABSOLUTE_GATE_LUFS));
  if (absolutelyGated.count === 0) return LOUDNESS_FLOOR_LUFS;
  const relativeGateLufs = loudnessOfPower(absolutelyGated.mean) + RELATIVE_GATE_LU;
  const gated = meanAbove(Math.max(powerOfLoudness(relativeGateLufs), powerOfLoudness(ABSOLUTE_GATE_LUFS)));
  return loudnessOfPower(gated.mean);
}

/**
 * Integrated loudness of `channels` (equal lengths; mono is one channel) at
 * `sampleRateHz`, LUFS. See the file comment for the method and the floor.
 */
export function measureLoudness(
  channels: readonly ArrayLike<number>[],
  sampleRateHz: number,
  options: Partial<LoudnessOptions> = {},
): number {
  const weights = validate(channels, sampleRateHz, options);
  const length = channels[0]?.length ?? 0;
  const { hopCount, blockCount, boundary } = layoutGatingBlocks(length, sampleRateHz);
  if (blockCount < 1) return LOUDNESS_FLOOR_LUFS;

  // Σ_i G_i · Σ_n y_i[n]² per hop, y the K-weighted channel.
  const hopEnergy = new Float64Array(hopCount);
  const [preFilter, rlbFilter] = designKWeighting(sampleRateHz);
  const weighted = new Float64Array(length);
  channels.forEach((channel, index) => {
    const weight = weights[index] ?? 1;
    if (weight === 0) return;
    // Widened to float64 first (exact): applyBiquad sees one array type (see measure-audio-figures.ts).
    weighted.set(channel);
    applyBiquad(preFilter, weighted, weighted);
    applyBiquad(rlbFilter, weighted, weighted);
    for (let hop = 0; hop < hopCount; hop += 1) {
      let sum = 0;
      const end = boundary(hop + 1);
      for (let n = boundary(hop); n < end; n += 1) {
        const y = weighted[n] as number;
        sum += y * y;
      }
      hopEnergy[hop] = (hopEnergy[hop] as number) + weight * sum;
    }
  });

  // Block power Σ_i G_i·z_ij (mean squares over the block).
  const blockPower = new Float64Array(blockCount);
  for (let block = 0; block < blockCount; block += 1) {
    let sum = 0;
    for (let hop = block; hop < block + HOPS_PER_BLOCK; hop += 1) sum += hopEnergy[hop] as number;
    blockPower[block] = sum / (boundary(block + HOPS_PER_BLOCK) - boundary(block));
  }

  if (!hopEnergy.every(Number.isFinite)) {
    throw new InputError([{ path: 'channels', expected: 'finite samples', got: 'NaN or an infinite sample' }]);
  }

  return integrateGatedLoudness(blockPower);
}
