/**
 * The table-driven delay model (docs/physics.md, "Gate delay"): characterized delay and output-transition tables per
 * cell, input pin, output edge and corner, indexed by input transition and output load and
 * interpolated bilinearly (the usual non-linear delay model). Loads are re-counted with the
 * characterized pin capacitances (the net's declared and switch capacitance is kept as it is) and
 * scaled to the characterized size. A corner missing from the file is interpolated linearly in
 * supply and temperature between characterized corners of the same process corner. Leaving a
 * grid warns once per cell and axis. Local mismatch scales each delay by the analytic model's
 * ratio with and without the mismatch. The rows at each gate's load are built once per corner and
 * netlist and kept; a Monte Carlo die only recomputes its mismatch scale.
 */
import { inputError } from '../errors.js';
import { CELLS, parasiticCapacitance, type PrimitiveCell } from '../cells/library.js';
import { capacitancePerWidth, gatePinCapacitance, unitWidths } from '../cells/card-widths.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { CornerDevices } from '../process/device.js';
import type { DelayTables, EdgeTables, PinTables } from '../schema/tables.js';
import { analyticModel } from './analytic.js';
import { bracket, linear } from './interpolate.js';
import type { DelayModel, GateTiming, Mismatch } from './model.js';
import { cornerTables } from './table-corner.js';
import { psNumber } from '../units/format.js';

export interface TableModelOptions {
  /** Receives each extrapolation warning once. */
  readonly warn?: (message: string) => void;
}

/** Checks that every table has the axes' shape and every cell its pin count. */
export function checkTables(tables: DelayTables): void {
  const rows = tables.transitions.length;
  const cols = tables.loads.length;
  tables.corners.forEach((corner, c) => {
    for (const [cell, entry] of Object.entries(corner.cells)) {
      const pins = CELLS[cell as PrimitiveCell].inputs;
      const path = ['corners', c, 'cells', cell];
      if (entry.pins.length !== pins)
        throw inputError(
          'tables.invalid',
          [...path, 'pins'],
          entry.pins.length,
          `tables for ${pins} pins are needed (one per input of ${cell})`,
        );
      entry.pins.forEach((pin, p) => {
        for (const edge of ['rise', 'fall'] as const) {
          for (const kind of ['delay', 'transition'] as const) {
            const grid = pin[edge][kind];
            if (grid.length !== rows || grid.some((r) => r.length !== cols)) {
              throw inputError(
                'tables.invalid',
                [...path, 'pins', p, edge, kind],
                `${grid.length} rows`,
                `must have ${rows} rows (input transitions) of ${cols} values (loads)`,
              );
            }
          }
        }
      });
    }
  });
}

/**
 * What a bound corner keeps for every die: the table rows at each gate's load (flat: per gate,
 * pin and edge, one value per input transition), and the analytic delays without mismatch that
 * a die's mismatch scale is taken against.
 */
interface Frame {
  readonly loads: Float64Array;
  readonly delayRows: Float64Array;
  readonly transitionRows: Float64Array;
  /** First row of gate g: gate g, pin p, edge e (0 fall, 1 rise) starts at (rowStart[g] + 2p + e) * axis length. */
  readonly rowStart: Int32Array;
  /** Per gate, [fall, rise] analytic delay at a step input without mismatch, s. */
  readonly base: Float64Array;
  readonly onSlewOutside: (gate: number, slew: number) => void;
}

class TableTiming implements GateTiming {
  /** Per gate, [fall, rise] delay scale of this die's mismatch; null without mismatch. */
  scale: Float64Array | null = null;
  /** The analytic timing a die's mismatch is evaluated with, reused from die to die. */
  analytic: GateTiming | undefined;
  private lastSlew = NaN;
  private segment = 0;
  private fraction = 0;

  constructor(
    public frame: Frame,
    private readonly axis: Float64Array,
  ) {}

