/**
 * Energy a cross-coupled level shifter and the switch gate it drives draw from their supplies per
 * period, at a corner, for both of the deck's shifters: up from the core (src/spice/level-shifter.ts:
 * n pull-downs against a p latch on the high level) and its mirror down to a level below ground
 * (src/spice/down-shifter.ts: p pull-ups from the core supply against an n latch on the low level).
 * Every internal node is charged once and discharged once, C V^2: the complement inverter's and the
 * skewed buffer's nodes over the core supply, both latch nodes over the latch's span (0 to the high
 * level up, the low level to VDD down), the output with the gate over high - low, whose charge
 * returns to the low level's supply. On top comes the crowbar charge of the two latch flips: what
 * the fought latch device conducts across the span while the pull device raises its node and the
 * other side follows, integrated in time (latch-flip.ts; C V^2 per node and the crowbar charge:
 * common practice, e.g. J. M. Rabaey et al., Digital Integrated Circuits, 2nd ed., on dynamic and
 * short-circuit power, from memory). The three inverters of the front (the complement,
 * the skewed buffer's two stages) add their short-circuit charge and their input-to-output overlap
 * while their inputs ramp (process/gate-edge.ts), the first two from the shifter's input ramp, the
 * last from the buffer's middle node as the first stage drives it. The input is copied by an ideal
 * source in the deck and draws nothing here.
 */
import type { CornerDevices, DeviceAtCorner } from '../process/device.js';
import { gateEdge, overlapPerWidth, type GateDevice, type GateEdges } from '../process/gate-edge.js';
import { levelAt } from '../schema/level.js';
import type { DownShifterSizing } from './down-shifter-sizing.js';
import { flipCrowbarCharge } from './latch-flip.js';
import type { SwitchPlan } from './plan.js';
import type { ShifterSizing } from './shifter-sizing.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

/** The parts of a shifter's energy per period, J. */
export interface ShifterEnergy {
  /** Core-supply nodes: the complement, the skewed buffer's middle node and its output. */
  readonly core: number;
  /** Both latch nodes over the latch's span. */
  readonly latch: number;
  /** The output node with the switch gate (`load`), low to high level. */
  readonly output: number;
  /** Latch devices conducting while the pull devices fight them. */
  readonly crowbar: number;
  /** The front inverters' short-circuit charge and overlaps while their inputs ramp. */
  readonly front: number;
  readonly total: number;
}

/** One shifter in the terms both topologies share: node capacitances (F), the fighting devices, levels (V). */
interface LatchShifter {
  /** Complement, skewed-buffer middle and set-drive nodes, each over the core supply. */
  readonly coreNodes: number;
  /** A latch node without, and with, the output inverter's gates. */
  readonly side: number;
  readonly setNode: number;
  readonly output: number;
  /** A pull device with its gate drive when on, and a latch device. */
  readonly pull: GateDevice;
  readonly pullDrive: number;
  readonly latch: GateDevice;
  /** Swing of the latch nodes and of the output, V. */
  readonly span: number;
  readonly swing: number;
  readonly vdd: number;
}

function latchShifterEnergy(s: LatchShifter, front: number): ShifterEnergy {
  const { span } = s;
  const injection = (s.pull.device.cgate / 2) * s.pull.w;
  const flip = (node: number, other: number) =>
    flipCrowbarCharge({ pull: s.pull, pullDrive: s.pullDrive, latch: s.latch, span, node, other, injection });
  const crowbar = (flip(s.setNode, s.side) + flip(s.side, s.setNode)) * span;
  const core = s.coreNodes * s.vdd * s.vdd;
  const latch = (s.side + s.setNode) * span * span;
  const output = s.output * s.swing * s.swing;
  return { core, latch, output, crowbar, front, total: core + latch + output + crowbar + front };
}

/** Complement and set-drive nodes (each an inverter's drains and the gate of a pull device of `pullGate` F) and the buffer's middle node, F. */
function coreNodes(devices: CornerDevices, size: Pick<ShifterSizing, 'inverterN' | 'bufferN' | 'bufferP' | 'bufferCap'>, pullGate: number) {
  const { n, p } = devices;
  const inverterDrains = n.cdrain * size.inverterN + p.cdrain * 2 * size.inverterN;
  const mid = n.cdrain * size.bufferN + p.cdrain * size.bufferP + (n.cgate + 2 * p.cgate) * size.inverterN + size.bufferCap;
  return 2 * (inverterDrains + pullGate) + mid;
}

/**
 * Energy of the front's three inverters beyond C V^2 of their nodes, J: the complement and the
 * buffer's first stage switched by the input ramp `input` (s), the buffer's second stage by the
 * middle node's edges as the first stage makes them. The middle node's driver also pays the
 * second stage's overlap once more (gate-energy.ts in the circuit layer: C_M V^2); the input's
 * copy is ideal.
 */
