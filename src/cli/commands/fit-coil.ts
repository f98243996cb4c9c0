/**
 * `coilbench fit-coil`: the coil model (docs/physics.md §1.6) fitted to what
 * a maker measures — a measured impedance sweep (CSV, least squares) or the
 * unloaded resonant peak (frequency and height or Q, with R and L) — printed
 * (SI units with --json) with the fit's error, and optionally written into a
 * guitar file's coil (validated first, written through a temporary name).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from 'commander';
import {
  type CoilLossModel,
  type CoilModel,
  fitCoilToPeak,
  fitCoilToSweep,
  measureUnloadedPeak,
  parseImpedanceSweep,
} from '../../circuit/index.js';
import { InputError, type InputProblem, oneOfChoices, problemAt } from '../../errors/index.js';
import { parseGuitar, parseJsonText } from '../../guitar/index.js';
import { writeFileAtomicSync } from '../../render/index.js';
import { QuantityError, formatEngineering, parseQuantity } from '../../units/index.js';
import type { Io } from '../io.js';

interface FitCoilOptions {
  readonly losses?: string;
  readonly peak?: string;
  readonly height?: string;
  readonly q?: string;
  readonly resistance?: string;
  readonly inductance?: string;
  readonly json?: boolean;
  readonly guitar?: string;
  readonly coil?: string;
}

const LOSS_MODELS: readonly CoilLossModel[] = ['eddy', 'parallel', 'both'];
/** Significant digits written into a guitar file: a fit is no better than its measurement. */
const WRITTEN_DIGITS = 4;
const PERCENT = 100;
const DECIBELS_PER_RATIO = 20;

interface FitResult {
  readonly coil: CoilModel;
  readonly eddyCornerHz: number | null;
  readonly source: string;
  readonly points: number | null;
  readonly rmsRelativeError: number | null;
  readonly maxRelativeError: number | null;
}

function readText(path: string, cwd: string, what: string): string {
  try {
    return readFileSync(resolve(cwd, path), 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw InputError.at(path, what, code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : `an unreadable file (${code ?? 'error'})`);
  }
}

function quantityOption(text: string | undefined, kind: 'resistance' | 'inductance' | 'frequency', path: string, problems: InputProblem[]): number | undefined {
  if (text === undefined) return undefined;
  try {
    const value = parseQuantity(text, kind);
    if (value > 0) return value;
    problems.push(problemAt(path, `a positive ${kind}`, text));
  } catch (error) {
    if (!(error instanceof QuantityError)) throw error;
    problems.push(problemAt(path, error.expected, text));
  }
  return undefined;
}

function numberOption(text: string | undefined, path: string, expected: string, problems: InputProblem[], valid: (value: number) => boolean): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text.trim().replace(/\s*db$/iu, ''));
  if (text.trim() === '' || !Number.isFinite(value) || !valid(value)) {
    problems.push(problemAt(path, expected, text));
    return undefined;
  }
  return value;
}