  /** The axis segment of an input transition; the engine asks for a delay and then a transition at the same one. */
  private locate(gate: number, slew: number): void {
    if (slew === this.lastSlew) return;
    const axis = this.axis;
    const n = axis.length;
    let i = 0;
    if (slew >= axis[n - 1]!) i = n - 2;
    else while (i < n - 2 && slew >= axis[i + 1]!) i++;
    this.lastSlew = slew;
    this.segment = i;
    this.fraction = (slew - axis[i]!) / (axis[i + 1]! - axis[i]!);
    if (slew < axis[0]! || slew > axis[n - 1]!) {
      this.lastSlew = NaN;
      this.frame.onSlewOutside(gate, slew);
    }
  }

  private lookup(rows: Float64Array, gate: number, pin: number, rising: boolean, slew: number): number {
    this.locate(gate, slew);
    const k = (this.frame.rowStart[gate]! + 2 * pin + (rising ? 1 : 0)) * this.axis.length + this.segment;
    const a = rows[k]!;
    return a + (rows[k + 1]! - a) * this.fraction;
  }

  delay(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    const d = this.lookup(this.frame.delayRows, gate, pin, outputRising, inputTransition);
    return this.scale ? d * this.scale[2 * gate + (outputRising ? 1 : 0)]! : d;
  }

  transition(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    return Math.max(1e-15, this.lookup(this.frame.transitionRows, gate, pin, outputRising, inputTransition));
  }
}

function rowsAt(edge: EdgeTables, kind: 'delay' | 'transition', column: ReturnType<typeof bracket>, out: Float64Array, at: number): void {
  edge[kind].forEach((row, r) => {
    out[at + r] = linear(row, column);
  });
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

export function tableModel(tables: DelayTables, options: TableModelOptions = {}): DelayModel {
  const warned = new Set<string>();
  const warn = (key: string, message: string) => {
    if (warned.has(key)) return;
    warned.add(key);
    options.warn?.(message);
  };
  const axis = Float64Array.from(tables.transitions);
  // Frames by netlist and corner: a Monte Carlo die only rescales the delays of its corner's frame.
  const frames = new WeakMap<CompiledNetlist, WeakMap<CornerDevices, Frame>>();
  const frameFor = (netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices): Frame => {
    let byCorner = frames.get(netlist);
    if (!byCorner) {
      byCorner = new WeakMap();
      frames.set(netlist, byCorner);
    }
    const cached = byCorner.get(devices);
    if (cached && sameValues(cached.loads, loads)) return cached;
    const frame = buildFrame(tables, netlist, loads, devices, warn);
    byCorner.set(devices, frame);
    return frame;
  };
  return {
    name: 'table',
    ron: tables.corners.flatMap((c) => (c.ron ? [{ process: c.process, vdd: c.vdd, temperature: c.temperature, ron: c.ron }] : [])),
    bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch, reuse?: GateTiming): GateTiming {
      const frame = frameFor(netlist, loads, devices);
      const timing =
        reuse instanceof TableTiming && reuse.frame.rowStart.length === frame.rowStart.length ? reuse : new TableTiming(frame, axis);
      timing.frame = frame;
      if (!mismatch) {
        timing.scale = null;
        return timing;
      }
      const shifted = analyticModel.bind(netlist, loads, devices, mismatch, timing.analytic);
      timing.analytic = shifted;
      const scale = timing.scale && timing.scale.length === 2 * netlist.gateCount ? timing.scale : new Float64Array(2 * netlist.gateCount);
      for (let g = 0; g < netlist.gateCount; g++) {
        scale[2 * g] = shifted.delay(g, 0, false, 0) / frame.base[2 * g]!;
        scale[2 * g + 1] = shifted.delay(g, 0, true, 0) / frame.base[2 * g + 1]!;
      }
      timing.scale = scale;
      return timing;
    },
  };
}

