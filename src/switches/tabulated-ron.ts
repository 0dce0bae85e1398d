/**
 * Switch devices calibrated by characterized on-resistance: at a corner the tables cover, k' is
 * scaled so that the triode law gives the measured R_on * W/L at the characterized bias (gate at
 * the supply, source and body at the rail); mobility degradation and body effect still shape it
 * elsewhere. A corner between characterized ones takes the largest correction of its process
 * corner's entries (the higher R_on); a process corner without entries keeps the card's law.
 */
import { deviceAtCorner, type CornerDevices, type DeviceAtCorner } from '../process/device.js';
import type { CornerRon } from '../schema/tables.js';
import { triodeResistance } from './physics.js';

/** A characterized corner's on-resistance, as the tables give it. */
export interface RonEntry {
  readonly process: string;
  /** V */
  readonly vdd: number;
  /** °C */
  readonly temperature: number;
  readonly ron: CornerRon;
}

/** Triode R_on * W/L of a device with its gate at vdd and V_SB = 0, ohm. */
function sheetResistance(d: DeviceAtCorner, vdd: number): number {
  return triodeResistance(d.kprime, 1, 1, vdd - d.switchVth, d.theta);
}

/** measured / model R_on at the entry's own bias for one device type. */
function correction(devices: Pick<CornerDevices, 'card'>, entry: RonEntry, type: 'n' | 'p'): number {
  const corner = { name: '', process: entry.process, vdd: entry.vdd, temperature: entry.temperature, duty: 0.5 };
  return entry.ron[type] / sheetResistance(deviceAtCorner(devices.card, type, corner), entry.vdd);
}

function factor(devices: CornerDevices, entries: readonly RonEntry[], type: 'n' | 'p'): number {
  const { corner } = devices;
  const own = entries.filter((e) => e.process === corner.process);
  if (own.length === 0) return 1;
  const exact = own.find((e) => Math.abs(e.vdd - corner.vdd) < 1e-9 && Math.abs(e.temperature - corner.temperature) < 1e-9);
  return exact ? correction(devices, exact, type) : Math.max(...own.map((e) => correction(devices, e, type)));
}

/** A function from a corner's devices to the same devices with k' calibrated; cached per devices object. */
export function ronCalibration(entries: readonly RonEntry[]): (devices: CornerDevices) => CornerDevices {
  const cache = new WeakMap<CornerDevices, CornerDevices>();
  return (devices) => {
    let out = cache.get(devices);
    if (!out) {
      const n = factor(devices, entries, 'n');
      const p = factor(devices, entries, 'p');
      out = { ...devices, n: { ...devices.n, kprime: devices.n.kprime / n }, p: { ...devices.p, kprime: devices.p.kprime / p } };
      cache.set(devices, out);
    }
    return out;
  };
}
