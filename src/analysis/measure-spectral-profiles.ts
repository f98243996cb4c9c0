/**
 * What a listener compares between two level-matched wirings, per wiring,
 * ready for many pairwise distances:
 *
 * - shape: the excitation pattern (design-excitation-spread.ts) in dB
 *   relative to its own sum, ℓ_b = 10·log10(X_b / Σ X) — level matched, so
 *   only the shape of the spectrum remains — floored DYNAMIC_RANGE_DB below
 *   its largest band, so bands far under the loudest one (and exact nulls)
 *   cannot dominate;
 * - loudness: each band's share of loudness, (X_b / Σ X)^α with Zwicker's
 *   specific-loudness exponent α = 0.23 (E. Zwicker, H. Fastl,
 *   Psychoacoustics: Facts and Models, 2nd ed., Springer, 1999, ch. 8: N′ ∝
 *   E^0.23 well above threshold), used to weight the band differences.
 *
 * The spectral distance between wirings A and B is then the loudness-
 * weighted RMS of their shape differences,
 *
 *   D = √( Σ_b w_b·(ℓ_A,b − ℓ_B,b)² / Σ_b w_b ),   w_b = (N′_A,b + N′_B,b)/2
 *
 * in dB: 0 for the same shape, and a broad 1 dB tilt of the excitation
 * gives about 1 dB.
 */
import type { WiringSpectra } from './solve-wiring-spectra.js';
import { energyLevelDb } from './solve-wiring-spectra.js';

/** Zwicker's specific-loudness exponent (Zwicker & Fastl 1999, ch. 8). */
export const SPECIFIC_LOUDNESS_EXPONENT = 0.23;
/** Bands more than this far below a wiring's loudest band count as this far (our choice: the span of a quiet room to loud playing, common practice). */
export const DYNAMIC_RANGE_DB = 60;

const DECIBELS_PER_DECADE = 10;

export interface SpectralProfiles {
  readonly count: number;
  readonly bandCount: number;
  /** Band centres, Hz (for checking that two sets of profiles share a layout). */
  readonly centresHz: readonly number[];
  /** Level of each wiring against the reference energy, dB. */
  readonly levelsDb: Float64Array;
  readonly brightnessHz: Float64Array;
  /** Level-matched excitation, dB, wiring w's band b at w·bandCount + b. */
  readonly shapeDb: Float64Array;
  /** Loudness share per band, same layout. */
  readonly loudness: Float64Array;
  /** True for wirings with no output at all. */
  readonly silent: Uint8Array;
}

/**
 * Profiles of every wiring in `spectra`. Levels are relative to
 * `referenceEnergy` (default the spectra's own: the mean single-element
 * wiring), so two guitars can be put on one scale.
 */
export function measureSpectralProfiles(spectra: WiringSpectra, referenceEnergy: number = spectra.referenceEnergy): SpectralProfiles {
  const { count, bandCount } = spectra;
  const shapeDb = new Float64Array(count * bandCount);
  const loudness = new Float64Array(count * bandCount);
  const levelsDb = new Float64Array(count);
  const silent = new Uint8Array(count);
  for (let w = 0; w < count; w += 1) {
    levelsDb[w] = energyLevelDb(spectra.energies[w] as number, referenceEnergy);
    const base = w * bandCount;
    let total = 0;
    for (let b = 0; b < bandCount; b += 1) total += spectra.excitation[base + b] as number;
    if (!(total > 0)) {
      silent[w] = 1;
      continue;
    }
    let loudest = Number.NEGATIVE_INFINITY;
    for (let b = 0; b < bandCount; b += 1) {
      const share = (spectra.excitation[base + b] as number) / total;
      const level = share > 0 ? DECIBELS_PER_DECADE * Math.log10(share) : Number.NEGATIVE_INFINITY;
      shapeDb[base + b] = level;
      loudest = Math.max(loudest, level);
      loudness[base + b] = share > 0 ? share ** SPECIFIC_LOUDNESS_EXPONENT : 0;
    }
    const floor = loudest - DYNAMIC_RANGE_DB;
    for (let b = 0; b < bandCount; b += 1) shapeDb[base + b] = Math.max(floor, shapeDb[base + b] as number);
  }
  return {
    count,
    bandCount,
    centresHz: spectra.basis.layout.bands.map((band) => band.centreHz),
    levelsDb,
    brightnessHz: Float64Array.from(spectra.brightnessHz),
    shapeDb,
    loudness,
    silent,
  };
}
