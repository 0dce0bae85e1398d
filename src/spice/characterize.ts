/**
 * Characterization decks: for one corner, every cell's every input pin is driven through a real
 * driver (an ideal ramp into an inverter of the library, with a capacitor on its output setting
 * the edge rate), the other inputs held at their non-controlling level, into a load capacitor,
 * over a grid of input transition x output load. The driver has a finite output resistance, so
 * the pin's waveform carries the cell's kickback (Miller coupling from its output) as it does in
 * a generator. Measured: the pin's own transition, the delay pin 50 % to output 50 % and the
 * output transition on both edges, and the charge the pin has drawn when it crosses 50 % (its
 * effective capacitance as the driver sees it up to its own delay point). Tables are then
 * resampled from the measured pin transitions onto the axis. One deck holds one input-transition
 * row of a corner's grid (all cells, pins and loads), each point an independent test circuit, so
 * its time step can follow that transition. Grids are set in multiples of the process's own
 * scale: loads in unit-inverter input capacitances, transitions in the unit inverter's C*V/I.
 */
import { CELLS, pinCapacitance, type PrimitiveCell } from '../cells/library.js';
import { capacitancePerWidth, unitWidths } from '../cells/card-widths.js';
import { devicesAtCorner } from '../process/device.js';
import type { Corner } from '../process/corner.js';
import type { ProcessCard } from '../schema/process.js';
import { TABLE_CELLS, type CornerTables, type PinTables } from '../schema/tables.js';
import { bracket, linear } from '../delay/interpolate.js';
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

