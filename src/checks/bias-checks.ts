/**
 * The switch bias checks, from the node voltages in each phase state at one corner (and one
 * mismatch sample): off-state (the gate holds the switch off against both terminals wherever it
 * must be off), on-state (it conducts from both terminals' worst level wherever it must conduct)
 * and stress (no forward-biased junction, every terminal-pair voltage within the card's ratings).
 * Margins are volts, positive when met; no delay chain changes them.
 */
import type { CornerDevices, DeviceAtCorner } from '../process/device.js';
import { bulkAt, deviceOn, gateLevel, offStateMargin, onOverdrive, terminalSpan, thresholdAt } from '../switches/bias.js';
import { rangeHigh, rangeLow, type StateIndex } from '../switches/nodes.js';
import { offStateAllowance } from '../switches/physics.js';
import type { SwitchDevicePlan, SwitchPlan } from '../switches/plan.js';
import { VOLTAGE_KINDS, type Check, type CheckData, type CheckSubject } from './check.js';

/** Points across a tgate's terminal span at which its on-state is evaluated (ends included). */
const SPAN_POINTS = 9;
/** Rounding slack for levels that are equal by construction (e.g. a body tied to the node it guards), V. */
const EPS = 1e-9;
export const STATES: readonly StateIndex[] = [0, 1, 2];

export interface BiasSettings {
  /** Decades of sub-threshold current an off switch must keep below its threshold current. */
  readonly offDecades: number;
  /** A fixed off-state allowance instead, V. */
  readonly offMargin?: number;
  /** Labels of the phase states: the two phase names and the dead time. */
  readonly stateLabels: readonly [string, string, string];
}

/** Default offDecades: two decades, see README "Switch terminals and nodes" for why not three. */
export const DEFAULT_OFF_DECADES = 2;

export interface BiasCheckNames {
  readonly off: string;
  readonly on: string;
  readonly stress: string;
  /** The subject of all three: the switch. */
  readonly subject: CheckSubject;
}

/** Whether the phase states of a switch's gate are known (always with declared terminals). */
export function hasBiasChecks(plan: SwitchPlan): boolean {
  return plan.devices.every((d) => d.onIn !== null);
}

/** Names of each switch's bias checks, made once per design; null for a switch without them. */
export function biasCheckNames(plans: readonly SwitchPlan[], rated: boolean): Array<BiasCheckNames | null> {
  return plans.map((plan) => {
    if (!hasBiasChecks(plan)) return null;
    const limited = plan.declared ? '' : ' (terminals undeclared)';
    return {
      off: `${plan.name} holds off${limited}`,
      on: `${plan.name} turns on${limited}`,
      stress: `${plan.name} ${rated ? 'within ratings' : 'junctions reverse-biased'}${limited}`,
      subject: { type: 'switch', switch: plan.name, offIn: STATES.filter((state) => switchOffIn(plan, state)) },
    };
  });
}

/** Whether every device of the switch is off in a phase state: there it must be off; elsewhere it must conduct. */
export function switchOffIn(plan: SwitchPlan, state: StateIndex): boolean {
  return plan.devices.every((d) => !deviceOn(d, state));
}

/** The off-state allowance of a device at a temperature, V: offMargin, else offDecades sub-threshold decades. */
export function allowanceFor(d: DeviceAtCorner, celsius: number, settings: BiasSettings): number {
  return settings.offMargin ?? offStateAllowance(settings.offDecades, d.params.subthresholdN, celsius);
}

const volts = (v: number) => `${v.toFixed(3)} V`;
const mv = (v: number) => `${Math.round(v * 1e3)} mV`;

function terminalWords(plan: SwitchPlan, state: StateIndex, vdd: number): string {
  return plan.terminals
    .map((t) => {
      const lo = rangeLow(t.states[state], vdd);
      const hi = rangeHigh(t.states[state], vdd);
      return `${t.name} ${hi - lo > EPS ? `${lo.toFixed(3)}..${volts(hi)}` : volts(lo)}`;
    })
    .join(', ');
}

