/** One corner, end to end: devices -> gate timing -> event simulation -> measurements -> checks. */
import type { Corner } from '../process/corner.js';
import { devicesAtCorner, type CornerDevices } from '../process/device.js';
import { ronCalibration } from '../switches/tabulated-ron.js';
import type { GateTiming } from '../delay/model.js';
import type { SampleMismatch } from '../variation/mismatch.js';
import { Simulator, type SimulationResult } from '../sim/engine.js';
import { CycleIndex, measurePhases, type MeasurementFailure, type PhaseMeasurement } from '../measure/phases.js';
import { modelEdgeShape } from '../measure/levels.js';
import { requirementChecks } from '../checks/requirements.js';
import { compareChecks, type Check } from '../checks/check.js';
import { appendSwitchChecks, type SwitchCheckSetup } from '../checks/switch-checks.js';
import { BiasChecker } from '../checks/bias-frame.js';
import { switchConduction, type SwitchConduction } from '../switches/conduction.js';
import type { ResolvedDesign } from './resolve.js';
import { shifterSizes, type ShifterSizes } from './shifter-sizes.js';
import { instantBand } from '../switches/instant-band.js';
import { gapBand } from '../delay/error-band.js';
import { CircuitEvaluator, type CornerCircuit, type FigureChoice } from '../circuit/corner-circuit.js';
import { figureErrorFor, type FigureError } from '../circuit/figure-error.js';
import { circuitCheckNames, circuitChecks, type CircuitCheckNames } from '../checks/circuit-checks.js';

export interface CornerResult {
  readonly corner: Corner;
  readonly simulation: SimulationResult;
  readonly measurement: PhaseMeasurement | MeasurementFailure;
  /** Conduction of every switch in the reported period (empty if the run did not settle). */
  readonly switches: readonly SwitchConduction[];
  readonly checks: readonly Check[];
  readonly pass: boolean;
  /** The circuit's figures at this corner, when the design has a circuit section and the run settled. */
  readonly circuit?: CornerCircuit;
}

/** How an evaluator reuses its work between calls; `new CornerEvaluator(resolved)` reuses nothing a result holds. */
export interface EvaluatorReuse {
  /**
   * Hand out the scratch itself (simulation buffers, cycle index, timing table) instead of fresh
   * copies: a result is valid only until the next call. The fast path of tight loops.
   */
  readonly borrowScratch: boolean;
  /**
   * Start each simulation from the previous one's steady state: for many runs of one corner with
   * small changes (Monte Carlo dies), never across corners. A warm evaluator also replays the
   * previous steady period where that provably gives the simulation's answer, and with checked
   * circuit figures keeps the output's sign found for its first call.
   */
  readonly warmStart: boolean;
  /**
   * How much of the circuit the switches serve (when the design has one) to solve: every figure
   * (the default), only the figures its requirements are checked on, or none (timing and switch
   * checks only). A solve costs milliseconds per corner.
   */
  readonly circuit?: 'all-figures' | 'checked-figures' | 'none';
}

/** What a Monte Carlo die is checked against. */
export interface DieChecks {
  /** The circuit's requirements too (output, ripple, efficiency, lost charge), not only timing and switches. */
  readonly circuit: boolean;
}

/**
 * Evaluates corners one after another with reused scratch (simulator, cycle index, timing
 * table). With `borrowScratch`, the result's simulation buffers stay the evaluator's: read it
 * before the next call.
 */
export class CornerEvaluator {
  /** Results valid until the next call: for loops that read each result at once (fmax probes). */
  static borrowingScratch(resolved: ResolvedDesign): CornerEvaluator {
    return new CornerEvaluator(resolved, { borrowScratch: true, warmStart: false });
  }

  /**
   * Borrowed scratch and only the circuit figures a requirement is checked on: for searches that
   * read each result's checks at once, corner after corner (fmax probes).
   */
  static forProbes(resolved: ResolvedDesign): CornerEvaluator {
    return new CornerEvaluator(resolved, { borrowScratch: true, warmStart: false, circuit: 'checked-figures' });
  }

