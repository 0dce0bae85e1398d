/**
 * What a timing diagram shows, as plain data: the rows with each corner's waveform, the switch
 * conduction windows, the dead-time and break-before-make marks with their values and verdicts,
 * and the two handover windows worth a close look. Times are relative to the start of the
 * reported period (the clock's rising 50 % point), s. The SVG renderer only draws this.
 */
import { greatest, least as d3least } from 'd3-array';
import type { CornerResult } from '../analysis/evaluate.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { resultEdgeShape } from '../analysis/edge-shape.js';
import type { SwitchConduction } from '../switches/conduction.js';
import { signalRows, type NetChoice, type SignalRow } from './rows.js';
import { netWave, type NetWave } from './waveform.js';
import { wrapTime } from '../measure/wrap-time.js';
import { handoverWindows, type TimeWindow } from './windows.js';
import { compareChecks, type Check, type CheckKind, type DeadTimeIndex } from '../checks/check.js';
import type { SwitchPlan } from '../switches/plan.js';
import type { StateIndex } from '../switches/nodes.js';
import { circuitWaves, type CircuitWaves } from './circuit-waves.js';

export interface CornerWave {
  readonly corner: string;
  readonly wave: NetWave;
}

export interface DiagramRow extends SignalRow {
  /** One waveform per corner drawn (one for a single corner). */
  readonly waves: readonly CornerWave[];
  /** The waveform drawn as a line: the chosen corner, or the worst one in an overlay. */
  readonly reference: NetWave;
}

/** A conduction window, relative times; off may exceed the period (it wraps). */
export interface Conduction {
  readonly corner: string;
  /** Widest window over the signal range: earliest on to latest off, s. */
  readonly on: number;
  readonly off: number;
  /** Narrowest window: latest on to earliest off, s. */
  readonly onLatest: number;
  readonly offEarliest: number;
}

export interface SwitchRow {
  readonly name: string;
  readonly type: SwitchConduction['type'];
  /** The phase whose active time holds the conduction, for its colour; null if neither. */
  readonly phase: 0 | 1 | null;
  readonly windows: readonly Conduction[];
  /** Corners at which the switch does not switch, with the reason. */
  readonly problems: ReadonlyArray<{ readonly corner: string; readonly detail: string }>;
  /** Where it must be off and whether its gate holds it off there; null without an off-state check. */
  readonly offState: OffStateMark | null;
}

/** The phase states in which a switch must be off, in the reference period, and its off-state check. */
export interface OffStateMark {
  /** Intervals of the period in which it must be off, s from the window start (an end may pass the period: it wraps). */
  readonly intervals: ReadonlyArray<{ readonly start: number; readonly end: number; readonly state: string }>;
  /** Least off-state margin over the corners drawn, V; null when it could not be measured. */
  readonly margin: number | null;
  readonly pass: boolean;
  /** Corner and phase state of the least margin, and the check's words when it fails. */
  readonly corner: string;
  readonly phase: string;
  readonly detail: string;
}

export type MarkRole = 'single' | 'least' | 'most';

/** One dimension between two instants, with the value shown and its verdict. */
export interface SpanMark {
  readonly role: MarkRole;
  readonly corner: string;
  /** Start and end of the span, s; end - start is the value shown. */
  readonly start: number;
  readonly end: number;
  readonly value: number;
  readonly pass: boolean;
  /** Why it fails, in words ('' when it passes). */
  readonly reason: string;
}

/** A handover's span with its check's margin for it (value less the guard or the order's minimum), s. */
export interface HandoverMark extends SpanMark {
  readonly margin: number;
  /** What the check takes off the handover besides the guard (the model's measured switch-instant error), s. */
  readonly modelError: number;
}

export interface DeadTimeMarks {
  readonly from: string;
  readonly to: string;
  readonly marks: readonly SpanMark[];
  /** Clean gap at 10 % of swing of the `single`/`least` corner, s. */
  readonly gap: number;
}

/** A timing constraint between two switch events: break-before-make (off, then on) or an order. */
export interface BreakBeforeMakeMarks {
  readonly kind: 'break-before-make' | 'order';
  readonly name: string;
  /** The switch whose event comes first, and the one whose event must follow. */
  readonly from: string;
  readonly to: string;
  readonly fromEvent: 'on' | 'off';
  readonly toEvent: 'on' | 'off';
  /** Least time required between the two events (guard or order minimum), s. */
  readonly guard: number;
  /** value = the time from the first event to the second. */
  readonly marks: readonly HandoverMark[];
}

