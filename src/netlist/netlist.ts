/** The gate netlist of a generator, as plain data, and its compiled (indexed) form. */
import { inputError, type IssuePath } from '../errors.js';
import { CELLS, type PrimitiveCell } from '../cells/library.js';

export interface GateSpec {
  readonly name: string;
  readonly cell: PrimitiveCell;
  /** Drive relative to the unit inverter. */
  readonly size: number;
  readonly inputs: readonly string[];
  readonly output: string;
}

/** Roles of nets a report shows: the two phases, their complements and early phases. */
export interface PhaseNets {
  readonly phases: readonly [string, string];
  readonly complements: Readonly<Record<string, string>>;
  readonly early: Readonly<Record<string, string>>;
}

export interface Netlist extends PhaseNets {
  readonly clock: string;
  readonly gates: readonly GateSpec[];
  /** Capacitance the generator itself puts on nets (delay capacitors), F. */
  readonly loads: Readonly<Record<string, number>>;
  /** Index in the design's gate list of each gate, where they differ (a BUF becomes two gates). */
  readonly origins?: readonly number[];
}

export interface CompiledNetlist {
  readonly source: Netlist;
  readonly netNames: readonly string[];
  readonly netIndex: ReadonlyMap<string, number>;
  readonly clock: number;
  readonly gateCount: number;
  readonly gateCell: readonly PrimitiveCell[];
  readonly gateSize: Float64Array;
  /** Input nets of gate g: gateInputs[gateInputStart[g] .. gateInputStart[g+1]). */
  readonly gateInputStart: Int32Array;
  readonly gateInputs: Int32Array;
  readonly gateOutput: Int32Array;
  /** Gate driving each net, or -1 (the clock). */
  readonly driver: Int32Array;
  /** Fanout of net n: (gate, pin) pairs in fanoutGate/fanoutPin[fanoutStart[n] .. fanoutStart[n+1]). */
  readonly fanoutStart: Int32Array;
  readonly fanoutGate: Int32Array;
  readonly fanoutPin: Int32Array;
}

export function netId(netlist: CompiledNetlist, name: string): number {
  const id = netlist.netIndex.get(name);
  if (id === undefined) throw new Error(`internal: net ${name} is not in the netlist`);
  return id;
}

/**
 * Indexes a netlist. Structural problems (pin counts, two drivers, undriven nets, loops that no
 * clock breaks) are input errors naming the gate or net.
 */
