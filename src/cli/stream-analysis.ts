/**
 * `analyze --no-audio` for guitars with more wirings than are held in
 * memory (six elements: 228,386 wirings): the figures come from
 * measureWiringFigures one wiring at a time in the stable order and every
 * row is written as soon as it is known — to standard output (table,
 * Markdown or JSON) and to the CSV file, which is written under a temporary
 * name and renamed only when whole. Memory stays bounded (one subset's
 * figures at a time), and the loop pauses for Ctrl-C (pause-for-signals.ts).
 *
 * What is left out, and says so: loudness and the rendered centroid (each
 * wiring's render: about 25 ms each, 95 min for six elements), `--sort`
 * (needs every row first: sort the CSV), and groups of alike wirings (single
 * linkage compares pairs of wirings, which grows with the square of the
 * count).
 */
import { dirname, resolve } from 'node:path';
import { type SpectralBasis, measureWiringFigures } from '../analysis/index.js';
import type { CircuitMetricsSolver, CircuitOverrides } from '../circuit/index.js';
import { type InputProblem, problemAt } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import { formatCount } from '../units/index.js';
import { type AtomicFileStream, createPause, openFileAtomicSync, removeStaleTempFiles } from '../render/measuring/index.js';
import { invertAll, planWiringSubsets, printNetwork, type Network } from '../wiring/index.js';
import { wiringRecord } from './commands/wirings.js';
import { renderTableLine } from './format-table.js';
import type { Io } from './io.js';
import { type AnalyzedWiring, METRIC_COLUMNS, renderCsvHeader, renderCsvRow, renderMarkdownHeader, renderMarkdownRow } from './metric-columns.js';
import { createProgress } from './progress.js';

/** Most wirings analysed in memory (five elements); above this `analyze` streams. */
export const MAX_WIRINGS_IN_MEMORY = 9997;

/** Why the streamed analysis has no groups. */
export const STREAMED_GROUPS_NOTE = `groups of alike wirings are computed for up to ${formatCount(MAX_WIRINGS_IN_MEMORY)} wirings (five elements): they compare pairs of wirings, which grows with the square of the count`;
/** Why the streamed analysis has no loudness or rendered centroid. */
export const STREAMED_AUDIO_NOTE =
  'level comes from the band spectra of the reference phrase (the same energy a render measures); loudness and the rendered centroid need each wiring rendered and are left out; brightnessHz (JSON) is the power-weighted centroid of the band spectra';

/** Least width of a figure column in the streamed table (the widest cell, "cancels" or "silent", has 7 characters or fewer). */
const FIGURE_COLUMN_WIDTH = 7;

export interface StreamAnalysisRequest {
  readonly io: Io;
  readonly guitar: Guitar;
  readonly circuit: CircuitMetricsSolver;
  /** The guitar's band cross-spectra for the reference phrase (the circuit solver's drive comes from it). */
  readonly basis: SpectralBasis;
  readonly overrides: CircuitOverrides | undefined;
  readonly total: number;
  /** The --csv text as given (for the message) and resolved; undefined for none. */
  readonly csv: string | undefined;
  readonly format: 'table' | 'markdown' | 'json';
  /** Plain progress lines when standard error is not a terminal. */
  readonly big: boolean;
  /** The `settings` record of --json and the line describing the load. */
  readonly settings: Record<string, unknown>;
  readonly settingsLine: string;
  readonly footnotes: readonly string[];
  readonly silentNote: string;
}

/** The longest expression any wiring of these elements can have: every structure on all of them with every element but the first out of phase. */
function longestExpression(ids: readonly string[]): number {
  let longest = 0;
  let last: readonly { structure: Network }[] = [];
  for (const plan of planWiringSubsets(ids)) last = plan.structures; // the full set comes last
  for (const { structure } of last) {
    const flipped = invertAll(structure);
    // invertAll flips the first element too; a wiring never inverts it, so count one "~" fewer
    longest = Math.max(longest, printNetwork(flipped, ids).length - 1);
  }
  return longest;
}

/** "  " + JSON of `value` with every line after the first indented by `indent`. */
function jsonAt(value: unknown, indent: string): string {
  return JSON.stringify(value, null, 2).split('\n').join(`\n${indent}`);
}

