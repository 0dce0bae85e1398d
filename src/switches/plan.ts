/**
 * Switches resolved against the generator: the driver cells each adds to the netlist, the net
 * each device gate hangs on, and the gate capacitance it loads that net with.
 */
import { inputError, type IssuePath } from '../errors.js';
import type { SwitchSpec } from '../schema/switches.js';
import type { ProcessCard } from '../schema/process.js';
import type { GateSpec, Netlist } from '../netlist/netlist.js';
import { bufferStages } from '../netlist/template.js';
import { levelAt, parseLevel, type Level } from '../schema/level.js';
import type { PhaseNets } from '../netlist/netlist.js';
import { extremeLevels, fixedNode, hull, resolveTerminal, type NodeLevels, type VoltageRange } from './nodes.js';

export type DeviceKind = 'n' | 'p';

/** One device of a switch (a tgate has two). */
export interface SwitchDevicePlan {
  readonly kind: DeviceKind;
  /** Width and length, m. */
  readonly w: number;
  readonly l: number;
  /** Netlist net at the end of its driver chain. */
  readonly net: string;
  /**
   * Whether its gate turns it on while phase 1 is active, while phase 2 is, and in the dead time;
   * null when the gate hangs on a net that is not a phase, a complement or an early phase.
   */
  readonly onIn: readonly [boolean, boolean, boolean] | null;
}

export interface SwitchPlan {
  readonly name: string;
  readonly type: SwitchSpec['type'];
  readonly devices: readonly SwitchDevicePlan[];
  readonly levelShifter?: SwitchSpec['levelShifter'];
  /** Lowest and highest voltage passed while it conducts (picked at the card's nominal supply). */
  readonly signal: { readonly min: Level; readonly max: Level };
  readonly bulk?: Level;
  /** The two nodes it connects; with the older `signal` form, both at the signal. */
  readonly terminals: readonly [NodeLevels, NodeLevels];
  /** Terminals were declared (false for the older `signal` form). */
  readonly declared: boolean;
  /** Body tied to a node (per phase state), when the design names one. */
  readonly bulkNode?: NodeLevels;
}

export interface SwitchExpansion {
  readonly netlist: Netlist;
  readonly plans: readonly SwitchPlan[];
  /** Gate capacitance of the switches on the nets that drive them, F. */
  readonly loads: Readonly<Record<string, number>>;
  /** Switches whose terminals are undeclared, so their off-state and stress checks are limited. */
  readonly warnings: readonly string[];
}

type Bit = 0 | 1;

/** A net's logic level while phase 1 is active, while phase 2 is, and in the dead time; null for other nets. */
export function netStates(net: string, nets: PhaseNets): readonly [Bit, Bit, Bit] | null {
  const of = (phase: string): [Bit, Bit, Bit] => (phase === nets.phases[0] ? [1, 0, 0] : [0, 1, 0]);
  for (const phase of nets.phases) {
    if (net === phase || nets.early[phase] === net) return of(phase);
    if (nets.complements[phase] === net) return of(phase).map((x) => (x === 1 ? 0 : 1)) as [Bit, Bit, Bit];
  }
  return null;
}

