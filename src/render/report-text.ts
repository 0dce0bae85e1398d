/** Words and numbers of the review page, shared by its HTML and Markdown forms. */
import { leastMargin } from '../report/check-report.js';
import { formatMargin } from '../report/margin-format.js';
import type { ProcessCard } from '../schema/process.js';
import { formatEngineering, formatNs, formatPs, formatSignedTime, formatTime } from '../units/format.js';
import type { ConfirmSection, ReportModel } from './report-model.js';
import { worstDifference } from '../report/confirm-report.js';
import { breakBeforeMakeCells, percent, quantityCells } from '../report/confirm-text.js';
import type { VerdictPart } from '../report/verdict.js';
import { circuitConfirmTables } from './circuit-confirm.js';
import { GLYPH } from './palette.js';
import { candidateCells, loadText, type TuneCandidateReport, type TuneReport } from '../report/tune-report.js';

export function signedTime(seconds: number): string {
  return formatSignedTime(seconds);
}

/** The ngspice comparison as tables (quantities, break-before-make, the circuit per corner) and one sentence. */
export function confirmTables(c: ConfirmSection, model: string) {
  const quantities = c.comparisons.flatMap((corner) =>
    corner.quantities.map((q) => ({ cells: [...quantityCells(corner.corner, q), q.pass ? 'within' : 'OVER'], fail: !q.pass })),
  );
  const pairs = c.comparisons.flatMap((corner) =>
    corner.breakBeforeMake.map((b) => ({
      cells: [...breakBeforeMakeCells(corner.corner, b), b.agrees ? 'alike' : 'DISAGREE'],
      fail: !b.agrees,
    })),
  );
  const within = c.comparisons.filter((x) => x.quantities.every((q) => q.pass)).length;
  const alike = pairs.filter((p) => !p.fail).length;
  const worst = worstDifference(c.comparisons);
  const n = c.comparisons.length;
  const circuit = circuitConfirmTables(c.comparisons, c.simulator);
  const text =
    `The ${model} model against ${c.simulator} at ${n} corner${n === 1 ? '' : 's'}: ` +
    `dead times, gaps and widths within ${(c.tolerance * 100).toFixed(1)} % at ${within} of ${n}` +
    `${pairs.length > 0 ? `, break-before-make verdicts alike for ${alike} of ${pairs.length} pairs` : ''}` +
    `${circuit.length > 0 ? `, circuit figures within tolerance at ${circuit.filter((t) => t.pass).length} of ${circuit.length}` : ''}` +
    `${worst ? `; largest difference ${percent(worst.relativeError)} (${worst.quantity} at ${worst.corner})` : ''}. ` +
    "The decks use the invented device models of the process card; sign-off needs the foundry's.";
  return {
    text,
    quantities: { head: ['corner', 'quantity', 'model', c.simulator, 'difference', 'verdict'], rows: quantities },
    pairs: { head: ['corner', 'break-before-make', 'model margin', `${c.simulator} margin`, 'verdict'], rows: pairs },
    circuit,
  };
}

/** The delay-chain proposals as a table (the design's own chain first), and one sentence on them. */
/** `options`: the command-line options inside `text`, each to be kept on one line. */
export function tuneTable(t: TuneReport): {
  head: string[];
  rows: Array<{ cells: string[]; fail: boolean }>;
  text: string;
  options: string[];
} {
  const row = (label: string, c: TuneCandidateReport) => {
    const x = candidateCells(c);
    return { cells: [label, x.stages, x.size, x.load, x.deadMin, x.deadMax, x.margin, c.pass ? 'pass' : 'FAIL'], fail: !c.pass };
  };
  const rows = [row('this design', t.current), ...t.proposals.map((p, i) => row(`proposal ${i + 1}`, p))];
  if (t.closest) rows.push(row('closest', t.closest));
  const best = t.proposals[0];
  const text = best
    ? `The least wasteful chain that passes every corner: ${best.stages} stages of size ${String(best.stageSize)} with ${loadText(best.stageLoad)} per node, ` +
      `largest dead time ${formatTime(best.deadTimeMax ?? NaN)} against ${formatTime(t.current.deadTimeMax ?? NaN)} now (${best.overrides.map((o) => `--set ${o}`).join(' ')}). ` +
      (t.confirmed
        ? `The first proposals were simulated in ngspice at their worst corners (${t.confirmNote}).`
        : `Proposals keep the model's band and mismatch headroom but are unconfirmed in ngspice (${t.confirmNote}): run phasegap tune or confirm where it is installed.`)
    : `No chain searched passes every corner${t.closest?.limiting ? `; closest still fails ${t.closest.limiting.check} at ${t.closest.limiting.corner}` : ''}.`;
  return {
    head: ['chain', 'stages', 'stage size', 'stage load', 'dead min', 'dead max', 'least margin', 'verdict'],
    rows,
    text,
    options: best ? best.overrides.map((o) => `--set ${o}`) : [],
  };
}

