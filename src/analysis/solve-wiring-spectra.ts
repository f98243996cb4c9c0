/**
 * Each wiring's band spectrum, level and brightness from the guitar's band
 * cross-spectra (measure-spectral-basis.ts):
 *
 *   P_b = Σ_{s∈b} Σ_i Σ_j T_i(f_s)·conj(T_j(f_s))·C_ij,s
 *       = Σ_{i≤j} p_i·p_j·Q_ij,b,   Q_ij,b = (2 − δ_ij)·Σ_{s∈b} Re(T⁰_i·conj(T⁰_j)·C_ij,s)
 *
 * (Hermitian symmetry C_ji = conj(C_ij) folds the pairs i > j onto i < j;
 * T_i = p_i·T⁰_i, src/wiring/network-phases.ts). Q is solved once per network shape, so
 * each wiring costs one sum over coil pairs per band.
 *
 * - energy: Σ over every segment, 0 Hz to Nyquist — the energy Σ y[n]² of the
 *   wiring's render through the direct chain (Parseval, measure-cross-spectra.ts).
 * - levelDb: 10·log10(energy / mean energy of the single-element wirings),
 *   docs/design.md's levelDb, computed without rendering.
 * - brightnessHz: the power-weighted spectral centroid Σ f·|Y(f)|² / Σ |Y(f)|²
 *   over the band spectrum's range (20 Hz–20 kHz). docs/design.md's centroidHz is
 *   magnitude weighted (Σ f·|X| / Σ |X|) over a Hann-windowed FFT of the
 *   render; the two are different numbers (power weighting leans towards
 *   the strong low partials, so brightnessHz is lower) that move together:
 *   see docs/distinctness.md for the measured relation, checked in
 *   solve-wiring-spectra.test.ts.
 */
import { type CircuitOverrides, phaseClassKey, phaseClassNetwork, phaseClassSigns, prepareCircuit, solveTransfers } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { type Steps, runSteps } from '../math/index.js';
import { type Network, leaf } from '../wiring/index.js';
import { designExcitationSpread } from './design-excitation-spread.js';
import { LEVEL_FLOOR_DB } from './measure-energy.js';
import type { SpectralBasis } from './measure-spectral-basis.js';
import { prepareShapeTableFold } from './shape-table-kernel.js';

export interface WiringSpectra {
  readonly basis: SpectralBasis;
  /** Wirings, in the order given. */
  readonly count: number;
  readonly bandCount: number;
  /** True when the volume at 0 leaves nothing at the output: every energy is 0. */
  readonly silent: boolean;
  /** Energy of each wiring's output, 0 Hz to Nyquist, in (coil spectrum units)². */
  readonly energies: Float64Array;
  /** Band energies, wiring w's band b at w·bandCount + b. */
  readonly bandEnergies: Float64Array;
  /** Excitation of the auditory filter at each band's centre (design-excitation-spread.ts), same layout and units as bandEnergies. */
  readonly excitation: Float64Array;
  /** Power-weighted centroid over the band range, Hz (0 when nothing is there). */
  readonly brightnessHz: Float64Array;
  /** Mean energy of the single-element wirings (each element alone). */
  readonly referenceEnergy: number;
  /** 10·log10(energy / referenceEnergy), never below LEVEL_FLOOR_DB. */
  readonly levelsDb: Float64Array;
}

const DECIBELS_PER_DECADE = 10;

/** Level of `energy` against `reference`, dB, floored (and the floor for silence). */
export function energyLevelDb(energy: number, reference: number): number {
  if (!(reference > 0) || !(energy > 0)) return LEVEL_FLOOR_DB;
  return Math.max(LEVEL_FLOOR_DB, DECIBELS_PER_DECADE * Math.log10(energy / reference));
}

/** One wiring's figures from the band spectra (what a streaming caller keeps). */
export interface WiringSpectrumFigures {
  /** Energy of the output, 0 Hz to Nyquist, in (coil spectrum units)². */
  readonly energy: number;
  /** 10·log10(energy / referenceEnergy), never below LEVEL_FLOOR_DB. */
  readonly levelDb: number;
  /** Power-weighted centroid over the band range, Hz (0 when nothing is there). */
  readonly brightnessHz: number;
}

/**
 * The band-spectrum solver of a guitar: shape tables are solved once per
 * phase class and kept until `forgetShapes` (a streaming caller forgets them
 * after each network structure, so memory stays bounded).
 */
export interface WiringSpectraSolver {
  readonly silent: boolean;
  readonly bandCount: number;
  /** Mean energy of the single-element wirings (each element alone). */
  readonly referenceEnergy: number;
  /** The wiring's rows: band energies [0, bandCount), excitation [bandCount, 2·bandCount), outer energy, first moment. Valid until the next call. */
  readonly solveRows: (network: Network) => Float64Array;
  /** Level and brightness from rows `solveRows` returned. */
  readonly figuresFromRows: (rows: Float64Array) => WiringSpectrumFigures;
  readonly figuresOf: (network: Network) => WiringSpectrumFigures;
  readonly forgetShapes: () => void;
}

/**
 * Prepare the band spectra of `guitar`'s wirings, with the what-if overrides
 * applied to the circuit. `basis` must come from the same guitar (its coils,
 * strings and positions). Throws InputError for a bad override.
 */
