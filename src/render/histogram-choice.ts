/**
 * What a Monte Carlo histogram shows: a corner (the run's worst by default) and either one check's
 * margin (by default the check that limits yield there) or the corner's two dead times.
 */
import type { McReport } from '../report/mc-report.js';
import type { QuantityReport } from '../analysis/montecarlo.js';
import { inputError } from '../errors.js';

/** The `--histogram-check` value that asks for the dead-time panels. */
export const DEAD_TIMES = 'dead-times';

export type HistogramSubject =
  | { readonly corner: number; readonly kind: 'check'; readonly check: QuantityReport }
  | { readonly corner: number; readonly kind: 'dead-times'; readonly deadTimes: readonly QuantityReport[] };

/** Checks with a margin to draw (a run that never settled has none). */
function drawable(c: McReport['corners'][number]): QuantityReport[] {
  return c.quantities.filter((q) => q.kind !== 'measure' && q.count > 0);
}

/**
 * The check that limits yield at a corner: the one most dies fail, then the least sigma margin
 * (a check with no spread ranks by its mean margin's sign), then the least mean margin.
 */
export function yieldLimitingCheck(c: McReport['corners'][number]): QuantityReport | undefined {
  const sigma = (q: QuantityReport) => q.sigmaMargin ?? (q.mean < 0 ? -Infinity : Infinity);
  return [...drawable(c)].sort((a, b) => (b.failures ?? 0) - (a.failures ?? 0) || sigma(a) - sigma(b) || a.mean - b.mean)[0];
}

/** The one check `value` names among `names` (exactly or as a unique part, any case); an InputError otherwise. */
export function matchCheck(names: readonly string[], value: string, where: string): string {
  const lower = value.toLowerCase();
  const exact = names.filter((n) => n.toLowerCase() === lower);
  const found = exact.length > 0 ? exact : names.filter((n) => n.toLowerCase().includes(lower));
  if (found.length === 1) return found[0]!;
  const quote = (list: readonly string[]) => list.map((n) => `'${n}'`).join(', ');
  throw inputError(
    'reference.unknown',
    ['--histogram-check'],
    value,
    found.length > 1
      ? `names ${found.length} checks ${where}; write more of one: ${quote(found)}`
      : `is not a check ${where}; allowed: ${DEAD_TIMES}, or a check name or a unique part of one: ${quote(names)}`,
  );
}

/** Index of the corner `value` names (`worst` or a corner name, any case); an InputError otherwise. */
export function pickCorner(names: readonly string[], worst: string, corner: string | undefined): number {
  const want = corner ?? worst;
  if (want === 'worst') return names.indexOf(worst);
  const exact = names.indexOf(want);
  if (exact >= 0) return exact;
  const folded = names.findIndex((n) => n.toLowerCase() === want.toLowerCase());
  if (folded >= 0) return folded;
  throw inputError(
    'reference.unknown',
    ['--histogram-corner'],
    want,
    `is not a corner of this run; allowed: worst or one of ${names.join(', ')}`,
  );
}

/** Reads `--histogram-corner` and `--histogram-check` (a check name, a unique part of one, or `dead-times`). */
export function histogramSubject(r: McReport, corner?: string, check?: string): HistogramSubject {
  const index = pickCorner(
    r.corners.map((c) => c.name),
    r.worstCorner,
    corner,
  );
  const c = r.corners[index]!;
  const deadTimes = c.quantities.filter((q) => q.kind === 'measure' && q.name.startsWith('dead '));
  const checks = drawable(c);
  if (check === DEAD_TIMES) return { corner: index, kind: 'dead-times', deadTimes };
  if (check === undefined) {
    const limiting = yieldLimitingCheck(c);
    return limiting ? { corner: index, kind: 'check', check: limiting } : { corner: index, kind: 'dead-times', deadTimes };
  }
  const name = matchCheck(
    checks.map((q) => q.name),
    check,
    `at ${c.name}`,
  );
  return { corner: index, kind: 'check', check: checks.find((q) => q.name === name)! };
}