/** The run's verdict in one word with its glyph: "✓ PASS" or "✕ FAIL". */
export function verdictWord(verdict: 'pass' | 'fail'): string {
  return verdict === 'pass' ? `${GLYPH.pass} PASS` : `${GLYPH.fail} FAIL`;
}

/** Which parts of the run fail, for the headline: "fails: Monte Carlo yield"; empty when none does. */
export function failingParts(parts: readonly VerdictPart[]): string {
  const failing = parts.filter((p) => p.verdict === 'fail').map((p) => p.name);
  return failing.length === 0 ? '' : `fails: ${failing.join(', ')}`;
}

/** One part of the run's verdict as words: "Monte Carlo yield: ✕ FAIL: yield 95.8 % ...". */
export function verdictPartText(p: VerdictPart): string {
  if (p.verdict === 'not-run') return `${p.name}: not run (${p.reason})`;
  return `${p.name}: ${p.verdict === 'pass' ? `${GLYPH.pass} pass` : `${GLYPH.fail} FAIL`}: ${p.reason}`;
}

export function fmaxText(m: ReportModel): string {
  const f = m.fmax;
  if (f === null) return `fmax not computed (${m.fmaxNote})`;
  if (f.fmax === null) return `no safe clock frequency (${f.note})`;
  const head = `fmax ${formatEngineering(f.fmax, 'Hz', 4)} (${(f.fmax / f.designFrequency).toFixed(2)}x the design clock, resolution ${(f.resolution * 100).toPrecision(2)} %)`;
  const lim = f.limiting ? `, limited by ${f.limiting.check} at ${f.limiting.corner}` : '';
  return `${head}${lim}${f.note ? `; ${f.note}` : ''}`;
}

export function generatorText(m: ReportModel): string {
  const g = m.resolved.design.generator;
  if (g.template === 'netlist') return `free-form netlist of ${g.gates.length} cells`;
  const extras = [
    g.complementary ? 'complementary outputs' : '',
    g.earlyTap > 0 ? `early phases tapped ${g.earlyTap} stages early` : '',
  ].filter(Boolean);
  return `${g.template} cross-coupled, ${g.stages} chain stages, gate size ${g.gateSize}, buffer ${(g.buffer ?? []).join('/')}${extras.length ? `, ${extras.join(', ')}` : ''}`;
}

