/**
 * A complete ngspice testbench of a generator at one corner: every cell as a transistor-level
 * subcircuit sized as the model sizes it, the generator's and the design's extra capacitance, the
 * switches as devices on their gate nets (a level-shifted switch on its shifter's output, the shifter
 * a transistor-level cross-coupled shifter sized for the declared delay: up from the core in level-shifter.ts,
 * down to a level below ground in down-shifter.ts), the input clock as a PULSE source, the
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
import { cellSubckt, cellSubcktName, mosfet, type DeviceGeometry } from './cells.js';
import { cornerModels } from './models.js';
import { deckQuantities, measureLine, type DeckWindow, type Quantity } from './measures.js';
import { spiceNodeNames, spiceNumber } from './names.js';
import { shifterLines, shifterNode } from './level-shifter.js';
import { spiceComment, spiceInlineComment } from './text.js';
import type { BreakBeforeMakePair } from './switch-margins.js';
import { bulkLevel } from '../switches/conduction.js';
import { switchGateCapacitance } from '../switches/plan.js';
import { nominalTransitions } from './shifter-sizing.js';
import { shifterSizes } from '../analysis/shifter-sizes.js';
import { sizeShifter } from '../switches/shifter-sizing.js';
import { downShifterLines } from './down-shifter.js';
import { sizeDownShifter } from '../switches/down-shifter-sizing.js';
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
  /** Largest internal time step, s (default `generatorMaxStep`). */
  readonly maxStep?: number;
  /** The circuit the switches serve, in place of holding them at their signal level (circuit-deck.ts). */
  readonly circuit?: DeckCircuit;
}

/**
 * The generator deck's largest time step: T/2000, and never above EDGE_STEP, since a step of the
 * period's order strides over the generator's edges. Measured on lp-netlist (5 MHz, 70 fF chain
 * loads) at sf/1V/125C against a 2 ps step: a 100 ps step (T/2000) read one dead time 142 ps short
 * and its clean gap 188 ps short; 50 ps up to 10 ps off; 20 ps 2.2 ps; 10 ps 1.7 ps. At 20 MHz on
 * generic180 (25 ps) too-tight's gaps were 2.2 ps short.
 */
export const EDGE_STEP = 10e-12;
export function generatorMaxStep(period: number): number {
  return Math.min(period / 2000, EDGE_STEP);
}

/** What a circuit deck puts into the generator's deck. */
export interface DeckCircuit {
  /** Deck nodes of each switch's two terminals, in the design's switch order. */
  readonly switchNodes: readonly (readonly [string, string])[];
  /** The circuit's elements and initial conditions, written after the switches. */
  readonly lines: readonly string[];
  /** End of the transient, s. */
  readonly stop: number;
  /** Measurements in place of the generator's (the timing is confirmed by its own deck). */
  readonly measures: readonly string[];
}

/** The first clock edge comes after an eighth of a period; the measured period is the second. */
const FIRST_EDGE = 0.125;

export function generatorDeck(resolved: ResolvedDesign, corner: Corner, options: DeckOptions): Deck {
  const { design, card, netlist } = resolved;
  const models = cornerModels(card, corner, options.modelPath);
  const result = evaluateCorner(resolved, corner);
  if (!result.measurement.ok) {
    throw inputError(
      'physics.no-steady-state',
      ['corners'],
      corner.name,
      `cannot be written as a deck: the model finds no steady state there to place the measurements (${result.measurement.reason})`,
    );
  }
  const devices = devicesAtCorner(card, corner);
  const vdd = corner.vdd;
  const T = 1 / design.clock.frequency;
  const tr = design.clock.transition;
  const firstEdge = FIRST_EDGE * T;
  const window = deckWindow(T, corner.duty);
  const stop = options.circuit?.stop ?? window.start + 1.3 * T;
  const nodes = spiceNodeNames(netlist.netNames);
  const node = (net: string) => nodes.get(net)!;
  const quantities = deckQuantities({
    netlist,
    result: result.simulation,
    measurement: result.measurement,
    devices,
    switches: resolved.switches,
    node,
    window,
    shifterSizes: shifterSizes(resolved),
    timing: resolved.model.bind(netlist, resolved.loads, devices),
  });
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
    lines.push(
      `${name} ${gate.inputs.map(node).join(' ')} ${node(gate.output)} vdd ${cellSubcktName(gate.cell, gate.size)}${spiceInlineComment(gate.name)}`,
    );
  });
  lines.push('', '* extra capacitance (delay capacitors, declared loads)');
  const extra = new Map<string, number>();
  for (const caps of [netlist.source.loads, design.loads]) {
    for (const [net, c] of Object.entries(caps)) extra.set(net, (extra.get(net) ?? 0) + c);
  }
  let c = 0;
  for (const [net, cap] of extra) if (cap > 0) lines.push(`c${++c} ${node(net)} 0 ${spiceNumber(cap)}${spiceInlineComment(net)}`);
  const inputs = resolved.switches.some((plan) => plan.levelShifter) ? nominalTransitions(resolved) : null;
  lines.push(...switchLines(resolved, vdd, node, models.geometry, devices, (net) => inputs?.(net) ?? tr, options.circuit));
  if (options.circuit) lines.push(...options.circuit.lines);
  // The model's logic state while the clock is low helps the operating point of the latch.
  const start = result.simulation.startValues;
  lines.push('', "* starting guess for the operating point: the model's state with the clock low");
  netlist.netNames.forEach((net, n) => {
    if (n !== netlist.clock) lines.push(`.nodeset v(${node(net)})=${start[n] === 1 ? spiceNumber(vdd) : '0'}`);
  });
  const ron = options.circuit ? { lines: [], quantities: [] } : ronBench(resolved.switches, devices, models.geometry, window.start);
  if (ron.lines.length > 0)
    lines.push('', '* switch on-resistance benches (devices off the circuit, gates fully on, 1 mV drain-source)', ...ron.lines);
  const maxStep = options.maxStep ?? generatorMaxStep(T);
  lines.push('', `.tran ${spiceNumber(maxStep)} ${spiceNumber(stop)} 0 ${spiceNumber(maxStep)}`, '', '* measurements (s)');
  if (options.circuit) lines.push(...options.circuit.measures);
  else for (const q of quantities) lines.push(spiceComment(`${q.name}: ${q.label}`), measureLine(q));
  lines.push('.end', '');
  const breakBeforeMake = design.constraints.breakBeforeMake.map(
    (b, i): BreakBeforeMakePair => ({
      name: resolved.switchCheckNames[i]!,
      between: b.between,
      guard: b.guard ?? design.requirements.guard,
    }),
  );
  return { text: lines.join('\n'), corner, quantities: options.circuit ? [] : quantities, window, breakBeforeMake, ron: ron.quantities };
}