  /** Borrowed scratch and warm starts: for the dies of one corner (Monte Carlo). */
  static forDies(resolved: ResolvedDesign, checks: DieChecks): CornerEvaluator {
    return new CornerEvaluator(resolved, { borrowScratch: true, warmStart: true, circuit: checks.circuit ? 'checked-figures' : 'none' });
  }

  private readonly simulator: Simulator;
  private cycles: CycleIndex | null = null;
  private timing: GateTiming | undefined;

  private readonly borrow: boolean;

  constructor(
    private readonly resolved: ResolvedDesign,
    reuse: EvaluatorReuse = { borrowScratch: false, warmStart: false },
  ) {
    const borrow = reuse.borrowScratch;
    const warm = reuse.warmStart;
    this.borrow = borrow;
    this.simulator = new Simulator(resolved.netlist);
    const { clock } = resolved.design;
    this.period = 1 / clock.frequency;
    this.widthContext = { period: this.period, dutyTolerance: clock.dutyTolerance };
    this.runOptions = { borrow, warm, replay: warm };
    this.switchByName = (name: string) => this.current[resolved.switchIndex.get(name)!]!;
    this.switchSetup = {
      constraints: resolved.design.constraints,
      defaultGuard: resolved.design.requirements.guard,
      period: this.period,
      windowDerating: clock.dutyTolerance * this.period,
      names: resolved.switchCheckNames,
      subjects: resolved.switchCheckLabels.subjects,
      instantBand: instantBand(resolved.model.name, resolved.card.name),
    };
    this.bias = new BiasChecker(resolved.switches, resolved.bias, resolved.biasNames);
    this.gapBand = gapBand(resolved.model.name, resolved.card.name);
    this.figureError = figureErrorFor(resolved.card.name);
    this.shifters = resolved.switches.some((plan) => plan.levelShifter) ? shifterSizes(resolved) : null;
    this.ronCalibration = resolved.model.ron && resolved.model.ron.length > 0 ? ronCalibration(resolved.model.ron) : undefined;
    const spec = reuse.circuit === 'none' ? undefined : resolved.design.circuit;
    this.circuitFigures = { scope: reuse.circuit === 'checked-figures' ? 'checked' : 'all', sameCorner: warm };
    this.circuit = spec
      ? new CircuitEvaluator(resolved.design, resolved.switches, resolved.card, resolved.loads, this.period, resolved.netlist)
      : null;
    this.circuitNames = spec ? circuitCheckNames(spec.requirements, spec.output) : null;
  }

  /** The circuit the switches serve, prepared once; null without a circuit section. */
  private readonly circuit: CircuitEvaluator | null;
  private readonly circuitNames: CircuitCheckNames | null;
  private readonly circuitFigures: FigureChoice;

  /** The switch bias checks, prepared once per corner. */
  private readonly bias: BiasChecker;
  /** The model's measured clean-gap band on this card, fraction of the dead time. */
  private readonly gapBand: number;
  /** The card's measured circuit-figure error, taken off the circuit checks' margins. */
  private readonly figureError: FigureError;

  /** Clock period, s, and the per-run settings, made once. */
  private readonly period: number;
  private readonly widthContext: { readonly period: number; readonly dutyTolerance: number };
  private readonly runOptions: { readonly borrow: boolean; readonly warm: boolean; readonly replay: boolean };
  /** Switch conduction of the evaluation in progress, looked up by name for the constraints. */
  private current: readonly SwitchConduction[] = [];
  private readonly switchByName: (name: string) => SwitchConduction;
  private readonly switchSetup: SwitchCheckSetup;
  /** Sizes of the switches' level shifters (null: the design has none). */
  private readonly shifters: ShifterSizes | null;
  /** Switch devices with k' calibrated by the model's characterized R_on, when it has any. */
  private readonly ronCalibration: ((devices: CornerDevices) => CornerDevices) | undefined;

