/** The machine report of `phasegap check`: plain data, SI units, a stable shape. */
import type { CornerResult, Limiting } from '../analysis/evaluate.js';
import { limitingCheck } from '../analysis/evaluate.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { CIRCUIT_KINDS, VOLTAGE_KINDS, checkData, type CheckData } from '../checks/check.js';
import { CAUTIONS } from './cautions.js';
import { circuitReport, type CircuitReport } from './circuit-report.js';

export interface DeadTimeReport {
  readonly from: string;
  readonly to: string;
  /** 50 % to 50 % dead time, s. */
  readonly t50: number;
  /** Clean gap at 10 % of swing, s. */
  readonly gap: number;
}

export interface CornerReport {
  readonly name: string;
  readonly process: string;
  /** V */
  readonly vdd: number;
  /** °C */
  readonly temperature: number;
  readonly duty: number;
  /** Empty when the corner could not be measured (see reason). */
  readonly deadTimes: readonly DeadTimeReport[];
  /** Active width per phase (and early phase), s. */
  readonly widths: Readonly<Record<string, number>>;
  /** Time both phases are active together, s. */
  readonly overlap: number | null;
  /** Glitches swallowed by inertial delay in the steady-state period. */
  readonly glitches: ReadonlyArray<{ readonly net: string; readonly time: number }>;
  readonly checks: readonly CheckData[];
  readonly verdict: 'pass' | 'fail';
  /** Why the corner could not be measured, if so. */
  readonly reason?: string;
  /** The circuit's figures, when the design has a circuit section. */
  readonly circuit?: CircuitReport;
}

export interface CheckReport {
  readonly tool: 'phasegap';
  readonly design: string;
  readonly process: string;
  readonly model: string;
  readonly clock: {
    readonly frequency: number;
    readonly period: number;
    readonly duty: number;
    readonly dutyTolerance: number;
    readonly transition: number;
  };
  readonly phases: readonly string[];
  readonly verdict: 'pass' | 'fail';
  readonly limiting: Limiting | null;
  readonly corners: readonly CornerReport[];
  /** What the checks cannot see in this design (e.g. switches whose terminals are undeclared). */
  readonly warnings: readonly string[];
  readonly cautions: readonly string[];
}

/**
 * The least timing margin of a corner's checks, s; null when one could not be measured. Voltage
 * checks (off-state, on-state, stress) are counted only when they fail, as -Infinity: no timing
 * margin outweighs them.
 */
export function leastMargin(corner: CornerReport): number | null {
  let least: number | null = null;
  for (const c of corner.checks) {
    if (c.margin === null) return null;
    if (VOLTAGE_KINDS.has(c.kind) || CIRCUIT_KINDS.has(c.kind)) {
      if (!c.pass) least = -Infinity;
      continue;
    }
    if (least === null || c.margin < least) least = c.margin;
  }
  return least;
}

export function cornerReport(result: CornerResult, netNames: readonly string[]): CornerReport {
  const { corner, measurement: m } = result;
  const base = {
    name: corner.name,
    process: corner.process,
    vdd: corner.vdd,
    temperature: corner.temperature,
    duty: corner.duty,
    glitches: result.simulation.glitches.map((g) => ({ net: netNames[g.net] ?? '?', time: g.time - result.simulation.windowStart })),
    checks: result.checks.map(checkData),
    verdict: result.pass ? ('pass' as const) : ('fail' as const),
  };
  if (!m.ok) return { ...base, deadTimes: [], widths: {}, overlap: null, reason: m.reason };
  return {
    ...base,
    deadTimes: m.deadTimes.map((d) => ({ from: d.from, to: d.to, t50: d.t50, gap: d.gap })),
    widths: m.widths,
    overlap: m.overlap,
    ...(result.circuit ? { circuit: circuitReport(result.circuit) } : {}),
  };
}

export function checkReport(resolved: ResolvedDesign, results: readonly CornerResult[]): CheckReport {
  const { design, card, model, netlist } = resolved;
  const corners = results.map((r) => cornerReport(r, netlist.netNames));
  return {
    tool: 'phasegap',
    design: design.name,
    process: card.name,
    model: model.name,
    clock: {
      frequency: design.clock.frequency,
      period: 1 / design.clock.frequency,
      duty: design.clock.duty,
      dutyTolerance: design.clock.dutyTolerance,
      transition: design.clock.transition,
    },
    phases: netlist.source.phases,
    verdict: corners.every((c) => c.verdict === 'pass') ? 'pass' : 'fail',
    limiting: limitingCheck(results),
    corners,
    warnings: resolved.warnings,
    cautions: CAUTIONS,
  };
}
