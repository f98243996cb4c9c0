/**
 * docs/design.md's audio figures of every wiring (levelDb's energy,
 * loudnessLufs, centroidHz) from the coils' own signals, with no render and
 * no FFT per wiring.
 *
 * A wiring's direct output is linear in the coils' EMFs: Y(f) = Σ_i p_i·T_i(f)·E_i(f)
 * (docs/design.md, data flow; p_i = ±1 the phase, T_i the loaded transfer of
 * the wiring's phase class). Every figure is therefore a function of a few
 * per-coil quantities computed once per guitar:
 *
 * - Energy (Parseval over the synthesis frame of N points; Oppenheim &
 *   Schafer, Discrete-Time Signal Processing, §8.5):
 *     E = Σ_k w_k·|Y_k|² = Σ_ij p_i·p_j·Re Σ_k w_k·T_i·conj(T_j)·S_ij(k),
 *   S_ij = E_i·conj(E_j), w_0 = w_{N/2} = 1/N, w_k = 2/N otherwise.
 * - Loudness (ITU-R BS.1770-4): the K-weighting commutes with the circuit
 *   (both linear and time-invariant), so the K-weighted output is
 *   Σ_i p_i·t_i ∗ K(e_i). Each gating block j of K(e_i) (400 ms, a new one
 *   every 100 ms, measure-loudness.ts) is cut out with a rectangular window,
 *   zero padded to N_b points and transformed: U_ij. The block's mean square
 *   is then z_j = (1/len_j)·Σ_ab p_a·p_b·Re Σ_k w_k·T_a·conj(T_b)·U_aj·conj(U_bj),
 *   the mean square over the block of the circuit applied to the cut block.
 *   It differs from cutting the output only by the circuit's impulse
 *   response at the block's two edges (well under a millisecond against
 *   400 ms); the gating then runs unchanged (integrateGatedLoudness).
 * - Centroid: the Hann window (measure-centroid.ts) also commutes with the
 *   circuit up to the same edge effect, here spread over the whole render,
 *   so X(f) = Σ_i p_i·T_i(f)·H_i(f) with H_i the FFT of the Hann-windowed
 *   coil signal e_i (the render's length L, zero padded to N), and
 *   SC = Σ f_k·|X_k| / Σ |X_k| over 20 Hz–20 kHz as measureCentroid. The
 *   magnitude is not a quadratic form, so this sum runs over the bins for
 *   each wiring: no FFT, but per bin the products T_i·H_i (shared by the
 *   phase patterns of a class, measured together) and a square root per
 *   pattern.
 *
 * The circuit is solved at a grid of frequencies (0 Hz, then GRID_POINTS_PER_OCTAVE
 * log-spaced points per octave from GRID_LOWEST_HZ to Nyquist) and the
 * transfers are interpolated linearly in between (the hat functions φ_m):
 * T_i(f) = Σ_m φ_m(f)·T_i(g_m) for the centroid, and for the quadratic forms
 * the products T_a·conj(T_b) are interpolated, so the frequency sums fold into
 * the per-guitar tables S̃_ab,m = Σ_k w_k·φ_m(f_k)·S_ab(k). A phase class then
 * costs its transfers at the grid points and a few small dot products; a
 * phase pattern a few multiplications for energy and loudness, and for the
 * centroid its share of one pass over the band's bins. Linear interpolation is
 * second order: at 48 points per octave (1.45 % steps) a resonance with Q = 5
 * is off by about 0.07 % in |T|²; test/audio-figures.test.ts measures the
 * figures against each wiring's own render (measureEnergy, measureLoudness,
 * measureCentroid) and states the bounds.
 *
 * Any connection of coil leads (a `CircuitGraph`, `measureGraph`) is taken
 * the same way with its transfers from the nodal solver (solve-nodal.ts),
 * which carry every sign: one pattern with s_i = 1.
 */
