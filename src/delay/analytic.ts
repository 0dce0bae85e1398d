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
 * rest of the stack as on-devices (ramp-response.ts, stackFactor). Pin position counts: input 0
 * sits next to the output; when input p of a series stack switches last, the p internal nodes
 * above it are charged with the output and are discharged with it, so its edge sees p internal
 * node capacitances more: the shared junction each carries when the card's stacks have junctions
 * (spice.stackJunctions; see NODE_GATE for the channel charge).
 */
import { inputError } from '../errors.js';
import { CELLS, cellWidths } from '../cells/library.js';
import { shiftFactor, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { unitWidths } from '../cells/card-widths.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { ProcessCard } from '../schema/process.js';
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

/**
 * Per gate, six numbers in one array: tau and v_T position of the rising edge, then of the falling
 * edge, then the tau each internal stack node adds per position of the rising and falling edge.
 */
const STRIDE = 6;

class AnalyticTiming implements GateTiming {
  /** responses[2 * g] answers gate g's rising edge, responses[2 * g + 1] its falling edge. */
  constructor(
    readonly table: Float64Array,
    readonly responses: RampResponse[],
  ) {}

  /** The engine asks for an edge's delay and then its transition: the grid position is found once. */
  private lastEdge = -1;
  private lastInput = NaN;
  private lastTau = NaN;
  private lastPosition = 0;

  /** Called when the table is rebound: the remembered position belonged to the old taus. */
  forget(): void {
    this.lastEdge = -1;
  }

  private position(edge: number, tau: number, inputTransition: number): number {
    if (edge !== this.lastEdge || inputTransition !== this.lastInput || tau !== this.lastTau) {
      this.lastEdge = edge;
      this.lastInput = inputTransition;
      this.lastTau = tau;
      this.lastPosition = RampResponse.sPosition(inputTransition / tau);
    }
    return this.lastPosition;
  }

  /** Gate g's tau for an edge (0 rising, 1 falling) caused by input `pin`, s. */
  private tau(gate: number, falling: number, pin: number): number {
    const i = gate * STRIDE;
    const base = this.table[i + 2 * falling]!;
    return pin === 0 ? base : base + pin * this.table[i + 4 + falling]!;
  }

  delay(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    const falling = outputRising ? 0 : 1;
    const edge = 2 * gate + falling;
    const tau = this.tau(gate, falling, pin);
    return tau * this.responses[edge]!.at(this.table[gate * STRIDE + 2 * falling + 1]!, this.position(edge, tau, inputTransition), 0);
  }

  transition(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    const falling = outputRising ? 0 : 1;
    const edge = 2 * gate + falling;
    const tau = this.tau(gate, falling, pin);
    return tau * this.responses[edge]!.at(this.table[gate * STRIDE + 2 * falling + 1]!, this.position(edge, tau, inputTransition), 1);
  }

  crossing(gate: number, pin: number, outputRising: boolean, inputTransition: number, level: number): number {
    const falling = outputRising ? 0 : 1;
    const edge = 2 * gate + falling;
    const tau = this.tau(gate, falling, pin);
    return (
      tau *
      this.responses[edge]!.crossing(this.table[gate * STRIDE + 2 * falling + 1]!, inputTransition / tau, outputRising ? 1 - level : level)
    );
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
interface PullWidths {
  up: Float64Array;
  down: Float64Array;
  /** Capacitance of one internal node of the pull-up and pull-down stacks, F (0 without a stack). */
  nodeUp: Float64Array;
  nodeDown: Float64Array;
}

/**
 * Share of one device's gate capacitance an internal stack node adds per position. The stack
 * factor of ramp-response.ts already carries the channel charge of the on-devices (it was fitted
 * to the hand-written references), and a share of 0.5 on top of it moved the NOR reference's
 * clean gap from 28 ps to 76 ps off ngspice (test/reference/nor-gen.cir, 45 corners), so only the
 * junctions a card puts on stack nodes (spice.stackJunctions) count here.
 */
const NODE_GATE = 0;

const widthCache = new WeakMap<CompiledNetlist, WeakMap<ProcessCard, PullWidths>>();

function pullWidths(netlist: CompiledNetlist, card: ProcessCard): PullWidths {
  let byCard = widthCache.get(netlist);
  if (!byCard) {
    byCard = new WeakMap();
    widthCache.set(netlist, byCard);
  }
  const cached = byCard.get(card);
  if (cached) return cached;
  const unit = unitWidths(card);
  const junctions = card.spice?.stackJunctions === true;
  const n = netlist.gateCount;
  const entry: PullWidths = {
    up: new Float64Array(n),
    down: new Float64Array(n),
    nodeUp: new Float64Array(n),
    nodeDown: new Float64Array(n),
  };
  for (let g = 0; g < n; g++) {
    const shape = CELLS[netlist.gateCell[g]!];
    const widths = cellWidths(netlist.gateCell[g]!, netlist.gateSize[g]!, unit);
    entry.up[g] = widths.pullUp;
    entry.down[g] = widths.pullDown;
    if (shape.pSeries > 1) entry.nodeUp[g] = widths.wp * (NODE_GATE * card.p.cgate + (junctions ? card.p.cdrain : 0));
    if (shape.nSeries > 1) entry.nodeDown[g] = widths.wn * (NODE_GATE * card.n.cgate + (junctions ? card.n.cdrain : 0));
  }
  byCard.set(card, entry);
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
    const recycled =
      reuse instanceof AnalyticTiming &&
      reuse.table.length === count * STRIDE &&
      reuse.responses[0]!.alpha === p.alpha &&
      reuse.responses[1]!.alpha === n.alpha
        ? reuse
        : null;
    const table = recycled ? recycled.table : new Float64Array(count * STRIDE);
    const widths = pullWidths(netlist, devices.card);
    const vdd = devices.vdd;
    for (let g = 0; g < count; g++) {
      const load = loads[netlist.gateOutput[g]!]!;
      const vthP = mismatch ? p.vth + mismatch.dvthP[g]! : p.vth;
      const vthN = mismatch ? n.vth + mismatch.dvthN[g]! : n.vth;
      // Without mismatch every gate shares the corner's current per width; a shift dVth scales it
      // by (1 - dVth/overdrive)^alpha.
      const upCurrent = widths.up[g]! * p.idsatPerWidth * (mismatch ? shiftFactor(mismatch.dvthP[g]! / (vdd - p.vth), p.alpha) : 1);
      const downCurrent = widths.down[g]! * n.idsatPerWidth * (mismatch ? shiftFactor(mismatch.dvthN[g]! / (vdd - n.vth), n.alpha) : 1);
      if (!(upCurrent > 0 && downCurrent > 0))
        throw cannotTurnOn(upCurrent > 0 ? n : p, upCurrent > 0 ? vthN : vthP, vdd, devices.corner.name);
      const i = g * STRIDE;
      table[i] = (load * vdd) / upCurrent;
      table[i + 1] = RampResponse.vtPosition(vthP / vdd);
      table[i + 2] = (load * vdd) / downCurrent;
      table[i + 3] = RampResponse.vtPosition(vthN / vdd);
      table[i + 4] = (widths.nodeUp[g]! * vdd) / upCurrent;
      table[i + 5] = (widths.nodeDown[g]! * vdd) / downCurrent;
    }
    if (recycled) {
      recycled.forget();
      return recycled;
    }
    return new AnalyticTiming(table, gateResponses(netlist, p.alpha, n.alpha, null));
  },
};

function cannotTurnOn(device: DeviceAtCorner, vth: number, vdd: number, corner: string): Error {
  return inputError(
    'physics.device-off',
    ['corners'],
    `${vdd} V`,
    `leaves the ${device.type}-device below threshold (${vth.toFixed(3)} V) at ${corner}: it cannot turn on`,
  );
}
