/**
 * Model against simulator, as data: per corner and per quantity (each dead time, clean gap and phase
 * width) the model's and the simulator's values and the relative error (model - sim) / sim; and
 * per break-before-make pair both margins, which must agree on whether the pair holds.
 */

/** What a deck measures: a dead time, a clean gap, a phase width or a switch instant. */
export type QuantityKind = 'dead' | 'gap' | 'width' | 'switch';

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

export interface BreakBeforeMakeComparison {
  readonly check: string;
  /** Margins, s: least handover gap less the guard; null when the simulator missed an instant. */
  readonly model: number;
  readonly simulator: number | null;
  /** Both say the pair holds, or both say it fails. */
  readonly agrees: boolean;
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
