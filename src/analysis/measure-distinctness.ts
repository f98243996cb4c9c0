/**
 * Which wirings of a guitar really differ: the core entry point behind
 * `analyze`'s groups, `shortlist` and `compare`. Renders the reference
 * phrase once into band cross-spectra, solves every wiring's band spectrum,
 * level and brightness from them, and groups the alike ones.
 */
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { type AlikeThresholds, resolveAlikeThresholds } from './alike-thresholds.js';
import { type Steps, runSteps } from '../math/index.js';
import { type WiringGroups, groupAlikeWiringsSteps } from './group-alike-wirings.js';
import { type SpectralBasis, type SpectralBasisOptions, measureSpectralBasis } from './measure-spectral-basis.js';
import { type SpectralProfiles, measureSpectralProfiles } from './measure-spectral-profiles.js';
import { type WiringSpectra, solveWiringSpectraSteps } from './solve-wiring-spectra.js';

export interface DistinctnessOptions {
  readonly thresholds: Partial<AlikeThresholds>;
  readonly overrides: CircuitOverrides | undefined;
  readonly basis: Partial<SpectralBasisOptions>;
  /** A basis already measured for this guitar (skips the string render). */
  readonly reuseBasis: SpectralBasis | undefined;
}

export interface Distinctness {
  readonly thresholds: AlikeThresholds;
  readonly spectra: WiringSpectra;
  readonly profiles: SpectralProfiles;
  readonly groups: WiringGroups;
}

/**
 * What reports of the groups read of a Distinctness: the thresholds, the groups, and of the spectra only the count
 * and the basis; not the per-wiring spectra and profiles (four arrays of about 300 bytes a wiring, 12.5 MB for
 * 9,997 wirings), which a render's analysis thread does not send back.
 */
export type DistinctGroups = Pick<Distinctness, 'thresholds' | 'groups'> & { readonly spectra: Pick<WiringSpectra, 'count' | 'basis'> };

/** Spectra, profiles and groups of `wirings` (ranked by `number` when they have one). Throws InputError for bad thresholds or overrides. */
export function measureDistinctness(
  guitar: Guitar,
  wirings: readonly { readonly network: Network; readonly number?: number }[],
  options: Partial<DistinctnessOptions> = {},
): Distinctness {
  return runSteps(measureDistinctnessSteps(guitar, wirings, options));
}

/** Wirings solved between two yields of measureDistinctnessSteps. */
const WIRINGS_PER_STEP = 64;

/** measureDistinctness as steps (math/run-steps.ts): yields every few wirings and during grouping. */
export function* measureDistinctnessSteps(
  guitar: Guitar,
  wirings: readonly { readonly network: Network; readonly number?: number }[],
  options: Partial<DistinctnessOptions> = {},
): Steps<Distinctness> {
  const thresholds = resolveAlikeThresholds(options.thresholds);
  const basis = options.reuseBasis ?? measureSpectralBasis(guitar, options.basis);
  yield;
  const spectra = yield* solveWiringSpectraSteps(guitar, basis, wirings, options.overrides, WIRINGS_PER_STEP);
  const profiles = measureSpectralProfiles(spectra);
  yield;
  const groups = yield* groupAlikeWiringsSteps(profiles, thresholds, wirings.map((wiring, index) => wiring.number ?? index));
  return { thresholds, spectra, profiles, groups };
}