const deviceName = (plan: SwitchPlan, device: SwitchDevicePlan) =>
  plan.type === 'tgate' ? `the ${device.kind} device of ${plan.name}` : `${plan.name} (${plan.type})`;

interface OffWorst {
  margin: number;
  device: number;
  state: StateIndex;
  source: number;
  sourceTerminal: number;
  gate: number;
  bulk: number;
  vt: number;
  allowance: number;
}

/** An off device's source: the terminal that would turn it on, the lower one for n, the higher one for p. */
export function offSource(plan: SwitchPlan, n: boolean, state: StateIndex, vdd: number): { source: number; terminal: 0 | 1 } {
  const [a, b] = plan.terminals;
  const va = n ? rangeLow(a.states[state], vdd) : rangeHigh(a.states[state], vdd);
  const vb = n ? rangeLow(b.states[state], vdd) : rangeHigh(b.states[state], vdd);
  return (n ? vb < va : vb > va) ? { source: vb, terminal: 1 } : { source: va, terminal: 0 };
}

/**
 * How many points of a conducting state's terminal span the on-state is evaluated at: one device
 * is worst at an end of the span (its overdrive is monotonic in the voltage); a tgate's best device
 * changes across it, so it is sampled.
 */
export function spanPointCount(plan: SwitchPlan, span: { readonly low: number; readonly high: number }): number {
  return span.high - span.low <= EPS ? 1 : plan.devices.length === 1 ? 1 : SPAN_POINTS;
}

/** The k-th of `points` on-state points of the span (see spanPointCount), V. */
export function spanPoint(plan: SwitchPlan, span: { readonly low: number; readonly high: number }, k: number, points: number): number {
  return plan.devices.length === 1
    ? plan.devices[0]!.kind === 'n'
      ? span.high
      : span.low
    : points === 1
      ? span.low
      : span.low + ((span.high - span.low) * k) / (points - 1);
}

type BiasKind = 'off-state' | 'on-state' | 'stress';
const NAME_OF: Readonly<Record<BiasKind, 'off' | 'on' | 'stress'>> = { 'off-state': 'off', 'on-state': 'on', stress: 'stress' };

/** A bias check with a margin, V, in the phase state it is least in; a failing one gets its words from the caller (`{ ...check, detail }`). */
export function biasCheck(kind: BiasKind, names: BiasCheckNames, plan: SwitchPlan, margin: number, phase: string): Check {
  return { kind, subject: names.subject, name: names[NAME_OF[kind]], margin, pass: margin >= 0, switch: plan.name, phase };
}

/** The off-state check of a switch whose gate never opens it, or the on-state check of one whose gate never turns it on. */
export function neverCheck(kind: 'off-state' | 'on-state', names: BiasCheckNames, plan: SwitchPlan): Check {
  const never =
    kind === 'off-state'
      ? 'is on in every phase and the dead time: its gate never opens it'
      : 'is off in every phase: its gate never turns it on';
  return {
    kind,
    subject: names.subject,
    name: names[NAME_OF[kind]],
    margin: null,
    pass: false,
    switch: plan.name,
    detail: `${plan.name} (${plan.type}) ${never}`,
  };
}

/** The least off-state margin over the devices and the states in which the switch must be off; null when it is never off. */
export function offStateWorst(
  plan: SwitchPlan,
  devices: CornerDevices,
  dvth: ArrayLike<number> | undefined,
  settings: BiasSettings,
): OffWorst | null {
  const vdd = devices.vdd;
  let worst: OffWorst | null = null;
  for (const state of STATES) {
    if (!switchOffIn(plan, state)) continue;
    for (let i = 0; i < plan.devices.length; i++) {
      const device = plan.devices[i]!;
      const n = device.kind === 'n';
      const d = n ? devices.n : devices.p;
      const { source, terminal: sourceTerminal } = offSource(plan, n, state, vdd);
      const gate = gateLevel(plan, device, state, vdd);
      const bulk = bulkAt(plan, device.kind, state, vdd);
      const shift = dvth ? dvth[i]! : 0;
      const allowance = allowanceFor(d, devices.corner.temperature, settings);
      const margin = offStateMargin(device.kind, d, gate, source, bulk, shift, allowance);
      if (worst === null || margin < worst.margin) {
        worst = {
          margin,
          device: i,
          state,
          source,
          sourceTerminal,
          gate,
          bulk,
          vt: thresholdAt(device.kind, d, source, bulk, shift),
          allowance,
        };
      }
    }
  }
  return worst;
}