function fitFromOptions(sweepPath: string | undefined, options: FitCoilOptions, cwd: string): FitResult {
  const problems: InputProblem[] = [];
  const losses = options.losses ?? 'eddy';
  if (!LOSS_MODELS.includes(losses as CoilLossModel)) problems.push(problemAt('--losses', oneOfChoices(losses, LOSS_MODELS), losses));
  if ((options.guitar === undefined) !== (options.coil === undefined)) {
    problems.push(problemAt(options.guitar === undefined ? '--guitar' : '--coil', '--guitar and --coil together', 'only one of them'));
  }
  if (sweepPath !== undefined) {
    for (const [flag, value] of [['--peak', options.peak], ['--height', options.height], ['--q', options.q]] as const) {
      if (value !== undefined) problems.push(problemAt(flag, 'either a sweep file or the peak options, not both', value));
    }
    if (problems.length > 0) throw new InputError(problems);
    const sweep = parseImpedanceSweep(readText(sweepPath, cwd, 'a readable impedance sweep (CSV)'), sweepPath);
    const fit = fitCoilToSweep(sweep, { losses: losses as CoilLossModel });
    return { coil: fit, eddyCornerHz: fit.eddyCornerHz, source: sweepPath, points: fit.points, rmsRelativeError: fit.rmsRelativeError, maxRelativeError: fit.maxRelativeError };
  }
  const peakHz = quantityOption(options.peak, 'frequency', '--peak', problems);
  const resistanceOhms = quantityOption(options.resistance, 'resistance', '--resistance', problems);
  const inductanceH = quantityOption(options.inductance, 'inductance', '--inductance', problems);
  const heightDb = numberOption(options.height, '--height', 'a peak height above DC in dB, more than 0, like 12', problems, (v) => v > 0);
  const q = numberOption(options.q, '--q', 'a Q above 0.71, like 4', problems, (v) => v > Math.SQRT1_2);
  if (options.peak === undefined) problems.push(problemAt('<sweep>', 'a sweep file (CSV), or --peak with --height or --q, --resistance and --inductance', 'nothing'));
  else {
    if (options.resistance === undefined) problems.push(problemAt('--resistance', 'the DC resistance to go with --peak, like 6k', 'nothing'));
    if (options.inductance === undefined) problems.push(problemAt('--inductance', 'the inductance to go with --peak, like 2.5H', 'nothing'));
    if (options.height === undefined && options.q === undefined) problems.push(problemAt('--height', '--height or --q to go with --peak', 'nothing'));
  }
  if (problems.length > 0 || peakHz === undefined || resistanceOhms === undefined || inductanceH === undefined) throw new InputError(problems);
  const height = heightDb === undefined ? undefined : 10 ** (heightDb / DECIBELS_PER_RATIO);
  const coil = fitCoilToPeak({ resistanceOhms, inductanceH, peakHz, ...(height === undefined ? { q: q as number } : { height }) });
  if (coil === null) {
    throw InputError.at(options.height !== undefined ? '--height' : '--q', 'a peak no higher than the winding resistance alone allows (a lower height or Q)', options.height ?? options.q);
  }
  return { coil, eddyCornerHz: null, source: 'the unloaded peak', points: null, rmsRelativeError: null, maxRelativeError: null };
}

const significant = (value: number): number => Number(value.toPrecision(WRITTEN_DIGITS));

/** The guitar file with the coil's fitted fields set, validated; throws InputError (nothing written) when it is not a valid guitar. */
function updatedGuitarText(text: string, path: string, coilId: string, result: FitResult): string {
  const raw = parseJsonText(text, path);
  parseGuitar(raw);
  const coils = (raw as { coils: Array<Record<string, unknown>> }).coils;
  const entry = coils.find((coil) => coil.id === coilId);
  if (entry === undefined) throw InputError.at('--coil', `one of the coil ids in ${path} (${coils.map((coil) => String(coil.id)).join(', ')})`, coilId);
  const { coil } = result;
  entry.resistance = significant(coil.resistanceOhms);
  entry.inductance = significant(coil.inductanceH);
  entry.capacitance = significant(coil.capacitanceF);
  entry.eddyShare = significant(coil.eddyShare);
  if (result.eddyCornerHz === null) delete entry.eddyCorner;
  else entry.eddyCorner = significant(result.eddyCornerHz);
  if (coil.lossResistanceOhms === null) delete entry.lossResistance;
  else entry.lossResistance = significant(coil.lossResistanceOhms);
  parseGuitar(raw);
  return `${JSON.stringify(raw, null, 2)}\n`;
}

