/**
 * When each switch conducts at one corner (docs/physics.md, "Switches and constraints"): the instants its gate ramp crosses the
 * device's turn-on level, V_S + V_TN for an n device and V_S - |V_TP| for a p device, with body
 * effect, at every point of the signal range it passes. A tgate conducts while either device does.
 */
import type { CornerDevices, DeviceAtCorner } from '../process/device.js';
import type { CycleIndex, NetCycle } from '../measure/phases.js';
import { centralTransitions, type EdgeShape } from '../measure/levels.js';
import { levelAt } from '../schema/level.js';
import { bodyThreshold, rampCrossing, triodeResistance, type GateRamp } from './physics.js';
import type { SwitchDevicePlan, SwitchPlan } from './plan.js';
import { bulkAt, deviceOn } from './bias.js';
import type { StateIndex } from './nodes.js';
import { shifterGateTiming, type ShifterGateTiming } from './shifter-timing.js';
import { latchShifter, type ShifterSizing } from './shifter-sizing.js';

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
  /**
   * 50 % times of the gate net's edges that turn the switch on and off (its first device's net,
   * before any level shifter), s (absolute): where the model's own part of each instant starts.
   */
  readonly onEdge?: number;
  readonly offEdge?: number;
}

/** x - ref wrapped into (-T/2, T/2], added back to ref: the copy of x nearest ref. */
export function alignNear(x: number, ref: number, period: number): number {
  let d = (x - ref) % period;
  if (d > period / 2) d -= period;
  else if (d <= -period / 2) d += period;
  return ref + d;
}

/** Whether a switch conducts at one signal point: never, always, or from a turn-on to a turn-off. */
type PointState = 0 | 1 | 2;
const NEVER = 0;
const ALWAYS = 1;
const SWITCHING = 2;

/** A switch gate's rising and falling ramp in the period, after any level shifter. */
export interface GateWave {
  readonly rise: GateRamp;
  readonly fall: GateRamp;
}

/**
 * The gate ramps of one device of a switch, or why its net has none. `shifter` is its level
 * shifter's timing at this corner (shifter-timing.ts), or a scale of the declared delay and
 * transition (1: as declared, the nominal corner's). A gate driven by its net itself takes the
 * net's edges as the delay model shapes them (`shape`, modelEdgeShape); a latch shifter's output
 * its fitted edge (shifter-shape.ts), any other shifter's the linear ramp of its delay and transition.
 */
export function gateWave(
  plan: SwitchPlan,
  device: SwitchDevicePlan,
  cycles: CycleIndex,
  vdd: number,
  shifter: number | ShifterGateTiming = 1,
  shape?: EdgeShape,
): GateWave | string {
  const cycle = cycles.cycle(device.net);
  if (typeof cycle === 'string') return `its gate net ${cycle}`;
  const ls = plan.levelShifter;
  const low = ls ? levelAt(ls.low, vdd) : 0;
  const high = ls ? levelAt(ls.high, vdd) : vdd;
  // An inverting level shifter turns the net's fall into the gate's rise and the other way round.
  const invert = ls?.invert === true;
  const inRise = invert ? cycle.fall : cycle.rise;
  const inFall = invert ? cycle.rise : cycle.fall;
  if (ls && typeof shifter !== 'number') {
    return {
      rise: { t50: inRise + shifter.riseDelay, transition: shifter.riseTransition, low, high, rising: true, shape: shifter.riseShape },
      fall: { t50: inFall + shifter.fallDelay, transition: shifter.fallTransition, low, high, rising: false, shape: shifter.fallShape },
    };
  }
  // A shifter's declared delay and transition hold at the nominal corner; `shifter` (see
  // shifter-timing.ts) carries them to this one.
  const scale = typeof shifter === 'number' ? shifter : 1;
  const delay = ls ? ls.delay * scale : 0;
  const riseT = ls?.transition !== undefined ? ls.transition * scale : cycle.riseTransition;
  const fallT = ls?.transition !== undefined ? ls.transition * scale : cycle.fallTransition;
  if (!ls && shape) {
    const net = device.net;
    return {
      rise: { t50: inRise, transition: riseT, low, high, rising: true, shape: (f) => shape(net, true, f) },
      fall: { t50: inFall, transition: fallT, low, high, rising: false, shape: (f) => shape(net, false, f) },
    };
  }
  return {
    rise: { t50: inRise + delay, transition: invert ? fallT : riseT, low, high, rising: true },
    fall: { t50: inFall + delay, transition: invert ? riseT : fallT, low, high, rising: false },
  };
}

/**
 * Threshold magnitude of a switch device at signal vs, with body effect, V; `dvth` is a local
 * mismatch shift of its threshold magnitude. The gate turns an n device on above vs + vt and a
 * p device below vs - vt.
 */
export function switchThreshold(
  plan: SwitchPlan,
  device: SwitchDevicePlan,
  d: DeviceAtCorner,
  vs: number,
  vdd: number,
  dvth: number,
): number {
  const bulk = bulkLevel(plan, device.kind, vdd);
  return bodyThreshold(d.switchVth + dvth, d.gamma, d.phi2f, device.kind === 'n' ? vs - bulk : bulk - vs);
}