  evaluate(corner: Corner, mismatch?: SampleMismatch, devices = devicesAtCorner(this.resolved.card, corner)): CornerResult {
    const { design, netlist, loads, model } = this.resolved;
    const timing = model.bind(netlist, loads, devices, mismatch, this.borrow ? this.timing : undefined);
    if (this.borrow) this.timing = timing;
    const period = this.period;
    const simulation = this.simulator.run(timing, { period, duty: corner.duty, transition: design.clock.transition }, this.runOptions);
    const cycles = this.borrow && this.cycles ? this.cycles.reset(simulation) : new CycleIndex(simulation, netlist);
    if (this.borrow) this.cycles = cycles;
    const measurement = measurePhases(simulation, netlist, cycles, { level: design.requirements.gap?.level, timing, band: this.gapBand });
    const checks = requirementChecks(measurement, design.requirements, this.widthContext, this.resolved.labels);
    const switches: SwitchConduction[] = [];
    let circuit: CornerCircuit | undefined;
    if (measurement.ok) {
      const plans = this.resolved.switches;
      const switchDevices = this.ronCalibration ? this.ronCalibration(devices) : devices;
      const shape = modelEdgeShape(cycles, netlist, timing);
      for (let k = 0; k < plans.length; k++)
        switches.push(
          switchConduction(plans[k]!, cycles, switchDevices, mismatch?.switches[k], mismatch?.shifters?.[k], this.shifters?.[k], shape),
        );
      this.current = switches;
      appendSwitchChecks(this.switchSetup, this.switchByName, checks);
      if (this.circuit) {
        circuit = this.circuit.evaluate(
          switches,
          cycles,
          devices,
          {
            devices: switchDevices,
            dvth: mismatch?.switches,
            shifterSizes: this.shifters ?? undefined,
            shifterDvth: mismatch?.shifters,
            shape,
          },
          this.circuitFigures,
        );
        circuitChecks(circuit, design.circuit!.requirements, this.circuitNames!, devices.vdd, this.figureError, checks);
      }
    }
    // The switch bias checks need no timing: they hold (or not) whether or not the run settled.
    this.bias.run(devices, mismatch?.switches, checks);
    let pass = true;
    for (const c of checks)
      if (!c.pass) {
        pass = false;
        break;
      }
    return circuit
      ? { corner, simulation, measurement, switches, checks, pass, circuit }
      : { corner, simulation, measurement, switches, checks, pass };
  }
}

/** One corner with a fresh evaluator (results own their data). */
export function evaluateCorner(resolved: ResolvedDesign, corner: Corner, mismatch?: SampleMismatch): CornerResult {
  return new CornerEvaluator(resolved).evaluate(corner, mismatch);
}

/** Every corner of the design; `reuse` as for `CornerEvaluator` (by default nothing a result holds is reused). */
export function evaluateAll(resolved: ResolvedDesign, reuse?: EvaluatorReuse): CornerResult[] {
  const evaluator = new CornerEvaluator(resolved, reuse);
  return resolved.corners.map(({ corner }) => evaluator.evaluate(corner));
}

export interface Limiting {
  readonly corner: string;
  readonly check: string;
  readonly kind: string;
  /** Margin, s; null when the limiting check is a run that did not settle. */
  readonly margin: number | null;
}

/**
 * The check with the least margin over all corners; an unmeasurable check beats any margin and a
 * failing voltage check (off-state, on-state, stress) any timing margin (see compareChecks).
 * `start` continues a search over earlier results.
 */
export function limitingCheck(results: readonly CornerResult[], start: Limiting | null = null): Limiting | null {
  let best: Limiting | null = start;
  let bestCheck: Pick<Check, 'kind' | 'margin' | 'pass'> | null = start
    ? { kind: start.kind as Check['kind'], margin: start.margin, pass: start.margin !== null && start.margin >= 0 }
    : null;
  for (const r of results) {
    for (const c of r.checks) {
      if (bestCheck === null || compareChecks(c, bestCheck) < 0) {
        best = { corner: r.corner.name, check: c.name, kind: c.kind, margin: c.margin };
        bestCheck = c;
      }
    }
  }
  return best;
}
