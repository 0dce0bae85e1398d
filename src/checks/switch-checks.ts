/**
 * Constraints at the switches (docs/physics.md, "Switches and constraints"): break-before-make at every handover, event ordering and
 * RC settling of series paths. Margins are seconds, positive when met, worst over the signal range.
 */
import type { ConstraintsSpec } from '../schema/switches.js';
import { formatStated, formatTime } from '../units/format.js';
import { alignNear, type SwitchConduction } from '../switches/conduction.js';
import { bitsToError, settlingTimeConstants } from '../switches/physics.js';
import type { Check, CheckSubject } from './check.js';
import { handover } from '../measure/phases.js';
import { wrapTime } from '../measure/wrap-time.js';

/**
 * Time from `a` stopping to `b` starting, s: positive when b starts while a is off, minus the
 * overlap when b starts while a is still on.
 */
export function handoverGap(a: SwitchConduction, b: SwitchConduction, period: number): number {
  return handover(a.off, a.on, b.on, period);
}

/**
 * The model's own timing path of the handover from `a` turning off to `b` turning on, s: the time
 * between their gate nets' 50 % edges plus each instant's lag behind its edge (0 for a switch that
 * does not say its edges). What the switch-instant error band is a fraction of (instant-band.ts).
 */
export function handoverPath(a: SwitchConduction, b: SwitchConduction, period: number): number {
  if (a.offEdge === undefined || b.onEdge === undefined) return 0;
  const edges = Math.abs(alignNear(b.onEdge, a.offEdge, period) - a.offEdge);
  const lagA = Math.abs(alignNear(a.off, a.offEdge, period) - a.offEdge);
  const lagB = Math.abs(alignNear(b.on, b.onEdge, period) - b.onEdge);
  return edges + lagA + lagB;
}

function unmeasurable(kind: Check['kind'], subject: CheckSubject, name: string, who: readonly SwitchConduction[]): Check | null {
  const bad = who.find((s) => s.status !== 'switching');
  return bad ? { kind, subject, name, margin: null, pass: false, detail: bad.detail } : null;
}

/**
 * The time every switch of a series path conducts together, s, from its latest common turn-on to
 * its earliest turn-off, less `derating`; and the path's worst on-resistance, ohm.
 */
export function settleWindow(
  members: readonly SwitchConduction[],
  period: number,
  derating = 0,
): { start: number; end: number; window: number; resistance: number } {
  const ref = members[0]!.onLatest;
  let start = -Infinity;
  let end = Infinity;
  let resistance = 0;
  for (const s of members) {
    // Switches of one path turn on together, so their on instants are aligned to one another;
    // each one's off instant is the first after its own on (a window may exceed half a period).
    const on = alignNear(s.onLatest, ref, period);
    start = Math.max(start, on);
    end = Math.min(end, on + wrapTime(s.offEarliest - s.onLatest, period));
    resistance += s.ron;
  }
  return { start, end, window: end - start - derating, resistance };
}

/** On-time a settle path needs, ln(1/epsilon) * R_on,total * C, s. */
export function settleTime(path: ConstraintsSpec['settle'][number], resistance: number): number {
  return settlingTimeConstants(path.error ?? bitsToError(path.bits!)) * resistance * path.capacitance;
}

/** What a break-before-make pair requires, in words (its check's name unless the user named it). */
function bbmRequirement(bbm: ConstraintsSpec['breakBeforeMake'][number], guard: number): string {
  return `${bbm.between[0]}/${bbm.between[1]} break-before-make${guard > 0 ? ` + ${formatStated(guard, 's')}` : ''}`;
}

/** What an order constraint requires, in words. */
function orderRequirement(o: ConstraintsSpec['order'][number]): string {
  return `${o.first.switch} ${o.first.event} before ${o.then.switch} ${o.then.event}${o.min > 0 ? ` by ${formatStated(o.min, 's')}` : ''}`;
}

/** Display names of every switch constraint, in the order appendSwitchChecks emits them; computed once per design. */
export function switchCheckNames(constraints: ConstraintsSpec, defaultGuard: number): string[] {
  return [
    ...constraints.breakBeforeMake.map((bbm) => bbm.name ?? bbmRequirement(bbm, bbm.guard ?? defaultGuard)),
    ...constraints.order.map((o) => o.name ?? orderRequirement(o)),
    ...constraints.settle.map(
      (path) => `${path.name} settles to ${path.bits !== undefined ? `${path.bits} bits` : `${path.error ?? bitsToError(path.bits!)}`}`,
    ),
  ];
}

/** Names and subjects of every switch constraint's check, in the order appendSwitchChecks emits them; made once per design. */
export interface SwitchCheckLabels {
  readonly names: readonly string[];
  readonly subjects: readonly CheckSubject[];
}

