/**
 * What tune ranks by. A designer wants the switches to conduct as long as they can: the useful
 * conduction time of a switch is its narrowest on-window (latest turn-on to earliest turn-off over
 * its signal range), i.e. the phase width less the dead times and the switch's own turn-on and
 * turn-off delays; without switches, the phase width. The objective takes its least over switches
 * and corners (usually the slow corner, where the dead time is largest). The design may ask for the
 * least largest dead time instead, or a weighted score (tune.weights in the design file).
 */
import type { Design } from '../schema/design.js';
import type { CornerResult } from './evaluate.js';
import { wrapTime } from '../measure/wrap-time.js';

export interface TuneObjective {
  readonly kind: 'conduction' | 'dead-time' | 'weighted';
  /** Score = conduction × least conduction time + margin × least margin − deadTime × largest dead time (s). */
  readonly weights: { readonly conduction: number; readonly margin: number; readonly deadTime: number };
}

export function objectiveOf(design: Design): TuneObjective {
  const t = design.tune;
  const kind = t?.objective ?? 'conduction';
  if (kind === 'conduction') return { kind, weights: { conduction: 1, margin: 0, deadTime: 0 } };
  if (kind === 'dead-time') return { kind, weights: { conduction: 0, margin: 0, deadTime: 1 } };
  return { kind, weights: t?.weights ?? { conduction: 1, margin: 0, deadTime: 0 } };
}

/** Least useful conduction time at one corner, s (NaN when the corner did not settle or a switch never switches). */
export function usefulConduction(result: CornerResult, period: number): number {
  const m = result.measurement;
  if (!m.ok) return NaN;
  let least = Infinity;
  for (const s of result.switches) {
    if (s.status !== 'switching') return NaN;
    least = Math.min(least, wrapTime(s.offEarliest - s.onLatest, period));
  }
  if (least === Infinity) for (const w of Object.values(m.widths)) least = Math.min(least, w);
  return least;
}

export interface Conduction {
  /** Least useful conduction time over the corners, s (NaN if a corner has none). */
  readonly time: number;
  readonly corner: string;
}

export function leastConduction(results: readonly CornerResult[], period: number): Conduction {
  let time = Infinity;
  let corner = '';
  for (const r of results) {
    const t = usefulConduction(r, period);
    if (Number.isNaN(t)) return { time: NaN, corner: r.corner.name };
    if (t < time) {
      time = t;
      corner = r.corner.name;
    }
  }
  return { time, corner };
}

/** The figures a score reads: least conduction time, least margin and largest dead time, s. */
export interface ScoreInputs {
  readonly conduction: number;
  readonly margin: number;
  readonly deadMax: number;
}

/** Larger is better; NaN inputs score -Infinity. */
export function score(objective: TuneObjective, x: ScoreInputs): number {
  const w = objective.weights;
  const s =
    (w.conduction > 0 ? w.conduction * x.conduction : 0) +
    (w.margin > 0 ? w.margin * x.margin : 0) -
    (w.deadTime > 0 ? w.deadTime * x.deadMax : 0);
  return Number.isFinite(s) ? s : -Infinity;
}

/** Words for the objective, for the report's headline. */
export function objectiveText(o: TuneObjective): string {
  if (o.kind === 'conduction') return 'longest useful conduction time first';
  if (o.kind === 'dead-time') return 'least largest dead time first';
  const w = o.weights;
  return `highest score first (${w.conduction} × conduction + ${w.margin} × margin − ${w.deadTime} × largest dead time)`;
}
