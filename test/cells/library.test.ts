import { describe, it, expect } from 'vitest';
import {
  CELLS,
  cellWidths,
  parasiticCapacitance,
  pinCapacitance,
  type CapacitancePerWidth,
  type PrimitiveCell,
  type UnitWidths,
} from '../../src/cells/library.js';
import { expectClose } from '../helpers.js';

/** A unit inverter with P/N ratio gamma and equal gate and drain capacitance per width for n and p. */
function unitWith(gamma: number): UnitWidths {
  return { wn: 0.5e-6, wp: gamma * 0.5e-6 };
}
const CAPS: CapacitancePerWidth = { cgateN: 1.6e-9, cgateP: 1.6e-9, cdrainN: 1.0e-9, cdrainP: 1.0e-9 };

/** Logical effort: input capacitance relative to an inverter of the same size (same drive). */
const effort = (kind: PrimitiveCell, gamma: number, size = 1): number =>
  pinCapacitance(kind, size, unitWith(gamma), CAPS) / pinCapacitance('INV', size, unitWith(gamma), CAPS);

/** Parasitic delay in units of p_inv: output capacitance relative to the inverter of the same size. */
const parasitic = (kind: PrimitiveCell, gamma: number, size = 1): number =>
  parasiticCapacitance(kind, size, unitWith(gamma), CAPS) / parasiticCapacitance('INV', size, unitWith(gamma), CAPS);

describe('pinCapacitance', () => {
  // Sutherland, Sproull & Harris, "Logical Effort", Morgan Kaufmann 1999: with P/N ratio 2,
  // g(INV) = 1, g(NAND2) = 4/3, g(NAND3) = 5/3, g(NOR2) = 5/3, g(NOR3) = 7/3.
  it.each([
    ['INV', 1],
    ['NAND2', 4 / 3],
    ['NAND3', 5 / 3],
    ['NOR2', 5 / 3],
    ['NOR3', 7 / 3],
  ] as const)('gives %s the published logical effort %d at gamma = 2 (Logical Effort, 1999)', (kind, g) => {
    expectClose(effort(kind, 2), g, 1e-12);
  });

  // Derived from the same book's formulas (n + gamma)/(1 + gamma) and (1 + n*gamma)/(1 + gamma).
  it('gives NAND2 1.4 and NOR2 1.6 at gamma = 1.5 (derived from Logical Effort, 1999)', () => {
    expectClose(effort('NAND2', 1.5), 1.4, 1e-12);
    expectClose(effort('NOR2', 1.5), 1.6, 1e-12);
  });

  // Logical Effort (1999), general n-input forms: NAND (n + gamma)/(1 + gamma), NOR (1 + n*gamma)/(1 + gamma).
  it.each([1, 1.5, 2, 2.5, 3])('follows the n-input NAND and NOR effort formulas at gamma = %d', (gamma) => {
    expectClose(effort('NAND2', gamma), (2 + gamma) / (1 + gamma), 1e-12);
    expectClose(effort('NAND3', gamma), (3 + gamma) / (1 + gamma), 1e-12);
    expectClose(effort('NOR2', gamma), (1 + 2 * gamma) / (1 + gamma), 1e-12);
    expectClose(effort('NOR3', gamma), (1 + 3 * gamma) / (1 + gamma), 1e-12);
  });

  it('scales linearly with size, so the effort does not depend on size', () => {
    const unit = unitWith(2);
    expectClose(pinCapacitance('NAND2', 6, unit, CAPS), 6 * pinCapacitance('NAND2', 1, unit, CAPS), 1e-12);
    expectClose(effort('NOR3', 2, 7.5), 7 / 3, 1e-12);
  });

  it('adds n and p gate capacitance with their own per-width values', () => {
    const unit = unitWith(2);
    const caps: CapacitancePerWidth = { cgateN: 2e-9, cgateP: 1e-9, cdrainN: 0, cdrainP: 0 };
    // NOR2 of size 1: n device 0.5 um (no stack), p device 2 * 1.0 um (stack of two).
    expectClose(pinCapacitance('NOR2', 1, unit, caps), 0.5e-6 * 2e-9 + 2.0e-6 * 1e-9, 1e-12);
  });
});

describe('parasiticCapacitance', () => {
  // Logical Effort (1999): parasitic delay of an n-input NAND or NOR is n * p_inv.
  it.each([
    ['INV', 1],
    ['NAND2', 2],
    ['NAND3', 3],
    ['NOR2', 2],
    ['NOR3', 3],
  ] as const)('gives %s the published parasitic delay %d p_inv (Logical Effort, 1999)', (kind, p) => {
    expectClose(parasitic(kind, 2), p, 1e-12);
  });

  it('is zero when the card has no drain capacitance', () => {
    const caps = { ...CAPS, cdrainN: 0, cdrainP: 0 };
    expect(parasiticCapacitance('NAND3', 4, unitWith(2), caps)).toBe(0);
  });
});

describe('cellWidths', () => {
  it.each(['INV', 'NAND2', 'NAND3', 'NOR2', 'NOR3'] as const)('makes %s of size 3 pull up and down like an inverter of size 3', (kind) => {
    const unit = unitWith(2);
    const w = cellWidths(kind, 3, unit);
    expectClose(w.pullDown, 3 * unit.wn, 1e-12);
    expectClose(w.pullUp, 3 * unit.wp, 1e-12);
  });

  it('widens each device of a series stack by the stack depth', () => {
    const unit = unitWith(2);
    const nand3 = cellWidths('NAND3', 1, unit);
    expectClose(nand3.wn, 3 * unit.wn, 1e-12);
    expectClose(nand3.wp, unit.wp, 1e-12);
    const nor2 = cellWidths('NOR2', 1, unit);
    expectClose(nor2.wn, unit.wn, 1e-12);
    expectClose(nor2.wp, 2 * unit.wp, 1e-12);
  });

  it('puts every parallel drain but only the top drain of a stack on the output', () => {
    const unit = unitWith(2);
    const nand2 = cellWidths('NAND2', 1, unit);
    expectClose(nand2.drainN, 2 * unit.wn, 1e-12); // one stacked n device of width 2 wn
    expectClose(nand2.drainP, 2 * unit.wp, 1e-12); // two parallel p devices of width wp
  });
});

describe('CELLS evaluate', () => {
  // Truth tables, bit i = input pin i.
  it.each([
    ['INV', [1, 0]],
    ['NAND2', [1, 1, 1, 0]],
    ['NOR2', [1, 0, 0, 0]],
    ['NAND3', [1, 1, 1, 1, 1, 1, 1, 0]],
    ['NOR3', [1, 0, 0, 0, 0, 0, 0, 0]],
  ] as const)('computes the truth table of %s', (kind, table) => {
    const cell = CELLS[kind];
    expect(table).toHaveLength(1 << cell.inputs);
    table.forEach((out, bits) => {
      expect(cell.evaluate(bits)).toBe(out);
    });
  });

  it('describes the series depth of each pull network', () => {
    expect([CELLS.NAND3.nSeries, CELLS.NAND3.pSeries]).toEqual([3, 1]);
    expect([CELLS.NOR3.nSeries, CELLS.NOR3.pSeries]).toEqual([1, 3]);
    expect([CELLS.INV.nSeries, CELLS.INV.pSeries]).toEqual([1, 1]);
  });
});
