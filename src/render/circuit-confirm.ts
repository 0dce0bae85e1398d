/**
 * The review page's circuit against the simulator: one table per confirmed corner with a circuit,
 * each figure's model and simulator values, difference, tolerance and verdict. The cells come from
 * confirm's own row builders, so the page and `phasegap confirm` say the same thing.
 */
import type { CircuitComparison, CircuitFigureComparison, CornerComparison } from '../report/confirm-report.js';
import { circuitFigureCells, circuitFigureTolerance, circuitFigureVerdict, circuitRunText } from '../report/confirm-text.js';

export interface CircuitConfirmRow {
  /** figure, model, simulator, difference, tolerance, verdict */
  readonly cells: readonly string[];
  readonly fail: boolean;
  /** The comparison the cells were written from (SI), for machine-readable attributes. */
  readonly figure: CircuitFigureComparison;
}

export interface CircuitConfirmTable {
  readonly corner: string;
  readonly title: string;
  /** Periods simulated, settled or not, and both sides' powers. */
  readonly note: string;
  readonly head: readonly string[];
  readonly rows: readonly CircuitConfirmRow[];
  /** Settled, and every judged figure within its tolerance (the comparison's own verdict). */
  readonly pass: boolean;
}

/** The one table of a corner's circuit comparison. */
export function circuitConfirmTable(corner: string, circuit: CircuitComparison, simulator: string): CircuitConfirmTable {
  return {
    corner,
    title: `Circuit against ${simulator} at ${corner}`,
    note: circuitRunText(circuit, simulator),
    head: ['figure', 'model', simulator, 'difference', 'tolerance', 'verdict'],
    rows: circuit.figures.map((f) => {
      const [, ...cells] = circuitFigureCells(corner, f);
      return { cells: [...cells, circuitFigureTolerance(f), circuitFigureVerdict(f)], fail: !f.pass, figure: f };
    }),
    pass: circuit.pass,
  };
}

/** A table per corner whose comparison carries the circuit, in the order the corners were confirmed. */
export function circuitConfirmTables(comparisons: readonly CornerComparison[], simulator: string): CircuitConfirmTable[] {
  return comparisons.flatMap((c) => (c.circuit ? [circuitConfirmTable(c.corner, c.circuit, simulator)] : []));
}