import {
  type CircuitGraph,
  type CircuitOverrides,
  phaseClassKey,
  phaseClassNetwork,
  phaseClassSigns,
  prepareCircuit,
  solveNodalTransfers,
  solveTransfers,
} from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { anyNonZero, nextPowerOfTwo, realFft } from '../math/index.js';
import type { Network } from '../wiring/index.js';
import { applyBiquad } from './biquad.js';
import { prepareCentroidPass } from './centroid-kernel.js';
import { designKWeighting } from './k-weighting.js';
import { DEFAULT_CENTROID_OPTIONS, SILENCE_CENTROID_HZ } from './measure-centroid.js';
import { HOPS_PER_GATING_BLOCK, LOUDNESS_FLOOR_LUFS, integrateGatedLoudness, layoutGatingBlocks } from './measure-loudness.js';

/** Grid points per octave at which the circuit is solved (1.45 % steps; the figures' error against a render is measured in test/audio-figures.test.ts). */
export const GRID_POINTS_PER_OCTAVE = 48;
/** Lowest log-spaced grid point, Hz (below it the grid has only 0 Hz: the loaded circuit is flat there, common practice). */
export const GRID_LOWEST_HZ = 10;
/**
 * Least zero padding after a gating block before its FFT, s: room for the
 * circuit's impulse response (a resonance at 1 kHz with Q = 10 decays by
 * 60 dB in 6.9·Q/(π·f) ≈ 22 ms), so the block's output is a linear, not a
 * circular, convolution.
 */
export const BLOCK_PADDING_S = 0.05;

/** The coils' EMFs for the reference performance, as the render keeps them (render/synthesize-wirings.ts `CoilSignals`). */
export interface CoilRecording {
  readonly sampleRateHz: number;
  /** Samples in every wiring's render, L. */
  readonly length: number;
  /** Synthesis frame N (a power of two ≥ L). */
  readonly fftSize: number;
  /** One signal per coil (guitar.coils order), volts; at least L samples each, at most N. */
  readonly signals: readonly Float32Array[];
}

/** What a wiring's render of the reference phrase measures, before levels are referred to the single coils. */
export interface RawAudioFigures {
  /** Σ y² of the render over the synthesis frame, V²·samples. */
  readonly energy: number;
  readonly loudnessLufs: number;
  readonly centroidHz: number;
}

export interface AudioFigureMeter {
  /** Is the output shorted (volume at 0)? Every wiring is then silent. */
  readonly silent: boolean;
  /** The figures of one wiring. */
  measure(network: Network): RawAudioFigures;
  /** The figures of several wirings of one phase class (phaseClassKey), cheaper together than one by one; the same numbers either way. */
  measureClass(networks: readonly Network[]): RawAudioFigures[];
  /** The figures of any connection of coil leads (a bridge network, say), its transfers from the nodal solver. */
  measureGraph(graph: CircuitGraph): RawAudioFigures;
}

/** Grid of the circuit solves: 0 Hz, then points per octave from GRID_LOWEST_HZ, ending at `topHz` exactly. */
export function designFigureGrid(topHz: number): Float64Array {
  const points = [0];
  for (let m = 0; ; m += 1) {
    const frequencyHz = GRID_LOWEST_HZ * 2 ** (m / GRID_POINTS_PER_OCTAVE);
    if (frequencyHz >= topHz) break;
    points.push(frequencyHz);
  }
  points.push(topHz);
  return Float64Array.from(points);
}

/**
 * Where bin frequencies k·binHz (k = first … last) fall on the grid: the
 * grid interval's lower point and the hat weight t of the upper one,
 * T(f) ≈ (1 − t)·T(g_m) + t·T(g_{m+1}).
 */