export function summaryItems(m: ReportModel): Array<[string, string]> {
  const r = m.report;
  const c = r.clock;
  const items: Array<[string, string]> = [
    [
      'clock',
      `${formatEngineering(c.frequency, 'Hz')}, period ${formatTime(c.period)}, duty ${c.duty} ± ${c.dutyTolerance}, edges ${formatTime(c.transition)}`,
    ],
    ['generator', generatorText(m)],
    ['delay model', r.model],
    ['process card', `${r.process} (${m.processSource})`],
    ['corners', `${r.corners.length}, ${r.corners.filter((x) => x.verdict === 'pass').length} pass`],
  ];
  for (const d of m.deadTimes) {
    items.push([
      `dead time ${d.from}→${d.to}`,
      `${formatTime(d.least)} at ${d.leastCorner} to ${formatTime(d.most)} at ${d.mostCorner}${d.least > 0 ? `, spread ${(d.most / d.least).toFixed(2)}x` : ''}`,
    ]);
  }
  const req = m.resolved.design.requirements;
  const wants = [
    req.deadTime?.min !== undefined ? `dead time ≥ ${formatTime(req.deadTime.min)}` : '',
    req.deadTime?.max !== undefined ? `dead time ≤ ${formatTime(req.deadTime.max)}` : '',
    req.gap?.min !== undefined ? `clean gap ≥ ${formatTime(req.gap.min)}` : '',
    req.width?.min !== undefined ? `width ≥ ${formatTime(req.width.min)}` : '',
    `break-before-make guard ${formatTime(req.guard)}`,
  ].filter(Boolean);
  items.push(['requirements', wants.join(', ')]);
  items.push(['maximum frequency', fmaxText(m)]);
  if (r.limiting)
    items.push([
      'limiting check',
      `${r.limiting.check} at ${r.limiting.corner}${r.limiting.margin === null ? ' (not measurable)' : `, margin ${formatMargin(r.limiting.margin, r.limiting.kind)}`}`,
    ]);
  return items;
}

function ps(seconds: number | undefined): string {
  return seconds === undefined ? '-' : formatPs(seconds);
}

function ns(seconds: number | undefined): string {
  return seconds === undefined ? '-' : formatNs(seconds);
}

export function cornerRows(m: ReportModel): string[][] {
  const [a, b] = m.report.phases as [string, string];
  return m.report.corners.map((c) => {
    const least = leastMargin(c);
    return [
      c.name,
      ps(c.deadTimes[0]?.t50),
      ps(c.deadTimes[1]?.t50),
      ps(c.deadTimes[0]?.gap),
      ps(c.deadTimes[1]?.gap),
      ns(c.widths[a]),
      ns(c.widths[b]),
      least === null ? 'n/a' : least === -Infinity ? 'switch bias fails' : signedTime(least),
      c.verdict === 'pass' ? '✓ pass' : `✕ FAIL${c.reason ? ` (${c.reason})` : ''}`,
    ];
  });
}

/** How a switch's threshold moves with temperature on the card: SPICE level 1-3's law, a stated fall, or the fit's. */
function switchThresholdLaw(d: ProcessCard['n']): string {
  const law = d.triode?.vthTempco;
  if (law === 'spice') return 'SPICE level 1-3 (2 phiF, band gap)';
  return `${formatEngineering(law ?? d.vthTempco, 'V')}/K`;
}

export function cardRows(card: ProcessCard): { head: string[]; rows: string[][] } {
  const fields: Array<[string, (d: ProcessCard['n']) => string]> = [
    ['threshold vth0', (d) => formatEngineering(d.vth0, 'V')],
    ['alpha', (d) => String(d.alpha)],
    ['drive, A/m/V^alpha', (d) => String(d.drive)],
    ['threshold tempco', (d) => `${formatEngineering(d.vthTempco, 'V')}/K`],
    ['switch threshold law', (d) => switchThresholdLaw(d)],
    ['mobility exponent', (d) => String(d.mobilityExponent)],
    ['body effect gamma', (d) => String(d.gamma)],
    ['2 phiF at t0', (d) => formatEngineering(d.phi2f, 'V')],
    ['gate cap per width', (d) => `${formatEngineering(d.cgate * 1e-6, 'F')}/um`],
    ['drain cap per width', (d) => `${formatEngineering(d.cdrain * 1e-6, 'F')}/um`],
    ['A_VT', (d) => `${formatEngineering(d.avt * 1e6, 'V')}·um`],
    ["k' (mu Cox)", (d) => `${formatEngineering(d.kprime, 'A')}/V²`],
  ];
  const rows = [
    ['minimum length', formatEngineering(card.lmin, 'm'), ''],
    ['nominal supply', formatEngineering(card.vddNominal, 'V'), ''],
    ['unit inverter wn / wp', formatEngineering(card.unit.wn, 'm'), formatEngineering(card.unit.wp, 'm')],
    ...fields.map(([name, f]) => [name, f(card.n), f(card.p)]),
  ];
  return { head: ['parameter', 'n device', 'p device'], rows };
}