export function offDetail(plan: SwitchPlan, w: OffWorst, vdd: number, settings: BiasSettings): string {
  const device = plan.devices[w.device]!;
  const n = device.kind === 'n';
  const terminal = plan.terminals[w.sourceTerminal]!;
  // Reverse conduction: the terminal acting as source sits beyond what the switch passes while it
  // conducts, so current would flow back through it (a boosted node discharging into a rail).
  let onLow = Infinity;
  let onHigh = -Infinity;
  for (const s of STATES) {
    if (switchOffIn(plan, s)) continue;
    const span = terminalSpan(plan, s, vdd);
    onLow = Math.min(onLow, span.low);
    onHigh = Math.max(onHigh, span.high);
  }
  const reverse = Number.isFinite(onLow) && (n ? w.source < onLow - EPS : w.source > onHigh + EPS);
  const drive = n ? `V_GS ${volts(w.gate - w.source)}` : `V_SG ${volts(w.source - w.gate)}`;
  const from = w.margin + w.allowance;
  const where = `in ${settings.stateLabels[w.state]}`;
  const head = `${deviceName(plan, device)} ${where} is not held off: gate ${volts(w.gate)}, terminals ${terminalWords(plan, w.state, vdd)}`;
  const cause = reverse
    ? `; ${terminal.name} at ${volts(w.source)} acts as source, ${n ? 'below' : 'above'} the ${volts(n ? onLow : onHigh)} the switch passes when on: reverse conduction`
    : `; ${terminal.name} at ${volts(w.source)} acts as source`;
  const numbers = `; ${drive} against ${n ? 'V_T' : '|V_T|'} ${volts(w.vt)} (body ${volts(w.bulk)}) less the ${mv(w.allowance)} sub-threshold allowance`;
  const distance = from < 0 ? `: ${mv(-from)} past turn-on` : `: ${mv(from)} from turning on, inside the allowance`;
  return head + cause + numbers + distance;
}

interface OnWorst {
  margin: number;
  state: StateIndex;
  v: number;
  gate: number;
}

/** The least gate overdrive over the states in which the switch must conduct and its terminal span there; null when it never conducts. */
export function onStateWorst(plan: SwitchPlan, devices: CornerDevices, dvth: ArrayLike<number> | undefined): OnWorst | null {
  const vdd = devices.vdd;
  let worst: OnWorst | null = null;
  for (const state of STATES) {
    if (switchOffIn(plan, state)) continue;
    const span = terminalSpan(plan, state, vdd);
    const points = spanPointCount(plan, span);
    for (let k = 0; k < points; k++) {
      const v = spanPoint(plan, span, k, points);
      let best = -Infinity;
      let gateOfBest = NaN;
      for (let i = 0; i < plan.devices.length; i++) {
        const device = plan.devices[i]!;
        if (!deviceOn(device, state)) continue;
        const d = device.kind === 'n' ? devices.n : devices.p;
        const gate = gateLevel(plan, device, state, vdd);
        const od = onOverdrive(device.kind, d, gate, v, bulkAt(plan, device.kind, state, vdd), dvth ? dvth[i]! : 0);
        if (od > best) {
          best = od;
          gateOfBest = gate;
        }
      }
      if (worst === null || best < worst.margin) worst = { margin: best, state, v, gate: gateOfBest };
    }
  }
  return worst;
}

