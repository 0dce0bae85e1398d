/** The tune report: plain data for --json, and its table for people. */
import type { ChainCandidate, ChainKnobs, TuneResult } from '../analysis/tune.js';
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
  readonly searched: { readonly stages: readonly number[]; readonly stageSizes: readonly number[]; readonly maxLoad: number; readonly loadStep: number; readonly headroom: number };
  readonly evaluations: number;
  /** Switches whose off-state, on-state or stress check fails: no delay chain fixes them, so nothing was searched. */
  readonly faults: readonly SwitchFault[];
  readonly verdict: 'pass' | 'fail';
  readonly cautions: readonly string[];
}

/** Check kinds that more chain delay helps (the others want less of it, or a slower clock). */
const WANTS_DELAY: ReadonlySet<string> = new Set(['non-overlap', 'dead-time-min', 'gap-min', 'break-before-make', 'order']);

/** A capacitance the design file reads back exactly: `23.5fF`. */
export function loadText(farads: number): string {
  return `${Number((farads / 1e-15).toPrecision(6))}fF`;
}

function candidateReport(c: ChainCandidate): TuneCandidateReport {
  const finite = (x: number) => (Number.isFinite(x) ? x : null);
  return {
    stages: c.knobs.stages, stageSize: c.knobs.stageSize, stageLoad: c.knobs.stageLoad, pass: c.pass, meets: c.meets,
    deadTimeMin: finite(c.deadMin), deadTimeMax: finite(c.deadMax), limiting: c.limiting,
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
  };
}

function row(label: string, c: TuneCandidateReport): string[] {
  const x = candidateCells(c);
  const lim = c.limiting;
  return [
    label, x.stages, x.size, x.load, x.deadMin, x.deadMax,
    c.pass ? (c.meets ? 'pass' : 'pass, thin') : 'FAIL', x.margin, lim ? `${lim.check} at ${lim.corner}` : '',
  ];
}

export function renderTuneText(r: TuneReport, designPath: string): string {
  const out: string[] = [];
  const headroom = r.searched.headroom > 0 ? `, every margin at least ${formatTime(r.searched.headroom)}` : '';
  out.push(`${r.design}: delay chains tuned at ${formatEngineering(r.frequency, 'Hz', 4)} over ${r.corners} corners${headroom} (least wasted dead time first)`);
  out.push('');
  const rows = [row('current design', r.current), ...r.proposals.map((p, i) => row(`proposal ${i + 1}`, p))];
  if (r.closest) rows.push(row('closest (fails)', r.closest));
  out.push(renderTable([
    { header: '', align: 'left' }, { header: 'stages', align: 'right' }, { header: 'stage size', align: 'right' },
    { header: 'stage load', align: 'right' }, { header: 'dead min', align: 'right' }, { header: 'dead max', align: 'right' },
    { header: 'verdict', align: 'left' }, { header: 'least margin', align: 'right' }, { header: 'limited by', align: 'left' },
  ], rows));
  out.push('');
  const best = r.proposals[0];
  const faultAdvice = switchFaultAdvice(r.faults);
  if (faultAdvice) {
    out.push(`${faultAdvice}. The delay chains were not searched.`);
    for (const f of r.faults) if (f.detail) out.push(`  ${f.switch} at ${f.corner}: ${f.detail}`);
  } else if (best) {
    out.push(`best: ${best.stages} stages of size ${sizeText(best.stageSize)} with ${loadText(best.stageLoad)} per node; check it with`);
    out.push(`  ${shellCommand(['phasegap', 'check', designPath, ...best.overrides.flatMap((o) => ['--set', o])])}`);
    if (r.searched.headroom === 0) out.push('proposals sit at the edge of the tightest requirement: give --margin TIME for headroom, and run phasegap mc on the one you pick');
  } else {
    out.push(`no chain in the searched range passes every check at every corner${headroom}.`);
    const lim = r.closest?.limiting;
    if (lim) {
      const advice = WANTS_DELAY.has(lim.kind)
        ? 'it wants more delay than the search allows: widen it with --max-load or --stages'
        : 'it wants shorter chains or longer phases: a lower clock frequency (see phasegap fmax) or other switch sizes may be needed';
      out.push(`closest: ${lim.check} (${lim.kind}) at ${lim.corner} still fails; ${advice}`);
    }
  }
  if (faultAdvice) out.push(`searched: nothing (${r.evaluations} corner evaluations of the design as it stands)`);
  else out.push(`searched: stages ${r.searched.stages.join(', ')}; stage sizes ${r.searched.stageSizes.join(', ')}; stage load 0 .. ${formatEngineering(r.searched.maxLoad, 'F')} in ${formatEngineering(r.searched.loadStep, 'F')} steps; ${r.evaluations} corner evaluations`);
  out.push('', ...CAUTIONS.map((c) => `caution: ${c}`));
  return `${out.join('\n')}\n`;
}
