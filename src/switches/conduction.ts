/**
 * When each switch conducts at one corner (SPEC 2.4): the instants its gate ramp crosses the
 * device's turn-on level, V_S + V_TN for an n device and V_S - |V_TP| for a p device, with body
 * effect, at every point of the signal range it passes. A tgate conducts while either device does.
 */
import type { CornerDevices, DeviceAtCorner } from '../process/device.js';
import type { CycleIndex } from '../measure/phases.js';
import { levelAt } from '../schema/level.js';
import { bodyThreshold, rampCrossing, triodeResistance, type GateRamp } from './physics.js';
import type { SwitchDevicePlan, SwitchPlan } from './plan.js';

/** Points across the signal range at which a tgate is evaluated (ends included). */
const SIGNAL_POINTS = 9;

export interface SwitchConduction {
  readonly name: string;
  readonly type: SwitchPlan['type'];
  /** 'switching' when it turns on and off once per period at every signal point. */
  readonly status: 'switching' | 'never' | 'always' | 'unknown';
  /** Words for a status other than switching. */
  readonly detail: string;
  /** Widest conduction over the signal range: earliest turn-on and latest turn-off, s (absolute). */
  readonly on: number;
  readonly off: number;
  /** Narrowest conduction: latest turn-on and earliest turn-off, s (absolute). */
  readonly onLatest: number;
  readonly offEarliest: number;
  /** Worst (largest) triode on-resistance over the signal range with the gate fully driven, ohm. */
  readonly ron: number;
}

/** x - ref wrapped into (-T/2, T/2], added back to ref: the copy of x nearest ref. */
export function alignNear(x: number, ref: number, period: number): number {
  let d = (x - ref) % period;
  if (d > period / 2) d -= period;
  else if (d <= -period / 2) d += period;
  return ref + d;
}

interface Interval {
  readonly state: 'switching' | 'never' | 'always';
  readonly on: number;
  readonly off: number;
}

/** A switch gate's rising and falling ramp in the period, after any level shifter. */
export interface GateWave {
  readonly rise: GateRamp;
  readonly fall: GateRamp;
}

/** The gate ramps of one device of a switch, or why its net has none. */
export function gateWave(plan: SwitchPlan, device: SwitchDevicePlan, cycles: CycleIndex, vdd: number): GateWave | string {
  const cycle = cycles.cycle(device.net);
  if (typeof cycle === 'string') return `its gate net ${cycle}`;
  const ls = plan.levelShifter;
  const low = ls ? levelAt(ls.low, vdd) : 0;
  const high = ls ? levelAt(ls.high, vdd) : vdd;
  const delay = ls ? ls.delay : 0;
  const riseT = ls?.transition ?? cycle.riseTransition;
  const fallT = ls?.transition ?? cycle.fallTransition;
  // An inverting level shifter turns the net's fall into the gate's rise and the other way round.
  const invert = ls?.invert === true;
  return {
    rise: { t50: (invert ? cycle.fall : cycle.rise) + delay, transition: invert ? fallT : riseT, low, high, rising: true },
    fall: { t50: (invert ? cycle.rise : cycle.fall) + delay, transition: invert ? riseT : fallT, low, high, rising: false },
  };
}

/**
 * Turn-on level of a device's gate at signal vs, and its overdrive with the gate fully driven;
 * `dvth` is a local mismatch shift of its threshold magnitude, V.
 */
export function deviceLevels(plan: SwitchPlan, device: SwitchDevicePlan, d: DeviceAtCorner, vs: number, low: number, high: number, vdd: number, dvth: number) {
  const bulk = bulkLevel(plan, device.kind, vdd);
  if (device.kind === 'n') {
    const vt = bodyThreshold(d.vth + dvth, d.gamma, d.phi2f, vs - bulk);
    return { level: vs + vt, overdrive: high - vs - vt };
  }
  const vt = bodyThreshold(d.vth + dvth, d.gamma, d.phi2f, bulk - vs);
  return { level: vs - vt, overdrive: vs - vt - low };
}

/** Body voltage of a switch device, V: the declared one, else 0 V for n and the highest gate or signal level for p. */
export function bulkLevel(plan: SwitchPlan, kind: SwitchDevicePlan['kind'], vdd: number): number {
  if (plan.bulk) return levelAt(plan.bulk, vdd);
  if (kind === 'n') return 0;
  const high = plan.levelShifter ? levelAt(plan.levelShifter.high, vdd) : vdd;
  return Math.max(high, levelAt(plan.signal.max, vdd));
}

