/** Requirement checks on a corner's phase measurements (dead time, clean gap, width, overlap). */
import type { Requirements } from '../schema/design.js';
import { formatTime } from '../units/format.js';
import type { MeasurementFailure, PhaseMeasurement } from '../measure/phases.js';
import { marginCheck, type Check } from './check.js';

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

/** The requirement values as they appear in check names, formatted once per design. */
export interface RequirementLabels {
  readonly deadMin: string;
  readonly deadMax: string;
  readonly gapMin: string;
  readonly widthMin: string;
}

export function requirementLabels(req: Requirements): RequirementLabels {
  const show = (v: number | undefined) => (v === undefined ? '' : formatTime(v));
  return { deadMin: show(req.deadTime?.min), deadMax: show(req.deadTime?.max), gapMin: show(req.gap?.min), widthMin: show(req.width?.min) };
}

export function requirementChecks(m: PhaseMeasurement | MeasurementFailure, req: Requirements, context: WidthContext,
  labels: RequirementLabels = requirementLabels(req)): Check[] {
  if (!m.ok) return [{ kind: 'steady-state', name: 'periodic steady state', margin: null, pass: false, detail: m.reason }];
  const checks: Check[] = [];
  const label = (d: { from: string; to: string }) => `${d.from}->${d.to}`;
  checks.push(marginCheck('non-overlap', 'phases never active together', Math.min(m.deadTimes[0].t50, m.deadTimes[1].t50)));
  for (const d of m.deadTimes) {
    const min = req.deadTime?.min;
    const max = req.deadTime?.max;
    if (min !== undefined) checks.push(marginCheck('dead-time-min', `dead ${label(d)} >= ${labels.deadMin}`, d.t50 - min));
    if (max !== undefined) checks.push(marginCheck('dead-time-max', `dead ${label(d)} <= ${labels.deadMax}`, max - d.t50));
    const gap = req.gap?.min;
    if (gap !== undefined) checks.push(marginCheck('gap-min', `gap ${label(d)} >= ${labels.gapMin}`, d.gap - gap));
  }
  const minWidth = req.width?.min;
  if (minWidth !== undefined) {
    for (const [phase, width] of Object.entries(m.widths)) {
      checks.push(marginCheck('width-min', `width ${phase} >= ${labels.widthMin}`, worstWidth(width, context) - minWidth));
    }
  }
  return checks;
}