function locateBins(grid: Float64Array, binHz: number, first: number, last: number): { node: Int32Array; weight: Float64Array } {
  const count = last - first + 1;
  const node = new Int32Array(count);
  const weight = new Float64Array(count);
  let m = 0;
  for (let k = first; k <= last; k += 1) {
    const frequencyHz = k * binHz;
    while (m < grid.length - 2 && frequencyHz >= (grid[m + 1] as number)) m += 1;
    const low = grid[m] as number;
    const high = grid[m + 1] as number;
    node[k - first] = m;
    weight[k - first] = Math.min(1, Math.max(0, (frequencyHz - low) / (high - low)));
  }
  return { node, weight };
}

/**
 * S̃_ab,m = Σ_k w_k·φ_m(f_k)·A_a(k)·conj(A_b(k)) over every bin of half
 * spectra `spectra` (realFft layout, N = size) for the pairs a ≤ b, added
 * into `out` at 2·(pair·points + m) (interleaved complex), pair by pair
 * (foldPair).
 */
function foldCrossSpectra(spectra: readonly Float64Array[], size: number, located: { node: Int32Array; weight: Float64Array }, points: number, out: Float64Array): void {
  const coils = spectra.length;
  let pair = 0;
  for (let a = 0; a < coils; a += 1) {
    for (let b = a; b < coils; b += 1) {
      foldPair(spectra[a] as Float64Array, spectra[b] as Float64Array, size, located.node, located.weight, out, 2 * pair * points);
      pair += 1;
    }
  }
}

/**
 * One pair's S̃ into `out` from `at` (grid point m at at + 2m). Bins run in
 * order of frequency, so grid point m gathers first the upper hat weights of
 * the bins below it (interval m − 1), then the lower ones of the bins above
 * it (interval m). The two open sums (points m and m + 1, real and
 * imaginary) live in local variables while the bins stay in one grid
 * interval and are written out when the interval changes: every table entry
 * receives the same additions in the same order as adding into the table bin
 * by bin, so the same bits.
 */
function foldPair(first: Float64Array, second: Float64Array, size: number, node: Int32Array, weight: Float64Array, out: Float64Array, at: number): void {
  const bins = size / 2 + 1;
  let open = -1;
  let lowRe = 0;
  let lowIm = 0;
  let highRe = 0;
  let highIm = 0;
  for (let k = 0; k < bins; k += 1) {
    const m = node[k] as number;
    if (m !== open) {
      if (open >= 0) {
        out[at + 2 * open] = lowRe;
        out[at + 2 * open + 1] = lowIm;
        out[at + 2 * open + 2] = highRe;
        out[at + 2 * open + 3] = highIm;
      }
      // The new interval's lower point is the old one's upper point when they touch; every other
      // point starts from what the table already holds.
      if (m === open + 1 && open >= 0) {
        lowRe = highRe;
        lowIm = highIm;
      } else {
        lowRe = out[at + 2 * m] as number;
        lowIm = out[at + 2 * m + 1] as number;
      }
      highRe = out[at + 2 * m + 2] as number;
      highIm = out[at + 2 * m + 3] as number;
      open = m;
    }
    const parseval = (k === 0 || k === bins - 1 ? 1 : 2) / size;
    const upper = weight[k] as number;
    const lowWeight = parseval * (1 - upper);
    const highWeight = parseval * upper;
    const ar = first[2 * k] as number;
    const ai = first[2 * k + 1] as number;
    const br = second[2 * k] as number;
    const bi = second[2 * k + 1] as number;
    // A_a·conj(A_b) = (ar + j·ai)(br − j·bi)
    const pr = ar * br + ai * bi;
    const pi = ai * br - ar * bi;
    lowRe += lowWeight * pr;
    lowIm += lowWeight * pi;
    highRe += highWeight * pr;
    highIm += highWeight * pi;
  }
  if (open >= 0) {
    out[at + 2 * open] = lowRe;
    out[at + 2 * open + 1] = lowIm;
    out[at + 2 * open + 2] = highRe;
    out[at + 2 * open + 3] = highIm;
  }
}

