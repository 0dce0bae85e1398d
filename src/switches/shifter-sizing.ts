/**
 * Device widths and node capacitors of the deck's transistor-level level shifter (see
 * src/spice/level-shifter.ts for the circuit), chosen so that at the card's nominal corner the shifter has
 * the design's declared delay on both edges and its declared output transition.
 *
 * Each stage's time is estimated as C * dV / (2 I) from the card's alpha-power currents at the
 * nominal corner; the estimates are turned into the shifter's delays, transitions and output edge
 * shape by fits to ngspice runs of the same circuit (scripts/shifter-fit.mjs: ngspice-39 on
 * fixtures/models/generic180.lib at tt/1.8V/27C, 120 random sizings with loads of 10 to 160 fF,
 * input ramps of 60 to 500 ps, pull-downs of 2 to 8 unit widths, the output p device within 0.7 to
 * 1.4 times the width that matches the n device's drive, output low level at 0 and at VDD, high
 * level 2 VDD). Delays: median 3.1-5.1 %, worst 12-25 % of ngspice (40 other sizings: median
 * 3.6-5.6 %, worst 27 %). Output transitions from the output stage and the latch node's stage
 * time: median 1.7-11 %, worst 11-38 %; from the output stage alone (what the sizing can use,
 * before the latch is sized) median 15-34 %.
 * Other cards get the same fits: `confirm` measures what the shifter really does at every corner.
 */
import { cornerName, type Corner } from '../process/corner.js';
import { devicesAtCorner, saturationCurrent, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchPlan } from './plan.js';
import type { EdgeShapeFit } from './shifter-shape.js';

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
  /** Delays. Constant, then per estimate: latch node fall, latch node rise (or skewed buffer), output stage, input ramp. */
  readonly fall: readonly [number, number, number, number, number];
  readonly rise: readonly [number, number, number, number, number];
  /** The sizing's output transitions: constant, output stage (chosen before the latch, so on its own). */
  readonly transitionRise: readonly [number, number];
  readonly transitionFall: readonly [number, number];
  /** The edges' output transitions: constant, output stage, the latch node's stage time (fight; latch p rise). */
  readonly edgeTransitionRise: readonly [number, number, number];
  readonly edgeTransitionFall: readonly [number, number, number];
  /** Full-swing transitions of the latch node driving the output: its fall (constant, fight, latch p rise) and rise (constant, latch p rise). */
  readonly latchFall: readonly [number, number, number];
  readonly latchRise: readonly [number, number];
  /** The per-corner edge model's fits (shifter-edges.ts), made at every corner: see EdgeFits. */
  readonly edges: EdgeFits;
}

/**
 * Fits of the shifter's edges at any corner (scripts/shifter-fit.mjs 400 11 with CORNERS=1: random
 * sizings at random corners of the card, every third with no capacitors and a pull-down of 6 to 8
 * unit widths, as the sizing makes a short delay). Each set's first coefficient multiplies a core
 * inverter's C V / I over the nominal corner's (s), the rest the stage times as shifter-edges.ts
 * forms them at the corner (the fight by fightTime's integral); the order of the stage times is
 * the sizing fits' above. The delays' last coefficient multiplies the input ramp times its first
 * stage's switching point less one half (switchingPoint). Over the 200 runs of each group, delays
 * median 2.9 / 5.1 % (grounded rise / fall), 4.6 / 3.9 % (floating), worst 23 / 25 / 21 / 17 %.
 */
