/**
 * Analytic gate delay after T. Sakurai and A. R. Newton, "Alpha-power law MOSFET model and its
 * applications to CMOS inverter delay and other formulas", IEEE JSSC 25(2):584-594, 1990. The
 * pulling device's current follows the alpha-power law with the n-th power law's triode region
 * (Sakurai & Newton, IEEE TED 38(4), 1991); the output edge under the input ramp is solved in
 * ramp-response.ts, which gives the delay, the output transition and every level crossing of the
 * edge as functions of the input transition and tau = C_L V_DD / I_D0 (so of the load). For a fast
 * input with the output still saturated at 50 % the delay is the 1990 paper's closed form
 *   t_d = (1/2 - (1 - v_T)/(1 + alpha)) * t_T + C_L * V_DD / (2 * I_D0),  v_T = Vth / V_DD;
 * a slower input, and the triode tail of the output edge, are where the two part. Three things the
 * closed form leaves out are solved with the edge: an input that is another gate's edge, with its
 * triode tail, rather than a ramp (drivenEdge; a clock source still drives a ramp); the pulling
 * device's channel charge on the output once it leaves saturation (Meyer's C_gd, solveEdge); and
 * the opposing network's own strength (the ratio of the two networks' currents).
 *
 * A series stack's switching device is k times wider than the network's equivalent and sees the
 * rest of the stack as on-devices (ramp-response.ts, stackFactor). Pin position counts: input 0
 * sits next to the output; when input p of a series stack switches last, the p internal nodes
 * above it are charged with the output and are discharged with it, so its edge sees p internal
 * node capacitances more: half the near device's channel (NODE_GATE) and the shared junction
 * each carries when the card's stacks have junctions (spice.stackJunctions).
 */
