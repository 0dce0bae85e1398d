/**
 * The cell library, sized by logical effort (I. Sutherland, B. Sproull, D. Harris, "Logical
 * Effort", Morgan Kaufmann 1999): a series stack of depth k is widened k times, so a cell of size s
 * pulls up and down like an inverter of size s. Input and parasitic capacitance follow from the
 * widths, which gives g = (k + gamma)/(1 + gamma) for NAND, (1 + k*gamma)/(1 + gamma) for NOR and
 * a parasitic of k times the inverter's.
 */
import type { CellKind } from '../schema/design.js';

export interface CellShape {
  readonly inputs: number;
  /** Depth of the series n stack (pull-down). */
  readonly nSeries: number;
  /** Depth of the series p stack (pull-up). */
  readonly pSeries: number;
  /** Logic function of the input bits. */
  readonly evaluate: (bits: number) => 0 | 1;
}

const all = (k: number) => (1 << k) - 1;

/** Primitive cells; BUF is expanded to two inverters before simulation (see expandBuffers). */
export const CELLS: Readonly<Record<Exclude<CellKind, 'BUF'>, CellShape>> = {
  INV: { inputs: 1, nSeries: 1, pSeries: 1, evaluate: (b) => (b & 1 ? 0 : 1) },
  NAND2: { inputs: 2, nSeries: 2, pSeries: 1, evaluate: (b) => ((b & all(2)) === all(2) ? 0 : 1) },
  NAND3: { inputs: 3, nSeries: 3, pSeries: 1, evaluate: (b) => ((b & all(3)) === all(3) ? 0 : 1) },
  NOR2: { inputs: 2, nSeries: 1, pSeries: 2, evaluate: (b) => ((b & all(2)) === 0 ? 1 : 0) },
  NOR3: { inputs: 3, nSeries: 1, pSeries: 3, evaluate: (b) => ((b & all(3)) === 0 ? 1 : 0) },
};

export type PrimitiveCell = keyof typeof CELLS;

export function cellShape(kind: PrimitiveCell): CellShape {
  return CELLS[kind];
}

export interface UnitWidths {
  /** N and P widths of the unit inverter, m. */
  readonly wn: number;
  readonly wp: number;
}

export interface CellWidths {
  /** Width of each n device, m (devices in a stack are equal). */
  readonly wn: number;
  /** Width of each p device, m. */
  readonly wp: number;
  /** Effective pull-down and pull-up widths, m: what an equivalent inverter would have. */
  readonly pullDown: number;
  readonly pullUp: number;
  /** Total n and p drain width on the output node, m. */
  readonly drainN: number;
  readonly drainP: number;
}

/** Device widths of a cell of size s. */
export function cellWidths(kind: PrimitiveCell, size: number, unit: UnitWidths): CellWidths {
  const shape = CELLS[kind];
  const wn = size * unit.wn * shape.nSeries;
  const wp = size * unit.wp * shape.pSeries;
  // Parallel devices each put a drain on the output; of a series stack only the top one does.
  const nOnOutput = shape.nSeries === 1 ? shape.inputs : 1;
  const pOnOutput = shape.pSeries === 1 ? shape.inputs : 1;
  return {
    wn,
    wp,
    pullDown: size * unit.wn,
    pullUp: size * unit.wp,
    drainN: nOnOutput * wn,
    drainP: pOnOutput * wp,
  };
}

export interface CapacitancePerWidth {
  /** Gate capacitance per metre of width for n and p, F/m. */
  readonly cgateN: number;
  readonly cgateP: number;
  /** Drain capacitance per metre of width for n and p, F/m. */
  readonly cdrainN: number;
  readonly cdrainP: number;
}

/** Capacitance of one input pin, F. */
export function pinCapacitance(kind: PrimitiveCell, size: number, unit: UnitWidths, c: CapacitancePerWidth): number {
  const w = cellWidths(kind, size, unit);
  return w.wn * c.cgateN + w.wp * c.cgateP;
}

/** Self-parasitic capacitance on the output node, F. */
export function parasiticCapacitance(kind: PrimitiveCell, size: number, unit: UnitWidths, c: CapacitancePerWidth): number {
  const w = cellWidths(kind, size, unit);
  return w.drainN * c.cdrainN + w.drainP * c.cdrainP;
}
