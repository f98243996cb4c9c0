/**
 * Options of the effects chain: one interface, one frozen defaults object,
 * merged and validated once.
 */
import { InputError, problemAt, type InputProblem } from '../errors/index.js';

export interface ChainOptions {
  /**
   * Factor from the samples handed to the chain to volts at the amplifier
   * input. Levels inside the chain (the drive stage, the compressor threshold)
   * are set for volts: a plucked string peaks at a few hundred mV. 1 when the
   * samples already are volts; for samples normalised so that 1 = V volts,
   * pass V. Plain factor, > 0 and ≤ 1000. Default 1. Ignored by `direct`.
   * Use one value for every wiring: a louder wiring then drives the
   * amplifier harder, as it would on a real one.
   */
  readonly inputGain: number;
  /**
   * Gain before the drive stage's soft clipper, dB (0–60). Default 26 dB
   * (×20): a 0.2 V pluck drives the clipper to u = 4, well into saturation,
   * and its decay below 10 mV comes out nearly clean (our choice: a crunchy,
   * touch-sensitive drive). Used only by `drive`.
   */
  readonly driveDb: number;
}

/** Drive gain default, dB (our choice, see ChainOptions.driveDb). */
export const DEFAULT_DRIVE_DB = 26;
/** Largest input gain accepted (plain factor): beyond it the input cannot be volts from a passive guitar. */
export const MAX_INPUT_GAIN = 1000;
/** Largest drive gain accepted, dB (our choice: beyond 60 dB every wiring sounds alike, a square wave). */
export const MAX_DRIVE_DB = 60;

export const DEFAULT_CHAIN_OPTIONS: ChainOptions = Object.freeze({
  inputGain: 1,
  driveDb: DEFAULT_DRIVE_DB,
});

/** Merge `options` over the defaults and validate once; throws InputError listing every problem. */
export function resolveChainOptions(options: Partial<ChainOptions> = {}): ChainOptions {
  const merged: ChainOptions = { ...DEFAULT_CHAIN_OPTIONS, ...definedOnly(options) };
  const problems: InputProblem[] = [];
  if (!isFiniteNumber(merged.inputGain) || merged.inputGain <= 0 || merged.inputGain > MAX_INPUT_GAIN) {
    problems.push(problemAt('chain.inputGain', `a factor above 0 and at most ${MAX_INPUT_GAIN}`, merged.inputGain));
  }
  if (!isFiniteNumber(merged.driveDb) || merged.driveDb < 0 || merged.driveDb > MAX_DRIVE_DB) {
    problems.push(problemAt('chain.driveDb', `a gain in dB from 0 to ${MAX_DRIVE_DB}`, merged.driveDb));
  }
  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze(merged);
}

function isFiniteNumber(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

/** Drop keys given as `undefined`, so they do not hide the defaults. */
function definedOnly(options: Partial<ChainOptions>): Partial<ChainOptions> {
  return Object.fromEntries(Object.entries(options).filter(([, value]) => value !== undefined)) as Partial<ChainOptions>;
}
