import { describe, expect, it } from 'vitest';
import { capacitancePerWidth, gatePinCapacitance, unitWidths } from '../../src/cells/card-widths.js';
import { pinCapacitance } from '../../src/cells/library.js';
import { loadProcess } from '../../src/cli/load.js';
import { expectClose, processCard } from '../helpers.js';

describe('card widths', () => {
  const card = loadProcess(processCard('generic180'));

  it("unitWidths and capacitancePerWidth read the card's unit devices and capacitances, a drain's overlap twice (Miller)", () => {
    expect(unitWidths(card)).toEqual({ wn: card.unit.wn, wp: card.unit.wp });
    const c = capacitancePerWidth(card);
    expect([c.cgateN, c.cgateP]).toEqual([1.92e-9, 1.92e-9]);
    // generic180: junction 1.2 fF/um and CGDO 0.2 fF/um counted twice.
    expectClose(c.cdrainN, 1.6e-9, 1e-12);
    expectClose(c.cdrainP, 1.6e-9, 1e-12);
  });

  it("gatePinCapacitance gives each gate its cell's pin capacitance at its size", () => {
    const gates = { gateCell: ['INV', 'NAND2'] as const, gateSize: Float64Array.of(1, 3) };
    const pins = gatePinCapacitance({ gateCell: [...gates.gateCell], gateSize: gates.gateSize }, card);
    expect(Array.from(pins)).toEqual([
      pinCapacitance('INV', 1, unitWidths(card), capacitancePerWidth(card)),
      pinCapacitance('NAND2', 3, unitWidths(card), capacitancePerWidth(card)),
    ]);
    expect(pins[1]!).toBeGreaterThan(pins[0]!);
  });
});
