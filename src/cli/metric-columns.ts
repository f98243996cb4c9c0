/**
 * The columns of `analyze`'s table, CSV and Markdown, defined once. To add a
 * figure (level, loudness, centroid, group), add its field to
 * `AnalyzedWiring` and one entry to `METRIC_COLUMNS`.
 */
import { escapeMarkdown } from '../report/text/index.js';
import { HUM_FLOOR_DB, type WiringCircuitMetrics } from '../circuit/index.js';
import type { Wiring } from '../wiring/index.js';

/** Figures from the wiring's render of the reference phrase (docs/design.md metrics). */
/** A hum figure as every table prints it: whole decibels, the floor as "<=-40" (the model claims no deeper rejection). */
export function formatHumDb(hum: number | null): string {
  return hum !== null && hum <= HUM_FLOOR_DB ? `<=${HUM_FLOOR_DB}` : fixed(hum, 0, true);
}

export interface WiringAudioMetrics {
  readonly levelDb: number;
  /** Null when the wiring was not rendered (a streamed analysis of six elements: level from band spectra, stream-analysis.ts). */
  readonly loudnessLufs: number | null;
  readonly centroidHz: number | null;
}

/**
 * What a table row shows of its wiring: an enumerated wiring, or a connection
 * list given with `analyze --network` (topology "connection list").
 */
export type RowWiring = Omit<Wiring, 'network' | 'elements' | 'topology'> & { readonly topology: Wiring['topology'] | 'connection list' };

export interface AnalyzedWiring {
  readonly wiring: RowWiring;
  readonly circuit: WiringCircuitMetrics;
  /** Absent when the audio figures were not computed (silent output). */
  readonly audio?: WiringAudioMetrics | null;
  /** Group of wirings that sound alike (group-summary.ts), when computed. */
  readonly group?: number | null;
}

export type CellValue = string | number | boolean | null;

export interface MetricColumn {
  /** Name in CSV headers and JSON (docs/design.md names). */
  readonly key: string;
  /** Header in the table and Markdown. */
  readonly title: string;
  readonly align: 'left' | 'right';
  /** Cell text in the table and Markdown. */
  readonly text: (row: AnalyzedWiring) => string;
  /** Raw value in CSV (numbers unrounded, null as an empty cell). */
  readonly value: (row: AnalyzedWiring) => CellValue;
  readonly table: boolean;
  readonly markdown: boolean;
  /** `--sort` name, direction and key (null sorts last). */
  readonly sort?: { readonly name: string; readonly descending: boolean; readonly key: (row: AnalyzedWiring) => number | null };
}

const NONE = '-';
const SILENT = 'silent';

function fixed(value: number | null, digits: number, signed = false): string {
  if (value === null || !Number.isFinite(value)) return NONE;
  const rounded = Number(value.toFixed(digits));
  const text = (rounded === 0 ? 0 : rounded).toFixed(digits); // never "-0.0"
  return signed && rounded >= 0 ? `+${text}` : text;
}

const silent = (row: AnalyzedWiring): boolean => row.circuit.peakDb === null;

