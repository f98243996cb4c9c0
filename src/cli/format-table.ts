/** Plain-text tables for the terminal: left-aligned text, right-aligned numbers. */

export interface Column<Row> {
  readonly title: string;
  readonly value: (row: Row) => string;
  readonly align?: 'left' | 'right';
}

/** Characters gathered before each write while streaming a table (bounded memory, few writes). */
const TABLE_CHUNK_CHARACTERS = 1 << 16;

/**
 * Write rows as a table with a header and a rule (the last column is not
 * padded), in chunks: two passes over the rows (widths, then lines), so
 * memory does not grow with the number of rows.
 */
export function writeTable<Row>(rows: Iterable<Row>, columns: readonly Column<Row>[], write: (text: string) => void): void {
  const widths = columns.map((column) => column.title.length);
  for (const row of rows) {
    columns.forEach((column, index) => {
      const length = column.value(row).length;
      if (length > (widths[index] ?? 0)) widths[index] = length;
    });
  }
  const renderLine = (line: readonly string[]): string =>
    line
      .map((cell, index) => {
        const width = widths[index] ?? 0;
        if (index === line.length - 1 && columns[index]?.align !== 'right') return cell;
        return columns[index]?.align === 'right' ? cell.padStart(width) : cell.padEnd(width);
      })
      .join('  ')
      .trimEnd();
  let chunk = `${renderLine(columns.map((column) => column.title))}\n${widths.map((width) => '-'.repeat(width)).join('  ')}\n`;
  for (const row of rows) {
    chunk += `${renderLine(columns.map((column) => column.value(row)))}\n`;
    if (chunk.length >= TABLE_CHUNK_CHARACTERS) {
      write(chunk);
      chunk = '';
    }
  }
  write(chunk);
}

/** Render rows as a table with a header and a rule; the last column is not padded. */
export function formatTable<Row>(rows: readonly Row[], columns: readonly Column<Row>[]): string {
  let text = '';
  writeTable(rows, columns, (part) => {
    text += part;
  });
  return text;
}