export function prepareWiringSpectra(guitar: Guitar, basis: SpectralBasis, overrides?: CircuitOverrides): WiringSpectraSolver {
  const { layout, cross } = basis;
  const coilCount = guitar.coils.length;
  if (cross.coilCount !== coilCount) throw new RangeError(`solveWiringSpectra: the basis has ${cross.coilCount} coils, the guitar ${coilCount}`);
  const prepared = prepareCircuit(guitar, layout.frequenciesHz, overrides);
  const segments = layout.segments;
  const segmentCount = segments.length;
  const bandCount = layout.bands.length;
  const pairCount = cross.pairCount;
  // Rows of a shape's table: one per band, one per band's excitation, then the outer segments' energy, then the band range's first moment.
  const excitationRow = bandCount;
  const outerRow = 2 * bandCount;
  const momentRow = 2 * bandCount + 1;
  const rows = 2 * bandCount + 2;
  const spread = designExcitationSpread(layout);
  const foldTable = prepareShapeTableFold(segments, cross, spread, { coilCount, pairCount, bandCount, excitationRow, outerRow, momentRow });
  const transfers = guitar.coils.map(() => new Float64Array(2 * segmentCount));
  const shapes = new Map<string, Float64Array>();

  const tableFor = (network: Network): Float64Array => {
    const key = phaseClassKey(guitar, network);
    const known = shapes.get(key);
    if (known !== undefined) return known;
    solveTransfers(prepared, phaseClassNetwork(guitar, network), transfers);
    const table = new Float64Array(rows * pairCount);
    foldTable(transfers, table);
    shapes.set(key, table);
    return table;
  };

  const phases = new Float64Array(coilCount);
  const signs = new Float64Array(pairCount);
  const row = new Float64Array(rows);
  /** Fills `row` with the wiring's band energies, outer energy and moment. */
  const solve = (network: Network): Float64Array => {
    const table = tableFor(network);
    phaseClassSigns(guitar, network, phases);
    let pair = 0;
    for (let i = 0; i < coilCount; i += 1) {
      for (let j = i; j < coilCount; j += 1) {
        signs[pair] = (phases[i] as number) * (phases[j] as number);
        pair += 1;
      }
    }
    for (let r = 0; r < rows; r += 1) {
      let sum = 0;
      for (let p = 0; p < pairCount; p += 1) sum += (signs[p] as number) * (table[r * pairCount + p] as number);
      // A sum of |Y|² is never negative; rounding can leave −1e-30 where a pair cancels exactly.
      row[r] = r === momentRow ? sum : Math.max(0, sum);
    }
    return row;
  };

  let referenceEnergy = 0;
  for (const element of guitar.elements) {
    const energies = solve(leaf(element.index));
    let total = energies[outerRow] as number;
    for (let b = 0; b < bandCount; b += 1) total += energies[b] as number;
    referenceEnergy += total / guitar.elements.length;
  }

  const figuresFromRows = (values: Float64Array): WiringSpectrumFigures => {
    let inBand = 0;
    for (let b = 0; b < bandCount; b += 1) inBand += values[b] as number;
    const energy = inBand + (values[outerRow] as number);
    return { energy, levelDb: energyLevelDb(energy, referenceEnergy), brightnessHz: inBand > 0 ? Math.max(0, (values[momentRow] as number) / inBand) : 0 };
  };
  return {
    silent: prepared.load.silent,
    bandCount,
    referenceEnergy,
    solveRows: solve,
    figuresFromRows,
    figuresOf: (network) => figuresFromRows(solve(network)),
    forgetShapes: () => shapes.clear(),
  };
}

/**
 * Band spectra, levels and brightness of `wirings` on `guitar`, with the
 * what-if overrides applied to the circuit. `basis` must come from the same
 * guitar (its coils, strings and positions). Throws InputError for a bad override.
 */
export function solveWiringSpectra(
  guitar: Guitar,
  basis: SpectralBasis,
  wirings: readonly { readonly network: Network }[],
  overrides?: CircuitOverrides,
): WiringSpectra {
  return runSteps(solveWiringSpectraSteps(guitar, basis, wirings, overrides));
}

/** solveWiringSpectra as steps (math/run-steps.ts): yields after every `perStep` wirings. */
export function* solveWiringSpectraSteps(
  guitar: Guitar,
  basis: SpectralBasis,
  wirings: readonly { readonly network: Network }[],
  overrides?: CircuitOverrides,
  perStep = Number.POSITIVE_INFINITY,
): Steps<WiringSpectra> {
  const solver = prepareWiringSpectra(guitar, basis, overrides);
  const { bandCount, referenceEnergy } = solver;
  const excitationRow = bandCount;
  const count = wirings.length;
  const energies = new Float64Array(count);
  const bandEnergies = new Float64Array(count * bandCount);
  const excitation = new Float64Array(count * bandCount);
  const brightnessHz = new Float64Array(count);
  const levelsDb = new Float64Array(count);
  for (const [w, { network }] of wirings.entries()) {
    if (w > 0 && w % perStep === 0) yield;
    const values = solver.solveRows(network);
    for (let b = 0; b < bandCount; b += 1) {
      bandEnergies[w * bandCount + b] = values[b] as number;
      excitation[w * bandCount + b] = values[excitationRow + b] as number;
    }
    const figures = solver.figuresFromRows(values);
    energies[w] = figures.energy;
    brightnessHz[w] = figures.brightnessHz;
    levelsDb[w] = figures.levelDb;
  }
  return { basis, count, bandCount, silent: solver.silent, energies, bandEnergies, excitation, brightnessHz, referenceEnergy, levelsDb };
}
