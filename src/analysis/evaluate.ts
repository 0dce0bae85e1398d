/** One corner, end to end: devices -> gate timing -> event simulation -> measurements -> checks. */
import type { Corner } from '../process/corner.js';
import { devicesAtCorner } from '../process/device.js';
import type { Mismatch } from '../delay/model.js';
import { Simulator, type SimulationResult } from '../sim/engine.js';
import { CycleIndex, measurePhases, type MeasurementFailure, type PhaseMeasurement } from '../measure/phases.js';
import { requirementChecks } from '../checks/requirements.js';
import type { Check } from '../checks/check.js';
import { switchChecks } from '../checks/switch-checks.js';
import { switchConduction, type SwitchConduction } from '../switches/conduction.js';
import type { ResolvedDesign } from './resolve.js';

export interface CornerResult {
  readonly corner: Corner;
  readonly simulation: SimulationResult;
  readonly measurement: PhaseMeasurement | MeasurementFailure;
  /** Conduction of every switch in the reported period (empty if the run did not settle). */
  readonly switches: readonly SwitchConduction[];
  readonly checks: readonly Check[];
  readonly pass: boolean;
}

export function evaluateCorner(resolved: ResolvedDesign, corner: Corner, simulator: Simulator, mismatch?: Mismatch): CornerResult {
  const { design, netlist, loads, model, card } = resolved;
  const devices = devicesAtCorner(card, corner);
  const timing = model.bind(netlist, loads, devices, mismatch);
  const period = 1 / design.clock.frequency;
  const simulation = simulator.run(timing, { period, duty: corner.duty, transition: design.clock.transition });
  const cycles = new CycleIndex(simulation, netlist);
  const measurement = measurePhases(simulation, netlist, cycles);
  const checks = requirementChecks(measurement, design.requirements, { period, dutyTolerance: design.clock.dutyTolerance }, resolved.labels);
  const switches = measurement.ok ? resolved.switches.map((plan) => switchConduction(plan, cycles, devices)) : [];
  if (measurement.ok) {
    const byName = new Map(switches.map((s) => [s.name, s]));
    checks.push(...switchChecks(design.constraints, design.requirements.guard, byName, period, design.clock.dutyTolerance * period));
  }
  return { corner, simulation, measurement, switches, checks, pass: checks.every((c) => c.pass) };
}

export function evaluateAll(resolved: ResolvedDesign): CornerResult[] {
  const simulator = new Simulator(resolved.netlist);
  return resolved.corners.map(({ corner }) => evaluateCorner(resolved, corner, simulator));
}

export interface Limiting {
  readonly corner: string;
  readonly check: string;
  readonly kind: string;
  /** Margin, s; null when the limiting check is a run that did not settle. */
  readonly margin: number | null;
}

/** The check with the least margin over all corners; an unmeasurable check beats any margin. */
export function limitingCheck(results: readonly CornerResult[]): Limiting | null {
  let best: Limiting | null = null;
  for (const r of results) {
    for (const c of r.checks) {
      const worse = best === null
        || (c.margin === null && best.margin !== null)
        || (c.margin !== null && best.margin !== null && c.margin < best.margin);
      if (worse) best = { corner: r.corner.name, check: c.name, kind: c.kind, margin: c.margin };
    }
  }
  return best;
}
