/**
 * The crowbar charge of one flip of a level shifter's cross-coupled latch, integrated in time.
 *
 * A pull device turns on and raises its latch node from the latch's rail against the latch device
 * on that node, whose gate is the other node, still at the full span. The latch device starts in
 * its triode region with no voltage across it, so it conducts little while the node leaves the
 * rail; once the node passes the other latch device's threshold, that device pulls the other node
 * down (nothing else holds it: its own pull device turned off with the same input edge), and the
 * fought device's gate drive falls away. What crosses from the pull's supply to the latch's rail
 * through the fought device over the whole flip is the crowbar charge; it costs that charge times
 * the span. The two nodes' own C V^2 is counted elsewhere. Measured in ngspice on generic180's
 * models (negative-pump's shifter at tt/1.62V/27C, pull gates stepped): the other node starts
 * 0.35 V past the span, and the fought devices pass 61 and 66 fC in the two flips.
 *
 * Voltages are measured from the latch's rail toward the pull's supply (an n-type view of every
 * device, gate-edge.ts drainCurrent), so the same integration serves the shifter up from the core
 * (n pull-downs against a p latch) and its mirror below ground. The pull device's gate is taken as
 * switched at once; the front's ramp is left out.
 */
import { drainCurrent, type GateDevice } from '../process/gate-edge.js';

export interface LatchFight {
  /** The pull device, its gate drive when on (V_GS magnitude), and the latch devices (both alike). */
  readonly pull: GateDevice;
  readonly pullDrive: number;
  readonly latch: GateDevice;
  /** Latch swing, V: rail to the pull's supply. */
  readonly span: number;
  /** Capacitance of the node being pulled and of the other node, F. */
  readonly node: number;
  readonly other: number;
  /**
   * Charge the other side's pull device, turning off as this one turns on, leaves on the other
   * node per volt of its gate swing, F: its gate-drain overlap and the drain's half of its channel
   * (Meyer's split of a device in its linear region at V_DS = 0; J. E. Meyer, RCA Review 32, 1971),
   * half its gate capacitance in all. It lifts the other node past the span, so the fought device
   * starts with more gate drive.
   */
  readonly injection: number;
}

/**
 * Steps of the fastest time constant (midpoint steps; the charge moves by under 0.2 % from 2 to
 * 16 steps on negative-pump's shifter).
 */
const STEPS_PER_TAU = 2;
/** Most steps taken: a flip that has not finished by then is counted as far as it got. */
const STEP_LIMIT = 200_000;

/** Conductance of a device at full gate drive `drive` and V_DS = 0, S. */
function peakConductance(d: GateDevice, drive: number): number {
  return Math.max(drainCurrent(d, drive, 1e-3), 0) / 1e-3;
}

/** The charge the fought latch device passes from the pull's supply to its rail during one flip, C. */
export function flipCrowbarCharge(f: LatchFight): number {
  const { span } = f;
  const pullOn = (u: number) => drainCurrent(f.pull, f.pullDrive, span - u);
  const latchOn = (gate: number, u: number) => drainCurrent(f.latch, gate, u);
  const g = peakConductance(f.pull, f.pullDrive) + peakConductance(f.latch, span);
  if (!(g > 0) || !(f.node > 0) || !(f.other > 0)) return 0;
  const dt = Math.min(f.node, f.other) / g / STEPS_PER_TAU;
  // u: the pulled node, w: the other node, both from the latch's rail.
  let u = 0;
  let w = span + (f.injection * f.pullDrive) / f.other;
  let charge = 0;
  let peak = 0;
  for (let k = 0; k < STEP_LIMIT; k++) {
    const fought = latchOn(w, u);
    const du = (pullOn(u) - fought) / f.node;
    const dw = -latchOn(u, w) / f.other;
    const um = u + (du * dt) / 2;
    const wm = w + (dw * dt) / 2;
    const foughtMid = latchOn(wm, um);
    charge += foughtMid * dt;
    peak = Math.max(peak, foughtMid);
    u += ((pullOn(um) - foughtMid) / f.node) * dt;
    w -= (latchOn(um, wm) / f.other) * dt;
    if (u < 0) u = 0;
    if (w < 0) w = 0;
    // Done once the pulled node is up and the fought device has let go.
    if (u >= 0.99 * span && foughtMid <= 1e-4 * peak) break;
  }
  return charge;
}