/** Whether a device is on in each phase state: its gate net's level through the driver's inversions and the level shifter's. */
function onStates(spec: SwitchSpec, kind: DeviceKind, net: string, nets: PhaseNets): [boolean, boolean, boolean] | null {
  const states = netStates(net, nets);
  if (!states) return null;
  let flips = spec.driver.filter((d) => d.cell === 'INV').length + (spec.levelShifter?.invert ? 1 : 0);
  flips %= 2;
  return states.map((x) => ((x ^ flips) === 1) === (kind === 'n')) as [boolean, boolean, boolean];
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

export function expandSwitches(
  base: Netlist,
  switches: readonly SwitchSpec[],
  card: ProcessCard,
  nodes: ReadonlyMap<string, NodeLevels> = new Map(),
): SwitchExpansion {
  const warnings: string[] = [];
  const nets = new Set<string>([base.clock, ...base.gates.map((g) => g.output)]);
  const gates: GateSpec[] = [...base.gates];
  const loads: Record<string, number> = {};
  const names = new Set<string>();
  const plans = switches.map((spec, i): SwitchPlan => {
    const path: IssuePath = ['switches', i];
    if (names.has(spec.name))
      throw inputError('value.duplicate', [...path, 'name'], spec.name, 'is used by two switches; switch names must be unique');
    names.add(spec.name);
    const known = () => [...nets].filter((n) => !n.includes('.')).join(', ');
    if (!nets.has(spec.gate))
      throw inputError('reference.unknown', [...path, 'gate'], spec.gate, `is not a net of the generator; nets are ${known()}`);
    if (spec.type === 'tgate' && spec.gateBar === undefined) {
      throw inputError(
        'field.required',
        [...path, 'gateBar'],
        undefined,
        'is required for a tgate: name the net that drives its p gate (usually the phase complement)',
      );
    }
    if (spec.type !== 'tgate' && spec.gateBar !== undefined) {
      throw inputError('field.not-allowed', [...path, 'gateBar'], spec.gateBar, `is only for a tgate; a ${spec.type} switch has one gate`);
    }
    if (spec.gateBar !== undefined && !nets.has(spec.gateBar)) {
      throw inputError('reference.unknown', [...path, 'gateBar'], spec.gateBar, `is not a net of the generator; nets are ${known()}`);
    }
    const ls = spec.levelShifter;
    const devices: SwitchDevicePlan[] = [];
    const add = (kind: DeviceKind, w: number, source: string, tag: string) => {
      const net = driverChain(spec, source, tag, gates);
      devices.push({ kind, w, l: spec.l, net, onIn: onStates(spec, kind, source, base) });
      if (!ls) loads[net] = (Object.hasOwn(loads, net) ? loads[net]! : 0) + switchGateCapacitance(card, kind, w, spec.l);
    };
    if (spec.type === 'nmos') add('n', spec.w, spec.gate, 'n');
    else if (spec.type === 'pmos') add('p', spec.w, spec.gate, 'p');
    else {
      add('n', spec.w, spec.gate, 'n');
      add('p', spec.wp ?? spec.w * (card.unit.wp / card.unit.wn), spec.gateBar!, 'p');
    }
    const wiring = terminalsOf(spec, path, devices, nodes, card.vddNominal);
    if (!wiring.declared) {
      const unknown = devices.find((d) => d.onIn === null);
      warnings.push(
        unknown
          ? `${spec.name}: terminals undeclared (older \`signal\` form) and its gate net ${unknown.net} is not a phase, a complement or an early phase: it gets no off-state, on-state or stress check`
          : `${spec.name}: terminals undeclared (older \`signal\` form); its off-state and stress checks assume both terminals at the signal level and cannot see a boosted node: declare \`nodes\` and \`terminals\``,
      );
    }
    const bulkNode = spec.bulk === undefined ? undefined : resolveTerminal(spec.bulk, nodes, [...path, 'bulk']);
    const bulk = bulkNode?.rail ? parseLevel(spec.bulk!)! : undefined;
    return { name: spec.name, type: spec.type, devices, levelShifter: ls, bulk, bulkNode, ...wiring };
  });
  return { netlist: { ...base, gates }, plans, loads, warnings };
}

function terminalsOf(
  spec: SwitchSpec,
  path: IssuePath,
  devices: readonly SwitchDevicePlan[],
  nodes: ReadonlyMap<string, NodeLevels>,
  vddNominal: number,
): Pick<SwitchPlan, 'terminals' | 'declared' | 'signal'> {
  if (spec.terminals === undefined) {
    const raw = spec.signal ?? { scale: 0, offset: 0 };
    const signal = 'min' in raw ? raw : { min: raw, max: raw };
    const node = fixedNode(`signal`, { lo: [signal.min], hi: [signal.max] }, true);
    return { terminals: [node, node], declared: false, signal };
  }
  if (spec.signal !== undefined) {
    throw inputError(
      'field.not-allowed',
      [...path, 'signal'],
      'given',
      "cannot be given with `terminals`: the terminals' node voltages say what the switch passes",
    );
  }
  const terminals = spec.terminals.map((raw, j) => resolveTerminal(raw, nodes, [...path, 'terminals', j])) as [NodeLevels, NodeLevels];
  if (terminals[0] === terminals[1] || (terminals[0].rail && terminals[1].rail && terminals[0].name === terminals[1].name)) {
    throw inputError(
      'value.invalid',
      [...path, 'terminals'],
      spec.terminals,
      'connects a node to itself; name the two different nodes the switch connects',
    );
  }
  const unknown = devices.find((d) => d.onIn === null);
  if (unknown) {
    throw inputError(
      'value.invalid',
      [...path, 'gate'],
      unknown.net,
      'must be a phase, a phase complement or an early phase when terminals are declared, so the phase each terminal voltage belongs to is known',
    );
  }
  // What it passes while it conducts: both terminals in every phase state in which a device is on.
  const on: VoltageRange[] = [];
  for (let s = 0; s < 3; s++) if (devices.some((d) => d.onIn![s])) on.push(terminals[0].states[s]!, terminals[1].states[s]!);
  const range = on.length > 0 ? hull(...on) : hull(...terminals.flatMap((t) => t.states));
  return { terminals, declared: true, signal: extremeLevels(range, vddNominal) };
}

/** A level shifter's high level must be above its low level at every supply the corners use. */
export function checkLevelShifters(plans: readonly SwitchPlan[], vdds: readonly number[]): void {
  plans.forEach((plan, i) => {
    const ls = plan.levelShifter;
    if (!ls) return;
    for (const vdd of vdds) {
      if (!(levelAt(ls.high, vdd) > levelAt(ls.low, vdd))) {
        throw inputError(
          'physics.limit',
          ['switches', i, 'levelShifter', 'high'],
          describeLevel(ls.high),
          `must be above the low level (${describeLevel(ls.low)}); at vdd = ${vdd} V it is ${levelAt(ls.high, vdd).toFixed(3)} V against ${levelAt(ls.low, vdd).toFixed(3)} V`,
        );
      }
    }
  });
}

function describeLevel(level: Level): string {
  if (level.scale === 0) return `${level.offset} V`;
  const base = level.scale === 1 ? 'vdd' : `${level.scale}*vdd`;
  return level.offset === 0 ? base : `${base}${level.offset > 0 ? '+' : ''}${level.offset} V`;
}
