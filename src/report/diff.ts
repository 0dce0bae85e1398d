/**
 * Two check reports compared, check by check and corner by corner: the change in margin, failures
 * that are new and failures that are fixed, margins lost beyond a tolerance and dead times that
 * moved beyond it. The input shape is checked by `checkReportShape` (the files are untrusted).
 */
import { z } from 'zod';
import { marginUnit } from '../checks/check.js';
import { formatEngineering, formatSignedTime, formatTime } from '../units/format.js';
import { formatMargin } from './margin-format.js';
import { left, right, renderTable } from './text-table.js';

const finite = z.number().refine(Number.isFinite, 'must be a finite number');

/** What diff reads of a `check --json` report; anything else in it is ignored. */
export const checkReportShape = z.object({
  tool: z.literal('phasegap'),
  design: z.string().max(1000),
  corners: z
    .array(
      z.object({
        name: z.string().max(200),
        verdict: z.enum(['pass', 'fail']),
        deadTimes: z.array(z.object({ from: z.string().max(200), to: z.string().max(200), t50: finite, gap: finite })),
        checks: z.array(z.object({ kind: z.string().max(100), name: z.string().max(1000), margin: finite.nullable(), pass: z.boolean() })),
      }),
    )
    .min(1),
});

export type DiffInput = z.infer<typeof checkReportShape>;

export interface DiffTolerance {
  /** Margin loss and dead-time shift to ignore, s. */
  readonly time: number;
  /** Margin loss to ignore on the switch bias checks, V. */
  readonly voltage: number;
}

export interface CheckChange {
  readonly check: string;
  readonly kind: string;
  readonly corner: string;
  /** Margins (s, or V for the bias kinds); null when not measured or absent from that report. */
  readonly old: number | null;
  readonly new: number | null;
  /** new - old; null when either is null. */
  readonly delta: number | null;
  readonly oldPass: boolean | null;
  readonly newPass: boolean | null;
}

export interface DeadTimeShift {
  readonly corner: string;
  readonly edge: string;
  /** s */
  readonly old: number;
  readonly new: number;
  readonly shift: number;
}

export interface ReportDiff {
  readonly tool: 'phasegap';
  readonly old: { readonly file: string; readonly design: string };
  readonly new: { readonly file: string; readonly design: string };
  readonly tolerance: DiffTolerance;
  /** fail on a new failure or a margin loss beyond the tolerance. */
  readonly verdict: 'pass' | 'fail';
  readonly newFailures: readonly CheckChange[];
  readonly fixedFailures: readonly CheckChange[];
  /** Margins that fell by more than the tolerance: timing ones first, each by the largest loss. */
  readonly marginLosses: readonly CheckChange[];
  /** Margins that grew by more than the tolerance, largest gain first. */
  readonly marginGains: readonly CheckChange[];
  readonly deadTimeShifts: readonly DeadTimeShift[];
  readonly onlyInOld: { readonly corners: readonly string[]; readonly checks: readonly string[] };
  readonly onlyInNew: { readonly corners: readonly string[]; readonly checks: readonly string[] };
  /** Every check at every corner present in either report. */
  readonly changes: readonly CheckChange[];
}

const limit = (kind: string, t: DiffTolerance) => (marginUnit(kind) === 's' ? t.time : t.voltage);

export function diffReports(
  before: DiffInput,
  after: DiffInput,
  files: { old: string; new: string },
  tolerance: DiffTolerance,
): ReportDiff {
  const oldCorners = new Map(before.corners.map((c) => [c.name, c]));
  const newCorners = new Map(after.corners.map((c) => [c.name, c]));
  const changes: CheckChange[] = [];
  const shifts: DeadTimeShift[] = [];
  const names = [...new Set([...oldCorners.keys(), ...newCorners.keys()])];
  for (const corner of names) {
    const o = oldCorners.get(corner);
    const n = newCorners.get(corner);
    const oldChecks = new Map((o?.checks ?? []).map((k) => [k.name, k]));
    const newChecks = new Map((n?.checks ?? []).map((k) => [k.name, k]));
    for (const check of new Set([...oldChecks.keys(), ...newChecks.keys()])) {
      const a = oldChecks.get(check);
      const b = newChecks.get(check);
      const old = a?.margin ?? null;
      const now = b?.margin ?? null;
      changes.push({
        check,
        kind: (b ?? a)!.kind,
        corner,
        old,
        new: now,
        delta: old === null || now === null ? null : now - old,
        oldPass: a?.pass ?? null,
        newPass: b?.pass ?? null,
      });
    }
    if (o && n) {
      for (let i = 0; i < Math.min(o.deadTimes.length, n.deadTimes.length); i++) {
        const a = o.deadTimes[i]!;
        const b = n.deadTimes[i]!;
        const shift = b.t50 - a.t50;
        if (Math.abs(shift) > tolerance.time) shifts.push({ corner, edge: `${b.from}->${b.to}`, old: a.t50, new: b.t50, shift });
      }
    }
  }
  const newFailures = changes.filter((c) => c.newPass === false && c.oldPass !== false);
  const fixedFailures = changes.filter((c) => c.oldPass === false && c.newPass === true);
  // Seconds and volts do not compare: timing changes first, each unit by size.
  const unitOrder = (x: CheckChange, y: CheckChange) =>
    marginUnit(x.kind) === marginUnit(y.kind) ? 0 : marginUnit(x.kind) === 's' ? -1 : 1;
  const marginLosses = changes
    .filter((c) => c.delta !== null && c.delta < -limit(c.kind, tolerance))
    .sort((x, y) => unitOrder(x, y) || x.delta! - y.delta!);
  const marginGains = changes
    .filter((c) => c.delta !== null && c.delta > limit(c.kind, tolerance))
    .sort((x, y) => unitOrder(x, y) || y.delta! - x.delta!);
  const checksOf = (r: DiffInput) => new Set(r.corners.flatMap((c) => c.checks.map((k) => k.name)));
  const oldNames = checksOf(before);
  const newNames = checksOf(after);
  return {
    tool: 'phasegap',
    old: { file: files.old, design: before.design },
    new: { file: files.new, design: after.design },
    tolerance,
    verdict: newFailures.length > 0 || marginLosses.length > 0 ? 'fail' : 'pass',
    newFailures,
    fixedFailures,
    marginLosses,
    marginGains,
    deadTimeShifts: shifts,
    onlyInOld: { corners: names.filter((c) => !newCorners.has(c)), checks: [...oldNames].filter((k) => !newNames.has(k)) },
    onlyInNew: { corners: names.filter((c) => !oldCorners.has(c)), checks: [...newNames].filter((k) => !oldNames.has(k)) },
    changes,
  };
}

