/**
 * Perceptual bands for comparing wirings: the audible band cut into bands of
 * equal width on the ERB-number scale (erb-scale.ts), each split into a few
 * segments at whose centres the circuit is evaluated. Two outer segments,
 * below the audible band and from its top to Nyquist, carry energy that
 * counts in a wiring's level but not in its band spectrum, so the level is
 * the whole render's energy.
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import { erbNumber, erbNumberToHz } from './erb-scale.js';

export interface BandOptions {
  /** Lowest frequency of the band spectrum, Hz; above 0, below highHz. Default 20 Hz (the audible band, common practice). */
  readonly lowHz: number;
  /** Highest frequency of the band spectrum, Hz; also capped at Nyquist. Default 20 kHz. */
  readonly highHz: number;
  /** Width of each band on the ERB-number scale, 0.25 to 4. Default 1 (one auditory filter per band). */
  readonly bandwidthErb: number;
  /**
   * Segments per band, 1 to 16: the circuit's transfers are evaluated once
   * per segment, at its centre on the ERB scale. Default 8: every level of
   * the four sample guitars then agrees with the rendered audio's within
   * 0.015 dB (4 segments: 0.09 dB, on a parallel out-of-phase humbucker
   * whose cancelling coils make it sensitive to the transfers' slope; see
   * test/distinct-versus-render.test.ts).
   */
  readonly segmentsPerBand: number;
}

export const DEFAULT_BAND_OPTIONS: Readonly<BandOptions> = Object.freeze({ lowHz: 20, highHz: 20_000, bandwidthErb: 1, segmentsPerBand: 8 });

const MIN_BANDWIDTH_ERB = 0.25;
const MAX_BANDWIDTH_ERB = 4;
const MAX_SEGMENTS_PER_BAND = 16;

export interface Band {
  readonly lowHz: number;
  readonly highHz: number;
  /** Centre on the ERB-number scale, Hz. */
  readonly centreHz: number;
}

export interface BandSegment {
  /** Bins with lowHz ≤ f < highHz belong here (the last segment also takes Nyquist). */
  readonly lowHz: number;
  readonly highHz: number;
  /** Where the circuit is evaluated for this segment, Hz. */
  readonly frequencyHz: number;
  /** Index of the perceptual band, or −1 for the outer segments (level only). */
  readonly band: number;
}

export interface BandLayout {
  readonly options: BandOptions;
  readonly sampleRateHz: number;
  readonly bands: readonly Band[];
  /** Every segment from 0 Hz to Nyquist, in frequency order, contiguous. */
  readonly segments: readonly BandSegment[];
  /** The segments' evaluation frequencies, for `prepareCircuit`. */
  readonly frequenciesHz: Float64Array;
}

/** Merge `options` over the defaults and check them; throws InputError naming each bad field. */
export function resolveBandOptions(options: Partial<BandOptions> = {}): BandOptions {
  const merged: BandOptions = {
    lowHz: options.lowHz ?? DEFAULT_BAND_OPTIONS.lowHz,
    highHz: options.highHz ?? DEFAULT_BAND_OPTIONS.highHz,
    bandwidthErb: options.bandwidthErb ?? DEFAULT_BAND_OPTIONS.bandwidthErb,
    segmentsPerBand: options.segmentsPerBand ?? DEFAULT_BAND_OPTIONS.segmentsPerBand,
  };
  const problems: InputProblem[] = [];
  if (!(Number.isFinite(merged.lowHz) && merged.lowHz > 0)) problems.push(problemAt('bands.lowHz', 'a frequency above 0 Hz', merged.lowHz));
  if (!(Number.isFinite(merged.highHz) && merged.highHz > merged.lowHz)) {
    problems.push(problemAt('bands.highHz', `a frequency above lowHz (${merged.lowHz} Hz)`, merged.highHz));
  }
  if (!(merged.bandwidthErb >= MIN_BANDWIDTH_ERB && merged.bandwidthErb <= MAX_BANDWIDTH_ERB)) {
    problems.push(problemAt('bands.bandwidthErb', `a width from ${MIN_BANDWIDTH_ERB} to ${MAX_BANDWIDTH_ERB} ERB`, merged.bandwidthErb));
  }
  if (!(Number.isInteger(merged.segmentsPerBand) && merged.segmentsPerBand >= 1 && merged.segmentsPerBand <= MAX_SEGMENTS_PER_BAND)) {
    problems.push(problemAt('bands.segmentsPerBand', `a whole number from 1 to ${MAX_SEGMENTS_PER_BAND}`, merged.segmentsPerBand));
  }
  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze(merged);
}

/**
 * Bands of equal ERB width over lowHz…min(highHz, Nyquist): their count is
 * the span in ERB divided by bandwidthErb, rounded (41 one-ERB bands over
 * 20 Hz–20 kHz), so each is within a few percent of the width asked for.
 */
export function designBands(sampleRateHz: number, options: Partial<BandOptions> = {}): BandLayout {
  const resolved = resolveBandOptions(options);
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) throw InputError.at('sampleRateHz', 'a positive sample rate in Hz', sampleRateHz);
  const nyquistHz = sampleRateHz / 2;
  if (!(resolved.lowHz < nyquistHz)) throw InputError.at('bands.lowHz', `a frequency below Nyquist (${nyquistHz} Hz)`, resolved.lowHz);
  const topHz = Math.min(resolved.highHz, nyquistHz);
  const lowErb = erbNumber(resolved.lowHz);
  const highErb = erbNumber(topHz);
  const count = Math.max(1, Math.round((highErb - lowErb) / resolved.bandwidthErb));
  const step = (highErb - lowErb) / count;
  const subStep = step / resolved.segmentsPerBand;
  const edgeHz = (erb: number, isTop: boolean): number => (isTop ? topHz : erbNumberToHz(erb));

  const bands: Band[] = [];
  const segments: BandSegment[] = [{ lowHz: 0, highHz: resolved.lowHz, frequencyHz: resolved.lowHz / 2, band: -1 }];
  for (let b = 0; b < count; b += 1) {
    const start = lowErb + b * step;
    bands.push({
      lowHz: b === 0 ? resolved.lowHz : erbNumberToHz(start),
      highHz: edgeHz(start + step, b === count - 1),
      centreHz: erbNumberToHz(start + step / 2),
    });
    for (let s = 0; s < resolved.segmentsPerBand; s += 1) {
      const segmentStart = start + s * subStep;
      const last = b === count - 1 && s === resolved.segmentsPerBand - 1;
      segments.push({
        lowHz: b === 0 && s === 0 ? resolved.lowHz : erbNumberToHz(segmentStart),
        highHz: edgeHz(segmentStart + subStep, last),
        frequencyHz: erbNumberToHz(segmentStart + subStep / 2),
        band: b,
      });
    }
  }
  if (topHz < nyquistHz) segments.push({ lowHz: topHz, highHz: nyquistHz, frequencyHz: (topHz + nyquistHz) / 2, band: -1 });
  return Object.freeze({
    options: resolved,
    sampleRateHz,
    bands: Object.freeze(bands),
    segments: Object.freeze(segments),
    frequenciesHz: Float64Array.from(segments, (segment) => segment.frequencyHz),
  });
}
