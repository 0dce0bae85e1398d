/**
 * Energy a cross-coupled level shifter (the deck's circuit, see src/spice/level-shifter.ts) and the
 * switch gate it drives draw from their supplies per period, at a corner: every internal node
 * charged once and discharged once, C V^2 (the complement inverter's and the skewed buffer's
 * nodes over the core supply, both latch nodes over the high level, the output with the gate over
 * high - low, whose charge returns to the low level's supply), plus the crowbar charge of the two
 * latch flips: while a pull-down fights the cross-coupled p device, that device, fully on, conducts
 * from the high level to ground while the latch node falls and the other side rises (C V^2 per node
 * and the crowbar charge: common practice, e.g. J. M. Rabaey et al., Digital Integrated Circuits,
 * 2nd ed., on dynamic and short-circuit power, from memory). The input is copied by an ideal
 * source in the deck and draws nothing here.
 */
import { saturationCurrent, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import type { SwitchPlan } from './plan.js';
import type { ShifterSizing } from './shifter-sizing.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

const current = (d: DeviceAtCorner, vgs: number) => saturationCurrent(d.driveConstant, d.alpha, vgs - d.vth);

/** The parts of a shifter's energy per period, J. */
export interface ShifterEnergy {
  /** Core-supply nodes: the complement, the skewed buffer's middle node and its output. */
  readonly core: number;
  /** Both latch nodes, 0 to the high level. */
  readonly latch: number;
  /** The output node with the switch gate (`load`), low to high level. */
  readonly output: number;
  /** Latch p devices conducting while their pull-downs fight them. */
  readonly crowbar: number;
  readonly total: number;
}

/** Energy per period of a shifter sized `size` driving a gate of `load` farads at `devices`' corner. */
export function shifterEnergy(ls: Shifter, size: ShifterSizing, load: number, devices: CornerDevices): ShifterEnergy {
  const { n, p, vdd } = devices;
  const high = levelAt(ls.high, vdd);
  const swing = Math.abs(high - levelAt(ls.low, vdd));
  const inverterDrains = n.cdrain * size.inverterN + p.cdrain * 2 * size.inverterN;
  const complement = inverterDrains + n.cgate * size.pullDown;
  const mid = n.cdrain * size.bufferN + p.cdrain * size.bufferP + (n.cgate + 2 * p.cgate) * size.inverterN + size.bufferCap;
  const set = inverterDrains + n.cgate * size.pullDown;
  const side = n.cdrain * size.pullDown + (p.cdrain + p.cgate) * size.latchP + size.latchCap;
  const setNode = side + n.cgate * size.outputN + p.cgate * size.outputP;
  const output = load + n.cdrain * size.outputN + p.cdrain * size.outputP;
  const pull = current(n, vdd) * size.pullDown;
  const latchP = current(p, high) * size.latchP;
  const fall = (node: number) => (pull > latchP ? (node * high) / (pull - latchP) : 0);
  // Each flip: the fought p device at full current while its node falls, then on average at half
  // while the other side's p device lifts the other node and turns it off (that half charge is
  // half the other node's C V, whatever the currents).
  const crowbar = (latchP * (fall(setNode) + fall(side)) + 0.5 * (side + setNode) * high) * high;
  const core = (complement + mid + set) * vdd * vdd;
  const latch = (side + setNode) * high * high;
  const out = output * swing * swing;
  return { core, latch, output: out, crowbar, total: core + latch + out + crowbar };
}
