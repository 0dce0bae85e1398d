/**
 * Every check's margin at every corner, as plain data for the margin chart: one row per check
 * (in the order the checks first appear), one point per corner, the worst corner and how many
 * corners fail or could not be measured.
 */
import type { CornerResult } from '../analysis/evaluate.js';
import type { CheckKind } from '../checks/check.js';

export interface MarginPoint {
  readonly corner: string;
  readonly process: string;
  /** s; positive when the check holds. */
  readonly margin: number;
  readonly pass: boolean;
}

export interface MarginRow {
  readonly name: string;
  readonly kind: CheckKind;
  readonly points: readonly MarginPoint[];
  /** Corners at which the check had no margin (the run or a switch could not be measured). */
  readonly unmeasured: readonly string[];
  readonly failing: number;
  readonly corners: number;
  /** The point with the least margin, null when none was measured. */
  readonly worst: MarginPoint | null;
  /** The requirement in words, for a check whose name does not state it (a named constraint). */
  readonly requirement?: string;
}

/** What each named break-before-make or order check requires, in words, keyed by its check name (from the checks' subjects). */
export function namedRequirements(results: readonly CornerResult[]): Map<string, string> {
  const out = new Map<string, string>();
  for (const r of results) {
    for (const c of r.checks) if (c.subject.type === 'switch-events' && c.subject.named) out.set(c.name, c.subject.requirement);
  }
  return out;
}

export function marginRows(results: readonly CornerResult[]): MarginRow[] {
  const rows = new Map<string, { kind: CheckKind; points: MarginPoint[]; unmeasured: string[]; failing: number; corners: number }>();
  for (const r of results) {
    for (const c of r.checks) {
      let row = rows.get(c.name);
      if (!row) {
        row = { kind: c.kind, points: [], unmeasured: [], failing: 0, corners: 0 };
        rows.set(c.name, row);
      }
      row.corners++;
      if (!c.pass) row.failing++;
      if (c.margin === null) row.unmeasured.push(r.corner.name);
      else row.points.push({ corner: r.corner.name, process: r.corner.process, margin: c.margin, pass: c.pass });
    }
  }
  return [...rows.entries()].map(([name, row]) => ({
    name,
    ...row,
    worst: row.points.reduce<MarginPoint | null>((w, p) => (w === null || p.margin < w.margin ? p : w), null),
  }));
}

/** Process corner names in the order the corners list them. */
export function processOrder(results: readonly CornerResult[]): string[] {
  return [...new Set(results.map((r) => r.corner.process))];
}
