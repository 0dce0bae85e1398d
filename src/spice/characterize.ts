/**
 * Characterization decks: for one corner, every cell's every input pin is driven by a ramp (the
 * other inputs held at their non-controlling level) into a load capacitor, over a grid of input
 * transition x output load; the output's delay and transition on both edges and the charge the
 * pin draws (its effective capacitance) are measured. One deck holds one input transition of a
 * corner's grid (all cells, pins and loads), each point an independent test circuit, so its time
 * step can follow that transition. Grids are set in multiples of the process's own scale:
 * loads in unit-inverter input capacitances, transitions in the unit inverter's C*V/I.
 */
import { CELLS, pinCapacitance, type PrimitiveCell } from '../cells/library.js';
import { capacitancePerWidth, unitWidths } from '../cells/card-widths.js';
import { devicesAtCorner } from '../process/device.js';
import type { Corner } from '../process/corner.js';
import type { ProcessCard } from '../schema/process.js';
import { TABLE_CELLS, type CornerTables, type PinTables } from '../schema/tables.js';
import { cellSubckt, cellSubcktName } from './cells.js';
import { cornerModels } from './models.js';
import { spiceNumber } from './names.js';
import { spiceComment } from './text.js';

export interface GridSpec {
  /** Input transitions in units of the unit inverter's C_in * V_DD / I_D0 (tt, nominal supply, t0). */
  readonly transitions: readonly number[];
  /** Output loads in unit-inverter input capacitances. */
  readonly loads: readonly number[];
}

export const GRIDS: Readonly<Record<'coarse' | 'fine', GridSpec>> = {
  coarse: { transitions: [1, 10, 40, 100], loads: [0.5, 4, 16, 40] },
  fine: { transitions: [1, 3, 8, 20, 45, 100, 200], loads: [0.25, 1, 3, 8, 16, 30, 60] },
};

export interface Axes {
  /** s */
  readonly transitions: readonly number[];
  /** F, at the characterized size */
  readonly loads: readonly number[];
  readonly size: number;
}

/** The process's scale: unit-inverter input capacitance (F) and C*V/I time (s) at nominal. */
export function processScale(card: ProcessCard): { capacitance: number; time: number } {
  const capacitance = pinCapacitance('INV', 1, unitWidths(card), capacitancePerWidth(card));
  const process = 'tt' in card.corners ? 'tt' : Object.keys(card.corners)[0]!;
  const devices = devicesAtCorner(card, { name: 'nominal', process, vdd: card.vddNominal, temperature: card.t0, duty: 0.5 });
  const current = Math.min(devices.n.idsatPerWidth * card.unit.wn, devices.p.idsatPerWidth * card.unit.wp);
  return { capacitance, time: (capacitance * card.vddNominal) / current };
}

export function gridAxes(card: ProcessCard, grid: GridSpec, size = 1): Axes {
  const scale = processScale(card);
  const round = (v: number) => Number(v.toPrecision(4));
  return {
    transitions: grid.transitions.map((k) => round(k * scale.time)),
    loads: grid.loads.map((k) => round(k * scale.capacitance * size)),
    size,
  };
}

interface Arc {
  readonly cell: PrimitiveCell;
  readonly pin: number;
  readonly row: number;
  readonly column: number;
  readonly id: number;
}

export interface CharacterizationDeck {
  readonly text: string;
  readonly corner: Pick<Corner, 'name' | 'process' | 'vdd' | 'temperature'>;
  readonly arcs: readonly Arc[];
  /** The input-transition row this deck covers. */
  readonly row: number;
  readonly axes: Axes;
  /** Every measurement name in the deck. */
  readonly names: readonly string[];
}

const TD = 0.2e-9;

/** The decks of one corner, one per input transition. */
export function characterizationDecks(card: ProcessCard, corner: Pick<Corner, 'name' | 'process' | 'vdd' | 'temperature'>, axes: Axes,
  modelPath: string, cells: readonly PrimitiveCell[] = TABLE_CELLS): CharacterizationDeck[] {
  return axes.transitions.map((_, row) => characterizationDeck(card, corner, axes, modelPath, cells, row));
}

