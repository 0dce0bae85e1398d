/**
 * A complete ngspice testbench of a generator at one corner: every cell as a transistor-level
 * subcircuit sized as the model sizes it, the generator's and the design's extra capacitance, the
 * switches as devices on their gate nets (a level-shifted switch on its shifter's output, the shifter
 * built as the model describes it from XSPICE bridges: see level-shifter.ts), the input clock as a PULSE source, the
 * corner's supply, temperature and device models, and a .meas for every dead time, clean gap,
 * phase width and switch crossing over one steady-state period.
 */
import { inputError } from '../errors.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { evaluateCorner } from '../analysis/evaluate.js';
import type { Corner } from '../process/corner.js';
import { devicesAtCorner, type CornerDevices } from '../process/device.js';
import { unitWidths } from '../cells/card-widths.js';
import { levelAt } from '../schema/level.js';
import type { PrimitiveCell } from '../cells/library.js';
import { cellSubckt, cellSubcktName, mosfet } from './cells.js';
import { cornerModels } from './models.js';
import { deckQuantities, measureLine, type DeckWindow, type Quantity } from './measures.js';
import { spiceNodeNames, spiceNumber } from './names.js';
import { shifterLines, shifterNode } from './level-shifter.js';
import { spiceComment, spiceInlineComment } from './text.js';
import type { BreakBeforeMakePair } from './switch-margins.js';
import { bulkLevel, gateWave } from '../switches/conduction.js';
import { shifterScale } from '../switches/shifter-timing.js';
import { CycleIndex } from '../measure/phases.js';
import { ronBench, type RonQuantity } from './ron-bench.js';

export interface Deck {
  readonly text: string;
  readonly corner: Corner;
  readonly quantities: readonly Quantity[];
  readonly window: DeckWindow;
  /** The design's break-before-make pairs, to work out from the switch instants. */
  readonly breakBeforeMake: readonly BreakBeforeMakePair[];
  /** Switch on-resistance benches (drain currents), compared with the model's R_on. */
  readonly ron: readonly RonQuantity[];
}

export interface DeckOptions {
  /** The model file as the deck should include it. */
  readonly modelPath: string;
  /** Largest internal time step as a fraction of the period (default 1/2000). */
  readonly maxStepFraction?: number;
}

/** The first clock edge comes after an eighth of a period; the measured period is the second. */
const FIRST_EDGE = 0.125;