/** `derating` (s) is what appendSwitchChecks takes off every settle window (its `windowDerating`). */
export function switchCheckLabels(constraints: ConstraintsSpec, defaultGuard: number, derating = 0): SwitchCheckLabels {
  const subjects: CheckSubject[] = [
    ...constraints.breakBeforeMake.map((bbm): CheckSubject => {
      const [a, b] = bbm.between;
      const guard = bbm.guard ?? defaultGuard;
      return {
        type: 'switch-events',
        constraint: 'break-before-make',
        min: guard,
        handovers: [
          { first: { switch: a, event: 'off' }, then: { switch: b, event: 'on' } },
          { first: { switch: b, event: 'off' }, then: { switch: a, event: 'on' } },
        ],
        label: bbm.name ?? `${a}/${b}`,
        requirement: bbmRequirement(bbm, guard),
        named: bbm.name !== undefined,
      };
    }),
    ...constraints.order.map(
      (o, k): CheckSubject => ({
        type: 'switch-events',
        constraint: 'order',
        min: o.min,
        handovers: [{ first: o.first, then: o.then }],
        label: o.name ?? `order ${k + 1}`,
        requirement: orderRequirement(o),
        named: o.name !== undefined,
      }),
    ),
    ...constraints.settle.map((path): CheckSubject => ({ type: 'settle', path: path.name, switches: path.switches, derating })),
  ];
  return { names: switchCheckNames(constraints, defaultGuard), subjects };
}

/** What one design's switch constraints are checked with, the same at every corner: made once per evaluator. */
export interface SwitchCheckSetup {
  readonly constraints: ConstraintsSpec;
  /** Break-before-make guard where a constraint names none, s. */
  readonly defaultGuard: number;
  /** Clock period, s. */
  readonly period: number;
  /** Shortens every on-window for settling, s: the input duty error moves a phase's width one for one. */
  readonly windowDerating: number;
  /** The checks' names, `switchCheckNames(constraints, defaultGuard)`, formatted once per design. */
  readonly names: readonly string[];
  /** The checks' subjects, in the same order (`switchCheckLabels`). */
  readonly subjects: readonly CheckSubject[];
  /**
   * The model's measured error on a break-before-make handover, as a fraction of its path
   * (`handoverPath`, instant-band.ts): taken off each handover, as the gap check takes the delay
   * model's band off the clean gap, so a margin inside the error is not a pass. 0: none.
   */
  readonly instantBand?: number;
}

/**
 * All switch constraints at one corner, appended to `checks` (which is returned): the evaluator
 * collects every kind of check into one list without copying it.
 */
export function appendSwitchChecks(setup: SwitchCheckSetup, get: (name: string) => SwitchConduction, checks: Check[]): Check[] {
  const { constraints, defaultGuard, period, windowDerating, names, subjects } = setup;
  let slot = 0;
  for (const bbm of constraints.breakBeforeMake) {
    const [a, b] = bbm.between.map(get) as [SwitchConduction, SwitchConduction];
    const guard = bbm.guard ?? defaultGuard;
    const subject = subjects[slot]!;
    const name = names[slot++]!;
    const bad = unmeasurable('break-before-make', subject, name, [a, b]);
    if (bad) {
      checks.push(bad);
      continue;
    }
    const ab = handoverGap(a, b, period);
    const ba = handoverGap(b, a, period);
    const band = setup.instantBand ?? 0;
    const errAb = band * handoverPath(a, b, period);
    const errBa = band * handoverPath(b, a, period);
    const margin = Math.min(ab - errAb, ba - errBa) - guard;
    const inside = margin < 0 && Math.min(ab, ba) - guard >= 0;
    checks.push({
      kind: 'break-before-make',
      subject,
      name,
      margin,
      pass: margin >= 0,
      ...(inside
        ? {
            detail: `the handover clears its guard by ${formatTime(Math.min(ab, ba) - guard)} in the model, less than the model's measured switch-instant error there (${formatTime(Math.max(errAb, errBa))}); confirm it with ngspice`,
          }
        : {}),
      parts: [
        { margin: ab - errAb - guard, start: a.off, span: ab, need: guard + errAb },
        { margin: ba - errBa - guard, start: b.off, span: ba, need: guard + errBa },
      ],
    });
  }
  for (const order of constraints.order) {
    const first = get(order.first.switch);
    const then = get(order.then.switch);
    const subject = subjects[slot]!;
    const name = names[slot++]!;
    const bad = unmeasurable('order', subject, name, [first, then]);
    if (bad) {
      checks.push(bad);
      continue;
    }
    // Worst case: the first event as late as it gets, the second as early.
    const tFirst = order.first.event === 'on' ? first.onLatest : first.off;
    const tThen = order.then.event === 'on' ? then.on : then.offEarliest;
    const span = alignNear(tThen, tFirst, period) - tFirst;
    const margin = span - order.min;
    checks.push({ kind: 'order', subject, name, margin, pass: margin >= 0, parts: [{ margin, start: tFirst, span, need: order.min }] });
  }
  for (const path of constraints.settle) {
    const members = path.switches.map(get);
    const subject = subjects[slot]!;
    const name = names[slot++]!;
    const bad = unmeasurable('settle', subject, name, members);
    if (bad) {
      checks.push(bad);
      continue;
    }
    const { start, end, window, resistance } = settleWindow(members, period, windowDerating);
    const needed = settleTime(path, resistance);
    const margin = window - needed;
    checks.push(
      Number.isFinite(margin)
        ? { kind: 'settle', subject, name, margin, pass: margin >= 0, parts: [{ margin, start, span: end - start, need: needed }] }
        : {
            kind: 'settle',
            subject,
            name,
            margin: null,
            pass: false,
            detail: `a switch of ${path.name} cannot conduct at some signal level (infinite on-resistance)`,
          },
    );
  }
  return checks;
}