/** A settle path's common on-window at its worst corner and the time it needs. */
export interface SettleMark {
  readonly name: string;
  readonly corner: string;
  /** Start and end of the on-window, s from the window start of the reported period. */
  readonly start: number;
  readonly end: number;
  /** On-time needed, s (ln(1/epsilon) * R_on * C); end - start - derating - needed is the margin. */
  readonly needed: number;
  readonly margin: number;
  readonly pass: boolean;
}

/** A settle path that could not be measured at some corner (a member does not switch, or cannot conduct): a failure without a window. */
export interface SettleUnmeasured {
  readonly name: string;
  readonly corner: string;
  readonly reason: string;
  readonly pass: false;
}

export interface Diagram {
  readonly design: string;
  readonly mode: 'corner' | 'all';
  /** Corner name, or a count of corners for an overlay. */
  readonly cornerLabel: string;
  readonly referenceCorner: string;
  readonly frequency: number;
  readonly period: number;
  readonly model: string;
  readonly card: string;
  readonly verdict: { readonly pass: boolean; readonly failing: number; readonly checks: number };
  readonly rows: readonly DiagramRow[];
  readonly switches: readonly SwitchRow[];
  readonly deadTimes: readonly DeadTimeMarks[];
  readonly breakBeforeMake: readonly BreakBeforeMakeMarks[];
  readonly settle: ReadonlyArray<SettleMark | SettleUnmeasured>;
  readonly windows: readonly [TimeWindow, TimeWindow];
  /** Corners left out of an overlay and why. */
  readonly excluded: ReadonlyArray<{ readonly corner: string; readonly reason: string }>;
  /** The reference corner's circuit node waveforms over one period; null without a circuit. */
  readonly circuit: CircuitWaves | null;
}

export type DiagramChoice = { readonly kind: 'corner'; readonly index: number } | { readonly kind: 'all'; readonly reference: number };

function relative(t: number, result: CornerResult): number {
  return wrapTime(t - result.simulation.windowStart, result.simulation.period);
}

export function buildDiagram(resolved: ResolvedDesign, results: readonly CornerResult[], choice: DiagramChoice, nets: NetChoice): Diagram {
  const { design, netlist } = resolved;
  const period = 1 / design.clock.frequency;
  const refIndex = choice.kind === 'corner' ? choice.index : choice.reference;
  const chosen = choice.kind === 'corner' ? [results[refIndex]!] : results;
  const measured = chosen.filter((r) => r.measurement.ok);
  const excluded = chosen
    .filter((r) => !r.measurement.ok)
    .map((r) => ({ corner: r.corner.name, reason: r.measurement.ok ? '' : r.measurement.reason }));
  const refResult = results[refIndex]!;
  const reference = refResult.measurement.ok ? refResult : (measured[0] ?? refResult);
  // Edges drawn as the delay model shapes them, where the switch instants are read. The reference
  // is always among the drawn results (the chosen one, the first measured, or alone).
  const drawn = measured.length > 0 ? measured : [reference];
  const shapes = new Map(drawn.map((r) => [r, resultEdgeShape(resolved, r)]));
  const rows: DiagramRow[] = signalRows(netlist, nets).map((row) => ({
    ...row,
    waves: drawn.map((r) => ({ corner: r.corner.name, wave: netWave(r, netlist, row.net, shapes.get(r)) })),
    reference: netWave(reference, netlist, row.net, shapes.get(reference)),
  }));
  const switches = switchRows(resolved, measured, reference);
  const deadTimes = deadTimeMarks(measured, choice.kind === 'corner');
  const breakBeforeMake = bbmMarks(resolved, measured, choice.kind === 'corner');
  const settle = settleMarks(resolved, measured);
  const clockFall = reference.corner.duty * period;
  const events: Array<{ t: number; lo: number; hi: number }> = [];
  for (const row of rows) {
    for (const { wave } of row.waves)
      for (const r of wave.ramps) events.push({ t: r.t50, lo: r.t50 - r.transition / 2, hi: r.t50 + r.transition / 2 });
  }
  for (const s of switches)
    for (const w of s.windows) for (const t of [w.on, w.off, w.onLatest, w.offEarliest]) events.push({ t, lo: t, hi: t });
  const checks = chosen.flatMap((r) => r.checks);
  return {
    design: design.name,
    mode: choice.kind,
    cornerLabel: choice.kind === 'corner' ? refResult.corner.name : `all ${results.length} corners`,
    referenceCorner: reference.corner.name,
    frequency: design.clock.frequency,
    period,
    model: resolved.model.name,
    card: resolved.card.name,
    verdict: { pass: checks.every((c) => c.pass), failing: checks.filter((c) => !c.pass).length, checks: checks.length },
    rows,
    switches,
    deadTimes,
    breakBeforeMake,
    settle,
    windows: handoverWindows(period, clockFall, events),
    excluded,
    circuit: circuitWaves(resolved, reference),
  };
}

