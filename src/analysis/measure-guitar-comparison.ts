/**
 * Compare a candidate guitar (another pickup set) with a baseline: the core
 * entry point of `compare`. Both guitars play the reference phrase; every
 * wiring of the baseline is matched on the candidate (match-wirings.ts) and
 * compared figure by figure on the baseline's scale (measure-comparison.ts).
 */
import {
  type CircuitOverrides,
  type WiringCircuitMetrics,
  REFERENCE_FREQUENCY_HZ,
  amplitudeDb,
  measureCircuitMetrics,
  measureHumReference,
  prepareCircuit,
} from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { type Wiring, enumerateWirings } from '../wiring/index.js';
import { type AlikeThresholds, resolveAlikeThresholds } from './alike-thresholds.js';
import { type WiringComparison, measureComparison } from './measure-comparison.js';
import { measureCoilDrive } from './measure-coil-drive.js';
import { type SpectralBasisOptions, measureSpectralBasis } from './measure-spectral-basis.js';
import { type SpectralProfiles, measureSpectralProfiles } from './measure-spectral-profiles.js';
import { matchElements, matchWirings } from './match-wirings.js';
import { type WiringSpectra, solveWiringSpectra } from './solve-wiring-spectra.js';

export interface GuitarComparisonOptions {
  readonly thresholds: Partial<AlikeThresholds>;
  readonly overrides: CircuitOverrides | undefined;
  readonly basis: Partial<SpectralBasisOptions>;
  /** Baseline element id → candidate element id, for ids that differ. */
  readonly rename: ReadonlyMap<string, string>;
  /** Where a renaming problem is reported (an option name). Default "rename". */
  readonly renamePath: string;
  /** Resonance shift flagged, percent. Default RESONANCE_CHANGE_PERCENT. */
  readonly resonancePercent: number | undefined;
}

export interface ComparedGuitar {
  readonly guitar: Guitar;
  readonly wirings: readonly Wiring[];
  readonly circuit: readonly WiringCircuitMetrics[];
  readonly spectra: WiringSpectra;
  /** Profiles with levels on the baseline's scale. */
  readonly profiles: SpectralProfiles;
}

export interface GuitarComparison {
  readonly thresholds: AlikeThresholds;
  readonly base: ComparedGuitar;
  readonly candidate: ComparedGuitar;
  /** One per baseline wiring the candidate also has, in the baseline's order. */
  readonly wirings: readonly WiringComparison[];
  /** Baseline wiring indices the candidate does not have. */
  readonly unmatched: readonly number[];
}

function studyGuitar(guitar: Guitar, options: Partial<GuitarComparisonOptions>) {
  const wirings = enumerateWirings(guitar.elements);
  const basis = measureSpectralBasis(guitar, options.basis);
  const circuit = measureCircuitMetrics(guitar, wirings, options.overrides, { drive: measureCoilDrive(basis) }).wirings;
  const spectra = solveWiringSpectra(guitar, basis, wirings, options.overrides);
  const humReference = measureHumReference(prepareCircuit(guitar, Float64Array.of(REFERENCE_FREQUENCY_HZ), options.overrides));
  return { wirings, circuit, spectra, humReference };
}

/** Compare `candidate` with `base`. Throws InputError when the elements do not correspond, or for bad options. */
export function measureGuitarComparison(base: Guitar, candidate: Guitar, options: Partial<GuitarComparisonOptions> = {}): GuitarComparison {
  const thresholds = resolveAlikeThresholds(options.thresholds);
  const idsA = base.elements.map((element) => element.id);
  const idsB = candidate.elements.map((element) => element.id);
  const elementMap = matchElements(idsA, idsB, options.rename ?? new Map(), options.renamePath ?? 'rename');
  const a = studyGuitar(base, options);
  const b = studyGuitar(candidate, options);
  const match = matchWirings(a.wirings, b.wirings, elementMap, idsB);
  const profilesA = measureSpectralProfiles(a.spectra);
  const profilesB = measureSpectralProfiles(b.spectra, a.spectra.referenceEnergy);
  // Hum of B on A's scale: humDb_B is relative to B's own reference.
  const humOffset = a.humReference > 0 && b.humReference > 0 ? amplitudeDb(b.humReference / a.humReference) : 0;
  const wirings = measureComparison(
    { profiles: profilesA, circuit: a.circuit, humOffsetDb: 0 },
    { profiles: profilesB, circuit: b.circuit, humOffsetDb: humOffset },
    match,
    { thresholds, resonancePercent: options.resonancePercent },
  );
  const unmatched: number[] = [];
  match.forEach((indexB, indexA) => {
    if (indexB < 0) unmatched.push(indexA);
  });
  return {
    thresholds,
    base: { guitar: base, wirings: a.wirings, circuit: a.circuit, spectra: a.spectra, profiles: profilesA },
    candidate: { guitar: candidate, wirings: b.wirings, circuit: b.circuit, spectra: b.spectra, profiles: profilesB },
    wirings,
    unmatched,
  };
}