function renderText(result: FitResult): string {
  const { coil } = result;
  const peak = measureUnloadedPeak(coil);
  const lines = [
    `fit of ${result.source}${result.points === null ? '' : ` (${result.points} points)`}:`,
    `  resistance       ${formatEngineering(coil.resistanceOhms, 'Ω')}`,
    `  inductance       ${formatEngineering(coil.inductanceH, 'H')}`,
    `  capacitance      ${formatEngineering(coil.capacitanceF, 'F')}`,
    `  eddy branch      ${coil.eddyShare > 0 && result.eddyCornerHz !== null ? `${(coil.eddyShare * PERCENT).toFixed(1)} % of L above ${formatEngineering(result.eddyCornerHz, 'Hz')} (${formatEngineering(coil.eddyResistanceOhms, 'Ω')})` : 'none'}`,
    `  loss resistance  ${coil.lossResistanceOhms === null ? 'none' : formatEngineering(coil.lossResistanceOhms, 'Ω')}`,
    peak === null ? '  unloaded peak    none in 100 Hz–200 kHz' : `  unloaded peak    ${formatEngineering(peak.frequencyHz, 'Hz')}, ${peak.heightDb.toFixed(1)} dB above DC (open leads)`,
  ];
  if (result.rmsRelativeError !== null && result.maxRelativeError !== null) {
    lines.push(`  fit error        ${(result.rmsRelativeError * PERCENT).toPrecision(2)} % rms, ${(result.maxRelativeError * PERCENT).toPrecision(2)} % at worst, of |Z|`);
  } else {
    lines.push('  fit              closed form from the peak (no eddy branch: all losses in the loss resistance)');
  }
  return `${lines.join('\n')}\n`;
}

function renderJson(result: FitResult): string {
  const { coil } = result;
  const peak = measureUnloadedPeak(coil);
  return `${JSON.stringify(
    {
      source: result.source,
      points: result.points,
      resistanceOhms: coil.resistanceOhms,
      inductanceH: coil.inductanceH,
      capacitanceF: coil.capacitanceF,
      eddyShare: coil.eddyShare,
      eddyCornerHz: result.eddyCornerHz,
      eddyResistanceOhms: coil.eddyShare > 0 ? coil.eddyResistanceOhms : null,
      lossResistanceOhms: coil.lossResistanceOhms,
      rmsRelativeError: result.rmsRelativeError,
      maxRelativeError: result.maxRelativeError,
      unloadedPeakHz: peak?.frequencyHz ?? null,
      unloadedPeakDb: peak?.heightDb ?? null,
    },
    null,
    2,
  )}\n`;
}

export function registerFitCoil(program: Command, io: Io): void {
  program
    .command('fit-coil')
    .description("fit a coil's inductance, capacitance and losses to a measured impedance sweep (CSV) or its unloaded peak")
    .argument('[sweep]', 'impedance sweep CSV: a header with frequency and magnitude,phase (ohm, degrees) or real,imaginary (ohm)')
    .option('--losses <model>', 'losses fitted to a sweep: eddy (default), parallel or both')
    .option('--peak <frequency>', 'instead of a sweep: the unloaded resonant peak frequency, like 9.5k')
    .option('--height <dB>', 'with --peak: its height above DC in dB (open leads)')
    .option('--q <Q>', 'with --peak, instead of --height: its Q')
    .option('--resistance <ohms>', 'with --peak: the DC resistance, like 6k')
    .option('--inductance <henries>', 'with --peak: the inductance, like 2.5H')
    .option('--json', 'print the fitted values in SI units as JSON')
    .option('--guitar <file>', 'write the fitted values into this guitar file (with --coil)')
    .option('--coil <id>', 'the coil of --guitar to write them into')
    .action((sweepPath: string | undefined, options: FitCoilOptions) => {
      const result = fitFromOptions(sweepPath, options, io.cwd);
      if (options.guitar !== undefined && options.coil !== undefined) {
        const target = resolve(io.cwd, options.guitar);
        const text = updatedGuitarText(readText(options.guitar, io.cwd, 'a readable guitar file (JSON)'), options.guitar, options.coil, result);
        writeFileAtomicSync(target, text);
        io.stderr(`coilbench: wrote the fitted values into coil ${options.coil} of ${options.guitar}\n`);
      }
      io.stdout(options.json ? renderJson(result) : renderText(result));
    });
}
