/**
 * The figures a designer reads per corner: mean output and ripple, output impedance with its
 * slow- and fast-switching asymptotes, efficiency, charge lost per period and start-up.
 * The asymptotes follow the charge-flow view (M. D. Seeman, S. R. Sanders, Analysis and
 * optimization of switched-capacitor DC-DC converters, IEEE Trans. Power Electronics 23(2),
 * 2008): R_SSL is the output impedance with ideal switches (every on-resistance shrunk by
 * ASYMPTOTE: 1000), R_FSL the one with every capacitor grown by ASYMPTOTE. Each is found by solving
 * the same network, so it holds for any topology the design describes.
 */
import type { CircuitModel } from './model.js';
import { periodOf } from './model.js';
import { pwlCount } from './branches.js';
import { fixedConductances, solveDriven, type Solved } from './overdrive.js';
import { PeriodSolver, type SteadyState } from './period-solver.js';
import { startup } from './startup.js';
import type { PeriodTrace } from './trace.js';

const ASYMPTOTE = 1e3;

export interface CircuitLoad {
  /** Magnitude of the load current, A: it flows from the output to ground for a positive output. */
  readonly current: number;
  /** Load conductance to ground, S. */
  readonly conductance: number;
}

export interface CircuitFigures {
  readonly method: SteadyState['method'];
  /** Mean output, V. */
  readonly output: number;
  /** Peak-to-peak output ripple, V. */
  readonly ripple: number;
  /** Mean output extrapolated to no load along the output impedance, V. */
  readonly noLoadOutput: number;
  /** Mean current the load takes (signed like the output), A. */
  readonly loadCurrent: number;
  /** Output impedance at the load (from the load and half of it), ohm; null without a load. */
  readonly outputResistance: number | null;
  readonly slowLimit: number | null;
  readonly fastLimit: number | null;
  /** Powers, W: drawn from the rails, taken by the load, spent by the clock generator and switch gates. */
  readonly inputPower: number;
  readonly outputPower: number;
  readonly generatorPower: number;
  /** outputPower / (inputPower + generatorPower); null when nothing is drawn. */
  readonly efficiency: number | null;
  /** Charge lost per period, C: reverse conduction plus shoot-through. */
  readonly lostCharge: number;
  readonly reverseCharge: number;
  readonly shootThroughCharge: number;
  /** Periods and time from all capacitors discharged to 90 % of the final output; null if not reached. */
  readonly startupCycles: number | null;
  readonly startupTime: number | null;
  readonly startupLimit: number;
  /** The steady period, for waveforms. */
  readonly trace: PeriodTrace;
}

export function withLoad(model: CircuitModel, load: CircuitLoad, sign: number): CircuitModel {
  return { ...model, loadCurrent: sign * load.current, loadConductance: load.conductance };
}

/** The model with every on-conductance multiplied by k (k large: ideal switches, fixed at k gOn whatever their overdrive). */
export function scaleConductance(model: CircuitModel, k: number): CircuitModel {
  return {
    ...model,
    switches: model.switches.map((s) => ({ name: s.name, a: s.a, b: s.b, gOn: s.gOn * k, gOff: s.gOff })),
    intervals: model.intervals.map((iv) => (iv.g ? { ...iv, g: iv.g.map((g) => g * k) } : iv)),
    channels: model.channels.map((c) => ({ ...c, g: c.g * k })),
    diodes: model.diodes.map((d) => ({ ...d, gOn: d.gOn * k })),
  };
}

/** The model with every capacitance multiplied by k. */
export function scaleCapacitance(model: CircuitModel, k: number): CircuitModel {
  return { ...model, inverseCapacitance: model.inverseCapacitance.map((x) => x / k) };
}

export type { Solved };

/** The steady state, each switch's on-resistance following its overdrive where the model gives it (overdrive.ts). */
export function solve(model: CircuitModel, near?: SteadyState): Solved {
  return solveDriven(model, near);
}

/**
 * Output impedance of a model, ohm: the change of mean output between the load and half of it,
 * over the change of load current (a no-load solve of a diode pump has no unique steady state:
 * its diodes rest exactly at their drop). Also the output extrapolated to no load, V.
 */
function impedance(
  model: CircuitModel,
  load: CircuitLoad,
  sign: number,
  full?: PeriodTrace,
  near?: SteadyState,
): { r: number | null; open: number } {
  const period = periodOf(model);
  const heavy = full ?? solve(withLoad(model, load, sign), near).trace;
  const light = solve(withLoad(model, { current: load.current / 2, conductance: load.conductance / 2 }, sign), near).trace;
  const di = (heavy.loadCharge - light.loadCharge) / period;
  if (di === 0) return { r: null, open: heavy.outputMean };
  const r = (light.outputMean - heavy.outputMean) / di;
  return { r, open: heavy.outputMean + r * (heavy.loadCharge / period) };
}

