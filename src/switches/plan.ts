/**
 * Switches resolved against the generator: the driver cells each adds to the netlist, the net
 * each device gate hangs on, and the gate capacitance it loads that net with.
 */
import { inputError } from '../errors.js';
import type { SwitchSpec } from '../schema/switches.js';
import type { ProcessCard } from '../schema/process.js';
import type { GateSpec, Netlist } from '../netlist/netlist.js';
import { bufferStages } from '../netlist/template.js';
import { levelAt, type Level } from '../schema/level.js';

export type DeviceKind = 'n' | 'p';

/** One device of a switch (a tgate has two). */
export interface SwitchDevicePlan {
  readonly kind: DeviceKind;
  /** Width and length, m. */
  readonly w: number;
  readonly l: number;
  /** Netlist net at the end of its driver chain. */
  readonly net: string;
}

export interface SwitchPlan {
  readonly name: string;
  readonly type: SwitchSpec['type'];
  readonly devices: readonly SwitchDevicePlan[];
  readonly levelShifter?: SwitchSpec['levelShifter'];
  /** Lowest and highest voltage passed. */
  readonly signal: { readonly min: Level; readonly max: Level };
  readonly bulk?: Level;
}

export interface SwitchExpansion {
  readonly netlist: Netlist;
  readonly plans: readonly SwitchPlan[];
  /** Gate capacitance of the switches on the nets that drive them, F. */
  readonly loads: Readonly<Record<string, number>>;
}

/** Gate capacitance of a device of width w and length l, F: the card's per-width value scaled by l/lmin. */
export function switchGateCapacitance(card: ProcessCard, kind: DeviceKind, w: number, l: number): number {
  return card[kind].cgate * w * (l / card.lmin);
}

function driverChain(spec: SwitchSpec, from: string, tag: string, gates: GateSpec[]): string {
  let input = from;
  spec.driver.forEach((stage, k) => {
    const sizes = stage.cell === 'BUF' ? bufferStages(stage.size) : [stage.size];
    sizes.forEach((size, j) => {
      const output = `${spec.name}.${tag}${k + 1}${sizes.length > 1 ? String.fromCharCode(97 + j) : ''}`;
      gates.push({ name: `${spec.name}.drv_${tag}${k + 1}${j}`, cell: 'INV', size, inputs: [input], output });
      input = output;
    });
  });
  return input;
}

export function expandSwitches(base: Netlist, switches: readonly SwitchSpec[], card: ProcessCard): SwitchExpansion {
  const nets = new Set<string>([base.clock, ...base.gates.map((g) => g.output)]);
  const gates: GateSpec[] = [...base.gates];
  const loads: Record<string, number> = {};
  const names = new Set<string>();
  const plans = switches.map((spec, i): SwitchPlan => {
    const path = `switches[${i}]`;
    if (names.has(spec.name)) throw inputError(`${path}.name`, spec.name, 'is used by two switches; switch names must be unique');
    names.add(spec.name);
    const known = () => [...nets].filter((n) => !n.includes('.')).join(', ');
    if (!nets.has(spec.gate)) throw inputError(`${path}.gate`, spec.gate, `is not a net of the generator; nets are ${known()}`);
    if (spec.type === 'tgate' && spec.gateBar === undefined) {
      throw inputError(`${path}.gateBar`, undefined, 'is required for a tgate: name the net that drives its p gate (usually the phase complement)');
    }
    if (spec.type !== 'tgate' && spec.gateBar !== undefined) {
      throw inputError(`${path}.gateBar`, spec.gateBar, `is only for a tgate; a ${spec.type} switch has one gate`);
    }
    if (spec.gateBar !== undefined && !nets.has(spec.gateBar)) {
      throw inputError(`${path}.gateBar`, spec.gateBar, `is not a net of the generator; nets are ${known()}`);
    }
    const ls = spec.levelShifter;
    const devices: SwitchDevicePlan[] = [];
    const add = (kind: DeviceKind, w: number, source: string, tag: string) => {
      const net = driverChain(spec, source, tag, gates);
      devices.push({ kind, w, l: spec.l, net });
      if (!ls) loads[net] = (Object.hasOwn(loads, net) ? loads[net]! : 0) + switchGateCapacitance(card, kind, w, spec.l);
    };
    if (spec.type === 'nmos') add('n', spec.w, spec.gate, 'n');
    else if (spec.type === 'pmos') add('p', spec.w, spec.gate, 'p');
    else {
      add('n', spec.w, spec.gate, 'n');
      add('p', spec.wp ?? spec.w * (card.unit.wp / card.unit.wn), spec.gateBar!, 'p');
    }
    const signal = 'min' in spec.signal ? spec.signal : { min: spec.signal, max: spec.signal };
    return { name: spec.name, type: spec.type, devices, levelShifter: ls, signal, bulk: spec.bulk };
  });
  return { netlist: { ...base, gates }, plans, loads };
}

/** A level shifter's high level must be above its low level at every supply the corners use. */
export function checkLevelShifters(plans: readonly SwitchPlan[], vdds: readonly number[]): void {
  plans.forEach((plan, i) => {
    const ls = plan.levelShifter;
    if (!ls) return;
    for (const vdd of vdds) {
      if (!(levelAt(ls.high, vdd) > levelAt(ls.low, vdd))) {
        throw inputError(`switches[${i}].levelShifter.high`, describeLevel(ls.high),
          `must be above the low level (${describeLevel(ls.low)}); at vdd = ${vdd} V it is ${levelAt(ls.high, vdd).toFixed(3)} V against ${levelAt(ls.low, vdd).toFixed(3)} V`);
      }
    }
  });
}

function describeLevel(level: Level): string {
  if (level.scale === 0) return `${level.offset} V`;
  const base = level.scale === 1 ? 'vdd' : `${level.scale}*vdd`;
  return level.offset === 0 ? base : `${base}${level.offset > 0 ? '+' : ''}${level.offset} V`;
}
