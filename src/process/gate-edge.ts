/**
 * One edge of a CMOS gate driven by a ramp, integrated in time: how much charge its pull-up draws
 * from the supply and how fast its output moves. While the input ramps both networks conduct and
 * a short-circuit current crosses from the supply to ground (H. J. M. Veendrick, Short-circuit
 * dissipation of static CMOS circuitry and its impact on the design of buffer circuits, IEEE JSSC
 * 19(4), 1984: (beta / 12) (V_DD - 2 V_T)^3 tau per period for an unloaded inverter, an upper
 * bound). A loaded output moves less while the input ramps, so the edge is integrated instead:
 * the input a linear ramp over its transition, the output node with its capacitance and the
 * input-to-output (Miller) overlap, each network an equivalent device (alpha-power saturation
 * current, T. Sakurai, A. R. Newton, IEEE JSSC 25(2), 1990, capped below saturation by the
 * square-law triode current with mobility degradation).
 */
import type { DeviceParams } from '../schema/process.js';
import { saturationCurrent, type DeviceAtCorner } from './device.js';

/**
 * Gate-overlap capacitance per metre of width on each side, F/m: the card's `cov`, else an eighth
 * of its gate capacitance per width (value from memory: a 0.18 um-class overlap of about
 * 0.2 fF/um against 1.6 fF/um of gate).
 */
export function overlapPerWidth(params: Pick<DeviceParams, 'cov' | 'cgate'>): number {
  return params.cov ?? params.cgate / 8;
}

/** One network of a gate as an equivalent device. */
export interface GateDevice {
  readonly device: DeviceAtCorner;
  /** Width, m, and length, m. */
  readonly w: number;
  readonly l: number;
}

/** An inverter-equivalent gate switching its output net. */
export interface GateEdges {
  readonly pullDown: GateDevice;
  readonly pullUp: GateDevice;
  /** Output net capacitance to ground, F (fanout pins, own drains, extra load). */
  readonly load: number;
  /** Overlap capacitance from the switching input to the output, F. */
  readonly miller: number;
  /** Full-swing ramp times of the input, s: the rising input (output falls) and the falling one. */
  readonly inputRise: number;
  readonly inputFall: number;
  readonly vdd: number;
}

/** Drain current of an n-type view of a device, A, source at 0: V_GS, V_DS (either sign). */
export function drainCurrent(d: GateDevice, vgs: number, vds: number): number {
  if (vds < 0) return -drainCurrent(d, vgs - vds, -vds);
  const overdrive = vgs - d.device.vth;
  if (!(overdrive > 0) || vds === 0) return 0;
  const saturated = d.w * saturationCurrent(d.device.driveConstant, d.device.alpha, overdrive);
  const v = Math.min(vds, overdrive);
  const triode = (d.device.kprime * (d.w / d.l) * (overdrive * v - (v * v) / 2)) / (1 + d.device.theta * overdrive);
  return Math.min(saturated, triode);
}

/** Steps of an input ramp. */
const STEPS = 24;
/** Steps of the output's fastest time constant after the ramp, and the most taken, while it is followed. */
const TAIL_STEPS = 4;
const TAIL_LIMIT = 400;

/** One edge of a gate: the charge its pull-up delivers, C, and (when followed) its output's full-swing ramp time, s. */
export interface GateEdge {
  readonly charge: number;
  readonly transition: number;
}

/** Triode conductance of a device at full gate drive and V_DS = 0, S: no state of the edge conducts more. */
function peakConductance(d: GateDevice, vdd: number): number {
  const overdrive = vdd - d.device.vth;
  return overdrive > 0 ? (d.device.kprime * (d.w / d.l) * overdrive) / (1 + d.device.theta * overdrive) : 0;
}

/**
 * One input ramp: `rising` the input rising (output falling from V_DD), else falling (output
 * rising from 0). The pull-up's charge is counted over the ramp; on a falling input the pull-down
 * is off after it and the pull-up alone finishes the rise, (C + C_M) times what is left, while
 * on a rising input the pull-up is off after it. With `follow` the output is followed past the
 * ramp until it has crossed 10 % and 90 % of the swing, for its transition (that time over 0.8,
 * a linear ramp's full swing); else the transition is NaN.
 */
export function gateEdge(g: GateEdges, rising: boolean, follow = false): GateEdge {
  const { vdd } = g;
  const ramp = rising ? g.inputRise : g.inputFall;
  const c = g.load + g.miller;
  const slope = (rising ? vdd : -vdd) / ramp;
  const [from, to] = rising ? [0.9 * vdd, 0.1 * vdd] : [0.1 * vdd, 0.9 * vdd];
  // Midpoint steps no longer than the output's shortest time constant (stable and accurate there).
  const fastest = c / Math.max(peakConductance(g.pullUp, vdd) + peakConductance(g.pullDown, vdd), 1e-12);
  const h = Math.min(ramp / STEPS, fastest);
  const tail = fastest / TAIL_STEPS;
  const end = follow ? ramp + TAIL_LIMIT * tail : ramp;
  let vout = rising ? vdd : 0;
  let charge = 0;
  let t = 0;
  let first = NaN;
  let second = NaN;
  let up = 0;
  const dvdt = (time: number, v: number) => {
    const vin = time >= ramp ? (rising ? vdd : 0) : rising ? slope * time : vdd + slope * time;
    up = drainCurrent(g.pullUp, vdd - vin, vdd - v);
    return (up - drainCurrent(g.pullDown, vin, v) + (time < ramp ? g.miller * slope : 0)) / c;
  };
  while (t < end && (t < ramp || Number.isNaN(second))) {
    const dt = t < ramp ? Math.min(h, ramp - t) : tail;
    const mid = vout + (dvdt(t, vout) * dt) / 2;
    const next = vout + dvdt(t + dt / 2, mid) * dt;
    charge += up * dt;
    if (Number.isNaN(first) && (rising ? next <= from : next >= from)) first = t + (dt * (from - vout)) / (next - vout);
    if (Number.isNaN(second) && (rising ? next <= to : next >= to)) second = t + (dt * (to - vout)) / (next - vout);
    vout = next;
    t += dt;
  }
  if (!rising) charge += c * Math.max(0, vdd - vout);
  return { charge, transition: follow && !Number.isNaN(second) ? (second - first) / 0.8 : follow ? end : NaN };
}
