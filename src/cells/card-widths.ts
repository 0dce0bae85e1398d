/** A process card's unit widths and capacitance per width, as the cell library takes them. */
import { overlapPerWidth } from '../process/gate-edge.js';
import type { ProcessCard } from '../schema/process.js';
import { pinCapacitance, type CapacitancePerWidth, type PrimitiveCell, type UnitWidths } from './library.js';

/** Each gate's cell and size, indexed by gate (a compiled netlist is one). */
export interface GateCells {
  readonly gateCell: readonly PrimitiveCell[];
  readonly gateSize: Float64Array;
}

/**
 * Per width of each device type: the gate capacitance a pin presents, and what a drain puts on its
 * own output node: the card's junction (cdrain) and the drain's gate overlap twice, since the gate
 * and the drain of a switching gate move opposite ways (the Miller effect on C_gd).
 */
export function capacitancePerWidth(card: ProcessCard): CapacitancePerWidth {
  return {
    cgateN: card.n.cgate,
    cgateP: card.p.cgate,
    cdrainN: card.n.cdrain + 2 * overlapPerWidth(card.n),
    cdrainP: card.p.cdrain + 2 * overlapPerWidth(card.p),
  };
}

export function unitWidths(card: ProcessCard): UnitWidths {
  return { wn: card.unit.wn, wp: card.unit.wp };
}

/** Input capacitance of every gate's pins, F, indexed by gate. */
export function gatePinCapacitance(net: GateCells, card: ProcessCard): Float64Array {
  const unit = unitWidths(card);
  const c = capacitancePerWidth(card);
  return Float64Array.from(net.gateCell, (cell, g) => pinCapacitance(cell, net.gateSize[g]!, unit, c));
}
