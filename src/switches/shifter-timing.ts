/**
 * A level shifter's delay and output transition at a corner. The design gives both at the card's
 * nominal corner (typical process, nominal supply, t0); elsewhere they scale as the time a
 * cross-coupled shifter's pull-down takes to swing its output, t ~ C * V_swing / I_n(V_DD): the
 * low-side n device, driven by the low supply, sets the pace (common practice for the
 * cross-coupled shifter; e.g. J. M. Rabaey et al., Digital Integrated Circuits, on level
 * conversion, from memory). Checked against a transistor-level shifter in ngspice
 * (test/switches/shifter-timing.test.ts). The fight with the cross-coupled p device is not
 * modelled; it makes the shifter slower where the n device is weak beside the p device.
 */
import { deviceAtCorner, shiftFactor, type CornerDevices } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchPlan } from './plan.js';

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