function switchRows(resolved: ResolvedDesign, measured: readonly CornerResult[], reference: CornerResult): SwitchRow[] {
  const period = 1 / resolved.design.clock.frequency;
  const phases = resolved.netlist.source.phases;
  const refCycles = reference.measurement.ok ? reference.measurement.cycles : {};
  return resolved.switches.map((plan) => {
    const windows: Conduction[] = [];
    const problems: Array<{ corner: string; detail: string }> = [];
    for (const r of measured) {
      const s = r.switches.find((x) => x.name === plan.name);
      if (!s) continue;
      if (s.status !== 'switching') {
        problems.push({ corner: r.corner.name, detail: s.detail });
        continue;
      }
      const on = relative(s.on, r);
      windows.push({
        corner: r.corner.name,
        on,
        off: on + wrapTime(s.off - s.on, period),
        onLatest: on + wrapTime(s.onLatest - s.on, period),
        offEarliest: on + wrapTime(s.offEarliest - s.on, period),
      });
    }
    let phase: 0 | 1 | null = null;
    const first = windows[0];
    if (first) {
      const mid = wrapTime((first.onLatest + first.offEarliest) / 2, period);
      phases.forEach((p, i) => {
        const c = refCycles[p];
        if (!c) return;
        const rise = relative(c.rise, reference);
        const high = wrapTime(relative(c.fall, reference) - rise, period);
        if (wrapTime(mid - rise, period) <= high) phase = i as 0 | 1;
      });
    }
    return {
      name: plan.name,
      type: plan.type,
      phase,
      windows,
      problems,
      offState: offStateMark(resolved, plan, measured.length > 0 ? measured : [reference], reference),
    };
  });
}

/**
 * The phase states of the reference period as intervals (phase 1 active, the dead time after it,
 * phase 2 active, the dead time after that), s from the window start; empty if it did not settle.
 */
export function stateIntervals(
  resolved: ResolvedDesign,
  reference: CornerResult,
): Array<{ start: number; end: number; state: StateIndex; label: string }> {
  if (!reference.measurement.ok) return [];
  const period = 1 / resolved.design.clock.frequency;
  const [a, b] = resolved.netlist.source.phases;
  const ca = reference.measurement.cycles[a];
  const cb = reference.measurement.cycles[b];
  if (!ca || !cb) return [];
  const labels = resolved.bias.stateLabels;
  const riseA = relative(ca.rise, reference);
  const fallA = riseA + wrapTime(ca.fall - ca.rise, period);
  const riseB = fallA + wrapTime(cb.rise - ca.fall, period);
  const fallB = riseB + wrapTime(cb.fall - cb.rise, period);
  const next = riseA + period;
  return [
    { start: riseA, end: fallA, state: 0, label: labels[0] },
    { start: fallA, end: riseB, state: 2, label: labels[2] },
    { start: riseB, end: fallB, state: 1, label: labels[1] },
    { start: fallB, end: next, state: 2, label: labels[2] },
  ];
}

function offStateMark(
  resolved: ResolvedDesign,
  plan: SwitchPlan,
  results: readonly CornerResult[],
  reference: CornerResult,
): OffStateMark | null {
  const k = resolved.switchIndex.get(plan.name)!;
  const subject = resolved.biasNames[k]?.subject;
  if (!subject) return null;
  let worst: { check: Check; corner: string } | null = null;
  for (const r of results) {
    const c = r.checks.find((x) => x.kind === 'off-state' && x.subject === subject);
    if (c && (worst === null || compareChecks(c, worst.check) < 0)) worst = { check: c, corner: r.corner.name };
  }
  if (!worst) return null;
  const intervals = stateIntervals(resolved, reference)
    .filter((i) => subject.type === 'switch' && subject.offIn.includes(i.state))
    .map((i) => ({ start: i.start, end: i.end, state: i.label }));
  return {
    intervals,
    margin: worst.check.margin,
    pass: worst.check.pass,
    corner: worst.corner,
    phase: worst.check.phase ?? '',
    detail: worst.check.detail ?? '',
  };
}

/** Words for a dead time that fails a check of this kind. */
const DEAD_TIME_WORDS: Partial<Record<CheckKind, string>> = {
  'non-overlap': 'the phases overlap',
  'dead-time-min': 'below the least dead time',
  'dead-time-max': 'above the largest dead time',
  'gap-min': 'clean gap too short',
};

/** Whether a check fails at dead time `index`: its part there, or the whole check when that dead time is all it covers. */
function failsAtDeadTime(check: Check, index: DeadTimeIndex): boolean {
  if (check.subject.type !== 'dead-time') return false;
  const at = check.subject.deadTimes.indexOf(index);
  if (at < 0) return false;
  const part = check.parts?.[at];
  return part ? part.margin < 0 : !check.pass;
}

