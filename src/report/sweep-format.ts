/**
 * Sweep rows as CSV or as a streamed JSON array. CSV columns are fixed before the first row from
 * every quantity and check the swept designs can produce (`SweepColumns`), and each row fills them
 * by name, so a point with fewer or more checks than another never shifts a value under the wrong
 * header; what a point lacks is left empty.
 */
import type { SweepAxis, SweepColumns, SweepRow } from '../analysis/sweep.js';
import { marginUnit } from '../checks/check.js';

/**
 * A text cell that a spreadsheet would read as a formula (=, +, -, @ first) gets a leading
 * apostrophe, so a name in a design file cannot run one (common practice for CSV export).
 */
function csvField(value: string | number | null): string {
  if (value === null) return '';
  const text = typeof value === 'number' ? (Number.isFinite(value) ? String(Number(value.toPrecision(9))) : '') : /^[=+\-@]/.test(value) ? `'${value}` : value;
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvHeader(axes: readonly SweepAxis[], columns: SweepColumns): string {
  const cols = [
    ...axes.map((a) => a.path), 'corners', 'verdict', 'limiting_corner', 'limiting_check', 'limiting_margin_s', 'limiting_margin_V',
    ...columns.deadTimes.flatMap((d) => [`dead_${d}_min_s`, `dead_${d}_max_s`, `gap_${d}_min_s`]),
    ...columns.widths.map((w) => `width_${w}_min_s`),
    ...columns.checks.map((c) => `margin_${columns.voltChecks.includes(c) ? 'V' : 's'}: ${c}`),
  ];
  return `${cols.map(csvField).join(',')}\n`;
}

/** The row's quantities and checks that have no column (empty when the columns cover the row). */
export function unlistedNames(row: SweepRow, columns: SweepColumns): string[] {
  return [
    ...row.deadTimes.map((d) => d.label).filter((l) => !columns.deadTimes.includes(l)),
    ...row.widths.map((w) => w.phase).filter((p) => !columns.widths.includes(p)),
    ...row.checks.filter((c) => c.kind !== 'steady-state' && !columns.checks.includes(c.name)).map((c) => c.name),
  ];
}

export function csvRow(row: SweepRow, columns: SweepColumns): string {
  const cells: Array<string | number | null> = [
    ...row.point, row.corners, row.verdict, row.limiting?.corner ?? null, row.limiting?.check ?? null,
    ...(row.limiting && marginUnit(row.limiting.kind) === 'V' ? [null, row.limiting.margin] : [row.limiting?.margin ?? null, null]),
    ...columns.deadTimes.flatMap((label) => {
      const d = row.deadTimes.find((x) => x.label === label);
      return d ? [d.min, d.max, d.gapMin] : [null, null, null];
    }),
    ...columns.widths.map((phase) => row.widths.find((x) => x.phase === phase)?.min ?? null),
    ...columns.checks.map((name) => row.checks.find((x) => x.name === name)?.margin ?? null),
  ];
  return `${cells.map(csvField).join(',')}\n`;
}

export function jsonRow(row: SweepRow, axes: readonly SweepAxis[], firstRow: boolean): string {
  const point = Object.fromEntries(axes.map((a, i) => [a.path, row.point[i]]));
  const { index, corners, verdict, limiting, deadTimes, widths, checks } = row;
  const body = JSON.stringify({ index, point, corners, verdict, limiting, deadTimes, widths, checks });
  return `${firstRow ? '[\n' : ',\n'}  ${body}`;
}
