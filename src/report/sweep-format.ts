/** Sweep rows as CSV (header once, then one line per point) or as a streamed JSON array. */
import type { SweepAxis, SweepRow } from '../analysis/sweep.js';
import { marginUnit } from '../checks/check.js';

function csvField(value: string | number | null): string {
  if (value === null) return '';
  const text = typeof value === 'number' ? (Number.isFinite(value) ? String(Number(value.toPrecision(9))) : '') : value;
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Column names for a sweep, from its axes and the first row's shape. */
export function csvHeader(axes: readonly SweepAxis[], first: SweepRow): string {
  const cols = [
    ...axes.map((a) => a.path), 'corners', 'verdict', 'limiting_corner', 'limiting_check', 'limiting_margin_s', 'limiting_margin_V',
    ...first.deadTimes.flatMap((d) => [`dead_${d.label}_min_s`, `dead_${d.label}_max_s`, `gap_${d.label}_min_s`]),
    ...first.widths.map((w) => `width_${w.phase}_min_s`),
    ...first.checks.map((c) => `margin_${marginUnit(c.kind)}: ${c.name}`),
  ];
  return `${cols.map(csvField).join(',')}\n`;
}

/** One CSV line; columns follow the header's row shape (a point that could not be measured leaves them empty). */
export function csvRow(row: SweepRow, first: SweepRow): string {
  const cells: Array<string | number | null> = [
    ...row.point, row.corners, row.verdict, row.limiting?.corner ?? null, row.limiting?.check ?? null,
    ...(row.limiting && marginUnit(row.limiting.kind) === 'V' ? [null, row.limiting.margin] : [row.limiting?.margin ?? null, null]),
    ...first.deadTimes.flatMap((_, k) => {
      const d = row.deadTimes[k];
      return d ? [d.min, d.max, d.gapMin] : [null, null, null];
    }),
    ...first.widths.map((w) => row.widths.find((x) => x.phase === w.phase)?.min ?? null),
    ...first.checks.map((_, k) => row.checks[k]?.margin ?? null),
  ];
  return `${cells.map(csvField).join(',')}\n`;
}

export function jsonRow(row: SweepRow, axes: readonly SweepAxis[], firstRow: boolean): string {
  const point = Object.fromEntries(axes.map((a, i) => [a.path, row.point[i]]));
  const { index, corners, verdict, limiting, deadTimes, widths, checks } = row;
  const body = JSON.stringify({ index, point, corners, verdict, limiting, deadTimes, widths, checks });
  return `${firstRow ? '[\n' : ',\n'}  ${body}`;
}
