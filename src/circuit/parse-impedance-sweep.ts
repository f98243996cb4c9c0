/**
 * Reads a measured impedance sweep from CSV text: a header row naming the
 * columns, then one frequency per row. Columns (case ignored, units in
 * parentheses allowed, e.g. "frequency (Hz)"): `frequency` in Hz and either
 * `magnitude` (ohms) with `phase` (degrees), or `real` with `imaginary`
 * (ohms). Lines starting with "#" and blank lines are skipped.
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';

/** One measured point. */
export interface ImpedancePoint {
  readonly frequencyHz: number;
  readonly realOhms: number;
  readonly imaginaryOhms: number;
}

/** Fewest points a sweep must have to fit the six-element coil model. */
export const MIN_SWEEP_POINTS = 12;

const DEGREES_PER_RADIAN = 180 / Math.PI;

function columnName(header: string): string {
  return header.trim().toLowerCase().replace(/\s*\(.*\)\s*$/u, '').replace(/^"|"$/gu, '');
}

/** Parse sweep CSV text; `source` names the file in messages. Throws InputError listing every problem. */
export function parseImpedanceSweep(text: string, source: string): ImpedancePoint[] {
  const rows = text
    .split(/\r?\n/u)
    .map((line, index) => ({ line: line.trim(), number: index + 1 }))
    .filter((row) => row.line !== '' && !row.line.startsWith('#'));
  const header = rows.shift();
  if (header === undefined) throw InputError.at(source, 'a header row and impedance rows', 'an empty file');
  const names = header.line.split(/[,;\t]/u).map(columnName);
  const find = (name: string): number => names.indexOf(name);
  const frequency = find('frequency');
  const magnitude = find('magnitude');
  const phase = find('phase');
  const real = find('real');
  const imaginary = find('imaginary');
  const polar = magnitude >= 0 && phase >= 0;
  const cartesian = real >= 0 && imaginary >= 0;
  if (frequency < 0 || (!polar && !cartesian)) {
    throw InputError.at(`${source}:${header.number}`, 'a header with "frequency" and either "magnitude" and "phase" or "real" and "imaginary"', header.line);
  }
  const problems: InputProblem[] = [];
  const points: ImpedancePoint[] = [];
  for (const row of rows) {
    const cells = row.line.split(/[,;\t]/u).map((cell) => Number(cell.trim()));
    const at = `${source}:${row.number}`;
    const f = cells[frequency];
    if (f === undefined || !Number.isFinite(f) || f <= 0) {
      problems.push(problemAt(at, 'a positive frequency in Hz in the "frequency" column', row.line));
      continue;
    }
    if (polar) {
      const m = cells[magnitude];
      const p = cells[phase];
      if (m === undefined || !Number.isFinite(m) || m <= 0 || p === undefined || !Number.isFinite(p) || Math.abs(p) > 180) {
        problems.push(problemAt(at, 'a positive magnitude in ohms and a phase in degrees (−180 to 180)', row.line));
        continue;
      }
      points.push({ frequencyHz: f, realOhms: m * Math.cos(p / DEGREES_PER_RADIAN), imaginaryOhms: m * Math.sin(p / DEGREES_PER_RADIAN) });
    } else {
      const re = cells[real];
      const im = cells[imaginary];
      if (re === undefined || !Number.isFinite(re) || im === undefined || !Number.isFinite(im) || Math.hypot(re, im) === 0) {
        problems.push(problemAt(at, 'real and imaginary parts in ohms, not both zero', row.line));
        continue;
      }
      points.push({ frequencyHz: f, realOhms: re, imaginaryOhms: im });
    }
  }
  if (problems.length > 0) throw new InputError(problems);
  if (points.length < MIN_SWEEP_POINTS) {
    throw InputError.at(source, `at least ${MIN_SWEEP_POINTS} measured frequencies`, `${points.length}`);
  }
  points.sort((a, b) => a.frequencyHz - b.frequencyHz);
  return points;
}
