/** Requirement checks on a corner's phase measurements (dead time, clean gap, width, overlap). */
import type { Requirements } from '../schema/design.js';
import { formatStated } from '../units/format.js';
import { GAP_LEVEL, type MeasurementFailure, type PhaseMeasurement } from '../measure/phases.js';
import { marginCheck, type Check, type CheckSubject, type DeadTimeIndex } from './check.js';

export interface WidthContext {
  /** Clock period, s. */
  readonly period: number;
  /** Input duty tolerance, fraction of the period; widths are checked at the worst duty. */
  readonly dutyTolerance: number;
}

/**
 * A phase's active width follows the input clock's high (or low) time one for one, so the width at
 * the worst duty within tolerance is the simulated width less tolerance * period.
 */
export function worstWidth(width: number, context: WidthContext): number {
  return width - context.dutyTolerance * context.period;
}

/** Check names, formatted once per design: the evaluator runs for every corner and every die. */
export interface RequirementLabels {
  /** Per dead time, in the generator's order (first phase to second, then back). */
  readonly deadMin: readonly [string, string];
  readonly deadMax: readonly [string, string];
  readonly gapMin: readonly [string, string];
  /** The overlap check, at the gap level. */
  readonly overlap: string;
  /** Per phase or early phase. */
  readonly widthMin: Readonly<Record<string, string>>;
  /** Each check's subject, made with its name. */
  readonly subjects: RequirementSubjects;
}

export interface RequirementSubjects {
  readonly steadyState: CheckSubject;
  readonly overlap: CheckSubject;
  readonly deadMin: readonly [CheckSubject, CheckSubject];
  readonly deadMax: readonly [CheckSubject, CheckSubject];
  readonly gapMin: readonly [CheckSubject, CheckSubject];
  readonly widthMin: ReadonlyMap<string, CheckSubject>;
}

function requirementSubjects(req: Requirements, widthNets: readonly string[]): RequirementSubjects {
  const one = (k: DeadTimeIndex, level: 't50' | 'gap', limit: number | undefined): CheckSubject => ({
    type: 'dead-time',
    deadTimes: [k],
    level,
    limit: limit ?? null,
  });
  const pair = (level: 't50' | 'gap', limit: number | undefined): [CheckSubject, CheckSubject] => [
    one(0, level, limit),
    one(1, level, limit),
  ];
  return {
    steadyState: { type: 'generator' },
    overlap: { type: 'dead-time', deadTimes: [0, 1], level: 'gap', limit: null },
    deadMin: pair('t50', req.deadTime?.min),
    deadMax: pair('t50', req.deadTime?.max),
    gapMin: pair('gap', req.gap?.min),
    widthMin: new Map(widthNets.map((net) => [net, { type: 'width', net, limit: req.width?.min ?? 0 }])),
  };
}

export function requirementLabels(req: Requirements, phases: readonly [string, string], widthNets: readonly string[]): RequirementLabels {
  const show = (v: number | undefined) => (v === undefined ? '' : formatStated(v, 's'));
  const [a, b] = phases;
  const pair = (what: string, op: string, v: number | undefined): [string, string] => [
    `${what} ${a}->${b} ${op} ${show(v)}`,
    `${what} ${b}->${a} ${op} ${show(v)}`,
  ];
  return {
    deadMin: pair('dead', '>=', req.deadTime?.min),
    deadMax: pair('dead', '<=', req.deadTime?.max),
    gapMin: pair('gap', '>=', req.gap?.min),
    overlap: `phases never both above ${Math.round((req.gap?.level ?? GAP_LEVEL) * 1000) / 10} % of swing`,
    widthMin: Object.fromEntries(widthNets.map((n) => [n, `width ${n} >= ${show(req.width?.min)}`])),
    subjects: requirementSubjects(req, widthNets),
  };
}

export function requirementChecks(
  m: PhaseMeasurement | MeasurementFailure,
  req: Requirements,
  context: WidthContext,
  labels: RequirementLabels,
): Check[] {
  const subjects = labels.subjects;
  if (!m.ok)
    return [
      { kind: 'steady-state', subject: subjects.steadyState, name: 'periodic steady state', margin: null, pass: false, detail: m.reason },
    ];
  const checks: Check[] = [];
  const [first, second] = m.deadTimes;
  checks.push({
    ...marginCheck('non-overlap', subjects.overlap, labels.overlap, Math.min(first.gapBound, second.gapBound)),
    parts: [{ margin: first.gapBound }, { margin: second.gapBound }],
  });
  const min = req.deadTime?.min;
  const max = req.deadTime?.max;
  const gap = req.gap?.min;
  for (let k = 0; k < 2; k++) {
    const d = m.deadTimes[k]!;
    if (min !== undefined) checks.push(marginCheck('dead-time-min', subjects.deadMin[k]!, labels.deadMin[k]!, d.t50 - min));
    if (max !== undefined) checks.push(marginCheck('dead-time-max', subjects.deadMax[k]!, labels.deadMax[k]!, max - d.t50));
    if (gap !== undefined) checks.push(marginCheck('gap-min', subjects.gapMin[k]!, labels.gapMin[k]!, d.gapBound - gap));
  }
  const minWidth = req.width?.min;
  if (minWidth !== undefined) {
    for (const phase in m.widths) {
      const subject = subjects.widthMin.get(phase) ?? { type: 'width', net: phase, limit: minWidth };
      checks.push(
        marginCheck('width-min', subject, labels.widthMin[phase] ?? `width ${phase}`, worstWidth(m.widths[phase]!, context) - minWidth),
      );
    }
  }
  return checks;
}
