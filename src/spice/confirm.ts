/**
 * Model against simulator: per corner and per quantity (each dead time, clean gap and phase
 * width) the model's and the simulator's values and the relative error (model - sim) / sim; and
 * per break-before-make pair both margins, which must agree on whether the pair holds.
 */
import type { Deck } from './deck.js';
import type { QuantityKind } from './measures.js';
import type { SimulatorOutput } from './results.js';
import { breakBeforeMakeMargins, type BreakBeforeMakeComparison } from './switch-margins.js';

export interface QuantityComparison {
  readonly quantity: string;
  readonly kind: QuantityKind;
  /** s */
  readonly model: number;
  /** s; null when the simulator could not measure it. */
  readonly simulator: number | null;
  readonly relativeError: number | null;
  readonly pass: boolean;
}

export interface CornerComparison {
  readonly corner: string;
  readonly quantities: readonly QuantityComparison[];
  /** Break-before-make margins at the switches, model and simulator; they must agree on the verdict. */
  readonly breakBeforeMake: readonly BreakBeforeMakeComparison[];
  /** Errors the simulator reported. */
  readonly errors: readonly string[];
  readonly pass: boolean;
}

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

/** The largest |relative error| over corners, or null when nothing was measured. */
export function worstDifference(corners: readonly CornerComparison[]): { corner: string; quantity: string; relativeError: number } | null {
  let worst: { corner: string; quantity: string; relativeError: number } | null = null;
  for (const c of corners) {
    for (const q of c.quantities) {
      if (q.relativeError !== null && (worst === null || Math.abs(q.relativeError) > Math.abs(worst.relativeError))) {
        worst = { corner: c.corner, quantity: q.quantity, relativeError: q.relativeError };
      }
    }
  }
  return worst;
}
