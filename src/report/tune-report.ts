/** The tune report: plain data for --json, and its table for people. */
import type { AutoHeadroom, ChainCandidate, ChainKnobs, Diagnosis, FailingCheck, Headroom, TuneResult } from '../analysis/tune.js';
import { proposalOverrides } from '../analysis/tune.js';
import { switchFaultAdvice, type SwitchFault } from '../checks/bias-checks.js';
import { formatEngineering, formatTime } from '../units/format.js';
import { formatMargin } from './margin-format.js';
import { CAUTIONS } from './cautions.js';
import { shellCommand } from './shell-quote.js';
import { renderTable } from './text-table.js';

export interface TuneCandidateReport {
  readonly stages: number;
  readonly stageSize: number | readonly number[];
  /** F. */
  readonly stageLoad: number;
  readonly pass: boolean;
  /** Passes with the asked headroom on every margin. */
  readonly meets: boolean;
  /** Smallest and largest dead time over every corner and both handovers, s. */
  readonly deadTimeMin: number | null;
  readonly deadTimeMax: number | null;
  readonly limiting: ChainCandidate['limiting'];
  /** Checks that fail and where (empty when it passes). */
  readonly failing: readonly FailingCheck[];
  /** The headroom a proposal keeps: band + z sigma with the automatic headroom, or the fixed one (s); null for the design and the closest candidate. */
  readonly headroom: Headroom | null;
  /** The `--set` overrides that give this candidate. */
  readonly overrides: readonly string[];
}

export interface TuneReport {
  readonly tool: 'phasegap';
  readonly design: string;
  /** Clock frequency the chains were tuned at, Hz. */
  readonly frequency: number;
  readonly corners: number;
  readonly current: TuneCandidateReport;
  /** Passing proposals, the least wasted dead time (smallest largest dead time) first. */
  readonly proposals: readonly TuneCandidateReport[];
  /** Present when nothing passes: the candidate with the largest least margin. */
  readonly closest: TuneCandidateReport | null;
  /** What was searched: chain lengths, stage sizes, the largest capacitor and its step (F). */
  readonly searched: { readonly stages: readonly number[]; readonly stageSizes: readonly number[]; readonly maxLoad: number; readonly loadStep: number; readonly headroom: number | AutoHeadroom };
  readonly evaluations: number;
  /** Switches whose off-state, on-state or stress check fails: no delay chain fixes them, so nothing was searched. */
  readonly faults: readonly SwitchFault[];
  /** When nothing passes: what the closest candidate fails, conflicting requirements, whether a wider search can help. */
  readonly diagnosis: Diagnosis | null;
  /** Proposals come from the delay model alone; none was simulated at transistor level. */
  readonly confirmed: false;
  readonly verdict: 'pass' | 'fail';
  readonly cautions: readonly string[];
}

/** A capacitance the design file reads back exactly: `23.5fF`. */
export function loadText(farads: number): string {
  return `${Number((farads / 1e-15).toPrecision(6))}fF`;
}

function candidateReport(c: ChainCandidate): TuneCandidateReport {
  const finite = (x: number) => (Number.isFinite(x) ? x : null);
  return {
    stages: c.knobs.stages, stageSize: c.knobs.stageSize, stageLoad: c.knobs.stageLoad, pass: c.pass, meets: c.meets,
    deadTimeMin: finite(c.deadMin), deadTimeMax: finite(c.deadMax), limiting: c.limiting, failing: c.failing, headroom: c.headroom,
    overrides: proposalOverrides(c.knobs, loadText),
  };
}

export function tuneReport(design: string, frequency: number, corners: number, result: TuneResult, top: number): TuneReport {
  return {
    tool: 'phasegap', design, frequency, corners,
    current: candidateReport(result.current),
    proposals: result.proposals.slice(0, top).map(candidateReport),
    closest: result.closest ? candidateReport(result.closest) : null,
    searched: { ...result.space },
    evaluations: result.evaluations,
    faults: result.faults,
    diagnosis: result.diagnosis,
    confirmed: false,
    verdict: result.proposals.length > 0 ? 'pass' : 'fail',
    cautions: CAUTIONS,
  };
}

function sizeText(size: ChainKnobs['stageSize']): string {
  return typeof size === 'number' ? String(size) : size.join(',');
}

/** A candidate's figures as table cells, shared by the text report and the review page. */
export function candidateCells(c: TuneCandidateReport) {
  return {
    stages: String(c.stages), size: sizeText(c.stageSize), load: `${Number((c.stageLoad / 1e-15).toPrecision(6))} fF`,
    deadMin: c.deadTimeMin === null ? 'n/a' : formatTime(c.deadTimeMin), deadMax: c.deadTimeMax === null ? 'n/a' : formatTime(c.deadTimeMax),
    margin: c.limiting ? formatMargin(c.limiting.margin, c.limiting.kind, 'unmeasurable') : 'n/a',
    headroom: c.headroom ? formatTime(c.headroom.total) : '',
  };
}

function row(label: string, c: TuneCandidateReport): string[] {
  const x = candidateCells(c);
  const lim = c.limiting;
  return [
    label, x.stages, x.size, x.load, x.deadMin, x.deadMax,
    c.pass ? (c.meets ? 'pass' : 'pass, thin') : 'FAIL', x.margin, x.headroom, lim ? `${lim.check} at ${lim.corner}` : '',
  ];
}

