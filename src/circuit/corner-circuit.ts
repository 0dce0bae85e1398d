/**
 * Everything the circuit needs per corner, prepared once per design: the network, then at each
 * corner the model from that corner's conduction instants, its figures and the output at the
 * lighter end of a load range.
 */
import type { CycleIndex } from '../measure/phases.js';
import type { CornerDevices } from '../process/device.js';
import type { Design } from '../schema/design.js';
import { levelAt } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchConduction } from '../switches/conduction.js';
import { switchGateCapacitance, type SwitchPlan } from '../switches/plan.js';
import { cornerModel, type SwitchDrive } from './corner-model.js';
import { circuitFigures, loadSign, solve, withLoad, type CircuitFigures, type FigureScope } from './figures.js';
import { buildNetwork, type CircuitNetwork } from './network.js';

export interface CornerCircuit extends CircuitFigures {
  /** Mean output at the lighter end of the load range, V (a positive output's maximum and a negative one's minimum are checked there). */
  readonly lightOutput: number;
  /** Names of the circuit nodes, for the waveforms in trace.voltages. */
  readonly nodes: readonly string[];
  /** Start of the traced period, s (absolute, as the conduction instants). */
  readonly start: number;
}

/**
 * Energy the clock generator's nets and the switch gates behind level shifters draw per period,
 * J: C V^2 per net that swings the supply (each charged once from it), C (high - low) high per
 * shifted gate (charged from the shifter's high level).
 */
export function generatorEnergy(netLoads: ArrayLike<number>, plans: readonly SwitchPlan[], card: ProcessCard, vdd: number): number {
  let energy = 0;
  for (let i = 0; i < netLoads.length; i++) energy += netLoads[i]! * vdd * vdd;
  for (const plan of plans) {
    const ls = plan.levelShifter;
    if (!ls) continue;
    const high = levelAt(ls.high, vdd);
    const low = levelAt(ls.low, vdd);
    for (const d of plan.devices) energy += switchGateCapacitance(card, d.kind, d.w, d.l) * Math.abs(high - low) * Math.abs(high);
  }
  return energy;
}

export class CircuitEvaluator {
  readonly network: CircuitNetwork;
  /**
   * The output's sign found for the first call in scope 'checked' and kept for the rest: an
   * evaluator in that scope serves the Monte Carlo dies of one corner, whose mismatch cannot turn
   * a pump's output around; it saves a 20-period run per die.
   */
  private checkedSign: 1 | -1 | undefined;

  constructor(
    design: Design,
    private readonly plans: readonly SwitchPlan[],
    private readonly card: ProcessCard,
    private readonly netLoads: ArrayLike<number>,
    private readonly period: number,
  ) {
    this.network = buildNetwork(design, plans, card);
  }

  /**
   * `drive` sets the switches' on-resistance (the devices R_on is calibrated on, mismatch); by
   * default `devices`. `scope` 'checked' leaves out the figures no requirement is checked on.
   */
  evaluate(
    conduction: readonly SwitchConduction[],
    cycles: CycleIndex,
    devices: CornerDevices,
    drive: SwitchDrive = { devices },
    scope: FigureScope = 'all',
  ): CornerCircuit {
    const net = this.network;
    const model = cornerModel(net, this.plans, conduction, cycles, devices, this.period, drive);
    if (scope === 'checked' && this.checkedSign === undefined) this.checkedSign = loadSign(model, net.load);
    const figures = circuitFigures(
      model,
      net.load,
      generatorEnergy(this.netLoads, this.plans, this.card, devices.vdd),
      net.spec.startupCycles,
      scope === 'checked' ? { scope, sign: this.checkedSign } : { scope },
    );
    const sameLoad = net.lightLoad.current === net.load.current && net.lightLoad.conductance === net.load.conductance;
    const sign = figures.output < 0 ? -1 : 1;
    const bound = sign > 0 ? net.spec.requirements.output?.max : net.spec.requirements.output?.min;
    const needLight = !sameLoad && bound !== undefined;
    const lightOutput = needLight ? solve(withLoad(model, net.lightLoad, sign)).trace.outputMean : figures.output;
    return { ...figures, lightOutput, nodes: net.nodes, start: model.start };
  }
}