export interface AudioFigureOptions {
  /**
   * Bins of the centroid pass taken at a time: each class's products P_u for
   * a chunk of bins are worked out once, then every phase pattern runs its
   * own loop over the chunk with no branch inside. Any size gives the same
   * numbers (each pattern's sums take the bins in order either way); 512 is
   * a tuning choice, measured on the five-coil bench guitar (256 to 2,048
   * within noise of each other): a chunk's products for five coils, 40 kB,
   * stay in the processor's cache.
   */
  readonly centroidChunkBins: number;
}

export const DEFAULT_AUDIO_FIGURE_OPTIONS: Readonly<AudioFigureOptions> = Object.freeze({ centroidChunkBins: 512 });

/**
 * Re Σ_m Q_m·S̃_m over `points` grid points, S̃ read from `table` at `offset`.
 * A loop of its own (as math/any-non-zero.ts), so that V8's code compiled
 * for a running loop has nothing after it to bail out on (seen with node
 * --trace-deopt: once per phase class; src/math/real-fft.ts).
 */
function foldPairTerm(pairProduct: Float64Array, table: Float64Array, offset: number, points: number): number {
  let sum = 0;
  for (let m = 0; m < points; m += 1) {
    sum += (pairProduct[2 * m] as number) * (table[offset + 2 * m] as number) - (pairProduct[2 * m + 1] as number) * (table[offset + 2 * m + 1] as number);
  }
  return sum;
}

/**
 * Prepare the audio figures of every wiring of `guitar` from the coil signals
 * of the reference performance (see the file comment). The result is a pure
 * function of its inputs: a wiring's figures do not depend on which wirings
 * were measured before it.
 */