export function generatorDeck(resolved: ResolvedDesign, corner: Corner, options: DeckOptions): Deck {
  const { design, card, netlist } = resolved;
  const models = cornerModels(card, corner, options.modelPath);
  const result = evaluateCorner(resolved, corner);
  if (!result.measurement.ok) {
    throw inputError(`corners (${corner.name})`, corner.name,
      `cannot be written as a deck: the model finds no steady state there to place the measurements (${result.measurement.reason})`);
  }
  const devices = devicesAtCorner(card, corner);
  const vdd = corner.vdd;
  const T = 1 / design.clock.frequency;
  const tr = design.clock.transition;
  const firstEdge = FIRST_EDGE * T;
  const window: DeckWindow = { start: firstEdge + T, period: T, duty: corner.duty };
  const stop = window.start + 1.3 * T;
  const nodes = spiceNodeNames(netlist.netNames);
  const node = (net: string) => nodes.get(net)!;
  const quantities = deckQuantities({ netlist, result: result.simulation, measurement: result.measurement, devices, switches: resolved.switches, node, window });
  const lines: string[] = [
    spiceComment(`phasegap testbench: ${design.name} at ${corner.name}`),
    `* ${netlist.gateCount} cells, clock ${spiceNumber(design.clock.frequency)} Hz; measured period starts at ${spiceNumber(window.start)} s`,
    ...models.header,
    '',
    '* supply and input clock (ramps are the full-swing transition time)',
    `vsupply vdd 0 DC ${spiceNumber(vdd)}`,
    `vclock ${node(netlist.netNames[netlist.clock]!)} 0 PULSE(0 ${spiceNumber(vdd)} ${spiceNumber(firstEdge - tr / 2)} ${spiceNumber(tr)} ${spiceNumber(tr)} ${spiceNumber(corner.duty * T - tr)} ${spiceNumber(T)})`,
    '',
    '* cells',
  ];
  const unit = unitWidths(card);
  const subckts = new Map<string, [PrimitiveCell, number]>();
  netlist.gateCell.forEach((cell, g) => {
    subckts.set(cellSubcktName(cell, netlist.gateSize[g]!), [cell, netlist.gateSize[g]!]);
  });
  for (const [cell, size] of subckts.values()) lines.push(cellSubckt(cell, size, unit, models.geometry));
  lines.push('', '* generator');
  netlist.source.gates.forEach((gate, g) => {
    const name = `x${g}_${node(gate.output)}`;
    lines.push(`${name} ${gate.inputs.map(node).join(' ')} ${node(gate.output)} vdd ${cellSubcktName(gate.cell, gate.size)}${spiceInlineComment(gate.name)}`);
  });
  lines.push('', '* extra capacitance (delay capacitors, declared loads)');
  const extra = new Map<string, number>();
  for (const caps of [netlist.source.loads, design.loads]) {
    for (const [net, c] of Object.entries(caps)) extra.set(net, (extra.get(net) ?? 0) + c);
  }
  let c = 0;
  for (const [net, cap] of extra) if (cap > 0) lines.push(`c${++c} ${node(net)} 0 ${spiceNumber(cap)}${spiceInlineComment(net)}`);
  lines.push(...switchLines(resolved, new CycleIndex(result.simulation, netlist), vdd, node, models.geometry, devices));
  // The model's logic state while the clock is low helps the operating point of the latch.
  const start = result.simulation.startValues;
  lines.push('', '* starting guess for the operating point: the model\'s state with the clock low');
  netlist.netNames.forEach((net, n) => {
    if (n !== netlist.clock) lines.push(`.nodeset v(${node(net)})=${start[n] === 1 ? spiceNumber(vdd) : '0'}`);
  });
  const ron = ronBench(resolved.switches, devices, models.geometry, window.start);
  if (ron.lines.length > 0) lines.push('', '* switch on-resistance benches (devices off the circuit, gates fully on, 10 mV drain-source)', ...ron.lines);
  const maxStep = (options.maxStepFraction ?? 1 / 2000) * T;
  lines.push('', `.tran ${spiceNumber(maxStep)} ${spiceNumber(stop)} 0 ${spiceNumber(maxStep)}`, '', '* measurements (s)');
  for (const q of quantities) lines.push(spiceComment(`${q.name}: ${q.label}`), measureLine(q));
  lines.push('.end', '');
  const breakBeforeMake = design.constraints.breakBeforeMake.map((b, i): BreakBeforeMakePair => ({
    name: resolved.switchCheckNames[i]!, between: b.between, guard: b.guard ?? design.requirements.guard,
  }));
  return { text: lines.join('\n'), corner, quantities, window, breakBeforeMake, ron: ron.quantities };
}

function switchLines(resolved: ResolvedDesign, cycles: CycleIndex, vdd: number, node: (net: string) => string,
  geometry: { nModel: string; pModel: string; diffusion: number }, corner: CornerDevices): string[] {
  const lines: string[] = [];
  const biases = new Map<number, string>([[0, '0'], [vdd, 'vdd']]);
  const bias = (volts: number): string => {
    const key = Number(volts.toPrecision(9));
    let name = biases.get(key);
    if (name === undefined) {
      name = `bias${biases.size - 1}`;
      biases.set(key, name);
      lines.push(`v${name} ${name} 0 DC ${spiceNumber(volts)}`);
    }
    return name;
  };
  const devices: string[] = [];
  resolved.switches.forEach((plan, i) => {
    // Each device's gate: its net, or the output of the level shifter its net drives.
    const gates: string[] = [];
    for (const [j, device] of plan.devices.entries()) {
      if (!plan.levelShifter) { gates.push(node(device.net)); continue; }
      const scale = shifterScale(plan.levelShifter, corner);
      const wave = gateWave(plan, device, cycles, vdd, scale);
      const built = typeof wave === 'string' ? `${plan.name}: ${wave}` : shifterLines(`ls${i}_${j}`, plan, node(device.net), shifterNode(i, j), wave, vdd, scale);
      if (typeof built === 'string') {
        devices.push(spiceComment(`${plan.name} is left out: ${built}`));
        return;
      }
      devices.push(...built);
      gates.push(shifterNode(i, j));
    }
    const signal = levelAt(plan.signal.min, vdd);
    plan.devices.forEach((device, j) => {
      const n = device.kind === 'n';
      const bulk = bulkLevel(plan, device.kind, vdd);
      const terminal = bias(signal);
      const geo = { l: device.l, diffusion: geometry.diffusion, nModel: geometry.nModel, pModel: geometry.pModel };
      devices.push(`${mosfet(`msw${i}_${j}`, terminal, gates[j]!, terminal, bias(bulk), n ? geometry.nModel : geometry.pModel, device.w, geo)}${spiceInlineComment(plan.name)}`);
    });
  });
  return devices.length === 0 ? [] : ['', '* switches (gate loads; drain and source held at the signal level)', ...lines, ...devices];
}
