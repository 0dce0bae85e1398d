/**
 * Analytic gate delay after T. Sakurai and A. R. Newton, "Alpha-power law MOSFET model and its
 * applications to CMOS inverter delay and other formulas", IEEE JSSC 25(2):584-594, 1990. The
 * pulling device's current follows the alpha-power law with the n-th power law's triode region
 * (Sakurai & Newton, IEEE TED 38(4), 1991); the output edge under the input ramp is solved in
 * ramp-response.ts, which gives the delay, the output transition and every level crossing of the
 * edge as functions of the input transition and tau = C_L V_DD / I_D0 (so of the load). For a fast
 * input with the output still saturated at 50 % the delay is the 1990 paper's closed form
 *   t_d = (1/2 - (1 - v_T)/(1 + alpha)) * t_T + C_L * V_DD / (2 * I_D0),  v_T = Vth / V_DD;
 * a slower input, and the triode tail of the output edge, are where the two part.
 *
 * A series stack's switching device is k times wider than the network's equivalent and sees the
 * rest of the stack as on-devices (ramp-response.ts, stackFactor). Pin position in a stack is not
 * modelled: every input of a cell sees the same delay.
 */
import { inputError } from '../errors.js';
import { CELLS, cellWidths } from '../cells/library.js';
import { shiftFactor, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { unitWidths } from '../cells/card-widths.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { DelayModel, GateTiming, Mismatch } from './model.js';
import { RampResponse } from './ramp-response.js';

/** Slope of the delay on the input transition for a fast input: 1/2 - (1 - v_T)/(1 + alpha). */
export function rampCoefficient(vth: number, vdd: number, alpha: number): number {
  return 0.5 - (1 - vth / vdd) / (1 + alpha);
}

/** Sakurai-Newton ramp-input delay for a fast input (the closed form), s. */
export function alphaPowerDelay(load: number, vdd: number, current: number, vth: number, alpha: number, inputTransition: number): number {
  return rampCoefficient(vth, vdd, alpha) * inputTransition + (load * vdd) / (2 * current);
}

/** Per gate, four numbers in one array: tau and v_T position of the rising edge, then of the falling edge. */
const STRIDE = 4;

class AnalyticTiming implements GateTiming {
  /** responses[2 * g] answers gate g's rising edge, responses[2 * g + 1] its falling edge. */
  constructor(readonly table: Float64Array, readonly responses: RampResponse[]) {}

  /** The engine asks for an edge's delay and then its transition: the grid position is found once. */
  private lastEdge = -1;
  private lastInput = NaN;
  private lastPosition = 0;

  /** Called when the table is rebound: the remembered position belonged to the old taus. */
  forget(): void {
    this.lastEdge = -1;
  }

  private position(edge: number, tau: number, inputTransition: number): number {
    if (edge !== this.lastEdge || inputTransition !== this.lastInput) {
      this.lastEdge = edge;
      this.lastInput = inputTransition;
      this.lastPosition = RampResponse.sPosition(inputTransition / tau);
    }
    return this.lastPosition;
  }

  delay(gate: number, _pin: number, outputRising: boolean, inputTransition: number): number {
    const edge = 2 * gate + (outputRising ? 0 : 1);
    const i = 2 * edge;
    const tau = this.table[i]!;
    return tau * this.responses[edge]!.at(this.table[i + 1]!, this.position(edge, tau, inputTransition), 0);
  }

  transition(gate: number, _pin: number, outputRising: boolean, inputTransition: number): number {
    const edge = 2 * gate + (outputRising ? 0 : 1);
    const i = 2 * edge;
    const tau = this.table[i]!;
    return tau * this.responses[edge]!.at(this.table[i + 1]!, this.position(edge, tau, inputTransition), 1);
  }

  crossing(gate: number, _pin: number, outputRising: boolean, inputTransition: number, level: number): number {
    const edge = 2 * gate + (outputRising ? 0 : 1);
    const i = 2 * edge;
    const tau = this.table[i]!;
    return tau * this.responses[edge]!.crossing(this.table[i + 1]!, inputTransition / tau, outputRising ? 1 - level : level);
  }
}

/** Each gate's rising and falling response for the corner's alphas, by the depth of its pull networks. */
function gateResponses(netlist: CompiledNetlist, alphaP: number, alphaN: number, reuse: RampResponse[] | null): RampResponse[] {
  const out = reuse ?? new Array<RampResponse>(2 * netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    const shape = CELLS[netlist.gateCell[g]!];
    out[2 * g] = RampResponse.of(alphaP, shape.pSeries);
    out[2 * g + 1] = RampResponse.of(alphaN, shape.nSeries);
  }
  return out;
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
  // Against the hand-written ngspice references (test/reference/, 45 corners each) the clean gap
  // at 10 % is 8 ps pessimistic to 28 ps optimistic on a NAND generator and 17 ps to 26 ps on a
  // NOR one: 3 % of the dead time keeps it within 10 ps of never optimistic.
  gapBand: 0.03,
  bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch, reuse?: GateTiming): GateTiming {
    const count = netlist.gateCount;
    const { n, p } = devices;
    const recycled = reuse instanceof AnalyticTiming && reuse.table.length === count * STRIDE
      && reuse.responses[0]!.alpha === p.alpha && reuse.responses[1]!.alpha === n.alpha ? reuse : null;
    const table = recycled ? recycled.table : new Float64Array(count * STRIDE);
    const widths = pullWidths(netlist, unitWidths(devices.card));
    const vdd = devices.vdd;
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
      table[i] = (load * vdd) / upCurrent;
      table[i + 1] = RampResponse.vtPosition(vthP / vdd);
      table[i + 2] = (load * vdd) / downCurrent;
      table[i + 3] = RampResponse.vtPosition(vthN / vdd);
    }
    if (recycled) {
      recycled.forget();
      return recycled;
    }
    return new AnalyticTiming(table, gateResponses(netlist, p.alpha, n.alpha, null));
  },
};

function cannotTurnOn(device: DeviceAtCorner, vth: number, vdd: number, corner: string): Error {
  return inputError(`corners (${corner})`, `${vdd} V`, `leaves the ${device.type}-device below threshold (${vth.toFixed(3)} V) at ${corner}: it cannot turn on`);
}