/** Run the streamed analysis; rows go out as they are computed. */
export async function streamAnalysis(request: StreamAnalysisRequest): Promise<void> {
  const { io, guitar, circuit, format, total } = request;
  const ids = guitar.elements.map((element) => element.id);
  let csv: AtomicFileStream | undefined;
  if (request.csv !== undefined) {
    const path = resolve(io.cwd, request.csv);
    await removeStaleTempFiles(dirname(path)); // what a killed earlier run may have left
    csv = openFileAtomicSync(path);
    csv.write(`${renderCsvHeader()}\r\n`);
  }
  const tableColumns = METRIC_COLUMNS.filter((column) => column.table);
  const widths = tableColumns.map((column) => {
    if (column.key === 'id') return Math.max(column.title.length, `w${total}`.length);
    if (column.key === 'expression') return Math.max(column.title.length, longestExpression(ids));
    return Math.max(column.title.length, FIGURE_COLUMN_WIDTH);
  });
  const heading = `${guitar.name}: ${total} wirings`;
  let out = '';
  const emit = (text: string): void => {
    out += text;
    if (out.length >= 1 << 16) {
      io.stdout(out);
      out = '';
    }
  };
  if (format === 'json') {
    emit(`{\n  "guitar": ${JSON.stringify(guitar.name)},\n  "settings": ${jsonAt(request.settings, '  ')},\n  "count": ${total},\n  "silent": ${circuit.silent},\n  "wirings": [\n`);
  } else if (format === 'markdown') {
    const silentLine = circuit.silent ? `\n**Silent:** ${request.silentNote}.\n` : '';
    emit(`## ${heading}\n\n${request.settingsLine}.\n${silentLine}\n${renderMarkdownHeader()}\n`);
  } else {
    emit(`${heading}\n${request.settingsLine}\n`);
    if (circuit.silent) emit(`Silent: ${request.silentNote}.\n`);
    emit(`\n${renderTableLine(tableColumns.map((column) => column.title), tableColumns, widths)}\n${widths.map((width) => '-'.repeat(width)).join('  ')}\n`);
  }

  const progress = createProgress(io, undefined, { plainLines: request.big });
  progress.stage('analysing', total);
  const pause = createPause();
  let written = 0;
  let committed = false;
  try {
    for (const step of measureWiringFigures(guitar, { circuit, basis: request.basis, overrides: request.overrides, total })) {
      await pause();
      if (step.kind === 'progress') {
        progress.step(step.done, step.total);
        continue;
      }
      const { wiring, levelDb, brightnessHz } = step.figures;
      const row: AnalyzedWiring = {
        wiring,
        circuit: step.figures.circuit,
        audio: levelDb === null ? null : { levelDb, loudnessLufs: null, centroidHz: null },
        group: null,
      };
      csv?.write(`${renderCsvRow(row)}\r\n`);
      if (format === 'json') {
        const record = {
          ...wiringRecord(wiring),
          ...row.circuit,
          levelDb,
          loudnessLufs: null,
          centroidHz: null,
          brightnessHz,
          group: null,
        };
        emit(`${written > 0 ? ',\n' : ''}    ${jsonAt(record, '    ')}`);
      } else if (format === 'markdown') emit(`${renderMarkdownRow(row)}\n`);
      else emit(`${renderTableLine(tableColumns.map((column) => column.text(row)), tableColumns, widths)}\n`);
      written += 1;
    }
    progress.finish();
    if (csv !== undefined) {
      csv.commit();
      committed = true;
      io.stderr(`coilbench: wrote ${request.csv} (${written} wirings)\n`);
    }
  } finally {
    if (csv !== undefined && !committed) csv.abandon();
  }
  if (circuit.silent) io.stderr(`coilbench: note: ${request.silentNote}\n`);
  if (format === 'json') {
    const notes: Record<string, unknown> = { groups: null, groupsNote: STREAMED_GROUPS_NOTE, audioNote: STREAMED_AUDIO_NOTE };
    if (circuit.silent) notes.note = request.silentNote;
    const tail = Object.entries(notes).map(([key, value]) => `  ${JSON.stringify(key)}: ${JSON.stringify(value)}`);
    emit(`\n  ],\n${tail.join(',\n')}\n}\n`);
  } else {
    const separator = format === 'markdown' ? ' ' : '\n';
    emit(`\n${request.footnotes.join(separator)}\n\nNot computed for ${formatCount(total)} wirings: ${STREAMED_GROUPS_NOTE}; ${STREAMED_AUDIO_NOTE}.\n`);
  }
  io.stdout(out);
}

/** What a streamed analysis cannot do, as input problems (exit 2, before any work). */
export function streamedAnalysisProblems(audio: boolean, sort: string | undefined, total: number): InputProblem[] {
  const problems: InputProblem[] = [];
  const count = formatCount(total);
  if (audio) {
    problems.push(
      problemAt(
        '--no-audio',
        `--no-audio above ${formatCount(MAX_WIRINGS_IN_MEMORY)} wirings (loudness and centroid need each wiring rendered; level, resonance, peak, Q and hum come without; hear a few with render --only)`,
        `audio figures for ${count} wirings`,
      ),
    );
  }
  if (sort !== undefined) {
    problems.push(problemAt('--sort', `no --sort above ${formatCount(MAX_WIRINGS_IN_MEMORY)} wirings (rows are written as they are computed; sort the --csv file instead)`, `--sort ${sort} for ${count} wirings`));
  }
  return problems;
}
