/** Plain-text tables for the terminal: left-aligned text, right-aligned numbers. */

export interface Column<Row> {
  readonly title: string;
  readonly value: (row: Row) => string;
  readonly align?: 'left' | 'right';
}

/** Render rows as a table with a header and a rule; the last column is not padded. */
export function formatTable<Row>(rows: readonly Row[], columns: readonly Column<Row>[]): string {
  const cells = rows.map((row) => columns.map((column) => column.value(row)));
  const widths = columns.map((column, index) =>
    Math.max(column.title.length, ...cells.map((line) => (line[index] ?? '').length)),
  );
  const renderLine = (line: readonly string[]): string =>
    line
      .map((cell, index) => {
        const width = widths[index] ?? 0;
        if (index === line.length - 1 && columns[index]?.align !== 'right') return cell;
        return columns[index]?.align === 'right' ? cell.padStart(width) : cell.padEnd(width);
      })
      .join('  ')
      .trimEnd();
  const header = renderLine(columns.map((column) => column.title));
  const rule = widths.map((width) => '-'.repeat(width)).join('  ');
  return [header, rule, ...cells.map(renderLine)].join('\n') + '\n';
}
