/**
 * Device widths and node capacitors of the deck's transistor-level level shifter (see
 * src/spice/level-shifter.ts for the circuit), chosen so that at the card's nominal corner the shifter has
 * the design's declared delay on both edges and its declared output transition.
 *
 * Each stage's time is estimated as C * dV / (2 I) from the card's alpha-power currents at the
 * nominal corner; the estimates are turned into the shifter's delays and transitions by linear
 * fits to ngspice runs of the same circuit (ngspice 42 on fixtures/models/generic180.lib at
 * tt/1.8V/27C, 60 random sizings with loads of 10 to 160 fF, output transitions of 80 to 400 ps,
 * input ramps of 60 to 500 ps, pull-downs of 2 and 4 um, output low level at 0 and at VDD, high
 * level 2 VDD; delays within 7 %, transitions within 26 % of ngspice). Other cards get the same
 * fits: `confirm` measures what the shifter really does at every corner. The coefficients of the
 * current-based estimates are multiplied by 1.1261 since generic180's drive went up by that factor
 * (its prefactor 0.888 -> 0.955 with vdsatRatio, then to the fit's own 1.0), so every shifter is
 * sized as before.
 */
import { cornerName, type Corner } from '../process/corner.js';
import { devicesAtCorner, saturationCurrent, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchPlan } from './plan.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

/** Widths in m, capacitances in F. */
export interface ShifterSizing {
  /** Complement inverter of the input (n; its p is twice as wide). */
  readonly inverterN: number;
  /** Skewed buffer before the set-side pull-down: a weak n first stage, then an inverter like the complement's. */
  readonly bufferN: number;
  readonly bufferP: number;
  /** Capacitor on the skewed buffer's middle node. */
  readonly bufferCap: number;
  /** Pull-down n devices and cross-coupled p devices of the latch. */
  readonly pullDown: number;
  readonly latchP: number;
  /** Capacitor on each latch node. */
  readonly latchCap: number;
  /** Output inverter between the low and high levels. */
  readonly outputN: number;
  readonly outputP: number;
  /** The output inverter's stage time C (high - low) / I at the nominal corner, alike on both edges, s. */
  readonly outputStage: number;
  /** The fits' delays (output rising, falling) and mean transition at the nominal corner, s. */
  readonly estimate: { readonly rise: number; readonly fall: number; readonly transition: number };
}

/** A pull-down this many unit n widths wide when the design gives none (as mismatch.ts assumes). */
const PULL_DOWN_UNITS = 4;
/** The latch's p devices at most this fraction of the pull-downs, so the pull-down wins the fight. */
const LATCH_RATIO = 0.25;
/** Widest pull-down the sizing reaches for a short delay, unit n widths (the fits went to 8). */
const MAX_PULL_DOWN_UNITS = 8;
/** Shortest output transition the fits are asked for, s. */
const MIN_TRANSITION = 40e-12;

/** ngspice fits (see the header), s and dimensionless: [constant, coefficients of the estimates]. */
export interface ShifterFits {
  /** Constant, then per estimate: latch node fall, latch node rise (or skewed buffer), output transition, input ramp. */
  readonly fall: readonly [number, number, number, number, number];
  readonly rise: readonly [number, number, number, number, number];
  readonly transitionRise: readonly [number, number];
  readonly transitionFall: readonly [number, number];
}
/** Output low level at ground: the output n device sees the whole high level on its gate. */
const GROUNDED: ShifterFits = {
  fall: [89.34e-12, 0.7891, 1.3083, 0.4895, 0.1113],
  rise: [104.23e-12, 1.4697, 1.0145, 0.4217, 0.1653],
  transitionRise: [31.45e-12, 1.0114],
  transitionFall: [68.06e-12, 0.9058],
};
/** Output low level above ground (a floating output domain such as VDD .. 2 VDD). */
const FLOATING: ShifterFits = {
  fall: [72.24e-12, 1.221, 2.0243, 0.8518, 0.1646],
  rise: [77.3e-12, 1.4493, 0.8363, 0.6173, 0.2646],
  transitionRise: [34.46e-12, 1.7097],
  transitionFall: [64.59e-12, 1.4394],
};

/** The fits for a shifter whose output low level is `low` volts. */
export function shifterFits(low: number): ShifterFits {
  return low > 0 ? FLOATING : GROUNDED;
}

const nominal = new WeakMap<ProcessCard, CornerDevices>();

/** The card's devices at its nominal corner, computed once per card. */
export function nominalDevices(card: ProcessCard): CornerDevices {
  let devices = nominal.get(card);
  if (devices === undefined) {
    devices = devicesAtCorner(card, nominalCorner(card, 0.5));
    nominal.set(card, devices);
  }
  return devices;
}

/**
 * Sizes the shifter of a switch for an output load `load` (the switch's gate, F) and the input
 * ramp `input` (full-swing transition of its net at the nominal corner, s). Without a declared
 * transition it aims for one as long as its delay: the sizing must not depend on the corner, and
 * the net's own transition (what the model then uses) is known only per corner.
 */
