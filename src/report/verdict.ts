/**
 * One verdict per run: the corner checks, the Monte Carlo yield against its requirement and the
 * simulator's agreement with the model, each a part with its own verdict and reason; the run
 * fails when any part fails.
 */
import { formatTime } from '../units/format.js';
import type { CheckReport } from './check-report.js';
import type { McReport } from './mc-report.js';

export type PartVerdict = 'pass' | 'fail' | 'not-run';

export interface VerdictPart {
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
  readonly quantities: ReadonlyArray<{ readonly quantity: string; readonly kind: string; readonly simulator: number | null; readonly pass: boolean }>;
  readonly breakBeforeMake: ReadonlyArray<{ readonly check: string; readonly agrees: boolean }>;
}

export interface Confirmation {
  readonly simulator: string;
  readonly tolerance: number;
  readonly comparisons: readonly ComparedCorner[];
}

const pct = (x: number) => `${(x * 100).toFixed(x === 1 || x === 0 ? 1 : 3)} %`;

export function cornerPart(r: CheckReport): VerdictPart {
  const failing = r.corners.filter((c) => c.verdict === 'fail').length;
  const lim = r.limiting;
  const where = lim ? `; limiting: ${lim.check} at ${lim.corner}` : '';
  return {
    name: 'corner checks',
    verdict: failing === 0 ? 'pass' : 'fail',
    reason: `${r.corners.length - failing} of ${r.corners.length} corners pass${where}`,
  };
}

export function monteCarloPart(mc: McReport | null): VerdictPart {
  const name = 'Monte Carlo yield';
  if (mc === null) return { name, verdict: 'not-run', reason: 'add --mc N to run it' };
  const measured = `yield ${pct(mc.yield.value)} over ${mc.samples} dies at every corner`;
  if (mc.minYield === null) return { name, verdict: 'pass', reason: `${measured}; no requirement set (requirements.minYield)` };
  const met = mc.yield.value >= mc.minYield;
  return { name, verdict: met ? 'pass' : 'fail', reason: `${measured}, ${met ? 'meets' : 'below'} the ${pct(mc.minYield)} required` };
}

/**
 * The simulator part fails when a quantity differs beyond the tolerance, a break-before-make pair
 * disagrees, or the simulator's dead time breaks the design's dead-time requirement.
 */
export function confirmPart(c: Confirmation | null, deadTime?: { readonly min?: number; readonly max?: number }): VerdictPart {
  const name = 'simulator agreement';
  if (c === null) return { name, verdict: 'not-run', reason: 'add --confirm worst to run it' };
  const problems: string[] = [];
  const over = c.comparisons.flatMap((x) => x.quantities.filter((q) => !q.pass).map((q) => `${q.quantity} at ${x.corner}`));
  if (over.length > 0) problems.push(`${over.length} quantit${over.length === 1 ? 'y' : 'ies'} beyond ${(c.tolerance * 100).toFixed(1)} % (first: ${over[0]})`);
  const pairs = c.comparisons.flatMap((x) => x.breakBeforeMake.filter((b) => !b.agrees).map((b) => `${b.check} at ${x.corner}`));
  if (pairs.length > 0) problems.push(`${pairs.length} break-before-make pair${pairs.length === 1 ? '' : 's'} disagree${pairs.length === 1 ? 's' : ''} (first: ${pairs[0]})`);
  for (const x of c.comparisons) {
    for (const q of x.quantities) {
      if (q.kind !== 'dead' || q.simulator === null) continue;
      if (deadTime?.min !== undefined && q.simulator < deadTime.min) problems.push(`${c.simulator} gives ${q.quantity} ${formatTime(q.simulator)} at ${x.corner}, below the ${formatTime(deadTime.min)} minimum`);
      if (deadTime?.max !== undefined && q.simulator > deadTime.max) problems.push(`${c.simulator} gives ${q.quantity} ${formatTime(q.simulator)} at ${x.corner}, above the ${formatTime(deadTime.max)} maximum`);
    }
  }
  const n = c.comparisons.length;
  if (problems.length === 0) return { name, verdict: 'pass', reason: `${c.simulator} agrees with the model at ${n} corner${n === 1 ? '' : 's'}` };
  return { name, verdict: 'fail', reason: problems.join('; ') };
}

export function combineVerdict(parts: readonly VerdictPart[]): RunVerdict {
  return { verdict: parts.some((p) => p.verdict === 'fail') ? 'fail' : 'pass', parts };
}

export function runVerdict(r: CheckReport, mc: McReport | null, confirm: Confirmation | null, deadTime?: { readonly min?: number; readonly max?: number }): RunVerdict {
  return combineVerdict([cornerPart(r), monteCarloPart(mc), confirmPart(confirm, deadTime)]);
}
