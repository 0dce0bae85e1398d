/**
 * Model against simulator, as data: per corner and per quantity (each dead time, clean gap and phase
 * width) the model's and the simulator's values and the relative error (model - sim) / sim; and
 * per break-before-make pair both margins, which must agree on whether the pair holds.
 */

/** What a deck measures: a dead time, a clean gap, a phase width or a switch instant. */
export type QuantityKind = 'dead' | 'gap' | 'width' | 'switch';

/** Largest |relative error| of a switch R_on that counts as agreeing. */
export const RON_TOLERANCE = 0.1;

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
  /** The circuit the switches serve, simulated to its periodic steady state (designs with a circuit section). */
  readonly circuit?: CircuitComparison;
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

/**
 * Tolerances of the circuit figures: the mean output within 2 % of the corner's VDD, ripple and
 * efficiency within 10 % of the simulator's value. Lost charge is shown, not judged: the
 * simulator's figure also carries the displacement charge of the device capacitances.
 */
export const CIRCUIT_TOLERANCE = { output: 0.02, ripple: 0.1, efficiency: 0.1 } as const;

export type CircuitFigureName = 'output' | 'ripple' | 'efficiency' | 'lost charge';

export interface CircuitFigureComparison {
  readonly figure: CircuitFigureName;
  /** 'V', 'C' or '' (a fraction). */
  readonly unit: 'V' | 'C' | '';
  /** null when the model reached no periodic steady state (or, for the efficiency, drew no power). */
  readonly model: number | null;
  /** null when the simulator could not measure it. */
  readonly simulator: number | null;
  /** output: (model - sim) / VDD; ripple and efficiency: (model - sim) / |sim|; null when not judged or not measured. */
  readonly difference: number | null;
  /** Largest allowed |difference|; null when the figure is shown, not judged. */
  readonly tolerance: number | null;
  readonly pass: boolean;
}

/** Powers over the last simulated period, W. */
export interface CircuitPowers {
  /** Drawn from the circuit's rails. */
  readonly input: number;
  /** Drawn by the clock generator, switch bodies and gates. */
  readonly generator: number;
  /** Taken by the load. */
  readonly output: number;
}

export interface CircuitComparison {
  /** Periods simulated from the solver's steady state. */
  readonly periods: number;
  /** Drift of the output mean over the last periods the deck measures (least-squares slope), V per period. */
  readonly drift: number | null;
  /** Whether the last periods show the output settled (see circuit-measures.ts). */
  readonly settled: boolean;
  readonly figures: readonly CircuitFigureComparison[];
  /** The model's powers are null where it reached no periodic steady state. */
  readonly power: { readonly model: CircuitPowers | null; readonly simulator: CircuitPowers | null };
  /** Settled, and every judged figure within its tolerance. */
  readonly pass: boolean;
}
