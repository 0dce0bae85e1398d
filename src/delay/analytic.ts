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
 * triode tail, rather than a ramp (drivenEdge; a clock source still drives a ramp), its shape
 * set by the driving gate itself: the alpha of its pulling device and its own input transition over
 * its tau, read back from its output transition (driverCurve, curvePosition), no fitted constant; the pulling
 * device's channel charge on the output once it leaves saturation (Meyer's C_gd, solveEdge); and
 * the opposing network's own strength (the ratio of the two networks' currents) and its own
 * threshold, which a skewed corner or a mismatch sample moves away from the pulling device's.
 *
 * A series stack's switching device is k times wider than the network's equivalent and sees the
 * rest of the stack as on-devices (ramp-response.ts, stackFactor). Pin position counts: input 0
 * sits next to the output; when input p of a series stack switches last, the p internal nodes
 * above it are charged with the output and are discharged with it, so its edge sees p internal
 * node capacitances more: half the near device's channel (NODE_GATE) and the shared junction
 * each carries when the card's stacks have junctions (spice.stackJunctions).
 */
import { inputError } from '../errors.js';
import { PairCache } from '../pair-cache.js';
import { CELLS, cellWidths } from '../cells/library.js';
import { shiftFactor, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { unitWidths } from '../cells/card-widths.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { ProcessCard } from '../schema/process.js';
import type { DelayModel, GateTiming, Mismatch } from './model.js';
import {
  CHANNEL,
  DRIVER_INPUTS,
  KICK,
  OPPOSED,
  type DriveLaw,
  driveLaw,
  curvePosition,
  driverCurve,
  lawKey,
  OPPOSING_POINTS,
  opposingPosition,
  RampResponse,
  SHIFT_POINTS,
  shiftPosition,
} from './ramp-response.js';

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
 * position of the opposing network's current ratio (opposingPosition) of the rising and falling edge;
 * the position of the opposing device's threshold from the pulling one's (shiftPosition) of the
 * rising and falling edge.
 */
const STRIDE = 14;

class AnalyticTiming implements GateTiming {
  /**
   * responses[2 * g] answers gate g's rising edge, responses[2 * g + 1] its falling edge, each per
   * pin: [shape][opposing][shift], the shapes of DRIVER_INPUTS for a pin driven by a gate, one (the
   * linear ramp) for a clock source, each at every opposing ratio and threshold of the grid. inputDriver[k] is
   * the gate driving flat input k (netlist.gateInputStart), -1 for a clock source.
   */
  constructor(
    readonly table: Float64Array,
    readonly responses: RampResponse[][][][][],
    readonly inputStart: Int32Array,
    readonly inputDriver: Int32Array,
    /** Drive law of the device pulling the driver's edge behind a rising (0) and falling (1) output. */
    readonly driverLaw: readonly [DriveLaw, DriveLaw],
    /** Per flat input and edge (2 k + falling): the pulling device's channel over the input net's capacitance (0 for a clock source). */
    readonly kick: Float64Array,
  ) {
    this.curves = new Float64Array(2 * (table.length / STRIDE) * DRIVER_INPUTS.length).fill(NaN);
  }

  /** The engine asks for an edge's delay and then its transition: the grid positions are found once. */
  private lastKey = -1;
  private lastInput = NaN;
  private lastTau = NaN;
  private lastDriverTau = NaN;
  private lastPosition = 0;
  private lastShape = 0;
  private lastKick = 0;

  /**
   * Per gate and edge (2 g + falling), the gate's output transitions as a driver at each of
   * DRIVER_INPUTS (driverCurve), computed when first asked for after a bind; NaN until then.
   */
  private readonly curves: Float64Array;

  /** Called when the table is rebound: the remembered position and curves belonged to the old taus. */
  forget(): void {
    this.lastKey = -1;
    this.curves.fill(NaN);
  }

  /** Offset of gate `driver`'s curve for its edge `edge` (0 rising, 1 falling), computed if not yet. */
  private curve(driver: number, edge: number): number {
    const offset = (2 * driver + edge) * DRIVER_INPUTS.length;
    if (Number.isNaN(this.curves[offset]!)) {
      const i = driver * STRIDE;
      driverCurve(
        this.driverLaw[1 - edge]!,
        this.table[i + 2 * edge + 1]!,
        this.table[i + 6 + edge]!,
        this.table[i + 8 + edge]!,
        this.table[i + 12 + edge]!,
        this.table[i + 10 + edge]!,
        this.curves,
        offset,
      );
    }
    return offset;
  }

  /** Grid positions of input transition (sPosition) and, for a driven pin, of the driving edge's shape (curvePosition on the driver's curve). */
  private position(gate: number, falling: number, pin: number, tau: number, inputTransition: number): void {
    const k = this.inputStart[gate]! + pin;
    const driver = this.inputDriver[k]!;
    // The driver's edge behind this one: its falling edge for a rising output, its rising edge for a falling one.
    const driverTau = driver < 0 ? 0 : this.table[driver * STRIDE + 2 * (1 - falling)]!;
    const key = 2 * k + falling;
    if (key === this.lastKey && inputTransition === this.lastInput && tau === this.lastTau && driverTau === this.lastDriverTau) return;
    this.lastKey = key;
    this.lastInput = inputTransition;
    this.lastTau = tau;
    this.lastDriverTau = driverTau;
    this.lastPosition = RampResponse.sPosition(inputTransition / tau);
    this.lastKick = this.kick[key]!;
    this.lastShape = driver < 0 ? 0 : curvePosition(this.curves, this.curve(driver, 1 - falling), inputTransition / driverTau);
  }

  /** Gate g's tau for an edge (0 rising, 1 falling) caused by input `pin`, s. */
  private tau(gate: number, falling: number, pin: number): number {
    const i = gate * STRIDE;
    const base = this.table[i + 2 * falling]!;
    return pin === 0 ? base : base + pin * this.table[i + 4 + falling]!;
  }

  /**
   * `read` of the response at the gate's v_T and channel share, blended between the two driving
   * shapes and the two opposing ratios around the gate's, tau.
   */
  private blend(
    gate: number,
    falling: number,
    pin: number,
    read: (r: RampResponse, vt: number, m: number, mo: number, mk: number) => number,
  ): number {
    const i = gate * STRIDE;
    const vt = this.table[i + 2 * falling + 1]!;
    const m = this.table[i + 6 + falling]!;
    const mo = this.table[i + 12 + falling]!;
    const mk = this.lastKick;
    const o = this.table[i + 8 + falling]!;
    const r = o | 0;
    const wo = o - r;
    const shapes = this.responses[2 * gate + falling]![pin]!;
    const q = shapes.length === 1 ? 0 : this.lastShape;
    const j = q | 0;
    const wq = q - j;
    const d = this.table[i + 10 + falling]!;
    const b = d | 0;
    const wd = d - b;
    const point = (row: RampResponse[]): number => {
      const lo = row[b]!;
      lo.prepare(vt);
      const a = read(lo, vt, m, mo, mk);
      if (wd === 0) return a;
      const hi = row[b + 1]!;
      hi.prepare(vt);
      return a + wd * (read(hi, vt, m, mo, mk) - a);
    };
    const one = (set: RampResponse[][]): number => {
      const a = point(set[r]!);
      return wo === 0 ? a : a + wo * (point(set[r + 1]!) - a);
    };
    const a = one(shapes[j]!);
    return wq === 0 ? a : a + wq * (one(shapes[j + 1]!) - a);
  }

  delay(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    return this.edgeField(gate, pin, outputRising, inputTransition, 0);
  }

  transition(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    return this.edgeField(gate, pin, outputRising, inputTransition, 1);
  }

  /** Field 0 (delay) or 1 (full-swing transition) of the responses, with every share's term, s. */
  private edgeField(gate: number, pin: number, outputRising: boolean, inputTransition: number, f: number): number {
    const falling = outputRising ? 0 : 1;
    const tau = this.tau(gate, falling, pin);
    this.position(gate, falling, pin, tau, inputTransition);
    const s = this.lastPosition;
    return (
      tau *
      this.blend(
        gate,
        falling,
        pin,
        (r, vt, m, mo, mk) => r.at(vt, s, f) + m * r.at(vt, s, CHANNEL + f) + mo * r.at(vt, s, OPPOSED + f) + mk * r.at(vt, s, KICK + f),
      )
    );
  }

  crossing(gate: number, pin: number, outputRising: boolean, inputTransition: number, level: number): number {
    const falling = outputRising ? 0 : 1;
    const tau = this.tau(gate, falling, pin);
    this.position(gate, falling, pin, tau, inputTransition);
    const remaining = outputRising ? 1 - level : level;
    const s = inputTransition / tau;
    return tau * this.blend(gate, falling, pin, (r, vt, m, mo, mk) => r.crossing(vt, s, remaining, m, mo, mk));
  }
}

/** The responses of one drive law, depth and input edge at every opposing ratio and threshold of the grid. */
function responseSet(law: DriveLaw, depth: number, driver: DriveLaw | null, shape: number): RampResponse[][] {
  return Array.from({ length: OPPOSING_POINTS }, (_, r) =>
    Array.from({ length: SHIFT_POINTS }, (_, d) => RampResponse.of(law, depth, driver, shape, r, d)),
  );
}

/**
 * The response sets of a pin, one per shape of its input edge (a clock source's ramp: one), shared
 * by every pin and every binding that asks for the same alpha, depth and driver: a timing model is
 * bound per corner and per searched chain, and building the sets afresh each time cost more than
 * the evaluation itself (read-only, so sharing them changes no number).
 */
const pinResponses = new Map<string, RampResponse[][][]>();

function pinShapes(law: DriveLaw, depth: number, driver: DriveLaw | null): RampResponse[][][] {
  const key = `${lawKey(law)}/${depth}/${driver === null ? null : lawKey(driver)}`;
  let sets = pinResponses.get(key);
  if (!sets) {
    sets = driver === null ? [responseSet(law, depth, null, 0)] : DRIVER_INPUTS.map((_, j) => responseSet(law, depth, driver, j));
    pinResponses.set(key, sets);
  }
  return sets;
}

/**
 * Each gate's rising and falling responses for the corner's alphas, per pin: the shapes of a
 * driving gate's edge (whose pulling device is the other type), or the ramp of a clock source.
 */
function gateResponses(netlist: CompiledNetlist, lawP: DriveLaw, lawN: DriveLaw, inputDriver: Int32Array): RampResponse[][][][][] {
  const out = new Array<RampResponse[][][][]>(2 * netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    const shape = CELLS[netlist.gateCell[g]!];
    const start = netlist.gateInputStart[g]!;
    const pins = netlist.gateInputStart[g + 1]! - start;
    const edges = (law: DriveLaw, depth: number, driverLaw: DriveLaw): RampResponse[][][][] =>
      Array.from({ length: pins }, (_, pin) => pinShapes(law, depth, inputDriver[start + pin]! < 0 ? null : driverLaw));
    // The driver's edge behind a rising output is its falling one (its n network), and the other way round.
    out[2 * g] = edges(lawP, shape.pSeries, lawN);
    out[2 * g + 1] = edges(lawN, shape.nSeries, lawP);
  }
  return out;
}

/** Per flat input (netlist.gateInputStart), the gate driving it, -1 for a clock source. */
function inputDrivers(netlist: CompiledNetlist): Int32Array {
  const out = new Int32Array(netlist.gateInputs.length);
  for (let k = 0; k < out.length; k++) out[k] = netlist.driver[netlist.gateInputs[k]!]!;
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
  /**
   * Of the card's pin capacitance on each gate's output net, the part its fanout does not present
   * until the net is past half its swing, behind a rising and a falling output, F (see TURNING_ON).
   */
  pinLagUp: Float64Array;
  pinLagDown: Float64Array;
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

/**
 * A fanout pin's charge up to the driving edge's 50 % point, which sets the delay, with the fanout's
 * own output not yet moved (its edge starts only once its input is past threshold): in Meyer's
 * model (J. E. Meyer, RCA Review 32, 1971) the device turning off is in its linear region at
 * V_DS = 0, C_gs + C_gd = C_ox W L, both to still nodes, so it presents the card's gate
 * capacitance; the device turning on, with the full supply across it, is saturated, C_gs =
 * (2/3) C_ox W L and C_gd = 0 (below threshold only its smaller depletion charge). The card's
 * gate capacitance is a full swing's charge with the fanout switching, so per pin the turning-on
 * device's channel counts a third less over the first half: W C_ox L / 3. Measured in ngspice on
 * test/reference's level-1 devices (s = 6 inverter, output held, 500 ps input edge): 15.2 fF
 * (input falling) and 17.2 fF (rising) to the 50 % point against 19.3 fF on the card; this rule
 * gives 15.8 fF and 17.5 fF.
 */
const TURNING_ON = CHANNEL_SHARE / 3;

const widthCache = new PairCache<CompiledNetlist, ProcessCard, PullWidths>();

const pullWidths = (netlist: CompiledNetlist, card: ProcessCard): PullWidths =>
  widthCache.get(netlist, card, () => makePullWidths(netlist, card));

function makePullWidths(netlist: CompiledNetlist, card: ProcessCard): PullWidths {
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
    pinLagUp: new Float64Array(n),
    pinLagDown: new Float64Array(n),
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
    // A rising output turns its fanout's n devices on, a falling one their p devices.
    const net = netlist.gateOutput[g]!;
    for (let k = netlist.fanoutStart[net]!; k < netlist.fanoutStart[net + 1]!; k++) {
      const f = netlist.fanoutGate[k]!;
      const fan = cellWidths(netlist.gateCell[f]!, netlist.gateSize[f]!, unit);
      entry.pinLagUp[g]! += TURNING_ON * fan.wn * card.n.cgate;
      entry.pinLagDown[g]! += TURNING_ON * fan.wp * card.p.cgate;
    }
  }
  return entry;
}

export const analyticModel: DelayModel = {
  name: 'analytic',
  bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch, reuse?: GateTiming): GateTiming {
    const count = netlist.gateCount;
    const { n, p } = devices;
    const recycled =
      reuse instanceof AnalyticTiming &&
      reuse.table.length === count * STRIDE &&
      reuse.inputStart === netlist.gateInputStart &&
      reuse.driverLaw[0].alpha === n.alpha &&
      reuse.driverLaw[0].saturation === n.saturation &&
      reuse.driverLaw[1].alpha === p.alpha &&
      reuse.driverLaw[1].saturation === p.saturation
        ? reuse
        : null;
    const table = recycled ? recycled.table : new Float64Array(count * STRIDE);
    const widths = pullWidths(netlist, devices.card);
    const vdd = devices.vdd;
    for (let g = 0; g < count; g++) {
      const load = loads[netlist.gateOutput[g]!]!;
      const loadUp = load - widths.pinLagUp[g]!;
      const loadDown = load - widths.pinLagDown[g]!;
      const vthP = mismatch ? p.vth + mismatch.dvthP[g]! : p.vth;
      const vthN = mismatch ? n.vth + mismatch.dvthN[g]! : n.vth;
      // Without mismatch every gate shares the corner's current per width; a shift dVth scales it
      // by (1 - dVth/overdrive)^alpha.
      const upCurrent = widths.up[g]! * p.idsatPerWidth * (mismatch ? shiftFactor(mismatch.dvthP[g]! / (vdd - p.vth), p.alpha) : 1);
      const downCurrent = widths.down[g]! * n.idsatPerWidth * (mismatch ? shiftFactor(mismatch.dvthN[g]! / (vdd - n.vth), n.alpha) : 1);
      if (!(upCurrent > 0 && downCurrent > 0))
        throw cannotTurnOn(upCurrent > 0 ? n : p, upCurrent > 0 ? vthN : vthP, vdd, devices.corner.name);
      const i = g * STRIDE;
      table[i] = (loadUp * vdd) / upCurrent;
      table[i + 1] = RampResponse.vtPosition(vthP / vdd);
      table[i + 2] = (loadDown * vdd) / downCurrent;
      table[i + 3] = RampResponse.vtPosition(vthN / vdd);
      table[i + 4] = (widths.nodeUp[g]! * vdd) / upCurrent;
      table[i + 5] = (widths.nodeDown[g]! * vdd) / downCurrent;
      table[i + 6] = widths.channelUp[g]! / loadUp;
      table[i + 7] = widths.channelDown[g]! / loadDown;
      table[i + 8] = opposingPosition(downCurrent / upCurrent);
      table[i + 9] = opposingPosition(upCurrent / downCurrent);
      table[i + 10] = shiftPosition((vthN - vthP) / vdd);
      table[i + 11] = shiftPosition((vthP - vthN) / vdd);
      // The opposing network's switching device: the n one behind a rising output, the p one behind a falling one.
      table[i + 12] = widths.channelDown[g]! / loadUp;
      table[i + 13] = widths.channelUp[g]! / loadDown;
    }
    let timing = recycled;
    if (!timing) {
      const drivers = inputDrivers(netlist);
      const lawN = driveLaw(n.alpha, n.saturation);
      const lawP = driveLaw(p.alpha, p.saturation);
      timing = new AnalyticTiming(
        table,
        gateResponses(netlist, lawP, lawN, drivers),
        netlist.gateInputStart,
        drivers,
        [lawN, lawP],
        new Float64Array(2 * drivers.length),
      );
    }
    // The kickback of each pin's pulling device onto its input net (ramp-response.ts, solveEdge).
    for (let g = 0; g < count; g++) {
      for (let k = netlist.gateInputStart[g]!; k < netlist.gateInputStart[g + 1]!; k++) {
        const driven = timing.inputDriver[k]! >= 0;
        const input = loads[netlist.gateInputs[k]!]!;
        timing.kick[2 * k] = driven ? widths.channelUp[g]! / input : 0;
        timing.kick[2 * k + 1] = driven ? widths.channelDown[g]! / input : 0;
      }
    }
    timing.forget();
    return timing;
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
