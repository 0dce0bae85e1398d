/**
 * One verdict per run: the corner checks, the Monte Carlo yield against its requirement, the
 * simulator's agreement with the model and the circuit figures, each a part with its own verdict
 * and reason; the run fails when any part fails. A new analysis adds a part (a key, a name, a
 * verdict and a reason) and every output and the exit code pick it up.
 */
import { formatPercent, formatTime } from '../units/format.js';
import type { CheckReport } from './check-report.js';
import { mcPercent, type McReport } from './mc-report.js';

export type PartVerdict = 'pass' | 'fail' | 'not-run';

/** The parts every run knows; another analysis may bring its own key. */
export type PartKey = 'corners' | 'montecarlo' | 'simulator' | 'circuit' | (string & {});

export interface VerdictPart {
  /** Stable identifier for machines (JSON, JUnit). */
  readonly key: PartKey;
  /** Words for people. */
  readonly name: string;
  readonly verdict: PartVerdict;
  readonly reason: string;
}

export interface RunVerdict {
  readonly verdict: 'pass' | 'fail';
  readonly parts: readonly VerdictPart[];
}

/** What the verdict reads of a model-against-simulator comparison at one corner. */
export interface ComparedCorner {
  readonly corner: string;
  readonly quantities: ReadonlyArray<{
    readonly quantity: string;
    readonly kind: string;
    readonly simulator: number | null;
    readonly pass: boolean;
  }>;
  readonly breakBeforeMake: ReadonlyArray<{ readonly check: string; readonly agrees: boolean }>;
  readonly circuit?: { readonly settled: boolean; readonly figures: ReadonlyArray<{ readonly figure: string; readonly pass: boolean }> };
}

export interface Confirmation {
  readonly simulator: string;
  readonly tolerance: number;
  readonly comparisons: readonly ComparedCorner[];
}

export function cornerPart(r: CheckReport): VerdictPart {
  const failing = r.corners.filter((c) => c.verdict === 'fail').length;
  const lim = r.limiting;
  const where = lim ? `; limiting: ${lim.check} at ${lim.corner}` : '';
  return {
    key: 'corners',
    name: 'corner checks',
    verdict: failing === 0 ? 'pass' : 'fail',
    reason: `${r.corners.length - failing} of ${r.corners.length} corners pass${where}`,
  };
}

/** How a part that did not run could be run, per part key; the report's options by default. */
export type RunHints = Readonly<Partial<Record<PartKey, string>>>;

export const REPORT_HINTS: RunHints = {
  corners: 'run phasegap check',
  montecarlo: 'add --mc N to run it',
  simulator: 'add --confirm worst to run it',
};

/**
 * The yield part follows the Monte Carlo report's own verdict (`yieldMeets`): without
 * requirements.minYield every drawn die must pass at every corner.
 */
export function monteCarloPart(mc: McReport | null, hint = REPORT_HINTS.montecarlo!): VerdictPart {
  const key = 'montecarlo';
  const name = 'Monte Carlo yield';
  if (mc === null) return { key, name, verdict: 'not-run', reason: hint };
  const pct = mcPercent(mc);
  const measured = `yield ${pct(mc.yield.value)} over ${mc.samples} dies at every corner`;
  const met = mc.verdict === 'pass';
  if (mc.minYield === null) {
    return {
      key,
      name,
      verdict: met ? 'pass' : 'fail',
      reason: `${measured}; no requirements.minYield, so every die must pass${met ? '' : ` (${mc.samples - Math.round(mc.yield.value * mc.samples)} fail)`}`,
    };
  }
  return { key, name, verdict: met ? 'pass' : 'fail', reason: `${measured}, ${met ? 'meets' : 'below'} the ${pct(mc.minYield)} required` };
}

/**
 * The simulator part fails when a quantity differs beyond the tolerance, a break-before-make pair
 * disagrees, or the simulator's dead time breaks the design's dead-time requirement.
 */
