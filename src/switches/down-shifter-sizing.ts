/**
 * Device widths and node capacitors of the deck's transistor-level shifter to a low level below
 * ground (see down-shifter.ts for the circuit), chosen so that at the card's nominal corner it has
 * the design's declared delay on both edges and its declared output transition.
 *
 * As for the shifter up from the core (shifter-sizing.ts), each stage's time is estimated as
 * C * dV / (2 I) from the card's alpha-power currents at the nominal corner, and the estimates are
 * turned into delays and transitions by linear fits to ngspice runs of the same circuit (FITS:
 * ngspice-39 on fixtures/models/generic180.lib at tt/1.8V/27C, 60 random sizings from
 * scripts/down-shifter-fit.mjs, output levels -VDD..0, -VDD..VDD, -2VDD..-VDD, -VDD/2..VDD/2 and
 * -1.5VDD..0, loads of 10 to 160 fF, input ramps of 60 to 500 ps; rising delay within 8.6 % median
 * and 28 % worst, falling 2.5 % and 9.7 %, transitions 17 % and 13 % median, 108 % and 50 % worst).
 * Other cards get the same fits: `confirm` measures what the shifter really does at every corner.
 * The coefficients of the current-based estimates are multiplied by 1.1261 since generic180's drive
 * went up by that factor (its prefactor 0.888 -> 0.955 with vdsatRatio, then to the fit's own 1.0;
 * the script's fit scales the same way), so every shifter is sized as before.
 */
import type { ProcessCard } from '../schema/process.js';
import { saturationCurrent, type DeviceAtCorner } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import { bodyThreshold } from './physics.js';
import type { SwitchPlan } from './plan.js';
import { nominalDevices } from './shifter-sizing.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

/** Widths in m, capacitances in F. */
export interface DownShifterSizing {
  /** Complement inverter of the input (n; its p is twice as wide). */
  readonly inverterN: number;
  /** Skewed buffer before the set-side pull-up: a weak p first stage, then an inverter like the complement's. */
  readonly bufferN: number;
  readonly bufferP: number;
  /** Capacitor on the skewed buffer's middle node. */
  readonly bufferCap: number;
  /** Pull-up p devices (from the core supply) and cross-coupled n devices of the latch (on the low level). */
  readonly pullUp: number;
  readonly latchN: number;
  /** Capacitor on each latch node. */
  readonly latchCap: number;
  /** Output inverter between the low and high levels. */
  readonly outputN: number;
  readonly outputP: number;
  /** The fits' delays (output rising, falling) and mean transition at the nominal corner, s. */
  readonly estimate: { readonly rise: number; readonly fall: number; readonly transition: number };
}

/** Stage estimates of one sized shifter, s (the fits' regressors). */
export interface DownShifterTerms {
  /** A latch node pulled up by its p device against the latch's n device. */
  readonly pullUp: number;
  /** A latch node pulled down by the latch's n device. */
  readonly latch: number;
  /** The skewed buffer's middle node rising through its weak p device. */
  readonly buffer: number;
  /** The output node over its whole swing. */
  readonly output: number;
}

/** Pull-ups this many unit p widths wide when the design gives none. */
const PULL_UP_UNITS = 4;
/** The latch's n devices at most this fraction of the pull-ups, so the pull-up wins the fight. */
const LATCH_RATIO = 0.25;
/** Widest pull-up the sizing reaches for a short delay, unit p widths. */
const MAX_PULL_UP_UNITS = 8;
/** Shortest output transition the fits are asked for, s. */
const MIN_TRANSITION = 40e-12;

/**
 * ngspice fits, s and dimensionless: rise is [constant, pull-up, latch, output, input ramp], fall
 * [constant, buffer, pull-up, output, input ramp], transitions [constant, output, the slower latch stage].
 */
export const FITS = {
  rise: [140.82e-12, -0.5891, 1.552, 1.0409, 0.2395],
  fall: [115.67e-12, 1.286, 0.9165, 0.6356, 0.2935],
  transitionRise: [27.85e-12, 2.2197, 0.3408],
  transitionFall: [49.51e-12, 1.4559, 0.3106],
} as const;

