/** The tune report: plain data for --json, and its tables for people. */
import type {
  AutoHeadroom,
  ChainCandidate,
  ChainKnobs,
  Confirmation,
  CornerYield,
  Diagnosis,
  Headroom,
  StuckSwitch,
  TuneResult,
} from '../analysis/tune.js';
import { proposalOverrides } from '../analysis/tune.js';
import { objectiveText, type TuneObjective } from '../analysis/tune-objective.js';
import { switchFaultAdvice, type SwitchFault } from '../checks/bias-checks.js';
import { formatEngineering, formatTime } from '../units/format.js';
import { formatMargin } from './margin-format.js';
import { CAUTIONS } from './cautions.js';
import { shellCommand } from './shell-quote.js';
import { left, right, renderTable } from './text-table.js';
import { CIRCUIT_KINDS, type CheckKind } from '../checks/check.js';

/**
 * One candidate as the report shows it: its knobs, the candidate's verdicts and findings as the
 * search left them, and its figures with NaN (a corner that did not settle) as null.
 */
export interface TuneCandidateReport
  extends ChainKnobs,
    Pick<ChainCandidate, 'pass' | 'meets' | 'slowCorner' | 'limiting' | 'failing' | 'headroom' | 'yields' | 'confirmation'> {
  /** Smallest and largest dead time over every corner and both handovers, s. */
  readonly deadTimeMin: number | null;
  readonly deadTimeMax: number | null;
  /** Largest dead time beyond the requirement (requirements.deadTime.min, else the least dead time), s. */
  readonly waste: number | null;
  /** Least useful conduction time over the corners, s, and its corner. */
  readonly conduction: number | null;
  readonly conductionCorner: string;
  /** The objective's score, s (larger is better). */
  readonly score: number | null;
  /** The `--set` overrides that give this candidate. */
  readonly overrides: readonly string[];
}

export interface TuneReport {
  readonly tool: 'phasegap';
  readonly design: string;
  /** Clock frequency the chains were tuned at, Hz. */
  readonly frequency: number;
  readonly corners: number;
  readonly objective: TuneObjective;
  readonly current: TuneCandidateReport;
  /** Passing proposals, best first (those the simulator confirms before the others). */
  readonly proposals: readonly TuneCandidateReport[];
  /** Passing chains evaluated in the search, the least margin first, evenly thinned to CANDIDATES_SHOWN: the trade-off chart's points. */
  readonly candidates: readonly TuneCandidateReport[];
  /** Present when nothing passes: the candidate with the largest least margin. */
  readonly closest: TuneCandidateReport | null;
  /** What was searched: every knob and its values (F for loads). */
  readonly searched: {
    readonly stages: readonly number[];
    readonly stageSizes: readonly number[];
    readonly maxLoad: number;
    readonly loadStep: number;
    readonly headroom: number | AutoHeadroom;
    readonly tapers: readonly number[];
    readonly feedbackTaps: readonly number[];
  };
  /** Yield every proposal must show at its limiting corners. */
  readonly yieldTarget: number;
  readonly evaluations: number;
  /** Switches whose off-state, on-state or stress check fails: no delay chain fixes them, so nothing was searched. */
  readonly faults: readonly SwitchFault[];
  /** When nothing passes: what the closest candidate fails, conflicting requirements, stuck switches, whether a wider search can help. */
  readonly diagnosis: Diagnosis | null;
  /** Whether the first proposals were simulated at transistor level, and if not why. */
  readonly confirmed: boolean;
  readonly confirmNote: string;
  readonly verdict: 'pass' | 'fail';
  readonly cautions: readonly string[];
}

/** Points the report keeps for the trade-off chart. */
export const CANDIDATES_SHOWN = 60;

/** A capacitance the design file reads back exactly: `23.5fF`. */
export function loadText(farads: number): string {
  return `${Number((farads / 1e-15).toPrecision(6))}fF`;
}

/** At most `n` items evenly spaced over the list, first and last included. */
function spread<T>(list: readonly T[], n: number): T[] {
  if (list.length <= n) return [...list];
  return Array.from({ length: n }, (_, i) => list[Math.round((i * (list.length - 1)) / (n - 1))]!);
}

const finite = (x: number) => (Number.isFinite(x) ? x : null);

function candidateReport(c: ChainCandidate, own: ChainKnobs): TuneCandidateReport {
  return {
    stages: c.knobs.stages,
    stageSize: c.knobs.stageSize,
    stageLoad: c.knobs.stageLoad,
    buffer: c.knobs.buffer,
    feedbackTap: c.knobs.feedbackTap,
    pass: c.pass,
    meets: c.meets,
    deadTimeMin: finite(c.deadMin),
    deadTimeMax: finite(c.deadMax),
    slowCorner: c.slowCorner,
    waste: finite(c.waste),
    conduction: finite(c.conduction.time),
    conductionCorner: c.conduction.corner,
    score: finite(c.score),
    limiting: c.limiting,
    failing: c.failing,
    headroom: c.headroom,
    yields: c.yields,
    confirmation: c.confirmation,
    overrides: proposalOverrides(c.knobs, loadText, own),
  };
}