export function compileNetlist(netlist: Netlist, where: IssuePath = ['generator', 'gates']): CompiledNetlist {
  const netIndex = new Map<string, number>();
  const netNames: string[] = [];
  const intern = (name: string): number => {
    let id = netIndex.get(name);
    if (id === undefined) {
      id = netNames.length;
      netIndex.set(name, id);
      netNames.push(name);
    }
    return id;
  };
  const clock = intern(netlist.clock);
  const gateCount = netlist.gates.length;
  const at = gatePaths(netlist, where);
  const names = new Set<string>();
  netlist.gates.forEach((gate, g) => {
    const expected = CELLS[gate.cell].inputs;
    if (gate.inputs.length !== expected) {
      throw inputError(
        'netlist.invalid',
        [...at(g), 'inputs'],
        gate.inputs,
        `has ${gate.inputs.length} nets; cell ${gate.cell} takes exactly ${expected}`,
      );
    }
    if (names.has(gate.name))
      throw inputError('value.duplicate', [...at(g), 'name'], gate.name, 'is used by two gates; instance names must be unique');
    names.add(gate.name);
  });
  const gateInputStart = new Int32Array(gateCount + 1);
  const inputsFlat: number[] = [];
  const gateOutput = new Int32Array(gateCount);
  netlist.gates.forEach((gate, g) => {
    gateInputStart[g] = inputsFlat.length;
    for (const input of gate.inputs) inputsFlat.push(intern(input));
    gateOutput[g] = intern(gate.output);
  });
  gateInputStart[gateCount] = inputsFlat.length;
  const netCount = netNames.length;
  const driver = new Int32Array(netCount).fill(-1);
  netlist.gates.forEach((gate, g) => {
    const out = gateOutput[g]!;
    if (out === clock)
      throw inputError(
        'netlist.invalid',
        [...at(g), 'output'],
        gate.output,
        'is the input clock net; the clock is driven by the ideal source only',
      );
    const other = driver[out]!;
    if (other >= 0) {
      throw inputError(
        'value.duplicate',
        [...at(g), 'output'],
        gate.output,
        `is already driven by gate "${netlist.gates[other]!.name}"; a net has one driver`,
      );
    }
    driver[out] = g;
  });
  const gateInputs = Int32Array.from(inputsFlat);
  const fanoutCount = new Int32Array(netCount);
  for (const n of gateInputs) fanoutCount[n]!++;
  const fanoutStart = new Int32Array(netCount + 1);
  for (let n = 0; n < netCount; n++) fanoutStart[n + 1] = fanoutStart[n]! + fanoutCount[n]!;
  const fill = fanoutStart.slice(0, netCount);
  const fanoutGate = new Int32Array(gateInputs.length);
  const fanoutPin = new Int32Array(gateInputs.length);
  for (let g = 0; g < gateCount; g++) {
    for (let i = gateInputStart[g]!; i < gateInputStart[g + 1]!; i++) {
      const n = gateInputs[i]!;
      const slot = fill[n]!++;
      fanoutGate[slot] = g;
      fanoutPin[slot] = i - gateInputStart[g]!;
    }
  }
  const compiled: CompiledNetlist = {
    source: netlist,
    netNames,
    netIndex,
    clock,
    gateCount,
    gateCell: netlist.gates.map((g) => g.cell),
    gateSize: Float64Array.from(netlist.gates.map((g) => g.size)),
    gateInputStart,
    gateInputs,
    gateOutput,
    driver,
    fanoutStart,
    fanoutGate,
    fanoutPin,
  };
  checkDriven(compiled, at);
  checkRoles(compiled);
  checkLoops(compiled, where);
  return compiled;
}

/** The design-file path of gate g, e.g. `generator.gates[3]`. */
function gatePaths(netlist: Netlist, where: IssuePath): (g: number) => IssuePath {
  return (g) => [...where, netlist.origins?.[g] ?? g];
}

function checkDriven(net: CompiledNetlist, at: (g: number) => IssuePath): void {
  for (let g = 0; g < net.gateCount; g++) {
    for (let i = net.gateInputStart[g]!; i < net.gateInputStart[g + 1]!; i++) {
      const n = net.gateInputs[i]!;
      if (n !== net.clock && net.driver[n]! < 0) {
        throw inputError(
          'netlist.invalid',
          [...at(g), 'inputs', i - net.gateInputStart[g]!],
          net.netNames[n],
          `is not driven by any gate and is not the clock "${net.netNames[net.clock]}"; every input net needs a driver`,
        );
      }
    }
  }
}

function checkRoles(net: CompiledNetlist): void {
  const src = net.source;
  const named: Array<[IssuePath, string]> = [
    ...src.phases.map((p, i): [IssuePath, string] => [['generator', 'phases', i], p]),
    ...Object.entries(src.complements).map(([p, c]): [IssuePath, string] => [['generator', 'complements', p], c]),
    ...Object.entries(src.early).map(([p, e]): [IssuePath, string] => [['generator', 'early', p], e]),
  ];
  for (const [path, name] of named) {
    const id = net.netIndex.get(name);
    if (id === undefined || net.driver[id]! < 0)
      throw inputError('reference.unknown', path, name, 'is not the output of any gate in the netlist');
  }
  for (const key of [...Object.keys(src.complements), ...Object.keys(src.early)]) {
    if (!src.phases.includes(key))
      throw inputError('reference.unknown', ['generator'], key, `is not one of the phases ${src.phases.join(', ')}`);
  }
}