interface Currents {
  readonly n: DeviceAtCorner;
  readonly p: DeviceAtCorner;
  readonly vdd: number;
  readonly low: number;
  readonly high: number;
  /** Per width, A/m: a pull-up (and the core's p devices) at V_SG = VDD. */
  readonly pull: number;
  /** Per width: a latch n device and the output n device, gate at VDD, source at the low level. */
  readonly latch: number;
  /** Per width: the output p device at V_SG = high - low, its n-well at max(high, 0). */
  readonly outP: number;
  /** Per width: the core's n devices at V_GS = VDD. */
  readonly core: number;
  /** Threshold magnitude of the output p device with its body effect, V. */
  readonly pVth: number;
}

function currents(card: ProcessCard, lowLevel: Shifter['low'], highLevel: Shifter['high']): Currents {
  const { n, p } = nominalDevices(card);
  const vdd = card.vddNominal;
  const low = levelAt(lowLevel, vdd);
  const high = levelAt(highLevel, vdd);
  const current = (d: DeviceAtCorner, vgs: number, vth = d.vth) => saturationCurrent(d.driveConstant, d.alpha, Math.max(0, vgs - vth));
  const pBody = bodyThreshold(p.vth, p.gamma, p.phi2f, Math.max(0, -high));
  return {
    n,
    p,
    vdd,
    low,
    high,
    pull: current(p, vdd),
    latch: current(n, vdd - low),
    outP: current(p, high - low, pBody),
    core: current(n, vdd),
    pVth: pBody,
  };
}

/** Latch n width per pull-up width: at most LATCH_RATIO, and so that a pull-up has twice the latch device's current. */
export function downLatchRatio(card: ProcessCard, levels: Pick<Shifter, 'low' | 'high'>): number {
  const c = currents(card, levels.low, levels.high);
  return Math.min(LATCH_RATIO, (0.5 * c.pull) / c.latch);
}

/** Output p width per output n width, so both output edges have the same drive. */
function outputRatio(c: Currents): number {
  return c.latch / c.outP;
}

/** The stage estimates of a shifter with these sizes, a load `load` (F) on its output. */
export function downShifterTerms(
  card: ProcessCard,
  levels: Pick<Shifter, 'low' | 'high'>,
  size: Omit<DownShifterSizing, 'estimate'>,
  load: number,
): DownShifterTerms {
  const c = currents(card, levels.low, levels.high);
  const { n, p } = c;
  const swing = c.high - c.low;
  const outSelf = n.cdrain * size.outputN + p.cdrain * size.outputP;
  const output = ((load + outSelf) * swing) / (size.outputN * c.latch);
  const node = latchNode(c, size);
  const mid = n.cdrain * size.bufferN + p.cdrain * size.bufferP + (n.cgate + 2 * p.cgate) * size.inverterN + size.bufferCap;
  // The output inverter trips where its two devices have equal overdrive: the latch node travels
  // from VDD down to there (output rising) or from the low level up to there (output falling).
  const trip = Math.min(c.vdd, Math.max(c.low, (c.high - c.pVth + c.low + n.vth) / 2));
  return {
    pullUp: (node * 2 * (trip - c.low)) / (2 * Math.max(1e-12, c.pull * size.pullUp - c.latch * size.latchN)),
    latch: (node * 2 * (c.vdd - trip)) / (2 * c.latch * size.latchN),
    buffer: (mid * c.vdd) / (2 * c.pull * size.bufferP),
    output,
  };
}

/** Capacitance of one latch node, F: drains, the other side's n gate, the output inverter's gates, the capacitor. */
function latchNode(c: Currents, size: Pick<DownShifterSizing, 'pullUp' | 'latchN' | 'outputN' | 'outputP' | 'latchCap'>): number {
  const { n, p } = c;
  return p.cdrain * size.pullUp + (n.cdrain + n.cgate) * size.latchN + n.cgate * size.outputN + p.cgate * size.outputP + size.latchCap;
}

