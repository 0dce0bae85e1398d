/**
 * The steady state with each switch's on-resistance set by the overdrive it has at the node
 * voltages it connects: solve the periodic steady state, evaluate every conducting switch per
 * interval with its device sources at their worse end over the interval (an n device's source is
 * its lower terminal, taken at its highest; a p device's the higher, taken at its lowest), a
 * switch without overdrive there conducting only its leak, and solve again until the
 * conductances agree. Switches with gate charge (injection.ts) have their thresholds taken
 * at the source voltages of the traced steady state in the same rounds. A steady state that is not found or does not converge is 'none': its
 * figures are not trusted.
 */
import { edgeSources, hasGateCharge, sourcesAgree } from './injection.js';
import type { CircuitModel } from './model.js';
import { PeriodSolver, type SteadyState } from './period-solver.js';
import { tracePeriod, type PeriodTrace } from './trace.js';

/** Most rounds of solving the steady state and re-evaluating the switches. */
export const DRIVE_ROUNDS = 8;
/** Relative change of every on-conductance within which two rounds agree. */
export const DRIVE_TOLERANCE = 1e-3;
/**
 * Most periods run when the steady state is not found directly: a pump whose switches cannot
 * deliver its load has none (its output keeps falling), and its figures are those of the last.
 */
export const DRIVEN_PERIODS = 200;

export interface Solved {
  readonly state: SteadyState;
  readonly trace: PeriodTrace;
  readonly solver: PeriodSolver;
  /** Rounds of conductance evaluation (1 when every switch has a fixed conductance). */
  readonly rounds: number;
}

export function hasDrive(model: CircuitModel): boolean {
  return model.switches.some((s) => s.onConductance !== undefined);
}

/** On-conductance of each switch in each interval along a traced period, S. */
export function intervalConductances(solver: PeriodSolver, trace: PeriodTrace): Float64Array[] {
  const { model, n } = solver;
  const count = model.switches.length;
  const nSource = model.intervals.map(() => new Float64Array(count).fill(-Infinity));
  const pSource = model.intervals.map(() => new Float64Array(count).fill(Infinity));
  const voltage = (row: number, j: number) => (j < n ? trace.voltages[row * n + j]! : model.rails[j - n]!);
  for (let k = 0; k < solver.substeps; k++) {
    if (solver.edges[k]) continue;
    const i = solver.substepInterval[k]!;
    const on = model.intervals[i]!.on;
    for (let s = 0; s < count; s++) {
      const sw = model.switches[s]!;
      if (on[s] !== 1 || !sw.onConductance) continue;
      for (let row = k; row <= k + 1; row++) {
        const a = voltage(row, sw.a);
        const b = voltage(row, sw.b);
        nSource[i]![s] = Math.max(nSource[i]![s]!, Math.min(a, b));
        pSource[i]![s] = Math.min(pSource[i]![s]!, Math.max(a, b));
      }
    }
  }
  return model.intervals.map((iv, i) =>
    Float64Array.from(model.switches, (sw, s) => {
      const lo = nSource[i]![s]!;
      if (sw.onConductance && iv.on[s] === 1 && Number.isFinite(lo)) return sw.onConductance(lo, pSource[i]![s]!);
      return iv.g ? iv.g[s]! : sw.gOn;
    }),
  );
}

function agree(model: CircuitModel, g: readonly Float64Array[]): boolean {
  return model.intervals.every((iv, i) =>
    iv.on.every((on, s) => {
      if (on !== 1) return true;
      const before = iv.g ? iv.g[s]! : model.switches[s]!.gOn;
      const after = g[i]![s]!;
      if (before === 0 || after === 0) return before === after;
      return Math.abs(after - before) <= DRIVE_TOLERANCE * Math.max(before, after);
    }),
  );
}

/** The model with each switch's conductance fixed where it stands (per interval, if evaluated): nothing is re-evaluated. */
export function fixedConductances(model: CircuitModel): CircuitModel {
  return { ...model, switches: model.switches.map((s) => ({ name: s.name, a: s.a, b: s.b, gOn: s.gOn, gOff: s.gOff })) };
}

function withConductances(model: CircuitModel, g: readonly Float64Array[]): CircuitModel {
  return { ...model, intervals: model.intervals.map((iv, i) => ({ duration: iv.duration, on: iv.on, g: g[i]! })) };
}

/** `near`: a steady state of the same network with other element values, tried first (period-solver.ts). */
export function solveDriven(model: CircuitModel, near?: Pick<SteadyState, 'x0' | 'segments'>): Solved {
  const driven = hasDrive(model);
  const charged = hasGateCharge(model);
  const options = { ...(driven ? { maxPeriods: DRIVEN_PERIODS } : {}), near };
  let current = model;
  for (let round = 1; ; round++) {
    const solver = new PeriodSolver(current);
    const state = solver.steadyState(options);
    const trace = tracePeriod(solver, state.x0, state.segments);
    if ((!driven && !charged) || state.method === 'none') return { state, trace, solver, rounds: round };
    const g = driven ? intervalConductances(solver, trace) : null;
    const sources = charged ? edgeSources(solver, trace.voltages) : null;
    const settled = (!g || agree(current, g)) && (!sources || sourcesAgree(current, sources));
    if (settled) return { state, trace, solver, rounds: round };
    if (round === DRIVE_ROUNDS) return { state: { ...state, method: 'none' }, trace, solver, rounds: round };
    if (g) current = withConductances(current, g);
    if (sources) current = { ...current, chargeSources: sources };
  }
}
