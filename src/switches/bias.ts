/**
 * What a switch device sees in one phase state (phase 1, phase 2, dead time) at one corner: its
 * gate level, its body, and the terminal that would act as its source. Used by the off-state,
 * on-state and stress checks.
 */
import type { DeviceAtCorner } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import { rangeHigh, rangeLow, type StateIndex } from './nodes.js';
import { bodyThreshold } from './physics.js';
import type { DeviceKind, SwitchDevicePlan, SwitchPlan } from './plan.js';

/** Low and high level of a switch's gate swing, V: the level shifter's, else 0 V and the supply. */
export function gateSwing(plan: SwitchPlan, vdd: number): { low: number; high: number } {
  const ls = plan.levelShifter;
  return ls ? { low: levelAt(ls.low, vdd), high: levelAt(ls.high, vdd) } : { low: 0, high: vdd };
}

/** Whether the device's gate turns it on in a phase state (false when unknown). */
export function deviceOn(device: SwitchDevicePlan, state: StateIndex): boolean {
  return device.onIn?.[state] === true;
}

/** Gate voltage of a device in a phase state, V: the on level (high for n, low for p) where it is on. */
export function gateLevel(plan: SwitchPlan, device: SwitchDevicePlan, state: StateIndex, vdd: number): number {
  const { low, high } = gateSwing(plan, vdd);
  return deviceOn(device, state) === (device.kind === 'n') ? high : low;
}

/** Lowest and highest level of both terminals in a phase state, V. */
export function terminalSpan(plan: SwitchPlan, state: StateIndex, vdd: number): { low: number; high: number } {
  const [a, b] = plan.terminals;
  return {
    low: Math.min(rangeLow(a.states[state], vdd), rangeLow(b.states[state], vdd)),
    high: Math.max(rangeHigh(a.states[state], vdd), rangeHigh(b.states[state], vdd)),
  };
}

/**
 * Body voltage of a device in a phase state, V. A declared body is taken at its worst end (the
 * high end for n, the low end for p: that is the end nearer forward bias and the lower threshold);
 * an undeclared one is 0 V for n and for p the highest gate or terminal level in any state.
 */
export function bulkAt(plan: SwitchPlan, kind: DeviceKind, state: StateIndex, vdd: number): number {
  const node = plan.bulkNode;
  if (node) return kind === 'n' ? rangeHigh(node.states[state], vdd) : rangeLow(node.states[state], vdd);
  if (kind === 'n') return 0;
  let high = gateSwing(plan, vdd).high;
  for (let s = 0 as StateIndex; s < 3; s++) high = Math.max(high, terminalSpan(plan, s, vdd).high);
  return high;
}

/** Threshold magnitude of a device with its source at vs and body at vb, V; dvth is a mismatch shift. */
export function thresholdAt(kind: DeviceKind, d: DeviceAtCorner, vs: number, vb: number, dvth: number): number {
  return bodyThreshold(d.switchVth + dvth, d.gamma, d.phi2f, kind === 'n' ? vs - vb : vb - vs);
}

/**
 * How far an off device stays from turning on, V, less the sub-threshold allowance: for n,
 * V_T(V_SB) - allowance - (V_G - V_S) with V_S the lower terminal; for p, |V_T(V_BS)| - allowance -
 * (V_S - V_G) with V_S the higher terminal. Positive when it holds off. The terminal that acts as
 * source also sets the body effect, and is the worst for both terms.
 */
export function offStateMargin(
  kind: DeviceKind,
  d: DeviceAtCorner,
  gate: number,
  source: number,
  bulk: number,
  dvth: number,
  allowance: number,
): number {
  const vt = thresholdAt(kind, d, source, bulk, dvth);
  return vt - allowance - (kind === 'n' ? gate - source : source - gate);
}

/** Gate overdrive of an on device passing voltage v, V: V_GS - V_T for n, V_SG - |V_T| for p; positive when it conducts. */
export function onOverdrive(kind: DeviceKind, d: DeviceAtCorner, gate: number, v: number, bulk: number, dvth: number): number {
  const vt = thresholdAt(kind, d, v, bulk, dvth);
  return kind === 'n' ? gate - v - vt : v - gate - vt;
}