export function characterizationDeck(card: ProcessCard, corner: Pick<Corner, 'name' | 'process' | 'vdd' | 'temperature'>, axes: Axes,
  modelPath: string, cells: readonly PrimitiveCell[], row: number): CharacterizationDeck {
  const models = cornerModels(card, corner, modelPath);
  const vdd = corner.vdd;
  const devices = devicesAtCorner(card, { ...corner, duty: 0.5 });
  // Long enough for the slowest output edge to settle: several analytic C*V/I at the largest load.
  const weakest = Math.min(devices.n.idsatPerWidth * card.unit.wn, devices.p.idsatPerWidth * card.unit.wp) * axes.size;
  const slowest = (axes.loads[axes.loads.length - 1]! * vdd) / weakest;
  const slew = axes.transitions[row]!;
  const half = Math.max(1e-9, 5 * slowest + 1.5 * slew);
  const stop = 2 * (TD + slew + half);
  const lines = [
    spiceComment(`phasegap characterization: ${card.name} at ${corner.name}, cells of size ${axes.size}, input transition ${spiceNumber(slew)} s`),
    ...models.header,
    `vsupply vdd 0 DC ${spiceNumber(vdd)}`,
  ];
  for (const cell of cells) lines.push(cellSubckt(cell, axes.size, unitWidths(card), models.geometry));
  const arcs: Arc[] = [];
  const names: string[] = [];
  const half50 = spiceNumber(vdd / 2);
  const lo = spiceNumber(0.1 * vdd);
  const hi = spiceNumber(0.9 * vdd);
  for (const cell of cells) {
    const shape = CELLS[cell];
    // Non-controlling level of the other inputs: high for a NAND (and INV), low for a NOR.
    const idle = shape.nSeries > 1 || shape.inputs === 1 ? 'vdd' : '0';
    for (let pin = 0; pin < shape.inputs; pin++) {
      axes.loads.forEach((load, column) => {
        const id = arcs.length;
        arcs.push({ cell, pin, row, column, id });
        const inputs = Array.from({ length: shape.inputs }, (_, i) => (i === pin ? `i${id}` : idle));
        lines.push(
          `vi${id} i${id} 0 PULSE(0 ${spiceNumber(vdd)} ${spiceNumber(TD)} ${spiceNumber(slew)} ${spiceNumber(slew)} ${spiceNumber(half)} ${spiceNumber(2 * (half + slew))})`,
          `x${id} ${inputs.join(' ')} o${id} vdd ${cellSubcktName(cell, axes.size)}`,
          `cl${id} o${id} 0 ${spiceNumber(load)}`,
          `.meas tran df${id} TRIG v(i${id}) VAL=${half50} RISE=1 TARG v(o${id}) VAL=${half50} FALL=1`,
          `.meas tran dr${id} TRIG v(i${id}) VAL=${half50} FALL=1 TARG v(o${id}) VAL=${half50} RISE=1`,
          `.meas tran tf${id} TRIG v(o${id}) VAL=${hi} FALL=1 TARG v(o${id}) VAL=${lo} FALL=1`,
          `.meas tran tr${id} TRIG v(o${id}) VAL=${lo} RISE=1 TARG v(o${id}) VAL=${hi} RISE=1`,
          `.meas tran q${id} INTEG i(vi${id}) FROM=0 TO=${spiceNumber(TD + slew + half)}`,
        );
        names.push(`df${id}`, `dr${id}`, `tf${id}`, `tr${id}`, `q${id}`);
      });
    }
  }
  // The step follows the input ramp, but never exceeds a fraction of the process's own C*V/I, so
  // fast output edges at small loads are resolved too.
  const step = Math.max(5e-13, Math.min(slew, 2 * processScale(card).time) / 10);
  lines.push(`.tran ${spiceNumber(step)} ${spiceNumber(stop)} 0 ${spiceNumber(step)}`, '.end', '');
  return { text: lines.join('\n'), corner, arcs, row, axes, names };
}

/** Builds a corner's tables from its decks' measured values; a missing value is an error naming it. */
export function cornerTablesFrom(parts: ReadonlyArray<{ readonly deck: CharacterizationDeck; readonly values: ReadonlyMap<string, number | null> }>): CornerTables | string {
  const deck = parts[0]!.deck;
  const rows = deck.axes.transitions.length;
  const cols = deck.axes.loads.length;
  const vdd = deck.corner.vdd;
  const cells: CornerTables['cells'] = {};
  const grid = () => Array.from({ length: rows }, () => new Array<number>(cols).fill(NaN));
  const pins = new Map<string, { tables: PinTables; charge: number[] }>();
  for (const { deck, values } of parts) for (const arc of deck.arcs) {
    const key = `${arc.cell}/${arc.pin}`;
    let entry = pins.get(key);
    if (!entry) {
      entry = { tables: { capacitance: 0, rise: { delay: grid(), transition: grid() }, fall: { delay: grid(), transition: grid() } }, charge: [] };
      pins.set(key, entry);
      const cell = (cells[arc.cell] ??= { pins: [] });
      cell.pins[arc.pin] = entry.tables;
    }
    const get = (name: string): number | string => {
      const v = values.get(name);
      return v === null || v === undefined || !Number.isFinite(v) ? `${name} (${arc.cell} pin ${arc.pin}, transition ${deck.axes.transitions[arc.row]} s, load ${deck.axes.loads[arc.column]} F) was not measured` : v;
    };
    const measured = [get(`df${arc.id}`), get(`dr${arc.id}`), get(`tf${arc.id}`), get(`tr${arc.id}`), get(`q${arc.id}`)];
    const missing = measured.find((m) => typeof m === 'string');
    if (missing !== undefined) return missing as string;
    const [df, dr, tf, tr, q] = measured as number[];
    entry.tables.fall.delay[arc.row]![arc.column] = df!;
    entry.tables.rise.delay[arc.row]![arc.column] = dr!;
    entry.tables.fall.transition[arc.row]![arc.column] = tf! / 0.8;
    entry.tables.rise.transition[arc.row]![arc.column] = tr! / 0.8;
    entry.charge.push(Math.abs(q!));
  }
  const missing = parts.length !== rows || parts.some((p, i) => p.deck.row !== i);
  if (missing) return `the decks cover input-transition rows ${parts.map((p) => p.deck.row).join(', ')}; all ${rows} are needed`;
  for (const { tables, charge } of pins.values()) {
    (tables as { capacitance: number }).capacitance = charge.reduce((a, b) => a + b, 0) / charge.length / vdd;
  }
  return { name: deck.corner.name, process: deck.corner.process, vdd: deck.corner.vdd, temperature: deck.corner.temperature, cells };
}