export function prepareAudioFigures(guitar: Guitar, coils: CoilRecording, overrides: CircuitOverrides = {}, options: Partial<AudioFigureOptions> = {}): AudioFigureMeter {
  const { centroidChunkBins } = { ...DEFAULT_AUDIO_FIGURE_OPTIONS, ...options };
  if (!Number.isInteger(centroidChunkBins) || centroidChunkBins < 1) {
    throw new RangeError(`prepareAudioFigures: centroidChunkBins must be a whole number ≥ 1, got ${centroidChunkBins}`);
  }
  const { sampleRateHz, length, fftSize } = coils;
  const coilCount = guitar.coils.length;
  const pairCount = (coilCount * (coilCount + 1)) / 2;
  const grid = designFigureGrid(sampleRateHz / 2);
  const points = grid.length;
  const circuit = prepareCircuit(guitar, grid, overrides);
  const silentFigures: RawAudioFigures = Object.freeze({ energy: 0, loudnessLufs: LOUDNESS_FLOOR_LUFS, centroidHz: SILENCE_CENTROID_HZ });
  if (circuit.load.silent) return { silent: true, measure: () => silentFigures, measureClass: (networks) => networks.map(() => silentFigures), measureGraph: () => silentFigures };

  const fft = realFft(fftSize);
  const binHz = sampleRateHz / fftSize;
  const allBins = locateBins(grid, binHz, 0, fft.bins - 1);

  // Energy: S̃ over the whole synthesis frame (forwardPacked zero pads each signal to N itself).
  const energyTable = new Float64Array(2 * pairCount * points);
  const spectra = coils.signals.map((signal) => fft.forwardPacked(signal, new Float64Array(2 * fft.bins)));
  foldCrossSpectra(spectra, fftSize, allBins, points, energyTable);

  // Loudness: K-weighted coil signals over the render, cut into gating blocks.
  const blocks = layoutGatingBlocks(length, sampleRateHz);
  const blockCount = Math.max(0, blocks.blockCount);
  const blockLengths = new Float64Array(blockCount);
  let longestBlock = 0;
  for (let block = 0; block < blockCount; block += 1) {
    blockLengths[block] = blocks.boundary(block + HOPS_PER_GATING_BLOCK) - blocks.boundary(block);
    longestBlock = Math.max(longestBlock, blockLengths[block] as number);
  }
  const blockSize = nextPowerOfTwo(longestBlock + Math.ceil(BLOCK_PADDING_S * sampleRateHz));
  const blockFft = realFft(blockSize);
  const blockBins = locateBins(grid, sampleRateHz / blockSize, 0, blockFft.bins - 1);
  const blockTables = Array.from({ length: blockCount }, () => new Float64Array(2 * pairCount * points));
  const [preFilter, rlbFilter] = designKWeighting(sampleRateHz);
  const weighted = coils.signals.map((signal) => {
    // Widened to float64 first (exact), so applyBiquad only ever sees Float64Array input: a second array type
    // made V8 throw away its compiled loop and run the next call's samples uncompiled (node --trace-deopt).
    const out = new Float64Array(signal.subarray(0, length));
    applyBiquad(preFilter, out, out);
    return applyBiquad(rlbFilter, out, out);
  });
  const blockSpectra = weighted.map(() => new Float64Array(2 * blockFft.bins));
  for (let block = 0; block < blockCount; block += 1) {
    const start = blocks.boundary(block);
    const end = blocks.boundary(block + HOPS_PER_GATING_BLOCK);
    weighted.forEach((signal, coil) => blockFft.forwardPacked(signal.subarray(start, end), blockSpectra[coil] as Float64Array));
    foldCrossSpectra(blockSpectra, blockSize, blockBins, points, blockTables[block] as Float64Array);
  }

  // Centroid: Hann-windowed coil spectra over the band's bins (measure-centroid.ts's window, band and zero padding).
  const firstBin = Math.ceil(DEFAULT_CENTROID_OPTIONS.lowHz / binHz);
  const lastBin = Math.min(Math.floor(DEFAULT_CENTROID_OPTIONS.highHz / binHz), fft.bins - 1);
  const bandBins = Math.max(0, lastBin - firstBin + 1);
  // The band's bins lie on the grid where every bin does (locateBins walks the grid the same way from any first bin).
  const bandLocation = { node: allBins.node.subarray(firstBin, lastBin + 1), weight: allBins.weight.subarray(firstBin, lastBin + 1) };
  const window = new Float64Array(length);
  // Symmetric Hann, w[n] = 0.5 − 0.5·cos(2πn/(L − 1)) (measure-centroid.ts).
  for (let n = 0; n < length; n += 1) window[n] = length > 1 ? (1 - Math.cos((2 * Math.PI * n) / (length - 1))) / 2 : 1;
  // Into the energy spectra's arrays (folded above, not read again): no fresh megabytes to fault in per coil.
  const windowed = coils.signals.map((signal, coil) => {
    const spectrum = fft.forwardPacked(signal.subarray(0, length), spectra[coil] as Float64Array, window);
    return spectrum.subarray(2 * firstBin, 2 * (lastBin + 1));
  });

  // Per phase class: transfers at the grid and the quadratic forms' terms per pair.
  const transfers = guitar.coils.map(() => new Float64Array(2 * points));
  const used = new Uint8Array(coilCount);
  const energyTerms = new Float64Array(pairCount);
  const blockTerms = new Float64Array(blockCount * pairCount);
  // The centroid pass (centroid-kernel.ts), its chunk never longer than the band.
  const chunk = Math.max(1, Math.min(centroidChunkBins, bandBins));
  const centroidPass = prepareCentroidPass({ spectra: windowed, node: bandLocation.node, weight: bandLocation.weight, firstBin, bandBins, chunk, points });
  const usedCoils = new Int32Array(coilCount);
  let usedCount = 0;
  const pairA = new Int32Array(pairCount);
  const pairB = new Int32Array(pairCount);
  {
    let pair = 0;
    for (let a = 0; a < coilCount; a += 1) for (let b = a; b < coilCount; b += 1) { pairA[pair] = a; pairB[pair] = b; pair += 1; }
  }
  const pairProduct = new Float64Array(2 * points);
  let cachedClass = '';

  /** Re Σ_m Q_m·S̃_m for one pair's table slice, doubled for a ≠ b (the (b, a) term is its conjugate). */
  const foldTerm = (table: Float64Array, pair: number, twice: boolean): number => {
    const sum = foldPairTerm(pairProduct, table, 2 * pair * points, points);
    return twice ? 2 * sum : sum;
  };

  const solveClass = (network: Network): void => {
    const key = phaseClassKey(guitar, network);
    if (key === cachedClass) return;
    solveTransfers(circuit, phaseClassNetwork(guitar, network), transfers);
    foldTransfers();
    cachedClass = key;
  };

  /** The quadratic forms' terms per pair and the used coils, from the transfers just solved into `transfers`. */
  const foldTransfers = (): void => {
    transfers.forEach((transfer, coil) => {
      used[coil] = anyNonZero(transfer) ? 1 : 0;
    });
    for (let pair = 0; pair < pairCount; pair += 1) {
      const a = pairA[pair] as number;
      const b = pairB[pair] as number;
      if (!used[a] || !used[b]) {
        energyTerms[pair] = 0;
        for (let block = 0; block < blockCount; block += 1) blockTerms[block * pairCount + pair] = 0;
        continue;
      }
      const ta = transfers[a] as Float64Array;
      const tb = transfers[b] as Float64Array;
      // Q_ab(g_m) = T_a·conj(T_b)
      for (let m = 0; m < points; m += 1) {
        const ar = ta[2 * m] as number;
        const ai = ta[2 * m + 1] as number;
        const br = tb[2 * m] as number;
        const bi = tb[2 * m + 1] as number;
        pairProduct[2 * m] = ar * br + ai * bi;
        pairProduct[2 * m + 1] = ai * br - ar * bi;
      }
      energyTerms[pair] = foldTerm(energyTable, pair, a !== b);
      for (let block = 0; block < blockCount; block += 1) blockTerms[block * pairCount + pair] = foldTerm(blockTables[block] as Float64Array, pair, a !== b);
    }
    usedCount = 0;
    for (let coil = 0; coil < coilCount; coil += 1) if (used[coil]) usedCoils[usedCount++] = coil;
  };

  const signs = new Float64Array(coilCount);
  const blockPower = new Float64Array(blockCount);

  /** Energy and loudness of one phase pattern (signs in `signs`) from the class's quadratic-form terms. */
  const measureQuadratic = (): { energy: number; loudnessLufs: number } => {
    let energy = 0;
    blockPower.fill(0);
    for (let pair = 0; pair < pairCount; pair += 1) {
      const sign = (signs[pairA[pair] as number] as number) * (signs[pairB[pair] as number] as number);
      energy += sign * (energyTerms[pair] as number);
      for (let block = 0; block < blockCount; block += 1) blockPower[block] = (blockPower[block] as number) + sign * (blockTerms[block * pairCount + pair] as number);
    }
    for (let block = 0; block < blockCount; block += 1) blockPower[block] = Math.max(0, blockPower[block] as number) / (blockLengths[block] as number);
    return { energy: Math.max(0, energy), loudnessLufs: blockCount > 0 ? integrateGatedLoudness(blockPower) : LOUDNESS_FLOOR_LUFS };
  };

  /**
   * Centroids of several phase patterns of the class in one pass over the bins.
   * Per bin, P_u = T_u·H_u for the used coils u (T_u interpolated from the
   * grid) and their in-phase sum B = Σ_u P_u; then X = Σ_u s_u·P_u =
   * B − Σ_{u: s_u = −1} 2·P_u, and −X = B − Σ_{u: s_u = +1} 2·P_u has the
   * same magnitude, so each pattern subtracts the smaller of the two sets
   * from B (at most U/2 coils). Each result depends on its own signs only,
   * not on the other patterns measured with it.
   */
  const measureCentroids = (patterns: readonly Float64Array[]): number[] => {
    const count = patterns.length;
    const flipStart = new Int32Array(count + 1);
    const flips: number[] = [];
    patterns.forEach((patternSigns, index) => {
      const negative: number[] = [];
      const positive: number[] = [];
      for (let u = 0; u < usedCount; u += 1) ((patternSigns[usedCoils[u] as number] as number) < 0 ? negative : positive).push(2 * u * chunk);
      for (const offset of negative.length <= positive.length ? negative : positive) flips.push(offset);
      flipStart[index + 1] = flips.length;
    });
    // Per pattern: Σ bin·|X| at 2·pattern, Σ |X| at 2·pattern + 1.
    const sums = centroidPass(transfers, { usedCoils, usedCount, flipStart, flipOffsets: Int32Array.from(flips), count });
    return patterns.map((_, index) => {
      const magnitudeSum = sums[2 * index + 1] as number;
      return magnitudeSum > 0 ? ((sums[2 * index] as number) / magnitudeSum) * binHz : SILENCE_CENTROID_HZ;
    });
  };

  const measureClass = (networks: readonly Network[]): RawAudioFigures[] => {
    const first = networks[0];
    if (first === undefined) return [];
    solveClass(first);
    const quadratic: { energy: number; loudnessLufs: number }[] = [];
    const patterns = networks.map((network) => {
      if (phaseClassKey(guitar, network) !== cachedClass) throw new RangeError('measureClass: every network must be of one phase class');
      phaseClassSigns(guitar, network, signs);
      quadratic.push(measureQuadratic());
      return Float64Array.from(signs);
    });
    const centroids = measureCentroids(patterns);
    return quadratic.map((figures, index) => ({ ...figures, centroidHz: centroids[index] as number }));
  };
  const measure = (network: Network): RawAudioFigures => measureClass([network])[0] as RawAudioFigures;
  const measureGraph = (graph: CircuitGraph): RawAudioFigures => {
    // the graph's transfers carry every sign (solve-nodal.ts): one pattern, s_i = 1
    solveNodalTransfers(circuit, graph, transfers);
    foldTransfers();
    cachedClass = '';
    signs.fill(1);
    const quadratic = measureQuadratic();
    return { ...quadratic, centroidHz: measureCentroids([signs])[0] as number };
  };
  return { silent: false, measure, measureClass, measureGraph };
}