/** `note` says why nothing was simulated (no ngspice, --no-confirm) when no proposal carries a confirmation. */
export function tuneReport(
  design: string,
  frequency: number,
  corners: number,
  result: TuneResult,
  top: number,
  note = 'not simulated',
): TuneReport {
  const own = result.current.knobs;
  const confirmed = result.proposals.some((p) => p.confirmation !== null);
  const first = result.proposals[0];
  return {
    tool: 'phasegap',
    design,
    frequency,
    corners,
    objective: result.objective,
    current: candidateReport(result.current, own),
    proposals: result.proposals.slice(0, top).map((c) => candidateReport(c, own)),
    candidates: spread(result.candidates, CANDIDATES_SHOWN).map((c) => candidateReport(c, own)),
    closest: result.closest ? candidateReport(result.closest, own) : null,
    searched: { ...result.space },
    yieldTarget: result.yieldTarget,
    evaluations: result.evaluations,
    faults: result.faults,
    diagnosis: result.diagnosis,
    confirmed,
    confirmNote: confirmed ? `the first ${result.proposals.filter((p) => p.confirmation).length} simulated at their worst corners` : note,
    verdict: first && !(first.confirmation && !first.confirmation.pass) ? 'pass' : 'fail',
    cautions: CAUTIONS,
  };
}

function sizeText(size: ChainKnobs['stageSize']): string {
  return typeof size === 'number' ? String(size) : size.join(',');
}

const percent = (x: number) => `${Number((x * 100).toFixed(x >= 0.9995 || x <= 0.0005 ? 1 : 2))} %`;

/** The least yield over the limiting corners with its interval: `100 % [98.1 %, 100 %]`. */
export function yieldText(yields: readonly CornerYield[] | null): string {
  if (!yields || yields.length === 0) return '';
  const least = yields.reduce((a, b) => (b.passes / b.dies < a.passes / a.dies ? b : a));
  return `${percent(least.passes / least.dies)} [${percent(least.low)}, ${percent(least.high)}]`;
}

/** The simulator's word on a candidate: meets, pass, FAIL or unconfirmed. */
export function confirmWord(c: Confirmation | null): string {
  if (!c) return 'unconfirmed';
  return c.meets ? 'confirmed' : c.pass ? 'pass, thin' : 'FAIL';
}

/** A candidate's figures as table cells, shared by the text report and the review page. */
export function candidateCells(c: TuneCandidateReport) {
  return {
    stages: String(c.stages),
    size: sizeText(c.stageSize),
    load: `${Number((c.stageLoad / 1e-15).toPrecision(6))} fF`,
    buffer: c.buffer.join(','),
    tap: String(c.feedbackTap),
    deadMin: c.deadTimeMin === null ? 'n/a' : formatTime(c.deadTimeMin),
    deadMax: c.deadTimeMax === null ? 'n/a' : formatTime(c.deadTimeMax),
    conduction: c.conduction === null ? 'n/a' : formatTime(c.conduction),
    margin: c.limiting ? formatMargin(c.limiting.margin, c.limiting.kind, 'unmeasurable') : 'n/a',
    headroom: c.headroom ? formatTime(c.headroom.total) : '',
    yield: yieldText(c.yields),
    simulator: c.headroom ? confirmWord(c.confirmation) : '',
  };
}

function row(label: string, c: TuneCandidateReport): string[] {
  const x = candidateCells(c);
  const lim = c.limiting;
  return [
    label,
    x.stages,
    x.size,
    x.load,
    x.buffer,
    x.tap,
    x.deadMin,
    x.deadMax,
    x.conduction,
    c.pass ? (c.meets ? 'pass' : 'pass, thin') : 'FAIL',
    x.margin,
    x.headroom,
    x.yield,
    x.simulator,
    lim ? `${lim.check} at ${lim.corner}` : '',
  ];
}

/** `band 49.8 ps + 3.00 × σ 4.12 ps = 62.2 ps`, with what the simulator added. */
function headroomText(h: Headroom): string {
  const sim = h.simulator > 0 ? ` + ngspice shortfall ${formatTime(h.simulator)}` : '';
  return `band ${formatTime(h.band)} + ${h.z.toFixed(2)} × σ ${formatTime(h.sigma)}${sim} = ${formatTime(h.total)}`;
}

function searchedHeadroom(h: number | AutoHeadroom): string {
  if (typeof h === 'number') return h > 0 ? `, every margin at least ${formatTime(h)}` : ', with no headroom';
  return `, every margin at least the model's band + ${h.z.toFixed(2)} σ of mismatch`;
}