export interface EdgeFits {
  readonly fall: readonly [number, number, number, number, number, number];
  readonly rise: readonly [number, number, number, number, number, number];
  readonly edgeTransitionRise: readonly [number, number, number];
  readonly edgeTransitionFall: readonly [number, number, number];
  readonly latchFall: readonly [number, number, number];
  readonly latchRise: readonly [number, number];
  /** Shapes of the output's rising and falling edge (shifter-shape.ts). */
  readonly riseShape: EdgeShapeFit;
  readonly fallShape: EdgeShapeFit;
}
/** Output low level at ground: the output n device sees the whole high level on its gate. */
const GROUNDED: ShifterFits = {
  fall: [32.084e-12, 0.19635, 1.6926, 1.3055, 0.15124],
  rise: [77.775e-12, 1.7335, 0.71361, 0.67501, 0.15823],
  transitionRise: [113.94e-12, 0.94666],
  transitionFall: [231.97e-12, 0.50475],
  edgeTransitionRise: [10.15e-12, 1.3947, 0.44772],
  edgeTransitionFall: [10.992e-12, 1.4327, 0.75441],
  latchFall: [10.617e-12, 1.1865, 0.44198],
  latchRise: [21.701e-12, 3.3714],
  edges: {
    fall: [48.832e-12, 0.74205, 1.403, 0.89641, 0.1456, 0.61634],
    rise: [71.213e-12, 1.5833, 1.0297, 0.63165, 0.16431, 0.11224],
    edgeTransitionRise: [5.578e-12, 1.3558, 0.64239],
    edgeTransitionFall: [1.7924e-12, 1.5475, 0.78096],
    latchFall: [22.029e-12, 2.0473, 0.11692],
    latchRise: [6.6659e-12, 3.4787],
    riseShape: {
      ratio: [0.23, 3.93],
      levels: [
        [-0.4453, -0.1652, -0.0588],
        [-0.3468, -0.0974, -0.0358],
        [-0.2271, -0.0231, -0.0065],
        [-0.1441, 0.002, 0.0033],
        [-0.0714, 0.006, 0.0035],
        [0.0766, -0.0129, -0.007],
        [0.1655, -0.0319, -0.0169],
        [0.2789, -0.0583, -0.0285],
        [0.4531, -0.0974, -0.0357],
        [0.6106, -0.1276, -0.0233],
      ],
    },
    fallShape: {
      ratio: [0.34, 5.38],
      levels: [
        [0.577, -0.1383, 0.0392],
        [0.4463, -0.0913, -0.024],
        [0.281, -0.0505, -0.0308],
        [0.168, -0.027, -0.0188],
        [0.0783, -0.0106, -0.0081],
        [-0.075, 0.0034, 0.0071],
        [-0.153, -0.0029, 0.0125],
        [-0.2393, -0.0276, 0.0056],
        [-0.3537, -0.0913, -0.024],
        [-0.4368, -0.1447, -0.0554],
      ],
    },
  },
};
/** Output low level above ground (a floating output domain such as VDD .. 2 VDD). */
const FLOATING: ShifterFits = {
  fall: [68.872e-12, 0.74619, 2.4325, 1.2365, 0.10611],
  rise: [79.853e-12, 1.6466, 0.61729, 0.73072, 0.18586],
  transitionRise: [79.671e-12, 2.1202],
  transitionFall: [96.986e-12, 1.7809],
  edgeTransitionRise: [37.255e-12, 2.1678, 0.3108],
  edgeTransitionFall: [9.3623e-12, 1.8633, 0.42279],
  latchFall: [22.95e-12, 1.3705, 0.25054],
  latchRise: [-8.7602e-12, 3.3778],
  edges: {
    fall: [61.236e-12, 1.1885, 2.3676, 0.89413, 0.13991, 0.7632],
    rise: [72.212e-12, 1.5609, 0.84598, 0.806, 0.16566, 0.31893],
    edgeTransitionRise: [8.055e-12, 2.4887, 0.45316],
    edgeTransitionFall: [8.5158e-12, 1.8544, 0.41578],
    latchFall: [26.243e-12, 2.1488, 0.031068],
    latchRise: [-0.013878e-12, 3.311],
    riseShape: {
      ratio: [0.06, 5.04],
      levels: [
        [-0.3551, -0.0693, -0.0126],
        [-0.2989, -0.0504, -0.0101],
        [-0.2133, -0.0252, -0.0058],
        [-0.141, -0.0103, -0.0026],
        [-0.0718, -0.0024, -0.0007],
        [0.0794, -0.0021, -0.0002],
        [0.1741, -0.0091, -0.0016],
        [0.299, -0.0229, -0.0044],
        [0.5011, -0.0505, -0.0101],
        [0.6976, -0.0756, -0.0146],
      ],
    },
    fallShape: {
      ratio: [0.07, 11.59],
      levels: [
        [0.5754, -0.0632, -0.019],
        [0.4311, -0.0421, -0.0121],
        [0.2732, -0.0205, -0.0048],
        [0.1677, -0.0085, -0.0011],
        [0.081, -0.002, 0.0001],
        [-0.0824, -0.0012, -0.0007],
        [-0.169, -0.0062, -0.0021],
        [-0.2623, -0.0175, -0.0049],
        [-0.3689, -0.0421, -0.0121],
        // biome-ignore lint/suspicious/noApproximativeNumericConstant: a fitted coefficient, not Math's constant
        [-0.4343, -0.0657, -0.0193],
      ],
    },
  },
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