import { inputError } from '../errors.js';
import { CELLS, cellWidths } from '../cells/library.js';
import { shiftFactor, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { unitWidths } from '../cells/card-widths.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { ProcessCard } from '../schema/process.js';
import type { DelayModel, GateTiming, Mismatch } from './model.js';
import { CHANNEL, OPPOSING_POINTS, opposingPosition, RampResponse } from './ramp-response.js';

/** Slope of the delay on the input transition for a fast input: 1/2 - (1 - v_T)/(1 + alpha). */
export function rampCoefficient(vth: number, vdd: number, alpha: number): number {
  return 0.5 - (1 - vth / vdd) / (1 + alpha);
}

/** Sakurai-Newton ramp-input delay for a fast input (the closed form), s. */
export function alphaPowerDelay(load: number, vdd: number, current: number, vth: number, alpha: number, inputTransition: number): number {
  return rampCoefficient(vth, vdd, alpha) * inputTransition + (load * vdd) / (2 * current);
}

/**
 * Per gate, ten numbers in one array: tau and v_T position of the rising edge, then of the
 * falling edge; the tau each internal stack node adds per position of the rising and falling
 * edge; the channel share m (ramp-response.ts, solveEdge) of the rising and falling edge; the
 * position of the opposing network's current ratio (opposingPosition) of the rising and falling edge.
 */
const STRIDE = 10;

class AnalyticTiming implements GateTiming {
  /**
   * responses[4 * g] answers gate g's rising edge, responses[4 * g + 1] its falling edge, both
   * driven by another gate; + 2 the same driven by a clock source's ramp; each at every opposing
   * ratio of the grid. Bit p of ramps[g] is set when input p is a clock source.
   */
  constructor(
    readonly table: Float64Array,
    readonly responses: RampResponse[][],
    readonly ramps: Uint32Array,
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

  /** The responses answering gate g's edge from input `pin`. */
  private edge(gate: number, falling: number, pin: number): number {
    return 4 * gate + falling + ((this.ramps[gate]! >>> pin) & 1) * 2;
  }

  /** Field `field` plus m times its channel term, blended between the two opposing ratios around the gate's, tau. */
  private field(gate: number, falling: number, edge: number, sPos: number, field: number): number {
    const i = gate * STRIDE;
    const vt = this.table[i + 2 * falling + 1]!;
    const m = this.table[i + 6 + falling]!;
    const o = this.table[i + 8 + falling]!;
    const r = o | 0;
    const w = o - r;
    const set = this.responses[edge]!;
    const lo = set[r]!;
    const hi = set[r + 1]!;
    const a = lo.at(vt, sPos, field) + m * lo.at(vt, sPos, CHANNEL + field);
    return w === 0 ? a : a + w * (hi.at(vt, sPos, field) + m * hi.at(vt, sPos, CHANNEL + field) - a);
  }

  delay(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    const falling = outputRising ? 0 : 1;
    const edge = this.edge(gate, falling, pin);
    const tau = this.tau(gate, falling, pin);
    return tau * this.field(gate, falling, edge, this.position(edge, tau, inputTransition), 0);
  }

  transition(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    const falling = outputRising ? 0 : 1;
    const edge = this.edge(gate, falling, pin);
    const tau = this.tau(gate, falling, pin);
    return tau * this.field(gate, falling, edge, this.position(edge, tau, inputTransition), 1);
  }

  crossing(gate: number, pin: number, outputRising: boolean, inputTransition: number, level: number): number {
    const falling = outputRising ? 0 : 1;
    const edge = this.edge(gate, falling, pin);
    const tau = this.tau(gate, falling, pin);
    const i = gate * STRIDE;
    const vt = this.table[i + 2 * falling + 1]!;
    const m = this.table[i + 6 + falling]!;
    const o = this.table[i + 8 + falling]!;
    const r = o | 0;
    const set = this.responses[edge]!;
    const remaining = outputRising ? 1 - level : level;
    const a = set[r]!.crossing(vt, inputTransition / tau, remaining, m);
    return tau * (a + (o - r) * (set[r + 1]!.crossing(vt, inputTransition / tau, remaining, m) - a));
  }

  /** Solves the grid rows every edge of the bound table needs. */
  prepare(): void {
    for (let g = 0; 4 * g < this.responses.length; g++) {
      for (let falling = 0; falling < 2; falling++) {
        const i = g * STRIDE;
        const vt = this.table[i + 2 * falling + 1]!;
        const r = this.table[i + 8 + falling]! | 0;
        for (const kind of [0, 2]) {
          const set = this.responses[4 * g + falling + kind]!;
          set[r]!.prepare(vt);
          set[r + 1]!.prepare(vt);
        }
      }
    }
  }
}

/** The responses of one alpha, depth and kind of input edge at every opposing ratio of the grid. */
function responseSet(alpha: number, depth: number, driven: boolean): RampResponse[] {
  return Array.from({ length: OPPOSING_POINTS }, (_, r) => RampResponse.of(alpha, depth, driven, r));
}

/** Each gate's rising and falling responses for the corner's alphas, by the depth of its pull networks and the kind of input edge. */
function gateResponses(netlist: CompiledNetlist, alphaP: number, alphaN: number): RampResponse[][] {
  const out = new Array<RampResponse[]>(4 * netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    const shape = CELLS[netlist.gateCell[g]!];
    for (const driven of [true, false]) {
      const at = 4 * g + (driven ? 0 : 2);
      out[at] = responseSet(alphaP, shape.pSeries, driven);
      out[at + 1] = responseSet(alphaN, shape.nSeries, driven);
    }
  }
  return out;
}

/** Per gate, bit p set when input p is not driven by a gate (a clock source's linear ramp). */
function rampInputs(netlist: CompiledNetlist): Uint32Array {
  const out = new Uint32Array(netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    const start = netlist.gateInputStart[g]!;
    for (let k = start; k < netlist.gateInputStart[g + 1]!; k++)
      if (netlist.driver[netlist.gateInputs[k]!]! < 0) out[g]! |= 1 << (k - start);
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
  /** Channel capacitance C_ox W L of the switching device of the pull-up and pull-down, F. */
  channelUp: Float64Array;
  channelDown: Float64Array;
}

/**
 * Share of the card's gate capacitance per width that is channel (C_ox L) rather than overlap:
 * on the reference card (test/reference/ref18.yaml) C_ox L is 1.73 of 2.14 fF/um, the rest the
 * two overlaps.
 */
const CHANNEL_SHARE = 0.8;

/**
 * An internal stack node that must swing with the output (the far input switching last) carries
 * the source half of the on near device's channel, Meyer's split at V_DS = 0 (J. E. Meyer, RCA
 * Review 32, 1971): half the channel capacitance, per device width.
 */
const NODE_GATE = 0.5 * CHANNEL_SHARE;

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
    channelUp: new Float64Array(n),
    channelDown: new Float64Array(n),
  };
  for (let g = 0; g < n; g++) {
    const shape = CELLS[netlist.gateCell[g]!];
    const widths = cellWidths(netlist.gateCell[g]!, netlist.gateSize[g]!, unit);
    entry.up[g] = widths.pullUp;
    entry.down[g] = widths.pullDown;
    entry.channelUp[g] = CHANNEL_SHARE * widths.wp * card.p.cgate;
    entry.channelDown[g] = CHANNEL_SHARE * widths.wn * card.n.cgate;
    if (shape.pSeries > 1) entry.nodeUp[g] = widths.wp * (NODE_GATE * card.p.cgate + (junctions ? card.p.cdrain : 0));
    if (shape.nSeries > 1) entry.nodeDown[g] = widths.wn * (NODE_GATE * card.n.cgate + (junctions ? card.n.cdrain : 0));
  }
  byCard.set(card, entry);
  return entry;
}

export const analyticModel: DelayModel = {
  name: 'analytic',
  // Against the hand-written ngspice references (test/reference/, 45 corners each) the clean gap
  // at 10 % is 9.1 ps pessimistic to 0.5 ps pessimistic on a NAND generator and 6.0 ps
  // pessimistic to 9.6 ps optimistic on a NOR one (dead times 0.5-1.3 ns): 1 % of the dead time
  // keeps it never optimistic there.
  gapBand: 0.01,
  bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch, reuse?: GateTiming): GateTiming {
    const count = netlist.gateCount;
    const { n, p } = devices;
    const recycled =
      reuse instanceof AnalyticTiming &&
      reuse.table.length === count * STRIDE &&
      reuse.responses[0]![0]!.alpha === p.alpha &&
      reuse.responses[1]![0]!.alpha === n.alpha
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
      table[i + 6] = widths.channelUp[g]! / load;
      table[i + 7] = widths.channelDown[g]! / load;
      table[i + 8] = opposingPosition(downCurrent / upCurrent);
      table[i + 9] = opposingPosition(upCurrent / downCurrent);
    }
    const timing = recycled ?? new AnalyticTiming(table, gateResponses(netlist, p.alpha, n.alpha), rampInputs(netlist));
    timing.forget();
    timing.prepare();
    return timing;
  },
};

function cannotTurnOn(device: DeviceAtCorner, vth: number, vdd: number, corner: string): Error {
  return inputError(
    'physics.device-off',
    `corners (${corner})`,
    `${vdd} V`,
    `leaves the ${device.type}-device below threshold (${vth.toFixed(3)} V) at ${corner}: it cannot turn on`,
  );
}