/** The measured period of a deck: it opens at the clock's second rising edge. */
export function deckWindow(period: number, duty: number): DeckWindow {
  return { start: FIRST_EDGE * period + period, period, duty };
}

function switchLines(
  resolved: ResolvedDesign,
  vdd: number,
  node: (net: string) => string,
  geometry: DeviceGeometry,
  corner: CornerDevices,
  nominalInput: (net: string) => number,
  circuit?: DeckCircuit,
): string[] {
  const lines: string[] = [];
  const biases = new Map<number, string>([
    [0, '0'],
    [vdd, 'vdd'],
  ]);
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
      const ls = plan.levelShifter;
      if (!ls) {
        gates.push(node(device.net));
        continue;
      }
      const low = levelAt(ls.low, vdd);
      const high = levelAt(ls.high, vdd);
      // Up from the core (level-shifter.ts) when the low level is at or above ground, else down (down-shifter.ts),
      // whose latch swings from the low level to VDD: a high level above VDD would need both.
      if (low < 0 && high > vdd) {
        throw inputError(
          'value.not-allowed',
          ['switches', plan.name, 'levelShifter'],
          `${low} V .. ${high} V`,
          `cannot be written at transistor level: the deck builds a shifter up from the core supply (low level at or above 0 V) or down to a low level below ground with its high level at most VDD (${vdd} V), not both at once`,
        );
      }
      const gate = switchGateCapacitance(corner.card, device.kind, device.w, device.l);
      const deviceGeometry = { ...geometry, l: corner.card.lmin };
      if (low < 0) {
        const rails = { vdd: 'vdd', low: bias(low), high: bias(high), outputWell: bias(Math.max(0, high)) };
        const size = sizeDownShifter(ls, corner.card, gate, nominalInput(device.net));
        devices.push(
          ...downShifterLines(shifterNode(i, j), plan.name, node(device.net), shifterNode(i, j), ls, rails, size, deviceGeometry),
        );
      } else {
        const rails = { vdd: 'vdd', low: bias(low), high: bias(high) };
        const size = sizeShifter(ls, corner.card, gate, nominalInput(device.net));
        devices.push(...shifterLines(shifterNode(i, j), plan.name, node(device.net), shifterNode(i, j), ls, rails, size, deviceGeometry));
      }
      gates.push(shifterNode(i, j));
    }
    const signal = levelAt(plan.signal.min, vdd);
    plan.devices.forEach((device, j) => {
      const n = device.kind === 'n';
      const bulk = bulkLevel(plan, device.kind, vdd);
      const [drain, source] = circuit?.switchNodes[i] ?? [bias(signal), bias(signal)];
      const geo = { l: device.l, diffusion: geometry.diffusion, nModel: geometry.nModel, pModel: geometry.pModel };
      devices.push(
        `${mosfet(`msw${i}_${j}`, drain, gates[j]!, source, bias(bulk), n ? geometry.nModel : geometry.pModel, device.w, geo)}${spiceInlineComment(plan.name)}`,
      );
    });
  });
  const words = circuit ? "on the circuit's nodes" : 'gate loads; drain and source held at the signal level';
  return devices.length === 0 ? [] : ['', `* switches (${words})`, ...lines, ...devices];
}