export const GRIDS: Readonly<Record<'coarse' | 'fine' | 'wide', GridSpec>> = {
  coarse: { transitions: [1, 10, 40, 100], loads: [0.25, 4, 16, 40] },
  fine: { transitions: [1, 3, 8, 20, 45, 100, 200], loads: [0.25, 1, 3, 8, 16, 30, 60] },
  // fine, one step further each way: for delay chains loaded well past 60 unit loads, whose slow
  // edges then drive the next stage (generic-lp's lp-netlist: 134 unit loads, and 463 unit
  // transitions at ss/0.9V/-40C).
  wide: { transitions: [1, 3, 8, 20, 45, 100, 200, 500], loads: [0.25, 1, 3, 8, 16, 30, 60, 150] },
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
/** Rough full-swing transition of an inverter per C*V/I of its load, used only to aim the driver (the tables are resampled from the measured transitions). */
const AIM = 1.5;
/** Charge-integrator capacitance: the node's voltage is the pin's charge in units of this, F. */
const QSCALE = 1e-15;

/** The driver of a pin for a target transition: inverter size and the capacitor on its output. */
export function driverFor(card: ProcessCard, axes: Axes, cell: PrimitiveCell, transition: number): { size: number; capacitance: number } {
  const scale = processScale(card);
  const pin = pinCapacitance(cell, axes.size, unitWidths(card), capacitancePerWidth(card));
  // A transition of T from an inverter of size s needs about T * s * C_inv / (AIM * t_unit) on its
  // output; the size is at least the cells' own and large enough that the pin is at most half of it.
  const least = (AIM * scale.time * pin) / (transition * axes.size * scale.capacitance);
  const raw = Math.max(1, 2 * least);
  const step = 10 ** (Math.floor(Math.log10(raw)) - 1);
  const size = Number((Math.ceil(raw / step - 1e-9) * step).toPrecision(2));
  const total = (transition * size * axes.size * scale.capacitance) / (AIM * scale.time);
  return { size: size * axes.size, capacitance: Number(Math.max(0, total - pin).toPrecision(4)) };
}

/** The decks of one corner, one per input transition. */
export function characterizationDecks(
  card: ProcessCard,
  corner: Pick<Corner, 'name' | 'process' | 'vdd' | 'temperature'>,
  axes: Axes,
  modelPath: string,
  cells: readonly PrimitiveCell[] = TABLE_CELLS,
): CharacterizationDeck[] {
  return axes.transitions.map((_, row) => characterizationDeck(card, corner, axes, modelPath, cells, row));
}

export function characterizationDeck(
  card: ProcessCard,
  corner: Pick<Corner, 'name' | 'process' | 'vdd' | 'temperature'>,
  axes: Axes,
  modelPath: string,
  cells: readonly PrimitiveCell[],
  row: number,
): CharacterizationDeck {
  const models = cornerModels(card, corner, modelPath);
  const vdd = corner.vdd;
  const devices = devicesAtCorner(card, { ...corner, duty: 0.5 });
  // Long enough for the slowest output edge to settle: several analytic C*V/I at the largest load.
  const weakest = Math.min(devices.n.idsatPerWidth * card.unit.wn, devices.p.idsatPerWidth * card.unit.wp) * axes.size;
  const slowest = (axes.loads[axes.loads.length - 1]! * vdd) / weakest;
  const slew = axes.transitions[row]!;
  const half = Math.max(1e-9, 5 * slowest + 4 * slew);
  const stop = 2 * (TD + slew + half);
  const lines = [
    spiceComment(
      `phasegap characterization: ${card.name} at ${corner.name}, cells of size ${axes.size}, input transition ${spiceNumber(slew)} s`,
    ),
    ...models.header,
    `vsupply vdd 0 DC ${spiceNumber(vdd)}`,
  ];
  const drivers = new Map(cells.map((cell) => [cell, driverFor(card, axes, cell, slew)]));
  const subckts = new Map<string, string>();
  for (const cell of cells) subckts.set(cellSubcktName(cell, axes.size), cellSubckt(cell, axes.size, unitWidths(card), models.geometry));
  for (const { size } of drivers.values())
    subckts.set(cellSubcktName('INV', size), cellSubckt('INV', size, unitWidths(card), models.geometry));
  lines.push(...subckts.values());
  const arcs: Arc[] = [];
  const names: string[] = [];
  const half50 = spiceNumber(vdd / 2);
  const lo = spiceNumber(0.1 * vdd);
  const hi = spiceNumber(0.9 * vdd);
  // The driver's input falls at TD (the pin rises) and rises again at `fallAt` (the pin falls).
  const fallAt = spiceNumber(TD + slew + half);
  for (const cell of cells) {
    const shape = CELLS[cell];
    const driver = drivers.get(cell)!;
    // Non-controlling level of the other inputs: high for a NAND (and INV), low for a NOR.
    const idle = shape.nSeries > 1 || shape.inputs === 1 ? 'vdd' : '0';
    for (let pin = 0; pin < shape.inputs; pin++) {
      axes.loads.forEach((load, column) => {
        const id = arcs.length;
        arcs.push({ cell, pin, row, column, id });
        const inputs = Array.from({ length: shape.inputs }, (_, i) => (i === pin ? `i${id}` : idle));
        const v = (node: string) => `v(${node}${id})`;
        lines.push(
          `vs${id} s${id} 0 PULSE(${spiceNumber(vdd)} 0 ${spiceNumber(TD)} ${spiceNumber(slew)} ${spiceNumber(slew)} ${spiceNumber(half)} ${spiceNumber(2 * (half + slew))})`,
          `xd${id} s${id} d${id} vdd ${cellSubcktName('INV', driver.size)}`,
          `cd${id} d${id} 0 ${spiceNumber(driver.capacitance)}`,
          `vm${id} d${id} i${id} DC 0`,
          `x${id} ${inputs.join(' ')} o${id} vdd ${cellSubcktName(cell, axes.size)}`,
          `cl${id} o${id} 0 ${spiceNumber(load)}`,
          // The pin's charge, integrated on a capacitor (a leak of a millisecond time constant gives it a DC path).
          `fq${id} 0 q${id} vm${id} 1`,
          `cq${id} q${id} 0 ${spiceNumber(QSCALE)}`,
          `rq${id} q${id} 0 1e12`,
          `.meas tran sr${id} TRIG ${v('i')} VAL=${lo} RISE=1 TARG ${v('i')} VAL=${hi} RISE=1`,
          `.meas tran sf${id} TRIG ${v('i')} VAL=${hi} FALL=1 TARG ${v('i')} VAL=${lo} FALL=1`,
          `.meas tran df${id} TRIG ${v('i')} VAL=${half50} RISE=1 TARG ${v('o')} VAL=${half50} FALL=1`,
          `.meas tran dr${id} TRIG ${v('i')} VAL=${half50} FALL=1 TARG ${v('o')} VAL=${half50} RISE=1`,
          `.meas tran tf${id} TRIG ${v('o')} VAL=${hi} FALL=1 TARG ${v('o')} VAL=${lo} FALL=1`,
          `.meas tran tr${id} TRIG ${v('o')} VAL=${lo} RISE=1 TARG ${v('o')} VAL=${hi} RISE=1`,
          `.meas tran qr${id} FIND ${v('q')} WHEN ${v('i')}=${half50} RISE=1`,
          `.meas tran qh${id} FIND ${v('q')} AT=${fallAt}`,
          `.meas tran qf${id} FIND ${v('q')} WHEN ${v('i')}=${half50} FALL=1`,
        );
        names.push(`sr${id}`, `sf${id}`, `df${id}`, `dr${id}`, `tf${id}`, `tr${id}`, `qr${id}`, `qh${id}`, `qf${id}`);
      });
    }
  }
  // The step follows the input ramp, but never exceeds a fraction of the process's own C*V/I, so
  // fast output edges at small loads are resolved too.
  const step = Math.max(5e-13, Math.min(slew, 2 * processScale(card).time) / 10);
  lines.push(`.tran ${spiceNumber(step)} ${spiceNumber(stop)} 0 ${spiceNumber(step)}`, '.end', '');
  return { text: lines.join('\n'), corner, arcs, row, axes, names };
}

/** Values measured at the points of a grid, by input-transition row and load column. */
type Grid = number[][];

/**
 * Resamples one load column from the measured pin transitions onto the axis (piecewise linear,
 * the end segments extended): a realistic driver does not hit the aimed transition exactly.
 */
export function resampleColumn(measured: readonly number[], values: readonly number[], axis: readonly number[]): number[] {
  const order = measured.map((_, i) => i).sort((a, b) => measured[a]! - measured[b]!);
  const xs = order.map((i) => measured[i]!);
  const ys = order.map((i) => values[i]!);
  return axis.map((x) => linear(ys, bracket(xs, x)));
}

/** Builds a corner's tables from its decks' measured values; a missing value is an error naming it. */
export function cornerTablesFrom(
  parts: ReadonlyArray<{ readonly deck: CharacterizationDeck; readonly values: ReadonlyMap<string, number | null> }>,
): CornerTables | string {
  const deck = parts[0]!.deck;
  const rows = deck.axes.transitions.length;
  const cols = deck.axes.loads.length;
  const vdd = deck.corner.vdd;
  const missing = parts.length !== rows || parts.some((p, i) => p.deck.row !== i);
  if (missing) return `the decks cover input-transition rows ${parts.map((p) => p.deck.row).join(', ')}; all ${rows} are needed`;
  const grid = (): Grid => Array.from({ length: rows }, () => new Array<number>(cols).fill(NaN));
  const KEYS = ['sr', 'sf', 'df', 'dr', 'tf', 'tr', 'cr', 'cf'] as const;
  const pins = new Map<string, { cell: PrimitiveCell; pin: number; grids: Record<(typeof KEYS)[number], Grid> }>();
  for (const { deck, values } of parts)
    for (const arc of deck.arcs) {
      const key = `${arc.cell}/${arc.pin}`;
      let entry = pins.get(key);
      if (!entry) {
        entry = {
          cell: arc.cell,
          pin: arc.pin,
          grids: Object.fromEntries(KEYS.map((k) => [k, grid()])) as Record<(typeof KEYS)[number], Grid>,
        };
        pins.set(key, entry);
      }
      const get = (name: string): number | string => {
        const v = values.get(name);
        return v === null || v === undefined || !Number.isFinite(v)
          ? `${name} (${arc.cell} pin ${arc.pin}, transition ${deck.axes.transitions[arc.row]} s, load ${deck.axes.loads[arc.column]} F) was not measured`
          : v;
      };
      const measured = ['sr', 'sf', 'df', 'dr', 'tf', 'tr', 'qr', 'qh', 'qf'].map((m) => get(`${m}${arc.id}`));
      const absent = measured.find((m) => typeof m === 'string');
      if (absent !== undefined) return absent as string;
      const [sr, sf, df, dr, tf, tr, qr, qh, qf] = measured as number[];
      const put = (k: (typeof KEYS)[number], v: number) => {
        entry.grids[k][arc.row]![arc.column] = v;
      };
      put('sr', sr! / 0.8);
      put('sf', sf! / 0.8);
      put('df', df!);
      put('dr', dr!);
      put('tf', tf! / 0.8);
      put('tr', tr! / 0.8);
      // Charge to the pin's 50 % point over half the swing, on its rising and its falling edge.
      put('cr', (qr! * QSCALE) / (vdd / 2));
      put('cf', ((qh! - qf!) * QSCALE) / (vdd / 2));
    }
  const axis = deck.axes.transitions;
  const onAxis = (slews: Grid, values: Grid): Grid => {
    const out = grid();
    for (let c = 0; c < cols; c++) {
      const column = resampleColumn(
        slews.map((r) => r[c]!),
        values.map((r) => r[c]!),
        axis,
      );
      column.forEach((v, r) => {
        out[r]![c] = v;
      });
    }
    return out;
  };
  const mean = (g: Grid) => g.flat().reduce((a, b) => a + b, 0) / (rows * cols);
  const cells: CornerTables['cells'] = {};
  for (const { cell, pin, grids } of pins.values()) {
    const tables: PinTables = {
      capacitance: (mean(grids.cr) + mean(grids.cf)) / 2,
      // A rising pin makes the output fall.
      fall: { delay: onAxis(grids.sr, grids.df), transition: onAxis(grids.sr, grids.tf) },
      rise: { delay: onAxis(grids.sf, grids.dr), transition: onAxis(grids.sf, grids.tr) },
    };
    cells[cell] ??= { pins: [] };
    cells[cell].pins[pin] = tables;
  }
  return { name: deck.corner.name, process: deck.corner.process, vdd: deck.corner.vdd, temperature: deck.corner.temperature, cells };
}
