import { describe, expect, it } from 'vitest';
import { capacitancePerWidth, gatePinCapacitance, unitWidths } from '../../src/cells/card-widths.js';
import { pinCapacitance } from '../../src/cells/library.js';
import { loadProcess } from '../../src/cli/load.js';
import { processCard } from '../helpers.js';

describe('card widths', () => {
  const card = loadProcess(processCard('generic180'));

  it("unitWidths and capacitancePerWidth read the card's unit devices and capacitances", () => {
    expect(unitWidths(card)).toEqual({ wn: card.unit.wn, wp: card.unit.wp });
    expect(capacitancePerWidth(card)).toEqual({
      cgateN: card.n.cgate,
      cgateP: card.p.cgate,
      cdrainN: card.n.cdrain,
      cdrainP: card.p.cdrain,
    });
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