function frontEnergy(
  devices: CornerDevices,
  size: Pick<ShifterSizing, 'inverterN' | 'bufferN' | 'bufferP' | 'bufferCap'>,
  pullGate: number,
  input: number,
): number {
  const { n, p, vdd, card } = devices;
  const covN = overlapPerWidth(n.params);
  const covP = overlapPerWidth(p.params);
  const inverter = (wn: number, wp: number, load: number, inputRise: number, inputFall: number): GateEdges => ({
    pullDown: { device: n, w: wn, l: card.lmin },
    pullUp: { device: p, w: wp, l: card.lmin },
    load,
    miller: covN * wn + covP * wp,
    inputRise,
    inputFall,
    vdd,
  });
  const beyond = (g: GateEdges, follow = false) => {
    const fall = gateEdge(g, true, follow);
    const rise = gateEdge(g, false, follow);
    return { energy: vdd * (fall.charge + rise.charge - g.load * vdd), fall: fall.transition, rise: rise.transition };
  };
  const inverterLoad = n.cdrain * size.inverterN + p.cdrain * 2 * size.inverterN + pullGate;
  const complement = beyond(inverter(size.inverterN, 2 * size.inverterN, inverterLoad, input, input));
  const midLoad = n.cdrain * size.bufferN + p.cdrain * size.bufferP + (n.cgate + 2 * p.cgate) * size.inverterN + size.bufferCap;
  const first = beyond(inverter(size.bufferN, size.bufferP, midLoad, input, input), true);
  const second = inverter(size.inverterN, 2 * size.inverterN, inverterLoad, first.rise, first.fall);
  return complement.energy + first.energy + beyond(second).energy + second.miller * vdd * vdd;
}

/** Which devices pull and which latch, and the latch's levels: all that tells the two topologies apart. */
interface Mirror {
  readonly pull: DeviceAtCorner;
  readonly latch: DeviceAtCorner;
  /** Widths of a pull device and of a latch device, m. */
  readonly pullWidth: number;
  readonly latchWidth: number;
  /** Latch swing, V, which is also a latch device's gate drive when fully on. */
  readonly span: number;
  readonly swing: number;
}

function mirrorEnergy(
  m: Mirror,
  size: Pick<ShifterSizing, 'inverterN' | 'bufferN' | 'bufferP' | 'bufferCap' | 'outputN' | 'outputP' | 'latchCap'>,
  load: number,
  devices: CornerDevices,
  input: number,
): ShifterEnergy {
  const { n, p, vdd } = devices;
  // Drains carry their junction (cdrain) and their gate-drain overlap, whose gate holds still
  // while the drain swings (the card's cdrain is the junction alone).
  const drain = (d: DeviceAtCorner) => d.cdrain + overlapPerWidth(d.params);
  const side = drain(m.pull) * m.pullWidth + (drain(m.latch) + m.latch.cgate) * m.latchWidth + size.latchCap;
  return latchShifterEnergy(
    {
      coreNodes: coreNodes(devices, size, m.pull.cgate * m.pullWidth),
      side,
      setNode: side + n.cgate * size.outputN + p.cgate * size.outputP,
      output: load + drain(n) * size.outputN + drain(p) * size.outputP,
      pull: { device: m.pull, w: m.pullWidth, l: devices.card.lmin },
      pullDrive: vdd,
      latch: { device: m.latch, w: m.latchWidth, l: devices.card.lmin },
      span: m.span,
      swing: m.swing,
      vdd,
    },
    // A pull device's gate-drain overlap sees its drain swing the span against its gate's VDD, so
    // the front pays that charge from VDD on top of the gate's C V^2, once per pull device a period.
    frontEnergy(devices, size, m.pull.cgate * m.pullWidth, input) + 2 * overlapPerWidth(m.pull.params) * m.pullWidth * m.span * vdd,
  );
}

/**
 * Energy per period of a shifter up from the core sized `size` driving a gate of `load` farads at
 * `devices`' corner, its input a ramp of `input` seconds (full swing).
 */
export function shifterEnergy(ls: Shifter, size: ShifterSizing, load: number, devices: CornerDevices, input: number): ShifterEnergy {
  const { n, p, vdd } = devices;
  const high = levelAt(ls.high, vdd);
  const swing = Math.abs(high - levelAt(ls.low, vdd));
  return mirrorEnergy(
    { pull: n, latch: p, pullWidth: size.pullDown, latchWidth: size.latchP, span: high, swing },
    size,
    load,
    devices,
    input,
  );
}

/**
 * Energy per period of a shifter down to a level below ground, the mirror: p pull-ups at the core
 * supply against n latch devices whose gates swing to VDD over their sources at the low level, the
 * latch nodes from the low level to VDD; `input` as for `shifterEnergy`.
 */
export function downShifterEnergy(
  ls: Shifter,
  size: DownShifterSizing,
  load: number,
  devices: CornerDevices,
  input: number,
): ShifterEnergy {
  const { n, p, vdd } = devices;
  const low = levelAt(ls.low, vdd);
  const swing = Math.abs(levelAt(ls.high, vdd) - low);
  return mirrorEnergy(
    { pull: p, latch: n, pullWidth: size.pullUp, latchWidth: size.latchN, span: vdd - low, swing },
    size,
    load,
    devices,
    input,
  );
}
