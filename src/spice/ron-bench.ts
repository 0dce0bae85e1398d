/**
 * A switch's on-resistance in a deck: a copy of its devices, off the circuit, with every gate held
 * fully on, source and body where the switch conducts, and the drain 1 mV away (deep triode);
 * ngspice measures the current, R_on = V_DS / I_D. One bench per end of the signal range (and
 * its middle for a tgate, whose resistance peaks inside).
 */
import type { CornerDevices } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import { bulkLevel, onResistanceAt } from '../switches/conduction.js';
import type { SwitchPlan } from '../switches/plan.js';
import { mosfet } from './cells.js';
import { spiceNumber } from './names.js';
import { spiceInlineComment } from './text.js';

/**
 * Drain-source voltage of the bench, V: small beside any overdrive, so the device is in deep
 * triode and ngspice gives the small-signal R_on the model computes (V_DS -> 0). At 10 mV SPICE
 * level 3's linear current, beta (V_ov - (1 + f_b) V_DS / 2) V_DS, read 0.5 % high at generic180's
 * 1 V of overdrive and 2.6 % at generic-lp's 0.21 V (ss/0.9V/-40C) for that term alone.
 */
export const RON_VDS = 0.001;

export interface RonQuantity {
  /** ngspice measurement name of the drain current (lower case). */
  readonly name: string;
  readonly switch: string;
  /** Signal level, V. */
  readonly signal: number;
  /** For people: `R_on s_gnd @ 0 V`. */
  readonly label: string;
  /** The model's on-resistance, ohm. */
  readonly model: number;
}

export interface RonBench {
  readonly lines: readonly string[];
  readonly quantities: readonly RonQuantity[];
}

export interface RonGeometry {
  readonly nModel: string;
  readonly pModel: string;
  readonly diffusion: number;
}

/** Signal points of a switch's bench: the range ends, and the middle for a tgate. */
export function ronSignals(plan: SwitchPlan, vdd: number): number[] {
  const lo = levelAt(plan.signal.min, vdd);
  const hi = levelAt(plan.signal.max, vdd);
  if (lo === hi) return [lo];
  return plan.devices.length > 1 ? [lo, (lo + hi) / 2, hi] : [lo, hi];
}

/** The bench lines and the quantities they measure (at time `at`, s, in a transient). */
export function ronBench(switches: readonly SwitchPlan[], devices: CornerDevices, geometry: RonGeometry, at: number): RonBench {
  const vdd = devices.vdd;
  const lines: string[] = [];
  const quantities: RonQuantity[] = [];
  let k = 0;
  switches.forEach((plan) => {
    const ls = plan.levelShifter;
    const low = ls ? levelAt(ls.low, vdd) : 0;
    const high = ls ? levelAt(ls.high, vdd) : vdd;
    for (const vs of ronSignals(plan, vdd)) {
      const model = onResistanceAt(plan, devices, vs);
      if (!Number.isFinite(model)) continue;
      k++;
      const id = `ron${k}`;
      // The drain sits on the side the source's body is not, so no junction is forward-biased.
      const vd = plan.devices.every((d) => d.kind === 'p') ? vs - RON_VDS : vs + RON_VDS;
      lines.push(
        `v${id}s ${id}s 0 DC ${spiceNumber(vs)}${spiceInlineComment(plan.name)}`,
        `v${id}d ${id}d 0 DC ${spiceNumber(vd)}`,
        `v${id}gn ${id}gn 0 DC ${spiceNumber(high)}`,
        `v${id}gp ${id}gp 0 DC ${spiceNumber(low)}`,
      );
      plan.devices.forEach((device, j) => {
        const n = device.kind === 'n';
        const bulk = bulkLevel(plan, device.kind, vdd);
        lines.push(`v${id}b${j} ${id}b${j} 0 DC ${spiceNumber(bulk)}`);
        lines.push(
          mosfet(
            `m${id}_${j}`,
            `${id}d`,
            n ? `${id}gn` : `${id}gp`,
            `${id}s`,
            `${id}b${j}`,
            n ? geometry.nModel : geometry.pModel,
            device.w,
            { l: device.l, diffusion: geometry.diffusion, nModel: geometry.nModel, pModel: geometry.pModel },
          ),
        );
      });
      quantities.push({ name: `i_${id}`, switch: plan.name, signal: vs, label: `R_on ${plan.name} @ ${Number(vs.toFixed(3))} V`, model });
      lines.push(`.meas tran i_${id} FIND i(v${id}d) AT=${spiceNumber(at)}`);
    }
  });
  return { lines, quantities };
}

/** R_on from the measured drain-source current (A, as ngspice signs it), ohm; null when not measured. */
export function ronFromCurrent(current: number | null): number | null {
  return current === null || current === 0 ? null : RON_VDS / Math.abs(current);
}