/** Turn-on level of a device's gate at signal vs, V. */
export function turnOnLevel(plan: SwitchPlan, device: SwitchDevicePlan, d: DeviceAtCorner, vs: number, vdd: number, dvth: number): number {
  const vt = switchThreshold(plan, device, d, vs, vdd, dvth);
  return device.kind === 'n' ? vs + vt : vs - vt;
}

/**
 * Body voltage of a switch device while it conducts, V: a declared level, a declared node in the
 * phase state it conducts in, else 0 V for n and the highest gate or terminal level for p.
 */
export function bulkLevel(plan: SwitchPlan, kind: SwitchDevicePlan['kind'], vdd: number): number {
  if (plan.bulk) return levelAt(plan.bulk, vdd);
  return bulkAt(plan, kind, conductingState(plan), vdd);
}

/** The first phase state in which a device of the switch is on (phase 1 when none is known). */
export function conductingState(plan: SwitchPlan): StateIndex {
  for (let s = 0 as StateIndex; s < 3; s++) if (plan.devices.some((d) => deviceOn(d, s))) return s;
  return 0;
}

/** What a switch's level shifter reads beyond its corner's devices. */
export interface ShifterInputs {
  /** Per device of the switch, its shifter's transistor sizes when the deck builds it as the sized latch. */
  readonly sizes?: ReadonlyArray<ShifterSizing | null>;
  /** Threshold shift of the shifter's pull-downs (local mismatch), V. */
  readonly dvth?: number;
  /** The delay model's edge shapes at the corner, whose central slope drives the latch (centralTransitions). */
  readonly shape?: EdgeShape;
}

/**
 * The level shifter's timing for device `i` of a switch at this corner (1 without a shifter, or
 * when its net does not switch: gateWave then says why). Only the sized latch reads its net's
 * central slope; any other shifter takes the net's full-swing transition.
 */
export function deviceShifter(
  plan: SwitchPlan,
  i: number,
  cycles: CycleIndex,
  devices: CornerDevices,
  inputs: ShifterInputs = {},
): number | ShifterGateTiming {
  const ls = plan.levelShifter;
  if (!ls) return 1;
  const net = plan.devices[i]!.net;
  const cycle = cycles.cycle(net);
  if (typeof cycle === 'string') return 1;
  const size = inputs.sizes?.[i] ?? null;
  const slope = size && latchShifter(ls, devices.vdd) ? centralTransitions(net, cycle, inputs.shape) : cycle;
  return shifterGateTiming(ls, devices, cycle, size, inputs.dvth ?? 0, slope);
}

/**
 * `dvth[i]`, if given, shifts the threshold of plan.devices[i] (local mismatch), V; `shifterDvth`
 * the level shifter's pull-down; `shifterSizes[i]` the sizes of device i's shifter (shifter-sizes.ts);
 * `shape` the delay model's edge shapes at this corner (without: linear ramps).
 */