export function onDetail(plan: SwitchPlan, w: OnWorst, vdd: number, settings: BiasSettings): string {
  return (
    `${plan.name} (${plan.type}) in ${settings.stateLabels[w.state]} does not conduct at ${volts(w.v)}: gate ${volts(w.gate)}, terminals ${terminalWords(plan, w.state, vdd)}; ` +
    `the gate swing falls ${mv(-w.margin)} short of the turn-on level there`
  );
}

/** Which limit a stress margin is: the junction, |V_GS| or |V_GD|, |V_DS|, |V_GB|. */
type StressLimit = 0 | 1 | 2 | 3;

interface StressWorst {
  margin: number;
  state: StateIndex;
  device: number;
  limit: StressLimit;
}

interface StressValues {
  readonly gate: number;
  readonly bulk: number;
  readonly lo: number;
  readonly hi: number;
  readonly vg: number;
  readonly vds: number;
  readonly vgb: number;
}

function stressValues(plan: SwitchPlan, device: SwitchDevicePlan, state: StateIndex, vdd: number): StressValues {
  const [a, b] = plan.terminals;
  const aLo = rangeLow(a.states[state], vdd);
  const aHi = rangeHigh(a.states[state], vdd);
  const bLo = rangeLow(b.states[state], vdd);
  const bHi = rangeHigh(b.states[state], vdd);
  const gate = gateLevel(plan, device, state, vdd);
  const bulk = bulkAt(plan, device.kind, state, vdd);
  return {
    gate,
    bulk,
    lo: Math.min(aLo, bLo),
    hi: Math.max(aHi, bHi),
    vg: Math.max(Math.abs(gate - aLo), Math.abs(gate - aHi), Math.abs(gate - bLo), Math.abs(gate - bHi)),
    vds: Math.max(aHi - bLo, bHi - aLo),
    vgb: Math.abs(gate - bulk),
  };
}

/**
 * The least stress margin over the devices and states: with ratings, the rating less each of
 * |V_GS| or |V_GD|, |V_DS| and |V_GB| at their largest, and minus the forward bias of a junction
 * (a terminal below the body of an n device or above that of a p device) if there is one;
 * without ratings, the junctions' least reverse bias.
 */
export function stressWorst(plan: SwitchPlan, devices: CornerDevices): StressWorst {
  const vdd = devices.vdd;
  let worst: StressWorst = { margin: Infinity, state: 0, device: 0, limit: 0 };
  const consider = (margin: number, state: StateIndex, device: number, limit: StressLimit) => {
    if (margin < worst.margin) worst = { margin, state, device, limit };
  };
  for (const state of STATES) {
    for (let i = 0; i < plan.devices.length; i++) {
      const device = plan.devices[i]!;
      const x = stressValues(plan, device, state, vdd);
      const junction = device.kind === 'n' ? x.lo - x.bulk : x.bulk - x.hi;
      const rating = (device.kind === 'n' ? devices.n : devices.p).params.ratings;
      // With ratings, a reverse-biased junction leaves the margin to them; a forward bias always counts.
      if (junction < -EPS || !rating) consider(Math.abs(junction) < EPS ? 0 : junction, state, i, 0);
      if (!rating) continue;
      consider(rating.vgs - x.vg, state, i, 1);
      consider(rating.vds - x.vds, state, i, 2);
      consider(rating.vgb - x.vgb, state, i, 3);
    }
  }
  return worst;
}

export function stressDetail(plan: SwitchPlan, w: StressWorst, devices: CornerDevices, settings: BiasSettings): string {
  const device = plan.devices[w.device]!;
  const x = stressValues(plan, device, w.state, devices.vdd);
  const who = `in ${settings.stateLabels[w.state]}, ${deviceName(plan, device)}`;
  const where = `gate ${volts(x.gate)}, body ${volts(x.bulk)}, terminals ${terminalWords(plan, w.state, devices.vdd)}`;
  if (w.limit === 0) {
    return device.kind === 'n'
      ? `${who}: a terminal at ${volts(x.lo)} is below the body at ${volts(x.bulk)}: the source/drain junction is forward-biased (${where})`
      : `${who}: a terminal at ${volts(x.hi)} is above the body at ${volts(x.bulk)}: the source/drain junction is forward-biased (${where})`;
  }
  const rating = (device.kind === 'n' ? devices.n : devices.p).params.ratings!;
  const [what, value, limit] =
    w.limit === 1
      ? (['|V_GS| or |V_GD|', x.vg, rating.vgs] as const)
      : w.limit === 2
        ? (['|V_DS|', x.vds, rating.vds] as const)
        : (['|V_GB|', x.vgb, rating.vgb] as const);
  return `${who}: ${what} ${volts(value)} exceeds the ${device.kind}-device rating ${volts(limit)} (${where})`;
}