function buildFrame(
  tables: DelayTables,
  netlist: CompiledNetlist,
  loads: Float64Array,
  devices: CornerDevices,
  warn: (key: string, message: string) => void,
): Frame {
  const corner = cornerTables(tables, devices.corner, (m) => warn(`corner ${devices.corner.name}`, m));
  const card = devices.card;
  const unit = unitWidths(card);
  const cpw = capacitancePerWidth(card);
  const analyticPins = gatePinCapacitance(netlist, card);
  const pinOf = (cell: PrimitiveCell): PinTables[] => {
    const entry = corner.cells[cell];
    if (!entry)
      throw inputError(
        'reference.unknown',
        ['tables'],
        cell,
        `has no tables at ${corner.name}; characterize this cell (phasegap characterize)`,
      );
    return entry.pins;
  };
  // External load of each net as the tables count it: characterized pin capacitances of the
  // fanout, the declared capacitance, and no driver parasitic (the tables include it).
  const external = Float64Array.from(loads);
  for (let n = 0; n < netlist.netNames.length; n++) {
    for (let i = netlist.fanoutStart[n]!; i < netlist.fanoutStart[n + 1]!; i++) {
      const g = netlist.fanoutGate[i]!;
      const pin = pinOf(netlist.gateCell[g]!)[netlist.fanoutPin[i]!]!;
      external[n]! += pin.capacitance * (netlist.gateSize[g]! / tables.size) - analyticPins[g]!;
    }
    const d = netlist.driver[n]!;
    if (d >= 0) external[n]! -= parasiticCapacitance(netlist.gateCell[d]!, netlist.gateSize[d]!, unit, cpw);
  }
  const rowStart = new Int32Array(netlist.gateCount);
  let rowCount = 0;
  for (let g = 0; g < netlist.gateCount; g++) {
    rowStart[g] = rowCount;
    rowCount += 2 * pinOf(netlist.gateCell[g]!).length;
  }
  const width = tables.transitions.length;
  const delayRows = new Float64Array(rowCount * width);
  const transitionRows = new Float64Array(rowCount * width);
  for (let g = 0; g < netlist.gateCount; g++) {
    const cell = netlist.gateCell[g]!;
    const load = Math.max(0, external[netlist.gateOutput[g]!]!) * (tables.size / netlist.gateSize[g]!);
    const column = bracket(tables.loads, load);
    if (column.outside) {
      warn(
        `load ${cell} ${g}`,
        `table model: ${netlist.source.gates[g]!.name} (${cell}) drives ${(load * 1e15).toFixed(1)} fF per characterized size, outside the table's ${(tables.loads[0]! * 1e15).toFixed(1)}..${(tables.loads[tables.loads.length - 1]! * 1e15).toFixed(1)} fF at ${corner.name}; extrapolating`,
      );
    }
    pinOf(cell).forEach((p, k) => {
      const at = (rowStart[g]! + 2 * k) * width;
      rowsAt(p.fall, 'delay', column, delayRows, at);
      rowsAt(p.rise, 'delay', column, delayRows, at + width);
      rowsAt(p.fall, 'transition', column, transitionRows, at);
      rowsAt(p.rise, 'transition', column, transitionRows, at + width);
    });
  }
  const analytic = analyticModel.bind(netlist, loads, devices);
  const base = new Float64Array(2 * netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    base[2 * g] = analytic.delay(g, 0, false, 0);
    base[2 * g + 1] = analytic.delay(g, 0, true, 0);
  }
  const slews = tables.transitions;
  return {
    loads: Float64Array.from(loads),
    delayRows,
    transitionRows,
    rowStart,
    base,
    onSlewOutside: (g, slew) =>
      warn(
        `slew ${g}`,
        `table model: ${netlist.source.gates[g]!.name} sees an input transition of ${psNumber(slew)} ps, outside the table's ${psNumber(slews[0]!)}..${psNumber(slews[slews.length - 1]!)} ps at ${corner.name}; extrapolating`,
      ),
  };
}
