/**
 * What a render reports besides its audio: the circuit figures of the
 * rendered wirings (read from the response as the strings drive it), the
 * groups of alike wirings, and each rendered wiring's response curve for the
 * listening page; and, when asked, the audio figures of wirings (those a
 * render's manifest does not hold yet, so that the thread rendering audio
 * does nothing else). It is a pure function of the guitar, its settings and
 * the reference performance's spectral basis, so it is the same on any
 * thread; a render runs it on a thread of its own (render-analysis-thread.ts)
 * while it renders the audio.
 */
import {
  type CircuitAnalysis,
  type CircuitOverrides,
  type CoilDrive,
  AUDIO_BAND_HIGH_HZ,
  AUDIO_BAND_LOW_HZ,
  logSpacedFrequencies,
  measureCircuitMetrics,
  measureResponseDb,
  phaseClassNetwork,
  prepareCircuit,
  sampleCoilDrive,
  solveTransfers,
} from '../circuit/index.js';
import { type AlikeThresholds, type DistinctGroups, type SpectralBasis, measureCoilDrive, measureDistinctness, measureFiguresByClass } from '../analysis/index.js';
import { type RawAudioMetrics, prepareReferenceFigures, referenceCoilsOf } from './measure-wiring-audio.js';
import { type CoilSignals, assertAudible } from './synthesize-wirings.js';
import type { Guitar } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';

/** Points of the response curves drawn on the listening page (log-spaced, 20 Hz–20 kHz). */
export const RESPONSE_POINTS = 96;

export interface RenderAnalysisJob {
  readonly guitar: Guitar;
  readonly overrides: CircuitOverrides;
  /** The rendered wirings' networks, in the report's order. */
  readonly selected: readonly Network[];
  /** The wirings the groups cover, with their numbers (ranking within a group). */
  readonly scope: readonly { readonly network: Network; readonly number: number }[];
  readonly thresholds?: Partial<AlikeThresholds>;
}

/** A render's analysis; `distinct.spectra.basis` is the basis it was given. */
export interface RenderAnalysis {
  /** Raw audio figures of the wirings asked for (`figures` of measureRenderAnalysis), in their order. */
  readonly figures: readonly RawAudioMetrics[];
  readonly drive: CoilDrive;
  readonly circuit: CircuitAnalysis;
  /** The groups (a whole Distinctness when measured in the caller's thread; the groups alone from a thread of its own). */
  readonly distinct: DistinctGroups;
  readonly responseFrequenciesHz: Float64Array;
  /** Each selected wiring's response as the strings drive it, dB (null when silent). */
  readonly responsesDb: readonly (Float64Array | null)[];
}

/**
 * The analysis of `job`. The audio figures of `figuresOf` come from the
 * reference performance's coil signals: `coils` when the caller has them
 * (a render does: `referenceCoilsOf` of its basis, which then need not carry
 * its coil spectra to this thread), else made from `basis`.
 */
export function measureRenderAnalysis(job: RenderAnalysisJob, basis: SpectralBasis, figuresOf: readonly Network[] = [], coils?: CoilSignals): RenderAnalysis {
  const { guitar, overrides } = job;
  let figures: RawAudioMetrics[] = [];
  if (figuresOf.length > 0) {
    const meter = prepareReferenceFigures(guitar, overrides, coils ?? referenceCoilsOf(guitar, basis));
    assertAudible(meter, 'controls.volume.setting');
    figures = measureFiguresByClass(guitar, meter, figuresOf);
  }
  const drive = measureCoilDrive(basis);
  const circuit = measureCircuitMetrics(guitar, job.selected.map((network) => ({ network })), overrides, { drive });
  const distinct = measureDistinctness(guitar, job.scope, { overrides, thresholds: job.thresholds, reuseBasis: basis });
  const grid = logSpacedFrequencies(AUDIO_BAND_LOW_HZ, AUDIO_BAND_HIGH_HZ, RESPONSE_POINTS);
  const responseCircuit = prepareCircuit(guitar, grid, overrides);
  const transfers = guitar.coils.map(() => new Float64Array(2 * RESPONSE_POINTS));
  const sampledDrive = sampleCoilDrive(drive, grid);
  // The curves share one buffer (views of RESPONSE_POINTS each): one block of memory for thousands of wirings, handed to the parent whole.
  const curves = new Float64Array(job.selected.length * RESPONSE_POINTS);
  const responsesDb = job.selected.map((network, index) => {
    solveTransfers(responseCircuit, phaseClassNetwork(guitar, network), transfers);
    const response = measureResponseDb(responseCircuit, network, drive, { sampledDrive, inPhaseTransfers: transfers });
    if (response === null) return null;
    const slot = curves.subarray(index * RESPONSE_POINTS, (index + 1) * RESPONSE_POINTS);
    slot.set(response);
    return slot;
  });
  return { figures, drive, circuit, distinct, responseFrequenciesHz: grid, responsesDb };
}