/** A switch's stress check at a corner (no threshold in it: a Monte Carlo die does not move it). */
export function stressCheck(plan: SwitchPlan, names: BiasCheckNames, devices: CornerDevices, settings: BiasSettings): Check {
  const stress = stressWorst(plan, devices);
  const check = biasCheck('stress', names, plan, stress.margin, settings.stateLabels[stress.state]);
  return check.pass ? check : { ...check, detail: stressDetail(plan, stress, devices, settings) };
}

/**
 * All bias checks of every switch at one corner, appended to `checks` (which is returned): the
 * reference the per-corner BiasChecker (bias-frame.ts) must equal bit for bit.
 */
export function biasChecks(
  plans: readonly SwitchPlan[],
  devices: CornerDevices,
  mismatch: readonly ArrayLike<number>[] | undefined,
  settings: BiasSettings,
  names: ReadonlyArray<BiasCheckNames | null>,
  checks: Check[] = [],
): Check[] {
  const vdd = devices.vdd;
  for (let k = 0; k < plans.length; k++) {
    const name = names[k];
    if (!name) continue;
    const plan = plans[k]!;
    const dvth = mismatch?.[k];
    const off = offStateWorst(plan, devices, dvth, settings);
    if (off === null) checks.push(neverCheck('off-state', name, plan));
    else {
      const check = biasCheck('off-state', name, plan, off.margin, settings.stateLabels[off.state]);
      checks.push(check.pass ? check : { ...check, detail: offDetail(plan, off, vdd, settings) });
    }
    const on = onStateWorst(plan, devices, dvth);
    if (on === null) checks.push(neverCheck('on-state', name, plan));
    else {
      const check = biasCheck('on-state', name, plan, on.margin, settings.stateLabels[on.state]);
      checks.push(check.pass ? check : { ...check, detail: onDetail(plan, on, vdd, settings) });
    }
    checks.push(stressCheck(plan, name, devices, settings));
  }
  return checks;
}

/** A switch whose bias checks fail somewhere: the failing kinds and the first failure's corner and words. */
export interface SwitchFault {
  readonly switch: string;
  readonly kinds: readonly string[];
  readonly corner: string;
  readonly detail?: string;
}

/** Switches with a failing off-state, on-state or stress check over a set of corners, in the order first met. */
export function switchFaults(corners: Iterable<{ readonly name: string; readonly checks: readonly CheckData[] }>): SwitchFault[] {
  const faults = new Map<string, { switch: string; kinds: string[]; corner: string; detail?: string }>();
  for (const c of corners) {
    for (const k of c.checks) {
      if (k.pass || !VOLTAGE_KINDS.has(k.kind)) continue;
      const name = k.switch ?? k.name;
      const seen = faults.get(name);
      if (!seen) faults.set(name, { switch: name, kinds: [k.kind], corner: c.name, ...(k.detail ? { detail: k.detail } : {}) });
      else if (!seen.kinds.includes(k.kind)) seen.kinds.push(k.kind);
    }
  }
  return [...faults.values()];
}

/** Words naming the switches that no delay chain can fix, or null when there are none. */
export function switchFaultAdvice(faults: readonly SwitchFault[]): string | null {
  if (faults.length === 0) return null;
  const list = faults.map((f) => `${f.switch} (${f.kinds.join(', ')})`).join(', ');
  return `no delay chain can fix ${list}: change the switch's gate drive (a boosted or level-shifted swing), its device type, its body connection or the node voltages`;
}