/**
 * The wirings of each phase class, as indices into `networks`, the classes in
 * the order of their first member: the units `measureClassInto` measures.
 */
export function phaseClassesOf(guitar: Guitar, networks: readonly Network[]): number[][] {
  const classes = new Map<string, number[]>();
  networks.forEach((network, index) => {
    const key = phaseClassKey(guitar, network);
    const members = classes.get(key);
    if (members) members.push(index);
    else classes.set(key, [index]);
  });
  return [...classes.values()];
}

/**
 * The figures of one phase class's wirings (`members`, indices into
 * `networks`) into `results` at those indices. A class's figures depend on
 * nothing but its own wirings, so classes may be measured in any order, on
 * any thread, with the same numbers.
 */
export function measureClassInto(meter: AudioFigureMeter, networks: readonly Network[], members: readonly number[], results: RawAudioFigures[]): void {
  const figures = meter.measureClass(members.map((index) => networks[index] as Network));
  members.forEach((index, position) => {
    results[index] = figures[position] as RawAudioFigures;
  });
}

/**
 * The figures of `networks` (in their order), measured phase class by phase
 * class (`measureClass`): the way every caller should take many wirings.
 * `onProgress` is told after each class.
 */
export function measureFiguresByClass(
  guitar: Guitar,
  meter: AudioFigureMeter,
  networks: readonly Network[],
  onProgress?: (done: number, total: number) => void,
): RawAudioFigures[] {
  const results = new Array<RawAudioFigures>(networks.length);
  let done = 0;
  for (const members of phaseClassesOf(guitar, networks)) {
    measureClassInto(meter, networks, members, results);
    done += members.length;
    onProgress?.(done, networks.length);
  }
  return results;
}