/** The trade-off table: what each proposal keeps at the fast corner against what it wastes at the slow one. */
export function tradeOffRows(list: ReadonlyArray<[string, TuneCandidateReport]>): string[][] {
  return list.map(([label, c]) => [
    label,
    c.limiting ? `${formatMargin(c.limiting.margin, c.limiting.kind, 'unmeasurable')} at ${c.limiting.corner}` : 'n/a',
    c.deadTimeMax === null ? 'n/a' : `${formatTime(c.deadTimeMax)} at ${c.slowCorner}`,
    c.waste === null ? 'n/a' : formatTime(c.waste),
    c.conduction === null ? 'n/a' : `${formatTime(c.conduction)} at ${c.conductionCorner}`,
  ]);
}
export const TRADE_OFF_HEAD = ['', 'fast-corner margin', 'slow-corner dead time', 'waste', 'least conduction'];

function cornerList(corners: readonly string[]): string {
  return corners.join(', ');
}

function stuckLine(s: StuckSwitch): string {
  const what = s.status === 'never' ? 'never turns on' : s.status === 'always' ? 'never turns off' : 'has no conduction instants';
  return `  ${s.switch} ${what} at ${cornerList(s.corners)}${s.detail ? ` (${s.detail})` : ''}: no delay chain can fix that; change its gate drive, device or node voltages`;
}

function diagnosisLines(d: Diagnosis, closest: TuneCandidateReport | null): string[] {
  const out: string[] = [];
  if (d.failing.length > 0) {
    out.push('the closest candidate fails:');
    for (const f of d.failing) {
      out.push(
        `  ${f.check} (${f.kind}) at ${f.corners.length} corner${f.corners.length === 1 ? '' : 's'}, worst ${formatMargin(f.worst, f.kind, 'unmeasurable')}: ${cornerList(f.corners)}`,
      );
    }
  } else if (closest?.limiting) {
    out.push(
      `the closest candidate passes every check but not with the headroom: ${closest.limiting.check} at ${closest.limiting.corner} keeps ${formatMargin(closest.limiting.margin, closest.limiting.kind, 'unmeasurable')}`,
    );
  }
  for (const s of d.stuck) out.push(stuckLine(s));
  const c = d.conflict;
  if (c) {
    out.push(
      `conflicting requirements: requirements.deadTime.min ${formatTime(c.min)} and .max ${formatTime(c.max)} allow a spread of ${(c.max / c.min).toFixed(2)}x over the corners` +
        ` but the dead time of the closest candidate spreads ${c.spread.toFixed(2)}x (the least of any searched chain ${c.leastSpread.toFixed(2)}x);`,
    );
    out.push(
      '  no chain length or capacitor meets both, so a wider search cannot help: relax one of them, narrow the corners, or change the generator.',
    );
  } else if (d.widen) {
    out.push('it wants more delay than the search allows: widen it with --max-load or --stages');
  } else if (d.stuck.length > 0) {
    out.push('a wider search cannot help while a switch does not switch.');
  } else if (d.failing.length > 0 && d.failing.every((f) => CIRCUIT_KINDS.has(f.kind as CheckKind))) {
    out.push(
      "only the circuit's own requirements fail, with timing that passes: no delay chain fixes them; the circuit (its switches or diodes, capacitors, load or clock frequency) needs a change",
    );
  } else {
    out.push(
      'it wants shorter chains or longer phases: a wider search cannot help; a lower clock frequency (see phasegap fmax) or other switch sizes may be needed',
    );
  }
  return out;
}

function confirmationLine(label: string, c: TuneCandidateReport): string | null {
  const k = c.confirmation;
  if (!k) return null;
  const lim = k.limiting;
  const where = lim
    ? `${lim.check} at ${lim.corner}: ${k.simulator} ${Number.isFinite(k.least) ? formatTime(k.least) : 'not measured'}, model ${formatTime(lim.model)}`
    : 'nothing to check';
  return `  ${label}: ${confirmWord(k)} at ${k.corners.join(', ')}; least margin ${where}`;
}

/** Which knobs were searched, and the ones the template does not allow. */
export function knobsText(r: TuneReport): string {
  const s = r.searched;
  const parts = [
    `chain length ${s.stages.join(', ')}`,
    `stage size ${s.stageSizes.join(', ')}`,
    `delay capacitor 0 .. ${formatEngineering(s.maxLoad, 'F')} in ${formatEngineering(s.loadStep, 'F')} steps`,
    s.tapers.length > 0
      ? `buffer taper ${s.tapers.join(', ')} (last size ${r.current.buffer[r.current.buffer.length - 1]} kept) on the best chains`
      : `buffer taper not searched (the buffer has ${r.current.buffer.length} inverter${r.current.buffer.length === 1 ? '' : 's'})`,
    s.feedbackTaps.length > 1
      ? `feedback tap ${s.feedbackTaps.join(', ')} buffer inverters after the chain end on the best chains`
      : 'feedback tap not searched (the buffer has no even tap after the chain end)',
  ];
  return parts.join('; ');
}

