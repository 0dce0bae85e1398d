/** Compares a deck's measured values with the model's: the data of `src/report/confirm-report.ts`. */
import type { Deck } from './deck.js';
import {
  RON_TOLERANCE,
  type CornerComparison,
  type QuantityComparison,
  type QuantityKind,
  type RonComparison,
} from '../report/confirm-report.js';
import type { SimulatorOutput } from './results.js';
import { breakBeforeMakeMargins } from './switch-margins.js';
import { ronFromCurrent } from './ron-bench.js';

export const COMPARED_KINDS: readonly QuantityKind[] = ['dead', 'gap', 'width'];

export function compareCorner(deck: Deck, output: SimulatorOutput, tolerance: number): CornerComparison {
  const quantities = deck.quantities
    .filter((q) => COMPARED_KINDS.includes(q.kind))
    .map((q): QuantityComparison => {
      const simulator = output.values.get(q.name) ?? null;
      const relativeError = simulator === null || simulator === 0 ? null : (q.model - simulator) / Math.abs(simulator);
      return {
        quantity: q.label,
        kind: q.kind,
        model: q.model,
        simulator,
        relativeError,
        pass: relativeError !== null && Math.abs(relativeError) <= tolerance,
      };
    });
  const breakBeforeMake = breakBeforeMakeMargins(
    deck.quantities,
    (name) => output.values.get(name) ?? null,
    deck.breakBeforeMake,
    deck.window.period,
  );
  const ron = deck.ron.map((r): RonComparison => {
    const simulator = ronFromCurrent(output.values.get(r.name) ?? null);
    const relativeError = simulator === null ? null : (r.model - simulator) / simulator;
    return {
      label: r.label,
      switch: r.switch,
      model: r.model,
      simulator,
      relativeError,
      pass: relativeError !== null && Math.abs(relativeError) <= RON_TOLERANCE,
    };
  });
  return {
    corner: deck.corner.name,
    quantities,
    breakBeforeMake,
    ron,
    errors: output.errors,
    pass: quantities.every((q) => q.pass) && breakBeforeMake.every((b) => b.agrees) && ron.every((r) => r.pass),
  };
}