function deadTimeMarks(measured: readonly CornerResult[], single: boolean): DeadTimeMarks[] {
  const out: DeadTimeMarks[] = [];
  for (const index of [0, 1] as const) {
    const all = measured.flatMap((r) => {
      if (!r.measurement.ok) return [];
      const d = r.measurement.deadTimes[index];
      const start = relative(d.start, r);
      const reasons = r.checks.filter((c) => failsAtDeadTime(c, index)).map((c) => DEAD_TIME_WORDS[c.kind] ?? c.name);
      return [
        {
          d,
          mark: {
            role: 'single' as MarkRole,
            corner: r.corner.name,
            start,
            end: start + d.t50,
            value: d.t50,
            pass: reasons.length === 0,
            reason: reasons.join('; '),
          },
        },
      ];
    });
    if (all.length === 0) continue;
    const least = d3least(all, (m) => m.d.t50) ?? all[0]!;
    const most = greatest(all, (m) => m.d.t50) ?? all[0]!;
    const marks: SpanMark[] =
      single || least === most
        ? [{ ...least.mark, role: single ? 'single' : 'least' }]
        : [
            { ...least.mark, role: 'least' },
            { ...most.mark, role: 'most' },
          ];
    out.push({ from: least.d.from, to: least.d.to, marks, gap: least.d.gap });
  }
  return out;
}

/** Words for a handover that fails: the second event came first, or too soon. */
const HANDOVER_WORDS = {
  'break-before-make': { reversed: 'both conduct at once', short: 'less than the guard time' },
  order: { reversed: 'the order is reversed', short: 'less than the required time' },
} as const;

/** Each handover of every break-before-make and order check, at the corner where its part's margin is least. */
function bbmMarks(resolved: ResolvedDesign, measured: readonly CornerResult[], single: boolean): BreakBeforeMakeMarks[] {
  const out: BreakBeforeMakeMarks[] = [];
  for (const subject of resolved.switchCheckLabels.subjects) {
    if (subject.type !== 'switch-events') continue;
    const words = HANDOVER_WORDS[subject.constraint];
    subject.handovers.forEach((handover, h) => {
      let worst: HandoverMark | null = null;
      for (const r of measured) {
        const part = r.checks.find((c) => c.subject === subject)?.parts?.[h];
        if (part?.start === undefined || part.span === undefined) continue;
        const start = relative(part.start, r);
        const pass = part.margin >= 0;
        const mark: HandoverMark = {
          role: single ? 'single' : 'least',
          corner: r.corner.name,
          start,
          end: start + part.span,
          value: part.span,
          pass,
          reason: pass ? '' : part.span < 0 ? words.reversed : words.short,
          margin: part.margin,
          modelError: Math.max(0, (part.need ?? subject.min) - subject.min),
        };
        if (worst === null || mark.margin < worst.margin) worst = mark;
      }
      if (worst) {
        out.push({
          kind: subject.constraint,
          name: subject.label,
          from: handover.first.switch,
          to: handover.then.switch,
          fromEvent: handover.first.event,
          toEvent: handover.then.event,
          guard: subject.min,
          marks: [worst],
        });
      }
    });
  }
  return out;
}

/** Each settle path at the corner where its check's margin is least (the check's own window and need). */
function settleMarks(resolved: ResolvedDesign, measured: readonly CornerResult[]): Array<SettleMark | SettleUnmeasured> {
  const out: Array<SettleMark | SettleUnmeasured> = [];
  for (const subject of resolved.switchCheckLabels.subjects) {
    if (subject.type !== 'settle') continue;
    let worst: SettleMark | null = null;
    let unmeasured: SettleUnmeasured | null = null;
    for (const r of measured) {
      const check = r.checks.find((c) => c.subject === subject);
      if (check && check.margin === null) {
        unmeasured ??= { name: subject.path, corner: r.corner.name, reason: check.detail ?? 'not measurable', pass: false };
        continue;
      }
      const part = check?.parts?.[0];
      if (!check || check.margin === null || part?.start === undefined || part.span === undefined || part.need === undefined) continue;
      const start = relative(part.start, r);
      const mark: SettleMark = {
        name: subject.path,
        corner: r.corner.name,
        start,
        end: start + part.span,
        needed: part.need,
        margin: check.margin,
        pass: check.pass,
      };
      if (worst === null || check.margin < worst.margin) worst = mark;
    }
    // A corner where the path cannot be measured fails it outright: that is what the lane shows.
    const shown = unmeasured ?? worst;
    if (shown) out.push(shown);
  }
  return out;
}
