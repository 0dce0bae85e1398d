/**
 * Why no searched chain passes: every check the closest candidate fails and where, dead-time
 * requirements that no chain can meet together, switches that never turn on or off (no delay
 * changes that), and whether a wider search could help at all.
 */
import type { Design } from '../schema/design.js';
import type { Check } from '../checks/check.js';
import type { CornerResult } from './evaluate.js';

export interface FailingCheck {
  readonly check: string;
  readonly kind: Check['kind'];
  /** Corners where it fails, the least margin first (stable: corner order among equals). */
  readonly corners: readonly string[];
  /** Its least margin over those corners (s, or V for the switch bias kinds; null: unmeasurable). */
  readonly worst: number | null;
}

/** A switch that does not turn on and off once per period at some corner. */
export interface StuckSwitch {
  readonly switch: string;
  /** never: it never conducts; always: it never turns off; unknown: its instants could not be found. */
  readonly status: 'never' | 'always' | 'unknown';
  readonly corners: readonly string[];
  readonly detail: string;
}

/** Requirements no searched chain can meet together. */
export interface Conflict {
  /** Requirement ends, s. */
  readonly min: number;
  readonly max: number;
  /** Largest over smallest dead time over the corners of the closest candidate, and the least of any settled searched candidate. */
  readonly spread: number;
  readonly leastSpread: number;
}

/** Why nothing passes. */
export interface Diagnosis {
  /** The closest candidate's failing checks. */
  readonly failing: readonly FailingCheck[];
  /** The dead-time minimum and maximum conflict: the corner spread of every searched chain exceeds max/min. */
  readonly conflict: Conflict | null;
  /** Switches that never turn on or never turn off in the closest candidate. */
  readonly stuck: readonly StuckSwitch[];
  /** Whether a wider search (more stages or load) can help: only checks that want more delay fail, no conflict, no stuck switch. */
  readonly widen: boolean;
}

/** Check kinds that more chain delay helps (the others want less of it, or a slower clock). */
export const WANTS_DELAY: ReadonlySet<string> = new Set(['non-overlap', 'dead-time-min', 'gap-min', 'break-before-make', 'order']);

export function failingChecks(results: readonly CornerResult[]): FailingCheck[] {
  const byName = new Map<string, { kind: Check['kind']; at: Array<{ corner: string; margin: number }> }>();
  for (const r of results) {
    for (const c of r.checks) {
      if (c.pass) continue;
      const f = byName.get(c.name) ?? { kind: c.kind, at: [] };
      f.at.push({ corner: r.corner.name, margin: c.margin ?? -Infinity });
      byName.set(c.name, f);
    }
  }
  return [...byName].map(([check, { kind, at }]) => {
    const sorted = at.sort((a, b) => a.margin - b.margin);
    const worst = sorted[0]!.margin;
    return { check, kind, corners: sorted.map((x) => x.corner), worst: Number.isFinite(worst) ? worst : null };
  });
}

export function stuckSwitches(results: readonly CornerResult[]): StuckSwitch[] {
  const byName = new Map<string, { status: StuckSwitch['status']; corners: string[]; detail: string }>();
  for (const r of results) {
    for (const s of r.switches) {
      if (s.status === 'switching') continue;
      const seen = byName.get(s.name);
      if (seen) seen.corners.push(r.corner.name);
      else byName.set(s.name, { status: s.status, corners: [r.corner.name], detail: s.detail });
    }
  }
  return [...byName].map(([name, s]) => ({ switch: name, ...s }));
}

/** The closest candidate as diagnosis needs it. */
export interface Closest {
  readonly deadMin: number;
  readonly deadMax: number;
  readonly limiting: { readonly kind: string } | null;
  readonly failing: readonly FailingCheck[];
  readonly stuck: readonly StuckSwitch[];
}

/** What the closest candidate fails, whether the dead-time requirements conflict, and whether a wider search can help. */
export function diagnose(
  design: Design,
  closest: Closest | null,
  searched: ReadonlyArray<{ deadMin: number; deadMax: number }>,
): Diagnosis | null {
  if (!closest) return null;
  const failing = closest.failing;
  const req = design.requirements.deadTime;
  let conflict: Conflict | null = null;
  if (req?.min !== undefined && req.max !== undefined && req.min > 0) {
    const spreads = searched.filter((c) => Number.isFinite(c.deadMax) && c.deadMin > 0).map((c) => c.deadMax / c.deadMin);
    const leastSpread = Math.min(...spreads);
    if (spreads.length > 0 && leastSpread > req.max / req.min) {
      const spread = Number.isFinite(closest.deadMax) && closest.deadMin > 0 ? closest.deadMax / closest.deadMin : leastSpread;
      conflict = { min: req.min, max: req.max, spread, leastSpread };
    }
  }
  // A candidate that passes without the headroom fails only its limiting check's headroom.
  const kinds = failing.length > 0 ? failing.map((f) => f.kind) : closest.limiting ? [closest.limiting.kind] : [];
  const widen = conflict === null && closest.stuck.length === 0 && kinds.length > 0 && kinds.every((k) => WANTS_DELAY.has(k));
  return { failing, conflict, stuck: closest.stuck, widen };
}