export const METRIC_COLUMNS: readonly MetricColumn[] = Object.freeze([
  {
    key: 'id',
    title: '#',
    align: 'right',
    text: (row) => row.wiring.id,
    value: (row) => row.wiring.id,
    table: true,
    markdown: true,
    sort: { name: 'id', descending: false, key: (row) => row.wiring.number },
  },
  {
    key: 'expression',
    title: 'wiring',
    align: 'left',
    text: (row) => row.wiring.expression,
    value: (row) => row.wiring.expression,
    table: true,
    markdown: true,
  },
  {
    key: 'coils',
    title: 'coils',
    align: 'right',
    text: (row) => String(row.wiring.elementIds.length),
    value: (row) => row.wiring.elementIds.join(' '),
    table: false,
    markdown: false,
    sort: { name: 'coils', descending: false, key: (row) => row.wiring.elementIds.length },
  },
  {
    key: 'topology',
    title: 'topology',
    align: 'left',
    text: (row) => row.wiring.topology,
    value: (row) => row.wiring.topology,
    table: false,
    markdown: false,
  },
  {
    key: 'outOfPhase',
    title: 'out of phase',
    align: 'left',
    text: (row) => row.wiring.outOfPhase.join(', ') || NONE,
    value: (row) => row.wiring.outOfPhase.join(' '),
    table: false,
    markdown: false,
  },
  {
    key: 'resonanceHz',
    title: 'resonance Hz',
    align: 'right',
    text: (row) => (silent(row) ? SILENT : fixed(row.circuit.resonanceHz, 0)),
    value: (row) => row.circuit.resonanceHz,
    table: true,
    markdown: true,
    sort: { name: 'resonance', descending: true, key: (row) => row.circuit.resonanceHz },
  },
  {
    key: 'peakDb',
    title: 'peak dB',
    align: 'right',
    text: (row) => (silent(row) ? SILENT : fixed(row.circuit.peakDb, 1, true)),
    value: (row) => row.circuit.peakDb,
    table: true,
    markdown: true,
    sort: { name: 'peak', descending: true, key: (row) => row.circuit.peakDb },
  },
  {
    key: 'resonanceQ',
    title: 'Q',
    align: 'right',
    text: (row) => (silent(row) ? SILENT : fixed(row.circuit.resonanceQ, 2)),
    value: (row) => row.circuit.resonanceQ,
    table: true,
    markdown: true,
    sort: { name: 'q', descending: true, key: (row) => row.circuit.resonanceQ },
  },
  {
    key: 'humDb',
    title: 'hum dB',
    align: 'right',
    text: (row) => (silent(row) ? SILENT : formatHumDb(row.circuit.humDb)),
    value: (row) => row.circuit.humDb,
    table: true,
    markdown: true,
    sort: { name: 'hum', descending: false, key: (row) => row.circuit.humDb },
  },
  {
    key: 'humCategory',
    title: 'hum',
    align: 'left',
    text: (row) => (silent(row) ? SILENT : (row.circuit.humCategory ?? NONE)),
    value: (row) => row.circuit.humCategory,
    table: true,
    markdown: true,
  },
  {
    key: 'humCancelling',
    title: 'hum cancelling',
    align: 'left',
    text: (row) => (row.circuit.humCancelling ? 'yes' : ''),
    value: (row) => row.circuit.humCancelling,
    table: false,
    markdown: false,
  },
  {
    key: 'levelDb',
    title: 'level dB',
    align: 'right',
    text: (row) => (row.audio ? fixed(row.audio.levelDb, 1, true) : NONE),
    value: (row) => row.audio?.levelDb ?? null,
    table: true,
    markdown: true,
    sort: { name: 'level', descending: true, key: (row) => row.audio?.levelDb ?? null },
  },
  {
    key: 'loudnessLufs',
    title: 'LUFS',
    align: 'right',
    text: (row) => (row.audio ? fixed(row.audio.loudnessLufs, 1) : NONE),
    value: (row) => row.audio?.loudnessLufs ?? null,
    table: false,
    markdown: true,
    sort: { name: 'loudness', descending: true, key: (row) => row.audio?.loudnessLufs ?? null },
  },
  {
    key: 'centroidHz',
    title: 'centroid Hz',
    align: 'right',
    text: (row) => (row.audio ? fixed(row.audio.centroidHz, 0) : NONE),
    value: (row) => row.audio?.centroidHz ?? null,
    table: true,
    markdown: true,
    sort: { name: 'brightness', descending: true, key: (row) => row.audio?.centroidHz ?? null },
  },
  {
    key: 'group',
    title: 'group',
    align: 'right',
    text: (row) => (row.group === undefined || row.group === null ? NONE : String(row.group)),
    value: (row) => row.group ?? null,
    table: true,
    markdown: true,
    sort: { name: 'group', descending: false, key: (row) => row.group ?? null },
  },
  {
    key: 'description',
    title: 'in words',
    align: 'left',
    text: (row) => row.wiring.description,
    value: (row) => row.wiring.description,
    table: true,
    markdown: true,
  },
]);