/** `band 49.8 ps + 3.00 × σ 4.12 ps = 62.2 ps`. */
function headroomText(h: Headroom): string {
  return `band ${formatTime(h.band)} + ${h.z.toFixed(2)} × σ ${formatTime(h.sigma)} = ${formatTime(h.total)}`;
}

function searchedHeadroom(h: number | AutoHeadroom): string {
  if (typeof h === 'number') return h > 0 ? `, every margin at least ${formatTime(h)}` : ', with no headroom';
  return `, every margin at least the model's band + ${h.z.toFixed(2)} σ of mismatch`;
}

function diagnosisLines(d: Diagnosis, closest: TuneCandidateReport | null): string[] {
  const out: string[] = [];
  if (d.failing.length > 0) {
    out.push('the closest candidate fails:');
    for (const f of d.failing) {
      const at = f.corners.length > 3 ? `${f.corners.slice(0, 3).join(', ')} and ${f.corners.length - 3} more` : f.corners.join(', ');
      out.push(`  ${f.check} (${f.kind}) at ${f.corners.length} corner${f.corners.length === 1 ? '' : 's'}: ${at}; worst ${formatMargin(f.worst, f.kind, 'unmeasurable')}`);
    }
  } else if (closest?.limiting) {
    out.push(`the closest candidate passes every check but not with the headroom: ${closest.limiting.check} at ${closest.limiting.corner} keeps ${formatMargin(closest.limiting.margin, closest.limiting.kind, 'unmeasurable')}`);
  }
  const c = d.conflict;
  if (c) {
    out.push(`conflicting requirements: requirements.deadTime.min ${formatTime(c.min)} and .max ${formatTime(c.max)} allow a spread of ${(c.max / c.min).toFixed(2)}x over the corners`
      + ` but the dead time of the closest candidate spreads ${c.spread.toFixed(2)}x (the least of any searched chain ${c.leastSpread.toFixed(2)}x);`);
    out.push('  no chain length or capacitor meets both, so a wider search cannot help: relax one of them, narrow the corners, or change the generator.');
  } else if (d.widen) {
    out.push('it wants more delay than the search allows: widen it with --max-load or --stages');
  } else {
    out.push('it wants shorter chains or longer phases: a wider search cannot help; a lower clock frequency (see phasegap fmax) or other switch sizes may be needed');
  }
  return out;
}

export function renderTuneText(r: TuneReport, designPath: string): string {
  const out: string[] = [];
  const headroom = searchedHeadroom(r.searched.headroom);
  out.push(`${r.design}: delay chains tuned at ${formatEngineering(r.frequency, 'Hz', 4)} over ${r.corners} corners${headroom} (least wasted dead time first)`);
  out.push('');
  const rows = [row('current design', r.current), ...r.proposals.map((p, i) => row(`proposal ${i + 1}`, p))];
  if (r.closest) rows.push(row('closest (fails)', r.closest));
  out.push(renderTable([
    { header: '', align: 'left' }, { header: 'stages', align: 'right' }, { header: 'stage size', align: 'right' },
    { header: 'stage load', align: 'right' }, { header: 'dead min', align: 'right' }, { header: 'dead max', align: 'right' },
    { header: 'verdict', align: 'left' }, { header: 'least margin', align: 'right' }, { header: 'headroom', align: 'right' }, { header: 'limited by', align: 'left' },
  ], rows));
  out.push('');
  const best = r.proposals[0];
  const faultAdvice = switchFaultAdvice(r.faults);
  if (faultAdvice) {
    out.push(`${faultAdvice}. The delay chains were not searched.`);
    for (const f of r.faults) if (f.detail) out.push(`  ${f.switch} at ${f.corner}: ${f.detail}`);
  } else if (best) {
    const auto = typeof r.searched.headroom !== 'number';
    if (auto) {
      out.push('headroom: the model\'s error band on the largest dead time + z σ of the least margin per die at the limiting corners:');
      r.proposals.forEach((p, i) => {
        if (p.headroom) out.push(`  proposal ${i + 1}: ${headroomText(p.headroom)} (${p.headroom.dies} dies at ${p.headroom.corners.join(', ')})`);
      });
    }
    out.push(`best: ${best.stages} stages of size ${sizeText(best.stageSize)} with ${loadText(best.stageLoad)} per node; check it with`);
    out.push(`  ${shellCommand(['phasegap', 'check', designPath, ...best.overrides.flatMap((o) => ['--set', o])])}`);
    out.push(`proposals are model estimates, unconfirmed in ngspice: run phasegap confirm and phasegap mc with the overrides of the one you pick`);
    if (r.searched.headroom === 0) out.push('with --margin 0 the proposals sit at the edge of the tightest requirement');
  } else {
    out.push(`no chain in the searched range passes every check at every corner${headroom}.`);
    if (r.diagnosis) out.push(...diagnosisLines(r.diagnosis, r.closest));
  }
  if (faultAdvice) out.push(`searched: nothing (${r.evaluations} corner evaluations of the design as it stands)`);
  else out.push(`searched: stages ${r.searched.stages.join(', ')}; stage sizes ${r.searched.stageSizes.join(', ')}; stage load 0 .. ${formatEngineering(r.searched.maxLoad, 'F')} in ${formatEngineering(r.searched.loadStep, 'F')} steps; ${r.evaluations} corner evaluations`);
  out.push('', ...CAUTIONS.map((c) => `caution: ${c}`));
  return `${out.join('\n')}\n`;
}
