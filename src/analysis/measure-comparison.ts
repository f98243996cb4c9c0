/**
 * How a candidate pickup set changes each wiring: the same wiring (matched
 * by match-wirings.ts) on a baseline guitar A and a candidate B, with every
 * figure of B on A's scale — levels against A's mean single-element energy,
 * hum against A's mean single-element hum — so "+2 dB" means B's wiring is
 * 2 dB louder than A's.
 *
 * Each difference is flagged when it reaches its threshold: level, spectrum
 * and brightness by the alike thresholds (alike-thresholds.ts); the loaded
 * resonance by RESONANCE_CHANGE_PERCENT (a heuristic, docs/physics.md §7.2:
 * "peak frequency < ~5 %", not from a source; the band spectrum is what
 * decides audibility), and only where there is a peak to hear move: both
 * peaks at least the level threshold above the 100 Hz level (a clear peak
 * appearing or going is flagged too). A nearly flat response (the coils
 * partly cancelling) has at most a bump of a tenth of a dB, and which bump
 * counts as its "resonance" can jump octaves between two guitars that sound
 * alike; hum when its hum-cancelling state changes, or when
 * it moves by the level threshold or more while either of the two does not
 * cancel hum. `distance` is the scalar of measure-wiring-difference.ts: 1.0
 * is just noticeable.
 */
import type { WiringCircuitMetrics } from '../circuit/index.js';
import type { AlikeThresholds } from './alike-thresholds.js';
import type { SpectralProfiles } from './measure-spectral-profiles.js';
import { measureWiringDifference } from './measure-wiring-difference.js';

/** Resonance shift flagged as a change, percent (heuristic, docs/physics.md §7.2). */
export const RESONANCE_CHANGE_PERCENT = 5;

const PERCENT = 100;

export interface ComparisonSet {
  /** Profiles with levels relative to the baseline's reference energy. */
  readonly profiles: SpectralProfiles;
  readonly circuit: readonly WiringCircuitMetrics[];
  /** Added to each humDb to put it on the baseline's hum scale, dB (0 for the baseline). */
  readonly humOffsetDb: number;
}

export interface FigurePair {
  readonly a: number | null;
  readonly b: number | null;
  /** b − a in the figure's unit, or (for *Percent figures) 100·(b/a − 1); null when either is missing. */
  readonly change: number | null;
  readonly aboveThreshold: boolean;
}

export interface WiringComparison {
  /** Index of the wiring in A's and in B's list. */
  readonly indexA: number;
  readonly indexB: number;
  readonly resonanceHz: FigurePair;
  readonly levelDb: FigurePair;
  readonly brightnessHz: FigurePair;
  readonly humDb: FigurePair & { readonly humCancelling: readonly [boolean, boolean] };
  /** Level-matched spectral distance between A's and B's wiring, dB. */
  readonly spectrumDb: number;
  readonly spectrumAboveThreshold: boolean;
  /** The largest difference over its threshold (level, spectrum, brightness): 1 = just noticeable. */
  readonly distance: number;
  /** distance ≥ 1: the wiring sounds different on B. */
  readonly audible: boolean;
}

export interface ComparisonOptions {
  readonly thresholds: AlikeThresholds;
  /** Resonance shift flagged, percent. Default RESONANCE_CHANGE_PERCENT. */
  readonly resonancePercent?: number;
}

/** Compare every wiring of A that B also has (match[a] = B's index, −1 for none); unmatched wirings are left out. */
export function measureComparison(a: ComparisonSet, b: ComparisonSet, match: Int32Array, options: ComparisonOptions): WiringComparison[] {
  const { thresholds } = options;
  const resonancePercent = options.resonancePercent ?? RESONANCE_CHANGE_PERCENT;
  const result: WiringComparison[] = [];
  match.forEach((indexB, indexA) => {
    if (indexB < 0) return;
    const circuitA = a.circuit[indexA] as WiringCircuitMetrics;
    const circuitB = b.circuit[indexB] as WiringCircuitMetrics;
    const difference = measureWiringDifference(a.profiles, indexA, b.profiles, indexB, thresholds);
    const resonanceA = circuitA.resonanceHz;
    const resonanceB = circuitB.resonanceHz;
    const resonanceChange = resonanceA !== null && resonanceB !== null ? PERCENT * (resonanceB / resonanceA - 1) : null;
    const clearA = resonanceA !== null && circuitA.peakDb !== null && circuitA.peakDb >= thresholds.levelDb;
    const clearB = resonanceB !== null && circuitB.peakDb !== null && circuitB.peakDb >= thresholds.levelDb;
    const levelA = a.profiles.levelsDb[indexA] as number;
    const levelB = b.profiles.levelsDb[indexB] as number;
    const brightA = a.profiles.brightnessHz[indexA] as number;
    const brightB = b.profiles.brightnessHz[indexB] as number;
    const humA = circuitA.humDb === null ? null : circuitA.humDb + a.humOffsetDb;
    const humB = circuitB.humDb === null ? null : circuitB.humDb + b.humOffsetDb;
    const humChange = humA !== null && humB !== null ? humB - humA : null;
    const cancelling: [boolean, boolean] = [circuitA.humCancelling, circuitB.humCancelling];
    const humAbove =
      cancelling[0] !== cancelling[1] || (humChange !== null && Math.abs(humChange) >= thresholds.levelDb && !(cancelling[0] && cancelling[1]));
    const brightnessLogThreshold = Math.log1p(thresholds.brightnessPercent / PERCENT);
    result.push({
      indexA,
      indexB,
      resonanceHz: {
        a: resonanceA,
        b: resonanceB,
        change: resonanceChange,
        aboveThreshold: clearA && clearB ? Math.abs(Math.log1p((resonanceChange as number) / PERCENT)) >= Math.log1p(resonancePercent / PERCENT) : clearA !== clearB,
      },
      levelDb: { a: levelA, b: levelB, change: difference.levelDb, aboveThreshold: Math.abs(difference.levelDb) >= thresholds.levelDb },
      brightnessHz: {
        a: brightA,
        b: brightB,
        change: difference.brightnessPercent,
        aboveThreshold: difference.brightnessPercent === null || Math.abs(Math.log1p(difference.brightnessPercent / PERCENT)) >= brightnessLogThreshold,
      },
      humDb: { a: humA, b: humB, change: humChange, aboveThreshold: humAbove, humCancelling: cancelling },
      spectrumDb: difference.spectrumDb,
      spectrumAboveThreshold: difference.spectrumDb >= thresholds.spectrumDb,
      distance: difference.distance,
      audible: !difference.alike,
    });
  });
  return result;
}