function deviceInterval(device: SwitchDevicePlan, wave: GateWave, level: number): Interval {
  const { low, high } = wave.rise;
  if (device.kind === 'n') {
    if (level >= high) return { state: 'never', on: NaN, off: NaN };
    if (level <= low) return { state: 'always', on: NaN, off: NaN };
    return { state: 'switching', on: rampCrossing(wave.rise, level), off: rampCrossing(wave.fall, level) };
  }
  if (level <= low) return { state: 'never', on: NaN, off: NaN };
  if (level >= high) return { state: 'always', on: NaN, off: NaN };
  return { state: 'switching', on: rampCrossing(wave.fall, level), off: rampCrossing(wave.rise, level) };
}

/** Union of two devices' conduction (a tgate); overlapping intervals are assumed (their phases agree). */
function union(a: Interval, b: Interval, period: number): Interval {
  if (a.state === 'always' || b.state === 'always') return { state: 'always', on: NaN, off: NaN };
  if (a.state === 'never') return b;
  if (b.state === 'never') return a;
  return {
    state: 'switching',
    on: Math.min(a.on, alignNear(b.on, a.on, period)),
    off: Math.max(a.off, alignNear(b.off, a.off, period)),
  };
}

/** `dvth[i]`, if given, shifts the threshold of plan.devices[i] (local mismatch), V. */
export function switchConduction(plan: SwitchPlan, cycles: CycleIndex, devices: CornerDevices, dvth?: ArrayLike<number>): SwitchConduction {
  const vdd = devices.vdd;
  const T = cycles.period;
  const count = plan.devices.length;
  const waves: GateWave[] = [];
  for (let i = 0; i < count; i++) {
    const wave = gateWave(plan, plan.devices[i]!, cycles, vdd);
    if (typeof wave === 'string') return failed(plan, 'unknown', wave);
    waves.push(wave);
  }
  const vMin = levelAt(plan.signal.min, vdd);
  const vMax = levelAt(plan.signal.max, vdd);
  // A single device's turn-on level and resistance are monotonic in the signal, so its range ends
  // bound it; a tgate's resistance peaks inside the range, so it is sampled across.
  const points = vMin === vMax ? 1 : count === 1 ? 2 : SIGNAL_POINTS;
  let on = NaN; let off = NaN; let onLatest = NaN; let offEarliest = NaN;
  let ron = 0;
  for (let k = 0; k < points; k++) {
    const vs = points === 1 ? vMin : vMin + ((vMax - vMin) * k) / (points - 1);
    let interval: Interval = NEVER;
    let conductance = 0;
    for (let i = 0; i < count; i++) {
      const device = plan.devices[i]!;
      const wave = waves[i]!;
      const d = device.kind === 'n' ? devices.n : devices.p;
      const { level, overdrive } = deviceLevels(plan, device, d, vs, wave.rise.low, wave.rise.high, vdd, dvth ? dvth[i]! : 0);
      const own = deviceInterval(device, wave, level);
      interval = i === 0 ? own : union(interval, own, T);
      const r = triodeResistance(d.kprime, device.w, device.l, overdrive);
      if (Number.isFinite(r)) conductance += 1 / r;
    }
    if (interval.state === 'never') return failed(plan, 'never', `${plan.name} never conducts at a signal of ${vs.toFixed(3)} V: its gate swing does not reach the turn-on level`);
    if (interval.state === 'always') return failed(plan, 'always', `${plan.name} conducts all the time at a signal of ${vs.toFixed(3)} V: its gate swing never turns it off`);
    if (k === 0) {
      on = onLatest = interval.on;
      off = offEarliest = interval.off;
    } else {
      const onK = alignNear(interval.on, on, T);
      const offK = alignNear(interval.off, off, T);
      if (onK < on) on = onK;
      if (onK > onLatest) onLatest = onK;
      if (offK > off) off = offK;
      if (offK < offEarliest) offEarliest = offK;
    }
    const r = conductance > 0 ? 1 / conductance : Infinity;
    if (r > ron) ron = r;
  }
  return { name: plan.name, type: plan.type, status: 'switching', detail: '', on, off, onLatest, offEarliest, ron };
}

const NEVER: Interval = { state: 'never', on: NaN, off: NaN };

function failed(plan: SwitchPlan, status: SwitchConduction['status'], detail: string): SwitchConduction {
  return { name: plan.name, type: plan.type, status, detail, on: NaN, off: NaN, onLatest: NaN, offEarliest: NaN, ron: Infinity };
}
