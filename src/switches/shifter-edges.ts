/**
 * A sized cross-coupled level shifter's delays and output transitions at any corner, one per
 * output edge, from its stage times at that corner. The circuit is the deck's (see
 * src/spice/level-shifter.ts); its sizes come from shifter-sizing.ts, and the fits that turn stage
 * times into delays are that module's `edges` (ngspice fits over random sizings at every corner of
 * the card). Each stage time is C dV / (2 I) with the corner's alpha-power currents (common
 * practice), but the stage that flips the latch is the fight, the n pull-down at the core supply
 * against the cross-coupled p device fully on at the high level (the ratioed-latch condition
 * I_n W_pd > I_p W_p, e.g. J. M. Rabaey et al., Digital Integrated Circuits, 2nd ed., on level
 * conversion, from memory), timed over the node's fall with the p device's drain current as it
 * leaves its source (fightTime): at first it opposes nothing. Taking its saturation current all the
 * way made the fall 18.5 % slow at sf/1.62V/27C and the fall's worst error 21 %.
 *
 * Output rising (input rising, after any inversion): the skewed buffer, the set-side fight on the
 * latch node, the output inverter's p device. Output falling: the complement inverter, the
 * reset-side fight, the latch p device lifting the set-side node, the output inverter's n device.
 * The fits' constants stand for the core-supply inverters and scale with a core inverter's
 * C V / I (n and p together). The input ramp reaches the first stage's switching point, not its
 * 50 % point: the skewed buffer's (weak n, strong p) sits above mid-supply and moves with the
 * corner's n to p balance (0.475 VDD at fs, 0.627 at sf on generic180), so the ramp's term carries
 * (point - 0.5) of the ramp as well (switchingPoint). The output stage moves its load across the
 * output's swing, which grows with the supply.
 *
 * Measured against the deck's shifter at 45 corners (test/switches/shifter-edges.test.ts,
 * too-tight's s_high sizing): delays within 3.2 / 2.3 % median, 12.3 / 11.5 % worst (rise / fall);
 * transitions 4.4 / 5.4 % median, 11.3 / 8.4 % worst; the shaped edge's crossings of 5 to 95 %
 * within -27.9..+7.7 ps (rise, the 95 % point at the 1.98 V hot corners) and -8.6..+9.0 ps (fall).
 * Without the switching points, the swing and the fits' fast sizings: delays 3.8 / 3.4 % median,
 * 16.3 / 9.0 % worst, transitions 9.5 / 4.7 % median, 20.7 / 14.5 % worst, crossings down to
 * -58.6 ps; the rise 7 % fast and the fall 9 % slow at sf/1.98V/125C in too-tight's circuit. The
 * latch node's transition over the output's (riseRatio, fallRatio) sets the output edge's shape
 * (shifter-shape.ts). What the switches' gate ramps use (shifter-timing.ts, `shifterGateTiming`);
 * the break-before-make check reads them against the measured switch-instant band
 * (instant-band.ts), since the generator's own edges are optimistic at the hot corners.
 */