export function switchConduction(
  plan: SwitchPlan,
  cycles: CycleIndex,
  devices: CornerDevices,
  dvth?: ArrayLike<number>,
  shifterDvth = 0,
  shifterSizes?: ReadonlyArray<ShifterSizing | null>,
  shape?: EdgeShape,
): SwitchConduction {
  const vdd = devices.vdd;
  const T = cycles.period;
  const count = plan.devices.length;
  const waves: GateWave[] = [];
  for (let i = 0; i < count; i++) {
    const wave = gateWave(
      plan,
      plan.devices[i]!,
      cycles,
      vdd,
      deviceShifter(plan, i, cycles, devices, { sizes: shifterSizes, dvth: shifterDvth, shape }),
      shape,
    );
    if (typeof wave === 'string') return failed(plan, 'unknown', wave);
    waves.push(wave);
  }
  // Body voltages once per call: they do not depend on the signal point.
  const bulk0 = bulkLevel(plan, plan.devices[0]!.kind, vdd);
  const bulk1 = count > 1 ? bulkLevel(plan, plan.devices[1]!.kind, vdd) : bulk0;
  const vMin = levelAt(plan.signal.min, vdd);
  const vMax = levelAt(plan.signal.max, vdd);
  // A single device's turn-on level and resistance are monotonic in the signal, so its range ends
  // bound it; a tgate's resistance peaks inside the range, so it is sampled across.
  const points = vMin === vMax ? 1 : count === 1 ? 2 : SIGNAL_POINTS;
  let on = NaN;
  let off = NaN;
  let onLatest = NaN;
  let offEarliest = NaN;
  let ron = 0;
  for (let k = 0; k < points; k++) {
    const vs = points === 1 ? vMin : vMin + ((vMax - vMin) * k) / (points - 1);
    // Conduction at this signal point, device by device: a tgate conducts while either device
    // does (their windows overlap, as their phases agree). Plain numbers, no objects: this runs
    // for every switch of every Monte Carlo die.
    let state: PointState = NEVER;
    let pointOn = NaN;
    let pointOff = NaN;
    let conductance = 0;
    for (let i = 0; i < count; i++) {
      const device = plan.devices[i]!;
      const wave = waves[i]!;
      const { low, high } = wave.rise;
      const d = device.kind === 'n' ? devices.n : devices.p;
      const n = device.kind === 'n';
      const bulk = i === 0 ? bulk0 : bulk1;
      const vt = bodyThreshold(d.switchVth + (dvth ? dvth[i]! : 0), d.gamma, d.phi2f, n ? vs - bulk : bulk - vs);
      const level = n ? vs + vt : vs - vt;
      const overdrive = n ? high - vs - vt : vs - vt - low;
      const own: PointState = n
        ? level >= high
          ? NEVER
          : level <= low
            ? ALWAYS
            : SWITCHING
        : level <= low
          ? NEVER
          : level >= high
            ? ALWAYS
            : SWITCHING;
      if (state === ALWAYS || own === ALWAYS) state = ALWAYS;
      else if (own === SWITCHING) {
        const on = rampCrossing(n ? wave.rise : wave.fall, level);
        const off = rampCrossing(n ? wave.fall : wave.rise, level);
        if (state === NEVER) {
          state = SWITCHING;
          pointOn = on;
          pointOff = off;
        } else {
          pointOn = Math.min(pointOn, alignNear(on, pointOn, T));
          pointOff = Math.max(pointOff, alignNear(off, pointOff, T));
        }
      }
      const r = triodeResistance(d.kprime, device.w, device.l, overdrive, d.theta);
      if (Number.isFinite(r)) conductance += 1 / r;
    }
    if (state === NEVER)
      return failed(
        plan,
        'never',
        `${plan.name} never conducts at a signal of ${vs.toFixed(3)} V: its gate swing does not reach the turn-on level`,
      );
    if (state === ALWAYS)
      return failed(
        plan,
        'always',
        `${plan.name} conducts all the time at a signal of ${vs.toFixed(3)} V: its gate swing never turns it off`,
      );
    if (k === 0) {
      on = onLatest = pointOn;
      off = offEarliest = pointOff;
    } else {
      const onK = alignNear(pointOn, on, T);
      const offK = alignNear(pointOff, off, T);
      if (onK < on) on = onK;
      if (onK > onLatest) onLatest = onK;
      if (offK > off) off = offK;
      if (offK < offEarliest) offEarliest = offK;
    }
    const r = conductance > 0 ? 1 / conductance : Infinity;
    if (r > ron) ron = r;
  }
  const first = plan.devices[0]!;
  const cycle = cycles.cycle(first.net) as NetCycle;
  // The gate rises with the net, or with its fall through an inverting shifter; an n device turns on as its gate rises.
  const gateRise = plan.levelShifter?.invert === true ? cycle.fall : cycle.rise;
  const gateFall = plan.levelShifter?.invert === true ? cycle.rise : cycle.fall;
  const n = first.kind === 'n';
  const onEdge = n ? gateRise : gateFall;
  const offEdge = n ? gateFall : gateRise;
  return { name: plan.name, type: plan.type, status: 'switching', detail: '', on, off, onLatest, offEarliest, ron, onEdge, offEdge };
}

function failed(plan: SwitchPlan, status: SwitchConduction['status'], detail: string): SwitchConduction {
  return { name: plan.name, type: plan.type, status, detail, on: NaN, off: NaN, onLatest: NaN, offEarliest: NaN, ron: Infinity };
}

/**
 * Triode on-resistance of one device of a switch with its source at vs and its gate fully on (the
 * top of its swing for n, the bottom for p), ohm; Infinity when it has no overdrive there. `dvth`
 * is a local mismatch shift of its threshold magnitude.
 */
export function deviceOnResistance(plan: SwitchPlan, device: SwitchDevicePlan, devices: CornerDevices, vs: number, dvth = 0): number {
  const vdd = devices.vdd;
  const ls = plan.levelShifter;
  const n = device.kind === 'n';
  const gate = n ? (ls ? levelAt(ls.high, vdd) : vdd) : ls ? levelAt(ls.low, vdd) : 0;
  const d = n ? devices.n : devices.p;
  const vt = switchThreshold(plan, device, d, vs, vdd, dvth);
  return triodeResistance(d.kprime, device.w, device.l, (n ? gate - vs : vs - gate) - vt, d.theta);
}

/**
 * On-resistance of a switch at signal vs with every device's gate fully on, its devices in
 * parallel, ohm; Infinity when none conducts.
 */
export function onResistanceAt(plan: SwitchPlan, devices: CornerDevices, vs: number): number {
  let conductance = 0;
  for (const device of plan.devices) {
    const r = deviceOnResistance(plan, device, devices, vs);
    if (Number.isFinite(r)) conductance += 1 / r;
  }
  return conductance > 0 ? 1 / conductance : Infinity;
}
