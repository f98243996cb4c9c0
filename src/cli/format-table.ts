/** Plain-text tables for the terminal: left-aligned text, right-aligned numbers. */

export interface Column<Row> {
  readonly title: string;
  readonly value: (row: Row) => string;
  readonly align?: 'left' | 'right';
}

/** Characters gathered before each write while streaming a table (bounded memory, few writes). */
const TABLE_CHUNK_CHARACTERS = 1 << 16;

/** One line of a table: cells padded to `widths` (the last column not padded unless right-aligned), two spaces apart. */
export function renderTableLine(cells: readonly string[], columns: readonly Pick<Column<never>, 'align'>[], widths: readonly number[]): string {
  return cells
    .map((cell, index) => {
      const width = widths[index] ?? 0;
      if (index === cells.length - 1 && columns[index]?.align !== 'right') return cell;
      return columns[index]?.align === 'right' ? cell.padStart(width) : cell.padEnd(width);
    })
    .join('  ')
    .trimEnd();
}

/**
 * The text of a table with a header and a rule (the last column is not
 * padded), in chunks: two passes over the rows (widths, then lines), so
 * memory does not grow with the number of rows. Yields `null` between rows
 * of the first pass, so a caller can pause there too.
 */
function* tableChunks<Row>(rows: Iterable<Row>, columns: readonly Column<Row>[]): Generator<string | null> {
  const widths = columns.map((column) => column.title.length);
  for (const row of rows) {
    columns.forEach((column, index) => {
      const length = column.value(row).length;
      if (length > (widths[index] ?? 0)) widths[index] = length;
    });
    yield null;
  }
  const renderLine = (line: readonly string[]): string => renderTableLine(line, columns, widths);
  let chunk = `${renderLine(columns.map((column) => column.title))}\n${widths.map((width) => '-'.repeat(width)).join('  ')}\n`;
  for (const row of rows) {
    chunk += `${renderLine(columns.map((column) => column.value(row)))}\n`;
    if (chunk.length >= TABLE_CHUNK_CHARACTERS) {
      yield chunk;
      chunk = '';
    }
  }
  yield chunk;
}

/** Write rows as a table (see tableChunks); `rows` is read twice. */
export function writeTable<Row>(rows: Iterable<Row>, columns: readonly Column<Row>[], write: (text: string) => void): void {
  for (const chunk of tableChunks(rows, columns)) if (chunk !== null) write(chunk);
}

/** The same, waiting on `pause` between rows and chunks (pause-for-signals.ts), for tables of hundreds of thousands of rows. */
export async function writeTablePausing<Row>(
  rows: Iterable<Row>,
  columns: readonly Column<Row>[],
  write: (text: string) => void,
  pause: () => Promise<void>,
): Promise<void> {
  for (const chunk of tableChunks(rows, columns)) {
    if (chunk !== null) write(chunk);
    await pause();
  }
}

/** Render rows as a table with a header and a rule; the last column is not padded. */
export function formatTable<Row>(rows: readonly Row[], columns: readonly Column<Row>[]): string {
  let text = '';
  writeTable(rows, columns, (part) => {
    text += part;
  });
  return text;
}