/** The names `--sort` accepts, in column order. */
export function sortNames(columns: readonly MetricColumn[] = METRIC_COLUMNS): string[] {
  return columns.flatMap((column) => (column.sort ? [column.sort.name] : []));
}

/** Rows sorted by the column whose sort name is `name` (stable; nulls last; ties by wiring number). */
export function sortRows(rows: readonly AnalyzedWiring[], name: string, columns: readonly MetricColumn[] = METRIC_COLUMNS): AnalyzedWiring[] {
  const column = columns.find((candidate) => candidate.sort?.name === name);
  if (!column?.sort) throw new RangeError(`sortRows: no column sorts by ${name}`);
  const { key, descending } = column.sort;
  return [...rows].sort((a, b) => {
    const x = key(a);
    const y = key(b);
    if (x === null || y === null) return x === y ? a.wiring.number - b.wiring.number : x === null ? 1 : -1;
    return (descending ? y - x : x - y) || a.wiring.number - b.wiring.number;
  });
}

/** One CSV field (RFC 4180: quote fields holding a comma, quote or line break; double the quotes). */
function csvField(value: CellValue): string {
  // a figure that does not exist is an empty cell; no Infinity or NaN ever reaches a file
  if (value === null || (typeof value === 'number' && !Number.isFinite(value))) return '';
  const text = String(value);
  return /[",\r\n]/u.test(text) ? `"${text.replace(/"/gu, '""')}"` : text;
}

/** The CSV header line (no line end). */
export function renderCsvHeader(columns: readonly MetricColumn[] = METRIC_COLUMNS): string {
  return columns.map((column) => csvField(column.key)).join(',');
}

/** One CSV row (no line end). */
export function renderCsvRow(row: AnalyzedWiring, columns: readonly MetricColumn[] = METRIC_COLUMNS): string {
  return columns.map((column) => csvField(column.value(row))).join(',');
}

/** CSV text with every column, header first, CRLF line ends (RFC 4180). */
export function renderCsv(rows: readonly AnalyzedWiring[], columns: readonly MetricColumn[] = METRIC_COLUMNS): string {
  const lines = [renderCsvHeader(columns)];
  for (const row of rows) lines.push(renderCsvRow(row, columns));
  return `${lines.join('\r\n')}\r\n`;
}

function markdownCell(text: string): string {
  return escapeMarkdown(text);
}

/** The header and rule lines of the Markdown table (no line end after the rule). */
export function renderMarkdownHeader(columns: readonly MetricColumn[] = METRIC_COLUMNS): string {
  const shown = columns.filter((column) => column.markdown);
  const header = `| ${shown.map((column) => column.title.replace(/\|/gu, '\\|')).join(' | ')} |`; // our own titles: only the cell separator escaped
  const rule = `|${shown.map((column) => (column.align === 'right' ? ' ---: ' : ' --- ')).join('|')}|`;
  return `${header}\n${rule}`;
}

/** One row of the Markdown table (no line end). */
export function renderMarkdownRow(row: AnalyzedWiring, columns: readonly MetricColumn[] = METRIC_COLUMNS): string {
  return `| ${columns.filter((column) => column.markdown).map((column) => markdownCell(column.text(row))).join(' | ')} |`;
}

/** A Markdown (GitHub-flavoured) table of the Markdown columns. */
export function renderMarkdownTable(rows: readonly AnalyzedWiring[], columns: readonly MetricColumn[] = METRIC_COLUMNS): string {
  const body = rows.map((row) => renderMarkdownRow(row, columns));
  return [renderMarkdownHeader(columns), ...body].join('\n') + '\n';
}