/** Periods run from rest to tell a positive output from a negative one. */
const SIGN_PERIODS = 20;

/**
 * The sign of the output, from a few periods run from rest without the load's current: the
 * load's current flows towards ground from a positive output and out of ground into a negative
 * one. (A steady-state solve without the current has no unique answer for a diode pump, whose
 * diodes then rest exactly at their drop, and falls back to running hundreds of periods.)
 */
export function outputSign(model: CircuitModel): 1 | -1 {
  const solver = new PeriodSolver(model);
  const x = new Float64Array(solver.n);
  const segments = Array.from({ length: solver.substeps }, () => new Uint8Array(pwlCount(model)));
  for (let period = 0; period < SIGN_PERIODS; period++) solver.runPeriod(x, segments);
  return x[model.output]! < 0 ? -1 : 1;
}

/**
 * Which figures to compute: 'all', or only those a requirement can be checked on ('checked': the
 * output, ripple, efficiency and lost charge; the impedance and its asymptotes, which take five
 * more solves, and the start-up run are left null). Monte Carlo dies need only the checked ones.
 */
export type FigureScope = 'all' | 'checked';

export interface FigureOptions {
  readonly scope: FigureScope;
  /** The output's sign when already known (`loadSign` of a model of the same circuit at the same corner). */
  readonly sign?: 1 | -1;
}

/** The sign the load's current takes: that of the output, found without the current (1 without a load). */
export function loadSign(model: CircuitModel, load: CircuitLoad): 1 | -1 {
  const hasLoad = load.current !== 0 || load.conductance !== 0;
  return hasLoad ? outputSign(withLoad(model, { current: 0, conductance: load.conductance }, 1)) : 1;
}

/**
 * `model` carries no load; `generatorEnergy` is what the clock generator and the switch gates
 * draw per period, J.
 */
export function circuitFigures(
  model: CircuitModel,
  load: CircuitLoad,
  generatorEnergy: number,
  startupLimit: number,
  options: FigureOptions = { scope: 'all' },
): CircuitFigures {
  const period = periodOf(model);
  const hasLoad = load.current !== 0 || load.conductance !== 0;
  const sign = options.sign ?? loadSign(model, load);
  const loaded = solve(withLoad(model, load, sign));
  const t = loaded.trace;
  const loadCurrent = t.loadCharge / period;
  const all = options.scope === 'all';
  const own = hasLoad && all ? impedance(model, load, sign, t) : { r: null, open: t.outputMean };
  let inputEnergy = 0;
  for (let k = 0; k < model.rails.length; k++) inputEnergy += model.rails[k]! * t.railCharge[k]!;
  const inputPower = inputEnergy / period;
  const outputPower = t.loadEnergy / period;
  const generatorPower = generatorEnergy / period;
  const drawn = inputPower + generatorPower;
  // Without a steady state there is nothing to start up to.
  const up =
    loaded.state.method === 'none' || !all
      ? { cycles: null }
      : startup(loaded.solver, loaded.state.x0, startupLimit, loaded.state.segments);
  return {
    method: loaded.state.method,
    output: t.outputMean,
    ripple: t.outputMax - t.outputMin,
    noLoadOutput: own.open,
    loadCurrent,
    outputResistance: own.r,
    slowLimit: hasLoad && all ? impedance(scaleConductance(model, ASYMPTOTE), load, sign).r : null,
    // The fast-switching limit keeps the switches' resistance of the real steady state (none
    // without one): grown capacitors (bottom plates too) move the node voltages the overdrive would be evaluated at.
    fastLimit:
      hasLoad && all && loaded.state.method !== 'none'
        ? impedance(scaleCapacitance(fixedConductances(loaded.solver.model), ASYMPTOTE), load, sign, undefined, loaded.state).r
        : null,
    inputPower,
    outputPower,
    generatorPower,
    efficiency: drawn > 0 ? outputPower / drawn : null,
    lostCharge: t.reverseCharge + t.shootThroughCharge,
    reverseCharge: t.reverseCharge,
    shootThroughCharge: t.shootThroughCharge,
    startupCycles: up.cycles,
    startupTime: up.cycles === null ? null : up.cycles * period,
    startupLimit,
    trace: t,
  };
}
