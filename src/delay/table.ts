/**
 * The table-driven delay model (SPEC 2.2): characterized delay and output-transition tables per
 * cell, input pin, output edge and corner, indexed by input transition and output load and
 * interpolated bilinearly (the usual non-linear delay model). Loads are re-counted with the
 * characterized pin capacitances (the net's declared and switch capacitance is kept as it is) and
 * scaled to the characterized size. A corner missing from the file is interpolated linearly in
 * supply and temperature between characterized corners of the same process corner. Leaving a
 * grid warns once per cell and axis. Local mismatch scales each delay by the analytic model's
 * ratio with and without the mismatch.
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
export function checkTables(tables: DelayTables, where: string): void {
  const rows = tables.transitions.length;
  const cols = tables.loads.length;
  tables.corners.forEach((corner, c) => {
    for (const [cell, entry] of Object.entries(corner.cells)) {
      const pins = CELLS[cell as PrimitiveCell].inputs;
      const path = `${where}: corners[${c}].cells.${cell}`;
      if (entry.pins.length !== pins) throw inputError(`${path}.pins`, entry.pins.length, `tables for ${pins} pins are needed (one per input of ${cell})`);
      entry.pins.forEach((pin, p) => {
        for (const edge of ['rise', 'fall'] as const) {
          for (const kind of ['delay', 'transition'] as const) {
            const grid = pin[edge][kind];
            if (grid.length !== rows || grid.some((r) => r.length !== cols)) {
              throw inputError(`${path}.pins[${p}].${edge}.${kind}`, `${grid.length} rows`, `must have ${rows} rows (input transitions) of ${cols} values (loads)`);
            }
          }
        }
      });
    }
  });
}

class TableTiming implements GateTiming {
  constructor(
    /** Per gate, pin and edge: the table row values at the gate's load, one per input transition. */
    private readonly delayRows: Float64Array[][],
    private readonly transitionRows: Float64Array[][],
    private readonly axis: readonly number[],
    private readonly scale: Float64Array[] | null,
    private readonly onSlewOutside: (gate: number, slew: number) => void,
  ) {}

  private lookup(rows: Float64Array[][], gate: number, pin: number, rising: boolean, slew: number): number {
    const at = bracket(this.axis, slew);
    if (at.outside) this.onSlewOutside(gate, slew);
    return linear(rows[gate]![2 * pin + (rising ? 1 : 0)]!, at);
  }

  delay(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    const d = this.lookup(this.delayRows, gate, pin, outputRising, inputTransition);
    return this.scale ? d * this.scale[gate]![outputRising ? 1 : 0]! : d;
  }

  transition(gate: number, pin: number, outputRising: boolean, inputTransition: number): number {
    return Math.max(1e-15, this.lookup(this.transitionRows, gate, pin, outputRising, inputTransition));
  }
}

function rowsAt(edge: EdgeTables, kind: 'delay' | 'transition', column: ReturnType<typeof bracket>): Float64Array {
  return Float64Array.from(edge[kind], (row) => linear(row, column));
}

export function tableModel(tables: DelayTables, options: TableModelOptions = {}): DelayModel {
  const warned = new Set<string>();
  const warn = (key: string, message: string) => {
    if (warned.has(key)) return;
    warned.add(key);
    options.warn?.(message);
  };
  return {
    name: 'table',
    ron: tables.corners.flatMap((c) => (c.ron ? [{ process: c.process, vdd: c.vdd, temperature: c.temperature, ron: c.ron }] : [])),
    bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch): GateTiming {
      const corner = cornerTables(tables, devices.corner, (m) => warn(`corner ${devices.corner.name}`, m));
      const card = devices.card;
      const unit = unitWidths(card);
      const cpw = capacitancePerWidth(card);
      const analyticPins = gatePinCapacitance(netlist, card);
      const pinOf = (cell: PrimitiveCell): PinTables[] => {
        const entry = corner.cells[cell];
        if (!entry) throw inputError('tables', cell, `has no tables at ${corner.name}; characterize this cell (phasegap characterize)`);
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
      const delayRows: Float64Array[][] = [];
      const transitionRows: Float64Array[][] = [];
      for (let g = 0; g < netlist.gateCount; g++) {
        const cell = netlist.gateCell[g]!;
        const load = Math.max(0, external[netlist.gateOutput[g]!]!) * (tables.size / netlist.gateSize[g]!);
        const column = bracket(tables.loads, load);
        if (column.outside) {
          warn(`load ${cell} ${g}`, `table model: ${netlist.source.gates[g]!.name} (${cell}) drives ${(load * 1e15).toFixed(1)} fF per characterized size, outside the table's ${(tables.loads[0]! * 1e15).toFixed(1)}..${(tables.loads[tables.loads.length - 1]! * 1e15).toFixed(1)} fF at ${corner.name}; extrapolating`);
        }
        const pins = pinOf(cell);
        delayRows.push(pins.flatMap((p) => [rowsAt(p.fall, 'delay', column), rowsAt(p.rise, 'delay', column)]));
        transitionRows.push(pins.flatMap((p) => [rowsAt(p.fall, 'transition', column), rowsAt(p.rise, 'transition', column)]));
      }
      const scale = mismatch ? mismatchScale(netlist, loads, devices, mismatch) : null;
      const slews = tables.transitions;
      return new TableTiming(delayRows, transitionRows, slews, scale, (g, slew) => {
        warn(`slew ${g}`, `table model: ${netlist.source.gates[g]!.name} sees an input transition of ${psNumber(slew)} ps, outside the table's ${psNumber(slews[0]!)}..${psNumber(slews[slews.length - 1]!)} ps at ${corner.name}; extrapolating`);
      });
    },
  };
}

/** Per gate, [fall, rise] ratio of the analytic delay with mismatch to that without. */
function mismatchScale(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch: Mismatch): Float64Array[] {
  const base = analyticModel.bind(netlist, loads, devices);
  const shifted = analyticModel.bind(netlist, loads, devices, mismatch);
  return Array.from({ length: netlist.gateCount }, (_, g) => Float64Array.from([false, true], (rising) =>
    shifted.delay(g, 0, rising, 0) / base.delay(g, 0, rising, 0)));
}