/** Names from an untrusted file, printed: controls and invisible format characters become "?". */
const shown = (text: string) => text.replace(/[\p{Cc}\p{Cf}\p{Zl}\p{Zp}]/gu, '?');

const delta = (c: CheckChange) =>
  c.delta === null ? 'n/a' : marginUnit(c.kind) === 's' ? formatSignedTime(c.delta) : formatMargin(c.delta, c.kind);
const row = (c: CheckChange) => [
  shown(c.check),
  shown(c.corner),
  formatMargin(c.old, c.kind, c.oldPass === null ? 'absent' : 'n/a'),
  formatMargin(c.new, c.kind, c.newPass === null ? 'absent' : 'n/a'),
  delta(c),
];
const HEAD = [left('check'), left('corner'), right('old margin'), right('new margin'), right('change')] as const;

/** At most `n` rows, then a count of the rest. */
function listed(title: string, items: readonly CheckChange[], n = 20): string[] {
  if (items.length === 0) return [];
  return [
    `${title} (${items.length}):`,
    renderTable([...HEAD], items.slice(0, n).map(row)),
    ...(items.length > n ? [`... and ${items.length - n} more (use --json for all)`] : []),
    '',
  ];
}

/** Per check: its least margin before and after over the corners both reports share, and the largest change. */
function perCheck(d: ReportDiff): string[][] {
  const by = new Map<string, CheckChange[]>();
  for (const c of d.changes) by.set(c.check, [...(by.get(c.check) ?? []), c]);
  return [...by.entries()].map(([name, list]) => {
    const least = (pick: (c: CheckChange) => number | null) =>
      list.reduce<number | null>((m, c) => {
        const v = pick(c);
        return v === null ? m : m === null || v < m ? v : m;
      }, null);
    const kind = list[0]!.kind;
    const moved = list.filter((c) => c.delta !== null).sort((x, y) => Math.abs(y.delta!) - Math.abs(x.delta!))[0];
    return [
      shown(name),
      formatMargin(
        least((c) => c.old),
        kind,
      ),
      formatMargin(
        least((c) => c.new),
        kind,
      ),
      moved ? `${delta(moved)} at ${shown(moved.corner)}` : 'n/a',
    ];
  });
}

export function renderDiffText(d: ReportDiff): string {
  const t = `${formatTime(d.tolerance.time)}, ${formatEngineering(d.tolerance.voltage, 'V')}`;
  const reasons = [
    d.newFailures.length > 0 ? `${d.newFailures.length} new failure${d.newFailures.length === 1 ? '' : 's'}` : '',
    d.marginLosses.length > 0 ? `${d.marginLosses.length} margin loss${d.marginLosses.length === 1 ? '' : 'es'} beyond ${t}` : '',
  ].filter(Boolean);
  const out = [
    `verdict: ${d.verdict === 'pass' ? 'PASS' : 'FAIL'}${reasons.length > 0 ? ` (${reasons.join(', ')})` : ' (no new failure, no margin lost beyond the tolerance)'}`,
    `${shown(d.old.design)} (${shown(d.old.file)}) -> ${shown(d.new.design)} (${shown(d.new.file)}), tolerance ${t}`,
    '',
    'least margin of each check over the corners, old -> new, and its largest change:',
    renderTable([left('check'), right('old'), right('new'), left('largest change')], perCheck(d)),
    '',
    ...listed('new failures', d.newFailures),
    ...listed('fixed failures', d.fixedFailures),
    ...listed(`margins lost beyond ${t}`, d.marginLosses),
    ...listed(`margins gained beyond ${t}`, d.marginGains, 10),
  ];
  if (d.deadTimeShifts.length > 0) {
    out.push(`dead times moved beyond ${formatTime(d.tolerance.time)} (${d.deadTimeShifts.length}):`);
    out.push(
      renderTable(
        [left('corner'), left('dead time'), right('old'), right('new'), right('shift')],
        d.deadTimeShifts
          .slice(0, 20)
          .map((s) => [shown(s.corner), shown(s.edge), formatTime(s.old), formatTime(s.new), formatSignedTime(s.shift)]),
      ),
    );
    if (d.deadTimeShifts.length > 20) out.push(`... and ${d.deadTimeShifts.length - 20} more (use --json for all)`);
    out.push('');
  }
  for (const [side, only] of [
    ['old', d.onlyInOld],
    ['new', d.onlyInNew],
  ] as const) {
    if (only.corners.length > 0) out.push(`corners only in the ${side} report: ${only.corners.map(shown).join(', ')}`);
    if (only.checks.length > 0) out.push(`checks only in the ${side} report: ${only.checks.map(shown).join(', ')}`);
  }
  return `${out.join('\n').replace(/\n+$/, '')}\n`;
}
