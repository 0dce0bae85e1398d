/**
 * Start-up from all capacitors discharged (every circuit node at 0 V, the rails at their
 * levels): the periods until the output, sampled at the period start, has covered 90 % of the way
 * to its steady-state value there.
 */
import { pwlCount } from './branches.js';
import type { PeriodSolver } from './period-solver.js';

export const STARTUP_FRACTION = 0.9;

export interface Startup {
  /** Periods to reach 90 % of the final output; null when not reached within the limit. */
  readonly cycles: number | null;
  /** The limit that was used. */
  readonly limit: number;
}

/**
 * With `steadySegments` all off (no diode or channel conducts in the steady state), the start-up
 * runs on the period's affine map with every part off, one matrix-vector product per period: a
 * part that conducts only during the start-up transient is then not seen.
 */
export function startup(solver: PeriodSolver, final: Float64Array, limit: number, steadySegments: readonly Uint8Array[] = []): Startup {
  const out = solver.model.output;
  const target = final[out]!;
  if (!(Math.abs(target) > 0)) return { cycles: 0, limit };
  const x = new Float64Array(solver.n);
  const reached = () => x[out]! / target >= STARTUP_FRACTION;
  const linear = pwlCount(solver.model) === 0 || steadySegments.every((s) => s.every((v) => v === 0));
  if (linear) {
    const { P, p } = solver.periodMap(Array.from({ length: solver.substeps }, () => new Uint8Array(pwlCount(solver.model))));
    const n = solver.n;
    const y = new Float64Array(n);
    for (let cycle = 1; cycle <= limit; cycle++) {
      for (let i = 0; i < n; i++) {
        let sum = p[i]!;
        for (let j = 0; j < n; j++) sum += P[i * n + j]! * x[j]!;
        y[i] = sum;
      }
      x.set(y);
      if (reached()) return { cycles: cycle, limit };
    }
    return { cycles: null, limit };
  }
  const segments = Array.from({ length: solver.substeps }, () => new Uint8Array(pwlCount(solver.model)));
  for (let cycle = 1; cycle <= limit; cycle++) {
    solver.runPeriod(x, segments);
    if (reached()) return { cycles: cycle, limit };
  }
  return { cycles: null, limit };
}