/**
 * Sizes the shifter of a switch for an output load `load` (the switch's gate, F) and the input
 * ramp `input` (full-swing transition of its net at the nominal corner, s). Without a declared
 * transition it aims for one as long as its delay.
 */
export function sizeDownShifter(ls: Shifter, card: ProcessCard, load: number, input: number): DownShifterSizing {
  const c = currents(card, ls.low, ls.high);
  const { n, p } = c;
  const swing = c.high - c.low;
  const ratio = outputRatio(c);
  const latchRatio = downLatchRatio(card, ls);
  const [tr0, tr1, tr2] = FITS.transitionRise;
  const [tf0, tf1, tf2] = FITS.transitionFall;
  const [r0, r1, r2, r3, r4] = FITS.rise;
  const [f0, f1, f2, f3, f4] = FITS.fall;
  const riseOf = (t: DownShifterTerms) => r0 + r1 * t.pullUp + r2 * t.latch + r3 * t.output + r4 * input;
  const fallOf = (t: DownShifterTerms) => f0 + f1 * t.buffer + f2 * t.pullUp + f3 * t.output + f4 * input;
  const transitionOf = (t: DownShifterTerms) => (tr0 + tf0 + (tr1 + tf1) * t.output + tr2 * t.latch + tf2 * t.pullUp) / 2;
  const target = ls.transition ?? ls.delay;
  const selfPerWidth = (n.cdrain + p.cdrain * ratio) * swing;
  const selfLoaded = (2 * selfPerWidth) / c.latch;
  const sized = (outEstimate: number, pullUp: number, latchCap: number, bufferCap: number) => {
    const outputN = (load * swing) / (outEstimate * c.latch - selfPerWidth);
    return {
      inverterN: 2 * card.unit.wn,
      bufferN: 8 * card.unit.wn,
      bufferP: card.unit.wp,
      bufferCap,
      pullUp,
      latchN: latchRatio * pullUp,
      latchCap,
      outputN,
      outputP: outputN * ratio,
    };
  };
  // Each time is linear in a node's capacitance, so two evaluations give the capacitor for a time.
  const capFor = (time: (cap: number) => number, goal: number) => {
    const at0 = time(0);
    return { at0, cap: Math.max(0, (goal - at0) / ((time(1e-12) - at0) / 1e-12)) };
  };
  // The output transition also carries the latch's slower stages: size the output, then the latch, and again.
  let latchPart = 0;
  let size = sized(Math.max(MIN_TRANSITION, selfLoaded), ls.w ?? PULL_UP_UNITS * card.unit.wp, 0, 0);
  for (let pass = 0; pass < 4; pass++) {
    const outEstimate = Math.max(MIN_TRANSITION, selfLoaded, (target - (tr0 + tf0) / 2 - latchPart) / ((tr1 + tf1) / 2));
    // The rising edge (through the latch) is the slow one: the latch capacitor sets it.
    const rise = (pullUp: number) =>
      capFor((cap) => riseOf(downShifterTerms(card, ls, sized(outEstimate, pullUp, cap, 0), load)), ls.delay);
    let pullUp = ls.w ?? PULL_UP_UNITS * card.unit.wp;
    if (ls.w === undefined) {
      // A wider pull-up also loads its node: widen it only while that makes the edge faster.
      for (let units = PULL_UP_UNITS + 1; units <= MAX_PULL_UP_UNITS && rise(pullUp).at0 > ls.delay; units++) {
        if (rise(units * card.unit.wp).at0 < rise(pullUp).at0) pullUp = units * card.unit.wp;
      }
    }
    const latchCap = rise(pullUp).cap;
    const bufferCap = capFor((cap) => fallOf(downShifterTerms(card, ls, sized(outEstimate, pullUp, latchCap, cap), load)), ls.delay).cap;
    size = sized(outEstimate, pullUp, latchCap, bufferCap);
    const t = downShifterTerms(card, ls, size, load);
    latchPart = (tr2 * t.latch + tf2 * t.pullUp) / 2;
  }
  const final = downShifterTerms(card, ls, size, load);
  return { ...size, estimate: { rise: riseOf(final), fall: fallOf(final), transition: transitionOf(final) } };
}
