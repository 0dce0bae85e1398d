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
  const text =
    typeof value === 'number'
      ? Number.isFinite(value)
        ? String(Number(value.toPrecision(9)))
        : ''
      : /^[=+\-@]/.test(value)
        ? `'${value}`
        : value;
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The unit of a column: an SI unit, 'fraction' for a ratio (0.4 is 40 %), or null for text and counts. */
export type CsvUnit = 's' | 'V' | 'C' | 'fraction' | null;

/** One CSV column: `key` is the header a notebook indexes by; `label` the words people read. */
export interface CsvColumn {
  readonly key: string;
  readonly label: string;
  readonly unit: CsvUnit;
}

/** Lower-case letters, digits and single underscores: "dead p1->p2" -> "dead_p1_p2". */
function slug(text: string): string {
  return (
    text
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '_')
      .replace(/^_+|_+$/g, '') || 'check'
  );
}

/** A check's name without its stated requirement: "dead p1->p2 >= 500 ps" -> "dead p1->p2". */
function subject(name: string): string {
  return name.replace(/\s*(?:>=|<=|\+)\s*[-+]?[\d.]+\s*\S*\s*$/, '').replace(/\b(settles) to .*$/, '$1');
}

type MarginUnit = 's' | 'V' | 'C' | 'fraction';

/** Key suffix of each margin unit: `margin_s.`, `margin_V.`, `margin_C.`, `margin_frac.`. */
const KEY_UNIT: Readonly<Record<MarginUnit, string>> = { s: 's', V: 'V', C: 'C', fraction: 'frac' };

function checkUnit(name: string, columns: SweepColumns): MarginUnit {
  if (columns.voltChecks.includes(name)) return 'V';
  if (columns.chargeChecks.includes(name)) return 'C';
  if (columns.fractionChecks.includes(name)) return 'fraction';
  return 's';
}

/** Check columns: `margin_s.dead_p1_p2_min`, `margin_V.s_chg_holds_off`, `margin_C.lost_charge_max`; unique within the file. */
function checkKeys(columns: SweepColumns): string[] {
  const used = new Set<string>();
  return columns.checks.map((name) => {
    const unit = KEY_UNIT[checkUnit(name, columns)];
    const base = slug(subject(name));
    const bound = /(>=)/.test(name) ? '_min' : /(<=)/.test(name) ? '_max' : '';
    let key = `margin_${unit}.${base}${bound}`;
    for (let n = 2; used.has(key); n++) key = `margin_${unit}.${base}${bound}_${n}`;
    used.add(key);
    return key;
  });
}

/**
 * The units the limiting margin is split into: seconds and volts always, coulombs and fraction
 * only when the design has such a check, so a sweep without them keeps its columns.
 */
function limitingUnits(columns: SweepColumns): MarginUnit[] {
  return [
    's',
    'V',
    ...(columns.chargeChecks.length > 0 ? ['C' as const] : []),
    ...(columns.fractionChecks.length > 0 ? ['fraction' as const] : []),
  ];
}

const LIMITING_LABEL: Readonly<Record<MarginUnit, string>> = {
  s: 'a timing check',
  V: 'a voltage check',
  C: 'a charge check',
  fraction: 'an efficiency check (a fraction)',
};

/** Every column of the CSV in order, with a notebook key, its label and unit. */
export function csvColumns(axes: readonly SweepAxis[], columns: SweepColumns): CsvColumn[] {
  const keys = checkKeys(columns);
  return [
    ...axes.map((a) => ({ key: a.path, label: `swept ${a.path}`, unit: null })),
    { key: 'corners', label: 'corners evaluated', unit: null },
    { key: 'verdict', label: 'pass or fail at every corner', unit: null },
    { key: 'limiting_corner', label: 'corner of the limiting check', unit: null },
    { key: 'limiting_check', label: 'limiting check', unit: null },
    ...limitingUnits(columns).map((u) => ({
      key: `limiting_margin_${KEY_UNIT[u]}`,
      label: `margin of the limiting check when it is ${LIMITING_LABEL[u]}`,
      unit: u,
    })),
    ...columns.deadTimes.flatMap((d) => [
      { key: `dead_${slug(d)}_min_s`, label: `least ${d} over the corners`, unit: 's' as const },
      { key: `dead_${slug(d)}_max_s`, label: `largest ${d} over the corners`, unit: 's' as const },
      { key: `gap_${slug(d)}_min_s`, label: `least clean gap of ${d} over the corners`, unit: 's' as const },
    ]),
    ...columns.widths.map((w) => ({
      key: `width_${slug(w)}_min_s`,
      label: `least active width of ${w} over the corners`,
      unit: 's' as const,
    })),
    ...columns.checks.map((c, i) => ({ key: keys[i]!, label: `least margin over the corners: ${c}`, unit: checkUnit(c, columns) })),
  ];
}

export function csvHeader(axes: readonly SweepAxis[], columns: SweepColumns): string {
  return `${csvColumns(axes, columns)
    .map((c) => csvField(c.key))
    .join(',')}\n`;
}

/** The JSON sidecar beside a CSV file (FILE.columns.json): each header key with its label and unit. */
export function csvColumnsJson(axes: readonly SweepAxis[], columns: SweepColumns): string {
  return `${JSON.stringify({ format: 'phasegap-sweep-columns/1', columns: csvColumns(axes, columns) }, null, 2)}\n`;
}

/** The row's quantities and checks that have no column (empty when the columns cover the row). */
export function unlistedNames(row: SweepRow, columns: SweepColumns): string[] {
  return [
    ...row.deadTimes.map((d) => d.label).filter((l) => !columns.deadTimes.includes(l)),
    ...row.widths.map((w) => w.phase).filter((p) => !columns.widths.includes(p)),
    ...row.checks.filter((c) => c.kind !== 'steady-state' && !columns.checks.includes(c.name)).map((c) => c.name),
  ];
}

function limitingUnitOf(kind: string): MarginUnit {
  const unit = marginUnit(kind);
  return unit === '' ? 'fraction' : unit;
}

export function csvRow(row: SweepRow, columns: SweepColumns): string {
  const cells: Array<string | number | null> = [
    ...row.point,
    row.corners,
    row.verdict,
    row.limiting?.corner ?? null,
    row.limiting?.check ?? null,
    ...limitingUnits(columns).map((u) => (row.limiting && limitingUnitOf(row.limiting.kind) === u ? row.limiting.margin : null)),
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
