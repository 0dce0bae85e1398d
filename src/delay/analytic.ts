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
import { saturationCurrent, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
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

class AnalyticTiming implements GateTiming {
  constructor(
    private readonly slopeRise: Float64Array,
    private readonly stepRise: Float64Array,
    private readonly slopeFall: Float64Array,
    private readonly stepFall: Float64Array,
    private readonly outRise: Float64Array,
    private readonly outFall: Float64Array,
  ) {}

  delay(gate: number, _pin: number, outputRising: boolean, inputTransition: number): number {
    return outputRising
      ? this.slopeRise[gate]! * inputTransition + this.stepRise[gate]!
      : this.slopeFall[gate]! * inputTransition + this.stepFall[gate]!;
  }

  transition(gate: number, _pin: number, outputRising: boolean): number {
    return outputRising ? this.outRise[gate]! : this.outFall[gate]!;
  }
}

export const analyticModel: DelayModel = {
  name: 'analytic',
  bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch): GateTiming {
    const count = netlist.gateCount;
    const arrays = Array.from({ length: 6 }, () => new Float64Array(count));
    const [slopeRise, stepRise, slopeFall, stepFall, outRise, outFall] = arrays as [Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array];
    const unit = unitWidths(devices.card);
    const vdd = devices.vdd;
    for (let g = 0; g < count; g++) {
      const widths = cellWidths(netlist.gateCell[g]!, netlist.gateSize[g]!, unit);
      const load = loads[netlist.gateOutput[g]!]!;
      const up = edge(devices.p, widths.pullUp, mismatch ? mismatch.dvthP[g]! : 0, vdd, devices.corner.name);
      const down = edge(devices.n, widths.pullDown, mismatch ? mismatch.dvthN[g]! : 0, vdd, devices.corner.name);
      slopeRise[g] = rampCoefficient(up.vth, vdd, devices.p.alpha);
      stepRise[g] = (load * vdd) / (2 * up.current);
      outRise[g] = alphaPowerTransition(load, vdd, up.current);
      slopeFall[g] = rampCoefficient(down.vth, vdd, devices.n.alpha);
      stepFall[g] = (load * vdd) / (2 * down.current);
      outFall[g] = alphaPowerTransition(load, vdd, down.current);
    }
    return new AnalyticTiming(slopeRise, stepRise, slopeFall, stepFall, outRise, outFall);
  },
};

function edge(device: DeviceAtCorner, width: number, dvth: number, vdd: number, corner: string): { vth: number; current: number } {
  const vth = device.vth + dvth;
  const current = width * saturationCurrent(device.driveConstant, device.alpha, vdd - vth);
  if (!(current > 0)) {
    throw inputError(`corners (${corner})`, `${vdd} V`, `leaves the ${device.type}-device below threshold (${vth.toFixed(3)} V) at ${corner}: it cannot turn on`);
  }
  return { vth, current };
}