export function sizeShifter(ls: Shifter, card: ProcessCard, load: number, input: number): ShifterSizing {
  const { n, p } = nominalDevices(card);
  const vdd = card.vddNominal;
  const low = levelAt(ls.low, vdd);
  const high = levelAt(ls.high, vdd);
  const swing = high - low;
  const current = (d: DeviceAtCorner, vgs: number) => saturationCurrent(d.driveConstant, d.alpha, vgs - d.vth);
  const fits = shifterFits(low);
  const unit = card.unit.wn;
  const inverterN = 2 * unit;
  const bufferN = 2 * unit;
  const bufferP = 4 * inverterN;
  // Per width: the pull-down at the input swing, a latch p device with its gate at ground.
  const inPull = current(n, vdd);
  const inLatch = current(p, high);
  const latchRatio = Math.min(LATCH_RATIO, (0.5 * inPull) / inLatch);
  // Output inverter: n gate-source at high - low, p source-gate at high; both edges alike.
  const outN = current(n, swing);
  const ratio = outN / inLatch;
  const target = ls.transition ?? ls.delay;
  const [tr0, tr1] = fits.transitionRise;
  const [tf0, tf1] = fits.transitionFall;
  const selfLoaded = (2 * n.cdrain * swing * (1 + ratio)) / outN;
  const outEstimate = Math.max(MIN_TRANSITION, selfLoaded, (target - (tr0 + tf0) / 2) / ((tr1 + tf1) / 2));
  const outputN = (load * swing) / (outEstimate * outN - n.cdrain * swing * (1 + ratio));
  const outputP = outputN * ratio;
  // Latch node: drains, the other side's p gate, the output inverter's gates, and a capacitor.
  // Per unit of pull-down width: the latch's own part of the node and its times per farad.
  const ownPerWidth = n.cdrain + (p.cdrain + p.cgate) * latchRatio;
  const outputGates = n.cgate * outputN + p.cgate * outputP;
  const [f0, f1, f2, f3, f4] = fits.fall;
  const fixedFall = f0 + f3 * outEstimate + f4 * input;
  const perFarad = (w: number) => (f1 * high) / (2 * (inPull - inLatch * latchRatio) * w) + (f2 * high) / (2 * inLatch * latchRatio * w);
  // The declared pull-down width, else the default one, widened when the delay needs a faster latch.
  let pullDown = ls.w ?? PULL_DOWN_UNITS * unit;
  const spare = (ls.delay - fixedFall) / perFarad(pullDown) - ownPerWidth * pullDown;
  if (ls.w === undefined && spare < outputGates) {
    const room = (ls.delay - fixedFall) / perFarad(1) - ownPerWidth;
    pullDown = room > 0 ? Math.min(MAX_PULL_DOWN_UNITS * unit, Math.max(pullDown, outputGates / room)) : MAX_PULL_DOWN_UNITS * unit;
  }
  const latchP = latchRatio * pullDown;
  const node0 = ownPerWidth * pullDown + outputGates;
  const perFall = high / (2 * (inPull * pullDown - inLatch * latchP));
  const perRise = high / (2 * inLatch * latchP);
  const fallAt = (node: number) => fixedFall + f1 * node * perFall + f2 * node * perRise;
  const latchCap = Math.max(0, (ls.delay - fixedFall) / perFarad(pullDown) - node0);
  const node = node0 + latchCap;
  // Skewed buffer: its weak first n stage holds back only the set side's rising edge.
  const mid0 = n.cdrain * bufferN + p.cdrain * bufferP + (n.cgate + 2 * p.cgate) * inverterN;
  const perBuffer = vdd / (2 * inPull * bufferN);
  const [r0, r1, r2, r3, r4] = fits.rise;
  const fixedRise = r0 + r2 * node * perFall + r3 * outEstimate + r4 * input;
  const riseAt = (mid: number) => fixedRise + r1 * mid * perBuffer;
  const bufferCap = Math.max(0, (ls.delay - fixedRise) / (r1 * perBuffer) - mid0);
  return {
    inverterN,
    bufferN,
    bufferP,
    bufferCap,
    pullDown,
    latchP,
    latchCap,
    outputN,
    outputP,
    outputStage: outEstimate,
    estimate: {
      rise: riseAt(mid0 + bufferCap),
      fall: fallAt(node),
      transition: (tr0 + tf0 + (tr1 + tf1) * outEstimate) / 2,
    },
  };
}

/** Whether the shifter is the cross-coupled up-shifter sized here, at supply `vdd`: a high level above 0 V, a low level at or above 0 V. */
export function latchShifter(ls: Shifter, vdd: number): boolean {
  return levelAt(ls.high, vdd) > 0 && levelAt(ls.low, vdd) >= 0;
}

/** The nominal corner of a card (typical process, nominal supply, t0) at a duty cycle. */
export function nominalCorner(card: ProcessCard, duty: number): Corner {
  const process = Object.hasOwn(card.corners, 'tt') ? 'tt' : Object.keys(card.corners)[0]!;
  return { name: cornerName(process, card.vddNominal, card.t0), process, vdd: card.vddNominal, temperature: card.t0, duty };
}
