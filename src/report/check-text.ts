/** The human rendering of a check report: one row per corner, extremes marked, a summary. */
import { modelErrorText } from './model-error.js';
import { formatEngineering, formatSignedTime, formatTime, nsNumber, psNumber } from '../units/format.js';
import { leastMargin, type CheckReport } from './check-report.js';
import { left, right, renderTable, type Column } from './text-table.js';
import { formatMargin } from './margin-format.js';
import { CIRCUIT_KINDS, compareChecks, HANDOVER_KINDS, type CheckKind } from '../checks/check.js';
import { renderCircuitTable } from './circuit-report.js';

const MIN_MARK = ' v';
const MAX_MARK = ' ^';

const ps = psNumber;

const ns = nsNumber;

const signed = (seconds: number | null) => formatSignedTime(seconds);

/** Index of the smallest and largest finite value of a column. */
function extremes(values: ReadonlyArray<number | undefined>): { min: number; max: number } {
  let min = -1;
  let max = -1;
  values.forEach((v, i) => {
    if (v === undefined || !Number.isFinite(v)) return;
    if (min < 0 || v < values[min]!) min = i;
    if (max < 0 || v > values[max]!) max = i;
  });
  return { min, max };
}

export function renderCheckText(report: CheckReport): string {
  const [a, b] = report.phases as [string, string];
  const corners = report.corners;
  type Series = { header: string; values: Array<number | undefined>; format: (s: number) => string; marks: 'both' | 'min' };
  const series: Series[] = [
    { header: `dead ${a}->${b} ps`, values: corners.map((c) => c.deadTimes[0]?.t50), format: ps, marks: 'both' },
    { header: `dead ${b}->${a} ps`, values: corners.map((c) => c.deadTimes[1]?.t50), format: ps, marks: 'both' },
    { header: `gap ${a}->${b} ps`, values: corners.map((c) => c.deadTimes[0]?.gap), format: ps, marks: 'min' },
    { header: `gap ${b}->${a} ps`, values: corners.map((c) => c.deadTimes[1]?.gap), format: ps, marks: 'min' },
    { header: `width ${a} ns`, values: corners.map((c) => c.widths[a]), format: ns, marks: 'min' },
    { header: `width ${b} ns`, values: corners.map((c) => c.widths[b]), format: ns, marks: 'min' },
  ];
  const cells = series.map((s) => {
    const { min, max } = extremes(s.values);
    return s.values.map((v, i) => {
      if (v === undefined) return '-';
      const mark = i === min ? MIN_MARK : s.marks === 'both' && i === max ? MAX_MARK : '  ';
      return s.format(v) + mark;
    });
  });
  const columns: Column[] = [left('corner'), ...series.map((s): Column => right(s.header)), right('least margin'), left('verdict')];
  const rows = corners.map((c, i) => [
    c.name,
    ...cells.map((col) => col[i]!),
    leastMargin(c) === -Infinity
      ? c.checks.some((k) => !k.pass && CIRCUIT_KINDS.has(k.kind))
        ? 'circuit fails'
        : 'switch bias fails'
      : signed(leastMargin(c)),
    c.verdict === 'pass' ? 'pass' : `FAIL${c.reason ? ` (${c.reason})` : ''}`,
  ]);
  const out: string[] = [];
  out.push(
    `${report.design}: ${report.process} card, ${report.model} model, clock ${formatEngineering(report.clock.frequency, 'Hz')}, ${corners.length} corners`,
  );
  const handovers = corners.some((c) => c.checks.some((k) => HANDOVER_KINDS.has(k.kind)));
  out.push(modelErrorText(report.model, report.process, handovers));
  out.push('');
  out.push(renderTable(columns, rows));
  out.push(`(v smallest, ^ largest in the column; gap = clean gap with neither phase above 10 % of its swing)`);
  out.push('');
  const circuit = renderCircuitTable(corners, report.process);
  if (circuit.length > 0) out.push(...circuit, '');
  out.push(...worstPerCheck(report));
  out.push('');
  out.push(...summaryLines(report, series[0]!.values, series[1]!.values));
  return `${out.join('\n')}\n`;
}

/** Each check's worst corner and margin, switch constraints included; the limiting one first. */
function worstPerCheck(report: CheckReport): string[] {
  const worst = new Map<string, { kind: CheckKind; corner: string; margin: number | null; pass: boolean; failing: number }>();
  for (const c of report.corners) {
    for (const k of c.checks) {
      const seen = worst.get(k.name);
      const fails = k.pass ? 0 : 1;
      if (!seen) worst.set(k.name, { kind: k.kind, corner: c.name, margin: k.margin, pass: k.pass, failing: fails });
      else {
        seen.failing += fails;
        if (compareChecks(k, seen) < 0) Object.assign(seen, { corner: c.name, margin: k.margin, pass: k.pass });
      }
    }
  }
  const rows = [...worst.entries()]
    .sort(([, a], [, b]) => compareChecks(a, b))
    .map(([name, w]) => [
      w.kind,
      name,
      formatMargin(w.margin, w.kind),
      w.corner,
      w.failing === 0 ? 'pass' : `FAIL at ${w.failing} corner${w.failing > 1 ? 's' : ''}`,
    ]);
  return [
    'worst case of each check:',
    renderTable([left('kind'), left('check'), right('margin'), left('at corner'), left('verdict')], rows),
  ];
}

function summaryLines(report: CheckReport, first: Array<number | undefined>, second: Array<number | undefined>): string[] {
  const lines: string[] = [];
  const [a, b] = report.phases as [string, string];
  for (const [label, values] of [
    [`${a}->${b}`, first],
    [`${b}->${a}`, second],
  ] as const) {
    const { min, max } = extremes(values);
    if (min < 0) continue;
    const lo = values[min]!;
    const hi = values[max]!;
    const spread = lo > 0 ? `, spread ${(hi / lo).toFixed(2)}x` : '';
    lines.push(
      `dead time ${label}: ${formatTime(lo)} at ${report.corners[min]!.name} .. ${formatTime(hi)} at ${report.corners[max]!.name}${spread}`,
    );
  }
  const lim = report.limiting;
  if (lim) lines.push(`limiting: ${lim.check} at ${lim.corner}, margin ${formatMargin(lim.margin, lim.kind)}`);
  const failing = report.corners.flatMap((c) => c.checks.filter((k) => !k.pass).map((k) => ({ corner: c.name, check: k })));
  if (failing.length > 0) {
    lines.push(`failing checks: ${failing.length}`);
    for (const f of failing.slice(0, 10))
      lines.push(
        `  ${f.corner}: ${f.check.name}, margin ${formatMargin(f.check.margin, f.check.kind)}${f.check.detail ? ` (${f.check.detail})` : ''}`,
      );
    if (failing.length > 10) lines.push(`  ... and ${failing.length - 10} more (use --json for all)`);
  }
  for (const w of report.warnings) lines.push(`warning: ${w}`);
  const passing = report.corners.filter((c) => c.verdict === 'pass').length;
  const limited =
    report.warnings.length > 0 ? `; limited: ${report.warnings.length} warning${report.warnings.length > 1 ? 's' : ''} above` : '';
  lines.push(`verdict: ${report.verdict === 'pass' ? 'PASS' : 'FAIL'} (${passing}/${report.corners.length} corners pass${limited})`);
  lines.push('');
  lines.push(...report.cautions.map((c) => `caution: ${c}`));
  return lines;
}
