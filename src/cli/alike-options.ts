/**
 * The "sounds alike" thresholds as options shared by `analyze`, `shortlist`
 * and `compare` (`--level-threshold 1`, `--spectrum-threshold 1.5dB`,
 * `--brightness-threshold 3%`), validated like the guitar file: every
 * problem at once, each naming its option.
 */
import type { Command } from 'commander';
import { type AlikeThresholds, DEFAULT_ALIKE_THRESHOLDS } from '../analysis/index.js';
import { type InputProblem, problemAt } from '../errors/index.js';

export interface AlikeOptionText {
  readonly levelThreshold?: string;
  readonly spectrumThreshold?: string;
  readonly brightnessThreshold?: string;
}

/** Upper limits of the options (the core's own limits). */
const MAX_DB = 20;
const MAX_PERCENT = 100;

export function addAlikeOptions(command: Command): Command {
  return command
    .option('--level-threshold <dB>', `level difference still heard as alike (default ${DEFAULT_ALIKE_THRESHOLDS.levelDb} dB)`)
    .option('--spectrum-threshold <dB>', `level-matched spectral distance still alike (default ${DEFAULT_ALIKE_THRESHOLDS.spectrumDb} dB)`)
    .option('--brightness-threshold <percent>', `brightness change still alike (default ${DEFAULT_ALIKE_THRESHOLDS.brightnessPercent} %)`);
}

function parseAmount(text: string, unit: RegExp, path: string, expected: string, high: number, problems: InputProblem[]): number | undefined {
  const trimmed = text.trim().replace(unit, '').trim();
  const value = Number(trimmed);
  if (trimmed === '' || !/^\d*\.?\d+$/u.test(trimmed) || !(value > 0 && value <= high)) {
    problems.push(problemAt(path, expected, text));
    return undefined;
  }
  return value;
}

/** The thresholds given (the core fills in the rest); problems are appended, one per bad option. */
export function parseAlikeOptions(options: AlikeOptionText, problems: InputProblem[]): Partial<AlikeThresholds> {
  const thresholds: { -readonly [K in keyof AlikeThresholds]?: number } = {};
  const decibels = /\s*db$/iu;
  if (options.levelThreshold !== undefined) {
    thresholds.levelDb = parseAmount(options.levelThreshold, decibels, '--level-threshold', `a level difference above 0 and at most ${MAX_DB} dB, like 1 or 0.5dB`, MAX_DB, problems);
  }
  if (options.spectrumThreshold !== undefined) {
    thresholds.spectrumDb = parseAmount(options.spectrumThreshold, decibels, '--spectrum-threshold', `a spectral distance above 0 and at most ${MAX_DB} dB, like 1 or 2dB`, MAX_DB, problems);
  }
  if (options.brightnessThreshold !== undefined) {
    thresholds.brightnessPercent = parseAmount(options.brightnessThreshold, /\s*%$/u, '--brightness-threshold', `a percentage above 0 and at most ${MAX_PERCENT}, like 3 or 5%`, MAX_PERCENT, problems);
  }
  return thresholds;
}

/** "level 1 dB, spectrum 1 dB, brightness 3 %". */
export function describeThresholds(thresholds: AlikeThresholds): string {
  return `level ${thresholds.levelDb} dB, spectrum ${thresholds.spectrumDb} dB, brightness ${thresholds.brightnessPercent} %`;
}