export function confirmPart(
  c: Confirmation | null,
  deadTime?: { readonly min?: number; readonly max?: number },
  hint = REPORT_HINTS.simulator!,
): VerdictPart {
  const key = 'simulator';
  const name = 'simulator agreement';
  if (c === null) return { key, name, verdict: 'not-run', reason: hint };
  const problems: string[] = [];
  const over = c.comparisons.flatMap((x) => x.quantities.filter((q) => !q.pass).map((q) => `${q.quantity} at ${x.corner}`));
  if (over.length > 0)
    problems.push(`${over.length} quantit${over.length === 1 ? 'y' : 'ies'} beyond ${formatPercent(c.tolerance, 1)} (first: ${over[0]})`);
  const pairs = c.comparisons.flatMap((x) => x.breakBeforeMake.filter((b) => !b.agrees).map((b) => `${b.check} at ${x.corner}`));
  if (pairs.length > 0)
    problems.push(
      `${pairs.length} break-before-make pair${pairs.length === 1 ? '' : 's'} disagree${pairs.length === 1 ? 's' : ''} (first: ${pairs[0]})`,
    );
  const figures = c.comparisons.flatMap((x) => (x.circuit?.figures ?? []).filter((f) => !f.pass).map((f) => `${f.figure} at ${x.corner}`));
  if (figures.length > 0)
    problems.push(`${figures.length} circuit figure${figures.length === 1 ? '' : 's'} beyond tolerance (first: ${figures[0]})`);
  const unsettled = c.comparisons.filter((x) => x.circuit && !x.circuit.settled).map((x) => x.corner);
  if (unsettled.length > 0)
    problems.push(
      `the circuit did not settle in ${c.simulator} at ${unsettled.length} corner${unsettled.length === 1 ? '' : 's'} (first: ${unsettled[0]})`,
    );
  for (const x of c.comparisons) {
    for (const q of x.quantities) {
      if (q.kind !== 'dead' || q.simulator === null) continue;
      if (deadTime?.min !== undefined && q.simulator < deadTime.min)
        problems.push(
          `${c.simulator} gives ${q.quantity} ${formatTime(q.simulator)} at ${x.corner}, below the ${formatTime(deadTime.min)} minimum`,
        );
      if (deadTime?.max !== undefined && q.simulator > deadTime.max)
        problems.push(
          `${c.simulator} gives ${q.quantity} ${formatTime(q.simulator)} at ${x.corner}, above the ${formatTime(deadTime.max)} maximum`,
        );
    }
  }
  const n = c.comparisons.length;
  if (problems.length === 0)
    return { key, name, verdict: 'pass', reason: `${c.simulator} agrees with the model at ${n} corner${n === 1 ? '' : 's'}` };
  return { key, name, verdict: 'fail', reason: problems.join('; ') };
}

/** A figure of the circuit around the generator that has its own requirement (settling, charge, ripple...). */
export interface CircuitFigure {
  readonly name: string;
  readonly pass: boolean;
  /** Words: the value and its requirement. */
  readonly detail: string;
}

/** The circuit figures part: not run when the design has none. */
export function circuitPart(figures: readonly CircuitFigure[] | null): VerdictPart {
  const key = 'circuit';
  const name = 'circuit figures';
  if (figures === null || figures.length === 0) return { key, name, verdict: 'not-run', reason: 'the design declares no circuit figures' };
  const failing = figures.filter((f) => !f.pass);
  if (failing.length === 0)
    return { key, name, verdict: 'pass', reason: `${figures.length} of ${figures.length} figures meet their requirements` };
  return {
    key,
    name,
    verdict: 'fail',
    reason: `${failing.length} of ${figures.length} figures fail (first: ${failing[0]!.name}: ${failing[0]!.detail})`,
  };
}

/** A part for an analysis the command did not run. */
export function notRun(key: PartKey, name: string, reason: string): VerdictPart {
  return { key, name, verdict: 'not-run', reason };
}

export function combineVerdict(parts: readonly VerdictPart[]): RunVerdict {
  return { verdict: parts.some((p) => p.verdict === 'fail') ? 'fail' : 'pass', parts };
}

/** Everything one run analysed; null for what it did not run. */
export interface RunAnalyses {
  readonly corners: CheckReport | null;
  readonly mc: McReport | null;
  readonly confirm: Confirmation | null;
  readonly deadTime?: { readonly min?: number; readonly max?: number };
  readonly circuit?: readonly CircuitFigure[] | null;
  /** Parts of further analyses, appended in order. */
  readonly extra?: readonly VerdictPart[];
  /** How to run what did not run, in this command's words. */
  readonly hints?: RunHints;
}

export function verdictOf(a: RunAnalyses): RunVerdict {
  const hints = { ...REPORT_HINTS, ...a.hints };
  const corners = a.corners === null ? notRun('corners', 'corner checks', hints.corners!) : cornerPart(a.corners);
  return combineVerdict([
    corners,
    monteCarloPart(a.mc, hints.montecarlo),
    confirmPart(a.confirm, a.deadTime, hints.simulator),
    ...(a.circuit === undefined ? [] : [circuitPart(a.circuit)]),
    ...(a.extra ?? []),
  ]);
}

export function runVerdict(
  r: CheckReport,
  mc: McReport | null,
  confirm: Confirmation | null,
  deadTime?: { readonly min?: number; readonly max?: number },
): RunVerdict {
  return verdictOf({ corners: r, mc, confirm, deadTime });
}
