/**
 * Analytic gate delay after T. Sakurai and A. R. Newton, "Alpha-power law MOSFET model and its
 * applications to CMOS inverter delay and other formulas", IEEE JSSC 25(2):584-594, 1990:
 *   t_d = (1/2 - (1 - v_T)/(1 + alpha)) * t_T + C_L * V_DD / (2 * I_D0),  v_T = Vth / V_DD,
 * for the device that pulls the output. The output transition is the V_D0 -> 0 limit of the same
 * paper's expression, t_out = (0.9/0.8) * C_L * V_DD / I_D0: it depends on the load and the drive,
 * not on the input ramp (a documented simplification).
 *
 * Pin position in a stack is not modelled: every input of a cell sees the same delay.
 */
import { inputError } from '../errors.js';
import { cellWidths } from '../cells/library.js';
import { shiftFactor, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { unitWidths } from '../netlist/loads.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { DelayModel, GateTiming, Mismatch } from './model.js';

const TRANSITION_FACTOR = 0.9 / 0.8;

/** Slope of the delay on the input transition: 1/2 - (1 - v_T)/(1 + alpha). */
export function rampCoefficient(vth: number, vdd: number, alpha: number): number {
  return 0.5 - (1 - vth / vdd) / (1 + alpha);
}

/** Sakurai-Newton ramp-input delay, s. */
export function alphaPowerDelay(load: number, vdd: number, current: number, vth: number, alpha: number, inputTransition: number): number {
  return rampCoefficient(vth, vdd, alpha) * inputTransition + (load * vdd) / (2 * current);
}

/** Output transition time (full swing, extrapolated from 10-90 %), s. */
export function alphaPowerTransition(load: number, vdd: number, current: number): number {
  return (TRANSITION_FACTOR * load * vdd) / current;
}

/** Per gate, six numbers in one array: rise slope, rise step, fall slope, fall step, rise and fall output transition. */
const STRIDE = 6;

class AnalyticTiming implements GateTiming {
  constructor(readonly table: Float64Array) {}

  delay(gate: number, _pin: number, outputRising: boolean, inputTransition: number): number {
    const i = gate * STRIDE + (outputRising ? 0 : 2);
    return this.table[i]! * inputTransition + this.table[i + 1]!;
  }

  transition(gate: number, _pin: number, outputRising: boolean): number {
    return this.table[gate * STRIDE + (outputRising ? 4 : 5)]!;
  }
}

/** Effective pull-up and pull-down widths per gate, m; computed once per netlist (both are immutable). */
const widthCache = new WeakMap<CompiledNetlist, { up: Float64Array; down: Float64Array }>();

function pullWidths(netlist: CompiledNetlist, unit: { wn: number; wp: number }): { up: Float64Array; down: Float64Array } {
  const cached = widthCache.get(netlist);
  if (cached) return cached;
  const up = new Float64Array(netlist.gateCount);
  const down = new Float64Array(netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    const widths = cellWidths(netlist.gateCell[g]!, netlist.gateSize[g]!, unit);
    up[g] = widths.pullUp;
    down[g] = widths.pullDown;
  }
  const entry = { up, down };
  widthCache.set(netlist, entry);
  return entry;
}

export const analyticModel: DelayModel = {
  name: 'analytic',
  bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch, reuse?: GateTiming): GateTiming {
    const count = netlist.gateCount;
    const recycled = reuse instanceof AnalyticTiming && reuse.table.length === count * STRIDE ? reuse : null;
    const table = recycled ? recycled.table : new Float64Array(count * STRIDE);
    const widths = pullWidths(netlist, unitWidths(devices.card));
    const vdd = devices.vdd;
    const { n, p } = devices;
    for (let g = 0; g < count; g++) {
      const load = loads[netlist.gateOutput[g]!]!;
      const vthP = mismatch ? p.vth + mismatch.dvthP[g]! : p.vth;
      const vthN = mismatch ? n.vth + mismatch.dvthN[g]! : n.vth;
      // Without mismatch every gate shares the corner's current per width; a shift dVth scales it
      // by (1 - dVth/overdrive)^alpha.
      const upCurrent = widths.up[g]! * p.idsatPerWidth * (mismatch ? shiftFactor(mismatch.dvthP[g]! / (vdd - p.vth), p.alpha) : 1);
      const downCurrent = widths.down[g]! * n.idsatPerWidth * (mismatch ? shiftFactor(mismatch.dvthN[g]! / (vdd - n.vth), n.alpha) : 1);
      if (!(upCurrent > 0 && downCurrent > 0)) throw cannotTurnOn(upCurrent > 0 ? n : p, upCurrent > 0 ? vthN : vthP, vdd, devices.corner.name);
      const i = g * STRIDE;
      table[i] = rampCoefficient(vthP, vdd, p.alpha);
      table[i + 1] = (load * vdd) / (2 * upCurrent);
      table[i + 2] = rampCoefficient(vthN, vdd, n.alpha);
      table[i + 3] = (load * vdd) / (2 * downCurrent);
      table[i + 4] = alphaPowerTransition(load, vdd, upCurrent);
      table[i + 5] = alphaPowerTransition(load, vdd, downCurrent);
    }
    return recycled ?? new AnalyticTiming(table);
  },
};

function cannotTurnOn(device: DeviceAtCorner, vth: number, vdd: number, corner: string): Error {
  return inputError(`corners (${corner})`, `${vdd} V`, `leaves the ${device.type}-device below threshold (${vth.toFixed(3)} V) at ${corner}: it cannot turn on`);
}
