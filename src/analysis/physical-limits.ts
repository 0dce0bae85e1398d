/**
 * Rules between fields that the schema cannot see alone: the clock's edges must fit in its
 * shortest half period, and a switch cannot be shorter than the card's minimum length.
 */
import type { Design } from '../schema/design.js';
import type { ProcessCard } from '../schema/process.js';
import type { SourcedCorner } from '../process/corners.js';
import { InputError, showValue, type InputIssue } from '../errors.js';
import { formatEngineering, formatPs } from '../units/format.js';

/**
 * The shortest time the input clock stays high or low, s: at the duty of each corner moved by the
 * duty tolerance towards the nearer end.
 */
export function shortestHalfPeriod(design: Design, corners: readonly SourcedCorner[]): { time: number; duty: number } {
  const period = 1 / design.clock.frequency;
  const tolerance = design.clock.dutyTolerance;
  let worst = { time: Infinity, duty: design.clock.duty };
  for (const { corner } of corners) {
    const high = corner.duty - tolerance;
    const low = 1 - corner.duty - tolerance;
    const fraction = Math.min(high, low);
    if (fraction * period < worst.time) worst = { time: fraction * period, duty: high <= low ? high : 1 - low };
  }
  return worst;
}

export function checkPhysicalLimits(design: Design, card: ProcessCard, corners: readonly SourcedCorner[]): void {
  const issues: InputIssue[] = [];
  const half = shortestHalfPeriod(design, corners);
  const transition = design.clock.transition;
  if (half.time <= 0) {
    issues.push({
      code: 'physics.limit',
      path: ['clock', 'dutyTolerance'],
      value: showValue(design.clock.dutyTolerance),
      expected: `leaves the clock no high or low time at duty ${showValue(half.duty)}; the duty plus or minus the tolerance must stay inside (0, 1)`,
    });
  } else if (!(transition < half.time)) {
    issues.push({
      code: 'physics.limit',
      path: ['clock', 'transition'],
      value: formatPs(transition),
      expected: `must be shorter than the clock's shortest half period, ${formatPs(half.time)} (duty ${half.duty.toFixed(3)} within tolerance at ${formatEngineering(design.clock.frequency, 'Hz')})`,
    });
  }
  design.switches.forEach((s, i) => {
    if (s.l < card.lmin) {
      issues.push({
        code: 'physics.limit',
        path: ['switches', i, 'l'],
        value: `${Number(s.l.toPrecision(4))} m`,
        expected: `is shorter than the process card's minimum length lmin = ${formatEngineering(card.lmin, 'm')} (${card.name})`,
      });
    }
  });
  if (issues.length > 0) throw new InputError(issues);
}
