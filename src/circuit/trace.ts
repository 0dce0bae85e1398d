/**
 * One period of the steady state traced substep by substep: node voltages at every substep
 * boundary, the output's mean and extremes, the charge each rail delivers, and the charge lost
 * to reverse conduction (off devices conducting backwards, diodes in reverse) and to
 * shoot-through (both switches of a break-before-make pair conducting in the same substep).
 */
import { branchCharge, CHANNEL, DIODE, LOAD, SWITCH } from './branches.js';
import type { PeriodSolver } from './period-solver.js';

export interface PeriodTrace {
  /** Substep boundaries from the period start, s. */
  readonly times: Float64Array;
  /** Circuit node voltages at each boundary, row per boundary, V. */
  readonly voltages: Float64Array;
  /** Mean, least and greatest output, V (the extremes over the substep boundaries). */
  readonly outputMean: number;
  readonly outputMin: number;
  readonly outputMax: number;
  /** Charge each rail delivers into the circuit per period, C. */
  readonly railCharge: Float64Array;
  /** Charge the load takes from the output per period (towards ground), C. */
  readonly loadCharge: number;
  /** Energy the load takes per period, J. */
  readonly loadEnergy: number;
  /** Charge per period through off devices conducting backwards and diodes in reverse, C. */
  readonly reverseCharge: number;
  /** Charge per period through break-before-make pairs while both conduct, C. */
  readonly shootThroughCharge: number;
}

export function tracePeriod(solver: PeriodSolver, x0: Float64Array, segments: readonly Uint8Array[]): PeriodTrace {
  const { model, n } = solver;
  const count = solver.substeps;
  const times = new Float64Array(count + 1);
  const voltages = new Float64Array((count + 1) * n);
  const railCharge = new Float64Array(model.rails.length);
  const integrals = new Float64Array(n);
  const switchCharge = new Float64Array(model.switches.length);
  const x = Float64Array.from(x0);
  voltages.set(x, 0);
  const out = model.output;
  let outMin = x[out]!;
  let outMax = x[out]!;
  let outIntegral = 0;
  let loadCharge = 0;
  let loadEnergy = 0;
  let reverse = 0;
  let shoot = 0;
  for (let k = 0; k < count; k++) {
    const m = solver.map(k, segments[k]!);
    for (let i = 0; i < n; i++) {
      let sum = m.f[i]!;
      for (let j = 0; j < n; j++) sum += m.F[i * n + j]! * x[j]!;
      integrals[i] = sum;
    }
    const vStart = x[out]!;
    switchCharge.fill(0);
    for (const b of m.branches) {
      const q = branchCharge(model, b, integrals, m.h);
      if (b.f >= n) railCharge[b.f - n]! += q;
      if (b.t >= n) railCharge[b.t - n]! -= q;
      if (b.tag === CHANNEL) reverse += Math.abs(q);
      else if (b.tag === DIODE && b.segment === 0 && q < 0) reverse -= q;
      else if (b.tag === SWITCH) switchCharge[b.part] = Math.abs(q);
      else if (b.tag === LOAD) loadCharge += q;
    }
    const on = model.intervals[solver.substepInterval[k]!]!.on;
    for (const [a, b] of model.pairs) if (on[a] === 1 && on[b] === 1) shoot += Math.min(switchCharge[a]!, switchCharge[b]!);
    solver.step(m, x);
    outIntegral += integrals[out]!;
    // A current load's energy is exact; a resistive load's uses the trapezoid of V^2 over the substep.
    const vEnd = x[out]!;
    loadEnergy += model.loadCurrent * integrals[out]! + ((model.loadConductance * (vStart * vStart + vEnd * vEnd)) / 2) * m.h;
    times[k + 1] = times[k]! + m.h;
    voltages.set(x, (k + 1) * n);
    if (vEnd < outMin) outMin = vEnd;
    if (vEnd > outMax) outMax = vEnd;
  }
  const period = times[count]!;
  return {
    times,
    voltages,
    outputMean: outIntegral / period,
    outputMin: outMin,
    outputMax: outMax,
    railCharge,
    loadCharge,
    loadEnergy,
    reverseCharge: reverse,
    shootThroughCharge: shoot,
  };
}
