/**
 * A level shifter's delay and output transition at a corner. The design gives both at the card's
 * nominal corner (typical process, nominal supply, t0); elsewhere they scale as the time a
 * cross-coupled shifter's pull-down takes to swing its output, t ~ C * V_swing / I_n(V_DD): the
 * low-side n device, driven by the low supply, sets the pace (common practice for the
 * cross-coupled shifter; e.g. J. M. Rabaey et al., Digital Integrated Circuits, on level
 * conversion, from memory). Checked against a transistor-level shifter in ngspice
 * (test/switches/shifter-timing.test.ts). The fight with the cross-coupled p device is not
 * modelled here; `shifterGateTiming` uses shifter-edges.ts, which has it, for every shifter the
 * deck builds as the sized latch, and this scale only for the others (down to a negative rail).
 */
import { deviceAtCorner, shiftFactor, type CornerDevices } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchPlan } from './plan.js';
import type { NetCycle } from '../measure/phases.js';
import { shifterEdges } from './shifter-edges.js';
import { latchShifter, nominalDevices, shifterFits, type ShifterSizing } from './shifter-sizing.js';
import { shapeLag, type EdgeShapeFit } from './shifter-shape.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

/** The card's nominal n drive per width, A/m, computed once per card. */
const nominalDrive = new WeakMap<ProcessCard, number>();

function nominalCurrent(card: ProcessCard): number {
  let current = nominalDrive.get(card);
  if (current === undefined) {
    const process = Object.hasOwn(card.corners, 'tt') ? 'tt' : Object.keys(card.corners)[0]!;
    current = deviceAtCorner(card, 'n', { name: 'nominal', process, vdd: card.vddNominal, temperature: card.t0, duty: 0.5 }).idsatPerWidth;
    nominalDrive.set(card, current);
  }
  return current;
}

/** How much slower than at the nominal corner the shifter is at `devices`' corner (1 at nominal). */
export function shifterScale(ls: Shifter, devices: CornerDevices): number {
  const card = devices.card;
  const swing = (vdd: number) => Math.abs(levelAt(ls.high, vdd) - levelAt(ls.low, vdd));
  const nominal = swing(card.vddNominal) / nominalCurrent(card);
  const here = swing(devices.vdd) / devices.n.idsatPerWidth;
  return nominal > 0 && here > 0 ? here / nominal : 1;
}

/**
 * The scale with the pull-down's threshold shifted by `dvth` (local mismatch, V): its drive falls
 * by the alpha-power factor (1 - dvth / V_ov)^alpha, and the shifter slows by its inverse.
 */
export function shifterScaleWithMismatch(ls: Shifter, devices: CornerDevices, dvth: number): number {
  const base = shifterScale(ls, devices);
  if (dvth === 0) return base;
  const factor = shiftFactor(dvth / (devices.vdd - devices.n.vth), devices.n.alpha);
  return factor > 0 ? base / factor : Infinity;
}

/** A shifter's timing at one corner, per output edge (the gate's), s. */
export interface ShifterGateTiming {
  /** Input 50 % to output 50 %, for the output's rising and falling edge. */
  readonly riseDelay: number;
  readonly fallDelay: number;
  /** Full-swing transition of the output's rising and falling edge. */
  readonly riseTransition: number;
  readonly fallTransition: number;
  /**
   * Time from the output's 50 % point to where it crosses a fraction of its swing, s (the latch
   * shifter's fitted edge shape, shifter-shape.ts); null, or none, for the linear ramp.
   */
  readonly riseShape?: (fraction: number) => number | null;
  readonly fallShape?: (fraction: number) => number | null;
}

/**
 * The shifter's timing at `devices`' corner with its pull-downs' threshold shifted by `dvth` (V).
 * A shifter the deck builds as the sized cross-coupled latch (`size` given) gets the per-edge
 * model of shifter-edges.ts, driven by its net's edges `slope`: ramps with their central slope
 * (measure/levels.ts, centralTransitions), the form the fits' ramps take. Against the deck's shifter
 * driven by too-tight's own phase net (ngspice-39, 45 corners, 90 edges), a ramp of the net's
 * 20-80 % slope gives the shifter's delay within -5.9..+1.3 ps (median -0.3); one of its 10-90 %
 * time made it +2.5..+14.8 ps slow (median +6.8), the net's tail counted as a slow input (the
 * hand-written deck test/spice/decks/shifter-up-netedge.cir shows it with one such edge). The rule
 * is for the smooth edges CMOS buffers make: an edge kinked at its 50 % point, fast below and slow
 * above, reads about 13 ps fast, its slow upper half being where the skewed buffer switches. Any
 * other shifter keeps the declared delay and transition carried by `shifterScaleWithMismatch`
 * (the transition, when none is declared, is the net's full-swing `cycle` one).
 */
export function shifterGateTiming(
  ls: Shifter,
  devices: CornerDevices,
  cycle: Pick<NetCycle, 'riseTransition' | 'fallTransition'>,
  size: ShifterSizing | null,
  dvth: number,
  slope: Pick<NetCycle, 'riseTransition' | 'fallTransition'> = cycle,
): ShifterGateTiming {
  if (size && latchShifter(ls, devices.vdd)) {
    const invert = ls.invert === true;
    const input = invert
      ? { rise: slope.fallTransition, fall: slope.riseTransition }
      : { rise: slope.riseTransition, fall: slope.fallTransition };
    const e = shifterEdges(ls, size, devices, nominalDevices(devices.card), input, dvth);
    const fits = shifterFits(levelAt(ls.low, devices.vdd));
    // A latch that never flips has no edge to shape: its infinite times stay as the ramp gives them.
    const lag = (fit: EdgeShapeFit, ratio: number, transition: number) => (fraction: number) => {
      const t = Number.isFinite(transition) ? shapeLag(fit, ratio, fraction) : null;
      return t === null ? null : t * transition;
    };
    return {
      riseDelay: e.rise,
      fallDelay: e.fall,
      riseTransition: e.riseTransition,
      fallTransition: e.fallTransition,
      riseShape: lag(fits.edges.riseShape, e.riseRatio, e.riseTransition),
      fallShape: lag(fits.edges.fallShape, e.fallRatio, e.fallTransition),
    };
  }
  const scale = shifterScaleWithMismatch(ls, devices, dvth);
  const delay = ls.delay * scale;
  const netRise = ls.invert === true ? cycle.fallTransition : cycle.riseTransition;
  const netFall = ls.invert === true ? cycle.riseTransition : cycle.fallTransition;
  return {
    riseDelay: delay,
    fallDelay: delay,
    riseTransition: ls.transition !== undefined ? ls.transition * scale : netRise,
    fallTransition: ls.transition !== undefined ? ls.transition * scale : netFall,
  };
}
