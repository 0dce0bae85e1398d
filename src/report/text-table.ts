/** A plain monospace table: header, rule, rows; columns padded to their widest cell. */
export interface Column {
  readonly header: string;
  readonly align: 'left' | 'right';
}

/** A column whose cells line up on their left edge (words, names). */
export function left(header: string): Column {
  return { header, align: 'left' };
}

/** A column whose cells line up on their right edge (numbers). */
export function right(header: string): Column {
  return { header, align: 'right' };
}

export function renderTable(columns: readonly Column[], rows: readonly (readonly string[])[]): string {
  const widths = columns.map((c, i) => Math.max(c.header.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: readonly string[]) =>
    cells
      .map((cell, i) => (columns[i]!.align === 'left' ? cell.padEnd(widths[i]!) : cell.padStart(widths[i]!)))
      .join('  ')
      .trimEnd();
  return [
    line(columns.map((c) => c.header)),
    widths
      .map((w) => '-'.repeat(w))
      .join('  ')
      .trimEnd(),
    ...rows.map(line),
  ].join('\n');
}