/** `errorBand`: the delay model's measured error line (`errorBandText`), printed under the header. */
export function renderTuneText(r: TuneReport, designPath: string, errorBand?: string): string {
  const out: string[] = [];
  const headroom = searchedHeadroom(r.searched.headroom);
  out.push(
    `${r.design}: delay chains tuned at ${formatEngineering(r.frequency, 'Hz', 4)} over ${r.corners} corners${headroom} (${objectiveText(r.objective)})`,
  );
  if (errorBand !== undefined) out.push(errorBand);
  out.push('');
  const rows = [row('current design', r.current), ...r.proposals.map((p, i) => row(`proposal ${i + 1}`, p))];
  if (r.closest) rows.push(row('closest (fails)', r.closest));
  out.push(
    renderTable(
      [
        left(''),
        right('stages'),
        right('stage size'),
        right('stage load'),
        right('buffer'),
        right('tap'),
        right('dead min'),
        right('dead max'),
        right('conduction'),
        left('verdict'),
        right('least margin'),
        right('headroom'),
        right('MC yield [95 %]'),
        left('ngspice'),
        left('limited by'),
      ],
      rows,
    ),
  );
  out.push('');
  const best = r.proposals[0];
  const faultAdvice = switchFaultAdvice(r.faults);
  if (faultAdvice) {
    out.push(`${faultAdvice}. The delay chains were not searched.`);
    for (const f of r.faults) if (f.detail) out.push(`  ${f.switch} at ${f.corner}: ${f.detail}`);
  } else if (best) {
    out.push(
      'trade-off: fast-corner margin against slow-corner waste (dead time beyond the requirement) and the least useful conduction time',
    );
    out.push(
      renderTable(
        TRADE_OFF_HEAD.map((header, i) => (i === 0 ? left(header) : right(header))),
        tradeOffRows([
          ['current design', r.current],
          ...r.proposals.map((p, i): [string, TuneCandidateReport] => [`proposal ${i + 1}`, p]),
        ]),
      ),
    );
    out.push('');
    const dies = best.yields?.[0]?.dies ?? 0;
    out.push(
      `Monte Carlo yield at each proposal's limiting corners (${dies} dies each, 95 % Wilson interval; at least ${percent(r.yieldTarget)} required):`,
    );
    r.proposals.forEach((p, i) => {
      if (p.yields)
        out.push(
          `  proposal ${i + 1}: ${p.yields.map((y) => `${y.corner} ${percent(y.passes / y.dies)} [${percent(y.low)}, ${percent(y.high)}]`).join('; ')}`,
        );
    });
    if (typeof r.searched.headroom !== 'number') {
      out.push("headroom: the model's error band on the largest dead time + z σ of the least margin per die at the limiting corners:");
      r.proposals.forEach((p, i) => {
        if (p.headroom) out.push(`  proposal ${i + 1}: ${headroomText(p.headroom)}`);
      });
    }
    if (r.confirmed) {
      out.push("transistor-level confirmation (every requirement and break-before-make pair from the simulator's measurements):");
      r.proposals.forEach((p, i) => {
        const line = confirmationLine(`proposal ${i + 1}`, p);
        if (line) out.push(line);
      });
    }
    out.push(
      `best: ${best.stages} stages of size ${sizeText(best.stageSize)} with ${loadText(best.stageLoad)} per node${best.overrides.length > 3 ? `, ${best.overrides.slice(3).join(', ')}` : ''}; check it with`,
    );
    out.push(`  ${shellCommand(['phasegap', 'check', designPath, ...best.overrides.flatMap((o) => ['--set', o])])}`);
    if (!r.confirmed)
      out.push(
        `proposals are model estimates, unconfirmed in ngspice (${r.confirmNote}): run phasegap confirm with the overrides of the one you pick`,
      );
    if (r.searched.headroom === 0) out.push('with --margin 0 the proposals sit at the edge of the tightest requirement');
  } else {
    out.push(`no chain in the searched range passes every check at every corner${headroom}.`);
    if (r.diagnosis) out.push(...diagnosisLines(r.diagnosis, r.closest));
  }
  if (faultAdvice) out.push(`searched: nothing (${r.evaluations} corner evaluations of the design as it stands)`);
  else out.push(`knobs searched: ${knobsText(r)}; ${r.evaluations} corner evaluations`);
  out.push('', ...CAUTIONS.map((c) => `caution: ${c}`));
  return `${out.join('\n')}\n`;
}
