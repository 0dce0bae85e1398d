/** Compares a deck's measured values with the model's: the data of `src/report/confirm-report.ts`. */
import type { Deck } from './deck.js';
import type { CornerComparison, QuantityComparison, QuantityKind } from '../report/confirm-report.js';
import type { SimulatorOutput } from './results.js';
import { breakBeforeMakeMargins } from './switch-margins.js';

export const COMPARED_KINDS: readonly QuantityKind[] = ['dead', 'gap', 'width'];

export function compareCorner(deck: Deck, output: SimulatorOutput, tolerance: number): CornerComparison {
  const quantities = deck.quantities.filter((q) => COMPARED_KINDS.includes(q.kind)).map((q): QuantityComparison => {
    const simulator = output.values.get(q.name) ?? null;
    const relativeError = simulator === null || simulator === 0 ? null : (q.model - simulator) / Math.abs(simulator);
    return { quantity: q.label, kind: q.kind, model: q.model, simulator, relativeError, pass: relativeError !== null && Math.abs(relativeError) <= tolerance };
  });
  const breakBeforeMake = breakBeforeMakeMargins(deck.quantities, (name) => output.values.get(name) ?? null, deck.breakBeforeMake, deck.window.period);
  return {
    corner: deck.corner.name, quantities, breakBeforeMake, errors: output.errors,
    pass: quantities.every((q) => q.pass) && breakBeforeMake.every((b) => b.agrees),
  };
}