import { saturationCurrent, shiftFactor, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import { PairCache } from '../pair-cache.js';
import { levelAt } from '../schema/level.js';
import type { SwitchPlan } from './plan.js';
import { shifterFits, type ShifterSizing } from './shifter-sizing.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

/** Per output edge, s. */
export interface ShifterEdges {
  readonly rise: number;
  readonly fall: number;
  readonly riseTransition: number;
  readonly fallTransition: number;
  /** The latch node's full-swing transition over the output's, on the output's rising and falling edge (what shapes it: shifter-shape.ts). */
  readonly riseRatio: number;
  readonly fallRatio: number;
}

/**
 * Full-swing transition of the shifter's input (after any inversion), s: `rise` is the input edge
 * that makes the output rise, `fall` the one that makes it fall.
 */
export interface ShifterInput {
  readonly rise: number;
  readonly fall: number;
}

/**
 * The latch fight's two devices at a corner, gates fixed while only the drains move: saturation
 * currents per width, A/m, and V_DSATs, V.
 */
interface FightDevices {
  readonly high: number;
  /** The pull-down n with the core supply on its gate, before any mismatch. */
  readonly nSat: number;
  readonly nVdsat: number;
  /** The cross-coupled p device fully on at the high level. */
  readonly pSat: number;
  readonly pVdsat: number;
}

/** The corner's view of the shifter: currents per width, A/m, and levels, V. */
interface Drives {
  readonly vdd: number;
  readonly high: number;
  readonly low: number;
  /** Pull-down n at the core supply (with any mismatch, `pullFactor`), latch p fully on at the high level. */
  readonly pull: number;
  readonly pullFactor: number;
  readonly latch: number;
  readonly fight: FightDevices;
  /** Output inverter: n with high - low on its gate, p with the high level across its gate. */
  readonly outN: number;
  readonly outP: number;
  /** A core inverter's C V / I per farad-metre: V_DD (1 / I_n + 1 / I_p). */
  readonly core: number;
}

const current = (d: DeviceAtCorner, vgs: number) => saturationCurrent(d.driveConstant, d.alpha, vgs - d.vth);

/**
 * Drain current per width, A/m, by the n-th power law's two regions (T. Sakurai and A. R. Newton,
 * IEEE TED 38(4):887-894, 1991): the saturation current `saturated` from V_DSAT on, (2 - v) v of
 * it below, v = V_DS / V_DSAT.
 */
function drainCurrent(saturated: number, vdsat: number, vds: number): number {
  const v = vds / vdsat;
  return v >= 1 ? saturated : saturated * (2 - v) * v;
}

/** A device's V_DSAT at `vgs`, V: the card's saturation ratio of the overdrive. */
const saturationVoltage = (d: DeviceAtCorner, vgs: number) => d.saturation * (vgs - d.vth);

/** Steps of the fight's integral over the latch node's fall. */
const FIGHT_STEPS = 16;

/**
 * How long the set-side pull-down takes to bring its latch node `latch` (F) from the high level to
 * half of it against the cross-coupled p device, s: the integral of C dV / (I_n(V) - I_p(V)) by the
 * midpoint rule. The p device's drain starts at its source, so it opposes nothing at first and
 * only its saturation current by the time the node is far down; the n device is saturated over
 * the half swing on the shipped cards (its triode region is taken all the same). Infinity when
 * the pull-down does not win somewhere on the way (the latch never flips). `pullFactor` scales
 * the pull-down (mismatch).
 */
export function fightTime(
  latch: number,
  high: number,
  vdd: number,
  n: DeviceAtCorner,
  p: DeviceAtCorner,
  pullDown: number,
  latchP: number,
  pullFactor = 1,
): number {
  return fightIntegral(latch, fightDevices(n, p, vdd, high), pullDown, latchP, pullFactor);
}

function fightDevices(n: DeviceAtCorner, p: DeviceAtCorner, vdd: number, high: number): FightDevices {
  return {
    high,
    nSat: current(n, vdd),
    nVdsat: saturationVoltage(n, vdd),
    pSat: current(p, high),
    pVdsat: saturationVoltage(p, high),
  };
}

/** fightTime's integral on devices already at their corner. */
function fightIntegral(latch: number, f: FightDevices, pullDown: number, latchP: number, pullFactor: number): number {
  const { high, nSat, nVdsat, pSat, pVdsat } = f;
  const step = high / 2 / FIGHT_STEPS;
  let time = 0;
  for (let i = 0; i < FIGHT_STEPS; i++) {
    const v = high - (i + 0.5) * step;
    const net = pullFactor * pullDown * drainCurrent(nSat, nVdsat, v) - latchP * drainCurrent(pSat, pVdsat, high - v);
    if (!(net > 0)) return Infinity;
    time += (latch * step) / net;
  }
  return time;
}

function drives(ls: Shifter, n: DeviceAtCorner, p: DeviceAtCorner, vdd: number, pullFactor: number): Drives {
  const high = levelAt(ls.high, vdd);
  const low = levelAt(ls.low, vdd);
  const fight = fightDevices(n, p, vdd, high);
  return {
    vdd,
    high,
    low,
    pull: fight.nSat * pullFactor,
    pullFactor,
    latch: fight.pSat,
    fight,
    outN: current(n, high - low),
    outP: fight.pSat,
    core: vdd * (1 / fight.nSat + 1 / current(p, vdd)),
  };
}

/** Bisection steps of `switchingPoint`: 2^-24 of the supply. */
const SWITCHING_STEPS = 24;

/**
 * An inverter's switching point as a fraction of its supply `vdd`: the input at which its n device
 * (width `wn`) and p device (`wp`), both saturated, carry the same alpha-power current (common
 * practice). A ramp into the stage reaches it later than its 50 % point by (point - 0.5) of the
 * ramp's time when rising, earlier when falling.
 */
export function switchingPoint(n: DeviceAtCorner, p: DeviceAtCorner, vdd: number, wn: number, wp: number): number {
  let low = 0;
  let high = vdd;
  for (let i = 0; i < SWITCHING_STEPS; i++) {
    const v = (low + high) / 2;
    if (wn * current(n, v) > wp * current(p, vdd - v)) high = v;
    else low = v;
  }
  return (low + high) / 2 / vdd;
}

/** Capacitance of the latch node and of the skewed buffer's middle node, F. */
function nodes(size: ShifterSizing, n: DeviceAtCorner, p: DeviceAtCorner): { latch: number; mid: number } {
  const latch =
    n.cdrain * size.pullDown + (p.cdrain + p.cgate) * size.latchP + n.cgate * size.outputN + p.cgate * size.outputP + size.latchCap;
  const mid = n.cdrain * size.bufferN + p.cdrain * size.bufferP + (n.cgate + 2 * p.cgate) * size.inverterN + size.bufferCap;
  return { latch, mid };
}

/**
 * The first stages' switching points against the input ramps, fractions of the core supply: the
 * skewed buffer's (weak n, strong p) on the rising input, the complement inverter's on the falling
 * one. They depend on the corner's devices and the sizing only, not on mismatch (which moves the
 * pull-downs), so they are formed once per corner and sizing.
 */
interface SwitchingPoints {
  readonly buffer: number;
  readonly inverter: number;
}

const pointCache = new PairCache<CornerDevices, ShifterSizing, SwitchingPoints>();

function switchingPoints(devices: CornerDevices, size: ShifterSizing): SwitchingPoints {
  const { n, p, vdd } = devices;
  return pointCache.get(devices, size, () => ({
    buffer: switchingPoint(n, p, vdd, size.bufferN, size.bufferP),
    inverter: switchingPoint(n, p, vdd, size.inverterN, 2 * size.inverterN),
  }));
}

/** The nominal corner's drives, once per nominal devices and shifter (they carry no mismatch). */
const nominalCache = new PairCache<CornerDevices, Shifter, Drives>();

const nominalDrives = (ls: Shifter, nominal: CornerDevices): Drives =>
  nominalCache.get(nominal, ls, () => drives(ls, nominal.n, nominal.p, nominal.vdd, 1));

function edgesWith(
  size: ShifterSizing,
  d: Drives,
  nominal: Drives,
  n: DeviceAtCorner,
  p: DeviceAtCorner,
  input: ShifterInput,
  points: SwitchingPoints,
): ShifterEdges {
  const fits = shifterFits(nominal.low).edges;
  const { latch, mid } = nodes(size, n, p);
  const fight = fightIntegral(latch, d.fight, size.pullDown, size.latchP, d.pullFactor);
  // The pull-down no longer wins the fight: the latch never flips.
  if (!Number.isFinite(fight))
    return { rise: Infinity, fall: Infinity, riseTransition: Infinity, fallTransition: Infinity, riseRatio: 1, fallRatio: 1 };
  const latchRise = (latch * d.high) / (2 * d.latch * size.latchP);
  const buffer = (mid * d.vdd) / (2 * d.pull * size.bufferN);
  const core = d.core / nominal.core;
  // The output stage moves its load across the output's swing: C (high - low) / I, from the sizing's nominal one.
  const stage = (size.outputStage * (d.high - d.low)) / (nominal.high - nominal.low);
  const outRise = (stage * nominal.outP) / d.outP;
  const outFall = (stage * nominal.outN) / d.outN;
  const [f0, f1, f2, f3, f4, f5] = fits.fall;
  const [r0, r1, r2, r3, r4, r5] = fits.rise;
  const [tr0, tr1, tr2] = fits.edgeTransitionRise;
  const [tf0, tf1, tf2] = fits.edgeTransitionFall;
  const [xf0, xf1, xf2] = fits.latchFall;
  const [xr0, xr1] = fits.latchRise;
  const riseTransition = tr0 * core + tr1 * outRise + tr2 * fight;
  const fallTransition = tf0 * core + tf1 * outFall + tf2 * latchRise;
  return {
    rise: r0 * core + r1 * buffer + r2 * fight + r3 * outRise + (r4 + r5 * (points.buffer - 0.5)) * input.rise,
    fall: f0 * core + f1 * fight + f2 * latchRise + f3 * outFall + (f4 + f5 * (0.5 - points.inverter)) * input.fall,
    riseTransition,
    fallTransition,
    // The latch node falls as the output rises, and rises as it falls.
    riseRatio: (xf0 * core + xf1 * fight + xf2 * latchRise) / riseTransition,
    fallRatio: (xr0 * core + xr1 * latchRise) / fallTransition,
  };
}

/**
 * The shifter's edges at `devices`' corner for the input ramps `input`; `nominal`
 * are the devices at the card's nominal corner, `dvth` shifts the pull-downs' threshold (local
 * mismatch, V): their drive falls by the alpha-power factor (1 - dvth / V_ov)^alpha.
 */
export function shifterEdges(
  ls: Shifter,
  size: ShifterSizing,
  devices: CornerDevices,
  nominal: CornerDevices,
  input: ShifterInput,
  dvth = 0,
): ShifterEdges {
  const { n, p, vdd } = devices;
  const factor = dvth === 0 ? 1 : shiftFactor(dvth / (vdd - n.vth), n.alpha);
  const here = drives(ls, n, p, vdd, factor);
  return edgesWith(size, here, nominalDrives(ls, nominal), n, p, input, switchingPoints(devices, size));
}
