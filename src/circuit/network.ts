/**
 * The design's circuit section resolved once: circuit nodes and rails by index, the inverse
 * capacitance matrix (it does not change with the corner), diodes, loads and the
 * break-before-make pairs whose overlap is shoot-through. Given the process card, each switch
 * device also loads its circuit-node terminals with its diffusion (cdrain W) and gate-overlap
 * (C_ov W, to a gate its driver holds) capacitance.
 */
import type { Design } from '../schema/design.js';
import { classifyTerminal, type CircuitSpec } from '../schema/circuit.js';
import { parseLevel, type Level } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchPlan } from '../switches/plan.js';
import { capacitanceMatrix, invertCapacitance, type Capacitor } from './capacitance.js';
import type { CircuitLoad } from './figures.js';
import { overlapPerWidth } from '../process/gate-edge.js';
import type { ModelDiode } from './model.js';

/** A diode of the network is the solver's piecewise-linear diode, on network node indices. */
export type NetworkDiode = ModelDiode;

export interface CircuitNetwork {
  readonly spec: CircuitSpec;
  readonly nodes: readonly string[];
  readonly railNames: readonly string[];
  /** Rail levels (rail 0 is ground). */
  readonly railLevels: readonly Level[];
  readonly inverseCapacitance: Float64Array;
  /** Terminals of every switch plan, by node index. */
  readonly switchTerminals: readonly (readonly [number, number])[];
  readonly diodes: readonly NetworkDiode[];
  readonly output: number;
  /** The load at its heavier end (figures) and its lighter end (the output maximum). */
  readonly load: CircuitLoad;
  readonly lightLoad: CircuitLoad;
  readonly pairs: readonly (readonly [number, number])[];
  /** Off conductance of a switch, S. */
  readonly switchLeak: number;
}

const GROUND: Level = { scale: 0, offset: 0 };

function loadEnds(spec: CircuitSpec['load']): { heavy: CircuitLoad; light: CircuitLoad } {
  if (!spec) return { heavy: { current: 0, conductance: 0 }, light: { current: 0, conductance: 0 } };
  if ('current' in spec) {
    const c = spec.current;
    const [lo, hi] = typeof c === 'number' ? [c, c] : [c.min, c.max];
    return { heavy: { current: Math.max(lo, hi), conductance: 0 }, light: { current: Math.min(lo, hi), conductance: 0 } };
  }
  const r = spec.resistance;
  const [lo, hi] = typeof r === 'number' ? [r, r] : [r.min, r.max];
  return { heavy: { current: 0, conductance: 1 / Math.min(lo, hi) }, light: { current: 0, conductance: 1 / Math.max(lo, hi) } };
}

/** The network of a design that has a circuit section (its references were checked by the schema). */
export function buildNetwork(design: Design, plans: readonly SwitchPlan[], card?: ProcessCard): CircuitNetwork {
  const spec = design.circuit!;
  const nodes: string[] = [];
  const railNames: string[] = ['0V'];
  const railLevels: Level[] = [GROUND];
  const nodeIndex = new Map<string, number>();
  const railIndex = new Map<string, number>([['0V', 0]]);
  const declared = design.nodes as Readonly<Record<string, unknown>>;
  const all = [
    spec.output,
    ...spec.capacitors.flatMap((c) => c.between),
    ...spec.diodes.flatMap((d) => [d.anode, d.cathode]),
    ...design.switches.flatMap((s) => s.terminals ?? []),
  ];
  for (const raw of all) {
    const ref = classifyTerminal(raw, declared, spec.rails);
    if (ref.kind === 'node' && !nodeIndex.has(ref.name)) {
      nodeIndex.set(ref.name, nodes.length);
      nodes.push(ref.name);
    }
  }
  const railOf = (name: string, raw: string | number): number => {
    const level = Object.hasOwn(spec.rails, name)
      ? spec.rails[name]!
      : Object.hasOwn(declared, name)
        ? (declared[name] as Level)
        : parseLevel(raw)!;
    const key = level.scale === 0 && level.offset === 0 ? '0V' : name;
    if (!railIndex.has(key)) {
      railIndex.set(key, railNames.length);
      railNames.push(key);
      railLevels.push(level);
    }
    return railIndex.get(key)!;
  };
  const n = nodes.length;
  const index = (raw: string | number): number => {
    const ref = classifyTerminal(raw, declared, spec.rails);
    if (ref.kind === 'node') return nodeIndex.get(ref.name)!;
    return n + railOf(ref.kind === 'rail' ? ref.name : String(raw), raw);
  };
  const caps: Capacitor[] = nodes.map((_, i) => ({ a: i, b: n, value: spec.nodeCapacitance }));
  for (const c of spec.capacitors) {
    const a = index(c.between[0]);
    const b = index(c.between[1]);
    caps.push({ a, b, value: c.value });
    if (c.bottomPlate > 0) caps.push({ a: b, b: n, value: c.value * c.bottomPlate });
  }
  const switchTerminals = design.switches.map((s) => [index(s.terminals![0]), index(s.terminals![1])] as const);
  if (card)
    plans.forEach((plan, k) => {
      for (const device of plan.devices) {
        const value = (card[device.kind].cdrain + overlapPerWidth(card[device.kind])) * device.w;
        for (const t of switchTerminals[k] ?? []) if (t < n) caps.push({ a: t, b: n, value });
      }
    });
  // Every circuit node has its own capacitance to ground, so the matrix is positive definite.
  const inverseCapacitance = invertCapacitance(capacitanceMatrix(n, caps), n)!;
  const diodes = spec.diodes.map((d) => ({
    name: d.name,
    a: index(d.anode),
    b: index(d.cathode),
    drop: d.drop,
    gOn: 1 / d.resistance,
    gOff: d.leakage,
  }));
  const planIndex = new Map(plans.map((p, i) => [p.name, i]));
  const pairs = design.constraints.breakBeforeMake
    .map((c) => [planIndex.get(c.between[0]), planIndex.get(c.between[1])] as const)
    .filter((p): p is readonly [number, number] => p[0] !== undefined && p[1] !== undefined);
  const { heavy, light } = loadEnds(spec.load);
  return {
    spec,
    nodes,
    railNames,
    railLevels,
    inverseCapacitance,
    switchTerminals,
    diodes,
    output: nodeIndex.get(spec.output)!,
    load: heavy,
    lightLoad: light,
    pairs,
    switchLeak: spec.switchLeakage,
  };
}