/**
 * A feedback loop is legal only if some gate on it also listens to a net that depends on the
 * clock from outside the loop: that is what the cross-coupled pair is. A loop with no such input
 * is a free-running or stuck combinational loop.
 */
function checkLoops(net: CompiledNetlist, where: IssuePath): void {
  const components = stronglyConnected(net);
  const clocked = clockDependence(net);
  const componentOf = new Int32Array(net.gateCount);
  components.forEach((comp, c) => {
    for (const g of comp) componentOf[g] = c;
  });
  for (const [c, comp] of components.entries()) {
    const g0 = comp[0]!;
    const selfLoop = comp.length === 1 && gateInputsOf(net, g0).includes(net.gateOutput[g0]!);
    if (comp.length === 1 && !selfLoop) continue;
    const broken = comp.some((g) =>
      gateInputsOf(net, g).some((n) => {
        const d = net.driver[n]!;
        return clocked[n] === 1 && (d < 0 || componentOf[d] !== c);
      }),
    );
    if (!broken) {
      const names = comp
        .map((g) => net.source.gates[g]!.name)
        .sort()
        .join(', ');
      throw inputError(
        'netlist.invalid',
        where,
        names,
        'form a combinational loop that no input from the clock controls; it would oscillate or stick. Break the loop or feed it from the clock',
      );
    }
  }
}

/** The input net ids of gate `g`, in pin order. */
export function gateInputsOf(net: CompiledNetlist, g: number): number[] {
  return Array.from(net.gateInputs.subarray(net.gateInputStart[g]!, net.gateInputStart[g + 1]!));
}

/** 1 for nets whose value depends on the clock. */
function clockDependence(net: CompiledNetlist): Uint8Array {
  const mark = new Uint8Array(net.netNames.length);
  const stack = [net.clock];
  mark[net.clock] = 1;
  while (stack.length > 0) {
    const n = stack.pop()!;
    for (let i = net.fanoutStart[n]!; i < net.fanoutStart[n + 1]!; i++) {
      const out = net.gateOutput[net.fanoutGate[i]!]!;
      if (mark[out] === 0) {
        mark[out] = 1;
        stack.push(out);
      }
    }
  }
  return mark;
}

/** Tarjan's strongly connected components over gates (edge g -> h when g's output feeds h). */
function stronglyConnected(net: CompiledNetlist): number[][] {
  const index = new Int32Array(net.gateCount).fill(-1);
  const low = new Int32Array(net.gateCount);
  const onStack = new Uint8Array(net.gateCount);
  const stack: number[] = [];
  const out: number[][] = [];
  let counter = 0;
  const successors = (g: number): number[] => {
    const n = net.gateOutput[g]!;
    const list: number[] = [];
    for (let i = net.fanoutStart[n]!; i < net.fanoutStart[n + 1]!; i++) list.push(net.fanoutGate[i]!);
    return list;
  };
  for (let root = 0; root < net.gateCount; root++) {
    if (index[root]! >= 0) continue;
    const work: Array<[number, number[], number]> = [];
    const open = (g: number) => {
      index[g] = low[g] = counter++;
      stack.push(g);
      onStack[g] = 1;
      work.push([g, successors(g), 0]);
    };
    open(root);
    while (work.length > 0) {
      const frame = work[work.length - 1]!;
      const [g, succ] = frame;
      if (frame[2] < succ.length) {
        const h = succ[frame[2]++]!;
        if (index[h]! < 0) open(h);
        else if (onStack[h]) low[g] = Math.min(low[g]!, index[h]!);
        continue;
      }
      work.pop();
      const parent = work[work.length - 1];
      if (parent) low[parent[0]] = Math.min(low[parent[0]]!, low[g]!);
      if (low[g] === index[g]) {
        const comp: number[] = [];
        let h: number;
        do {
          h = stack.pop()!;
          onStack[h] = 0;
          comp.push(h);
        } while (h !== g);
        out.push(comp.reverse());
      }
    }
  }
  return out;
}
