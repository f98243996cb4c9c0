/**
 * The what-if options shared by circuit commands (`--volume 7`, `--tone 5`,
 * `--cable 900p`, `--mains 50`), validated like the guitar file: every
 * problem at once, each naming its option, exit status 2, nothing written.
 */
import type { Command } from 'commander';
import {
  type CircuitOverrides,
  CABLE_CAPACITANCE_MAX_F,
  CABLE_CAPACITANCE_MIN_F,
  DEFAULT_HUM_GRADIENT_PER_M,
  DEFAULT_HUM_SOURCE_DISTANCE_M,
  HUM_GRADIENT_MAX_PER_M,
} from '../circuit/index.js';
import { type InputProblem, problemAt } from '../errors/index.js';
import { KNOB_MAX, KNOB_MIN, type Guitar } from '../guitar/index.js';
import { QuantityError, parseQuantity } from '../units/index.js';

export interface CircuitOptionText {
  readonly volume?: string;
  readonly tone?: string;
  readonly cable?: string;
  readonly mains?: string;
  readonly humGradient?: string;
}

/** Add the what-if options to a command. */
export function addCircuitOptions(command: Command): Command {
  return command
    .option('--volume <setting>', `volume knob ${KNOB_MIN}–${KNOB_MAX} instead of the guitar file's`)
    .option('--tone <setting>', `tone knob ${KNOB_MIN}–${KNOB_MAX} instead of the guitar file's`)
    .option('--cable <capacitance>', 'total cable capacitance instead of the guitar file\'s, like "900p"')
    .option('--mains <hz>', 'mains frequency for hum: 50 or 60 (default 60)')
    .option(
      '--hum-gradient <percent-per-cm>',
      `how fast the hum field changes along the strings, % per cm (0 = uniform; default ${DEFAULT_HUM_GRADIENT_PER_M}, a hum source about ${DEFAULT_HUM_SOURCE_DISTANCE_M} m away)`,
    );
}

const KNOB_TEXT = /^\s*\d+(?:\.\d+)?\s*$/u;

function parseKnob(text: string, path: string, problems: InputProblem[]): number | undefined {
  const value = Number(text);
  if (!KNOB_TEXT.test(text) || !(value >= KNOB_MIN && value <= KNOB_MAX)) {
    problems.push(problemAt(path, `a knob setting from ${KNOB_MIN} to ${KNOB_MAX} like 7 or 4.5`, text));
    return undefined;
  }
  return value;
}

/** Read the options' text into overrides; problems are appended, one per bad option. */
export function parseCircuitOptions(options: CircuitOptionText, guitar: Guitar, problems: InputProblem[]): CircuitOverrides {
  const overrides: { -readonly [K in keyof CircuitOverrides]: CircuitOverrides[K] } = {};
  if (options.volume !== undefined) overrides.volumeSetting = parseKnob(options.volume, '--volume', problems);
  if (options.tone !== undefined) {
    if (guitar.controls.tone === null) {
      problems.push(problemAt('--tone', 'no --tone for a guitar without a tone control', options.tone));
    } else {
      overrides.toneSetting = parseKnob(options.tone, '--tone', problems);
    }
  }
  if (options.cable !== undefined) {
    try {
      const value = parseQuantity(options.cable, 'capacitance');
      if (value < CABLE_CAPACITANCE_MIN_F || value > CABLE_CAPACITANCE_MAX_F) {
        problems.push(problemAt('--cable', 'a total cable capacitance between 1 pF and 20 nF, like "900p"', options.cable));
      } else {
        overrides.cableCapacitanceF = value;
      }
    } catch (error) {
      if (!(error instanceof QuantityError)) throw error;
      problems.push(problemAt('--cable', `the cable's total capacitance: ${error.expected}`, options.cable));
    }
  }
  if (options.mains !== undefined) {
    const text = options.mains.trim().replace(/\s*hz$/iu, '');
    if (text === '50' || text === '60') overrides.mainsHz = Number(text) as 50 | 60;
    else problems.push(problemAt('--mains', '50 or 60 (hertz)', options.mains));
  }
  if (options.humGradient !== undefined) {
    // % per cm equals 1/m: (x/100 per 0.01 m) = x per metre.
    const text = options.humGradient.trim().replace(/\s*%\s*\/\s*cm$/iu, '');
    const value = Number(text);
    if (text === '' || !Number.isFinite(value) || value < 0 || value > HUM_GRADIENT_MAX_PER_M) {
      problems.push(problemAt('--hum-gradient', `a hum-field gradient from 0 to ${HUM_GRADIENT_MAX_PER_M} % per cm, like 3`, options.humGradient));
    } else {
      overrides.humGradientPerM = value;
    }
  }
  return overrides;
}
