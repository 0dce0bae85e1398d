/**
 * Model against simulator: per corner and per quantity (each dead time, clean gap and phase
 * width) the model's and the simulator's values and the relative error (model - sim) / sim; and
 * per break-before-make pair both margins, which must agree on whether the pair holds.
 */
import type { Deck } from './deck.js';
import type { QuantityKind } from './measures.js';
import type { SimulatorOutput } from './results.js';
import { breakBeforeMakeMargins, type BreakBeforeMakeComparison } from './switch-margins.js';
import { ronFromCurrent } from './ron-bench.js';

/** Largest |relative error| of a switch R_on that counts as agreeing. */
export const RON_TOLERANCE = 0.10;

export interface RonComparison {
  readonly label: string;
  readonly switch: string;
  /** ohm */
  readonly model: number;
  /** ohm; null when the simulator could not measure it. */
  readonly simulator: number | null;
  readonly relativeError: number | null;
  /** Within RON_TOLERANCE. */
  readonly pass: boolean;
}

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
  /** Switch on-resistance, model and simulator, at each end of every switch's signal range. */
  readonly ron: readonly RonComparison[];
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
  const ron = deck.ron.map((r): RonComparison => {
    const simulator = ronFromCurrent(output.values.get(r.name) ?? null);
    const relativeError = simulator === null ? null : (r.model - simulator) / simulator;
    return { label: r.label, switch: r.switch, model: r.model, simulator, relativeError, pass: relativeError !== null && Math.abs(relativeError) <= RON_TOLERANCE };
  });
  return {
    corner: deck.corner.name, quantities, breakBeforeMake, ron, errors: output.errors,
    pass: quantities.every((q) => q.pass) && breakBeforeMake.every((b) => b.agrees) && ron.every((r) => r.pass),
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
