/**
 * Break-before-make at the switches, from a deck's measured switch instants: the simulator's
 * margin beside the model's, worked out the same way from each side's instants. A switch
 * conducts from its earliest turn-on to its latest turn-off over the instants measured (both
 * ends of its signal range, each device of a transmission gate), as in the model.
 */
import { handover } from '../measure/phases.js';
import { alignNear } from '../switches/conduction.js';
import type { BreakBeforeMakeComparison } from '../report/confirm-report.js';
import type { Quantity } from './measures.js';

export interface BreakBeforeMakePair {
  /** The check's name, as check prints it. */
  readonly name: string;
  readonly between: readonly [string, string];
  /** s */
  readonly guard: number;
}

export interface Conduction {
  readonly on: number;
  readonly off: number;
}

/** Earliest turn-on and latest turn-off, s (deck time), from instants `time(q)`; null if one is missing. */
export function conduction(events: readonly Quantity[], time: (q: Quantity) => number | null, period: number): Conduction | null {
  let on = NaN;
  let off = NaN;
  for (const q of events) {
    const t = time(q);
    if (t === null) return null;
    if (q.event!.event === 'on') on = Number.isNaN(on) ? t : Math.min(on, alignNear(t, on, period));
    else off = Number.isNaN(off) ? t : Math.max(off, alignNear(t, off, period));
  }
  return Number.isNaN(on) || Number.isNaN(off) ? null : { on, off };
}

function margin(a: Conduction, b: Conduction, guard: number, period: number): number {
  return Math.min(handover(a.off, a.on, b.on, period), handover(b.off, b.on, a.on, period)) - guard;
}

/**
 * Every pair whose two switches are both in the deck; `measured` gives the simulator's value of a
 * quantity by name (null when it did not measure it).
 */
export function breakBeforeMakeMargins(
  quantities: readonly Quantity[],
  measured: (name: string) => number | null,
  pairs: readonly BreakBeforeMakePair[],
  period: number,
): BreakBeforeMakeComparison[] {
  const out: BreakBeforeMakeComparison[] = [];
  for (const pair of pairs) {
    const [a, b] = pair.between.map((name) => quantities.filter((q) => q.event?.switch === name));
    if (a!.length === 0 || b!.length === 0) continue;
    const model = (q: Quantity) => q.event!.anchor + q.model;
    const sim = (q: Quantity) => {
      const v = measured(q.name);
      return v === null ? null : q.event!.anchor + v;
    };
    const ma = conduction(a!, model, period)!;
    const mb = conduction(b!, model, period)!;
    const modelMargin = margin(ma, mb, pair.guard, period);
    const sa = conduction(a!, sim, period);
    const sb = conduction(b!, sim, period);
    const simMargin = sa && sb ? margin(sa, sb, pair.guard, period) : null;
    out.push({
      check: pair.name,
      model: modelMargin,
      simulator: simMargin,
      agrees: simMargin !== null && simMargin >= 0 === modelMargin >= 0,
    });
  }
  return out;
}
