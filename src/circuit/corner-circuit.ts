/**
 * Everything the circuit needs per corner, prepared once per design: the network, then at each
 * corner the model from that corner's conduction instants, its figures and the output at the
 * lighter end of a load range.
 */
import { PairCache } from '../pair-cache.js';
import type { CycleIndex } from '../measure/phases.js';
import type { CornerDevices } from '../process/device.js';
import type { Design } from '../schema/design.js';
import type { SwitchConduction } from '../switches/conduction.js';
import { switchGateCapacitance, type SwitchPlan } from '../switches/plan.js';
import { downShifterEnergy, shifterEnergy } from '../switches/shifter-energy.js';
import { sizeDownShifter, type DownShifterSizing } from '../switches/down-shifter-sizing.js';
import { latchShifter, sizeShifter } from '../switches/shifter-sizing.js';
import { levelAt } from '../schema/level.js';
import type { ProcessCard } from '../schema/process.js';
import { cornerModel, type SwitchDrive } from './corner-model.js';
import { circuitFigures, loadSign, solve, withLoad, type CircuitFigures, type FigureScope } from './figures.js';
import { buildNetwork, type CircuitNetwork } from './network.js';
import { generatorGateEnergy, type GateEnergyCache } from './gate-energy.js';
import type { CompiledNetlist } from '../netlist/netlist.js';

type Shifter = NonNullable<SwitchPlan['levelShifter']>;

export interface CornerCircuit extends CircuitFigures {
  /** Mean output at the lighter end of the load range, V (a positive output's maximum and a negative one's minimum are checked there). */
  readonly lightOutput: number;
  /** Names of the circuit nodes, for the waveforms in trace.voltages. */
  readonly nodes: readonly string[];
  /** Start of the traced period, s (absolute, as the conduction instants). */
  readonly start: number;
}

/**
 * Energy the clock generator's nets and the level shifters with the switch gates they drive draw
 * per period, J: C V^2 per net that swings the supply (each charged once from it), with the
 * netlist each gate's short-circuit charge and input-to-output overlap (gate-energy.ts), and per
 * shifted gate its shifter's energy (shifter-energy.ts: internal nodes, latch crowbar, the gate
 * over the shifter's swing), the shifter sized as the deck sizes it (up from the core, or its
 * mirror down to a low level below ground) for its net's ramp here; a shifter the deck cannot
 * build (a low level below ground with a high level above VDD) counts its gate's charge between
 * its two levels, C (high - low)^2.
 */
/** Down-shifter sizings by card, shifter, gate load and input ramp: each takes about 0.3 ms, and every corner and die asks again. */
const downSizings = new PairCache<ProcessCard, Shifter, Map<string, DownShifterSizing>>();

/**
 * The down-shifter's sizing for a ramp rounded to the picosecond (its fits take the ramp with a
 * weight of 0.3 at most: a picosecond moves the sized delay by under 0.3 ps), so the dies of a
 * Monte Carlo run share a handful of sizings.
 */
function downSizing(ls: Shifter, card: ProcessCard, load: number, input: number): DownShifterSizing {
  const sizes = downSizings.get(card, ls, () => new Map());
  const ramp = Math.round(input * 1e12) * 1e-12;
  const key = `${load}|${ramp}`;
  let size = sizes.get(key);
  if (!size) {
    size = sizeDownShifter(ls, card, load, ramp);
    sizes.set(key, size);
  }
  return size;
}

export function generatorEnergy(
  netLoads: ArrayLike<number>,
  plans: readonly SwitchPlan[],
  devices: CornerDevices,
  cycles: CycleIndex,
  netlist?: CompiledNetlist,
  cache?: GateEnergyCache,
): number {
  const vdd = devices.vdd;
  let energy = netlist ? generatorGateEnergy(netlist, netLoads, devices, cycles, cache) : 0;
  for (let i = 0; i < netLoads.length; i++) energy += netLoads[i]! * vdd * vdd;
  for (const plan of plans) {
    const ls = plan.levelShifter;
    if (!ls) continue;
    const low = levelAt(ls.low, vdd);
    const high = levelAt(ls.high, vdd);
    for (const d of plan.devices) {
      const load = switchGateCapacitance(devices.card, d.kind, d.w, d.l);
      const cycle = cycles.cycle(d.net);
      const input = typeof cycle === 'string' ? ls.delay : (cycle.riseTransition + cycle.fallTransition) / 2;
      if (latchShifter(ls, vdd)) energy += shifterEnergy(ls, sizeShifter(ls, devices.card, load, input), load, devices, input).total;
      else if (low < 0 && high <= vdd)
        energy += downShifterEnergy(ls, downSizing(ls, devices.card, load, input), load, devices, input).total;
      else energy += load * (high - low) * (high - low);
    }
  }
  return energy;
}

/** Which figures a call computes, and whether every call of the evaluator is the same corner (Monte Carlo dies). */
export interface FigureChoice {
  readonly scope: FigureScope;
  readonly sameCorner: boolean;
}

export class CircuitEvaluator {
  readonly network: CircuitNetwork;
  /**
   * The output's sign found for the first call in scope 'checked' with `sameCorner` and kept for
   * the rest: such an evaluator serves the Monte Carlo dies of one corner, whose mismatch cannot
   * turn a pump's output around; it saves a 20-period run per die.
   */
  private checkedSign: 1 | -1 | undefined;
  /** The generator gates' energies, shared by the corners and dies this evaluator serves. */
  private readonly gateEnergies: GateEnergyCache = new Map();

  constructor(
    design: Design,
    private readonly plans: readonly SwitchPlan[],
    card: ProcessCard,
    private readonly netLoads: ArrayLike<number>,
    private readonly period: number,
    private readonly netlist?: CompiledNetlist,
  ) {
    this.network = buildNetwork(design, plans, card);
  }

  /**
   * `drive` sets the switches' on-resistance (the devices R_on is calibrated on, mismatch); by
   * default `devices`. `figures.scope` 'checked' leaves out the figures no requirement is checked on.
   */
  evaluate(
    conduction: readonly SwitchConduction[],
    cycles: CycleIndex,
    devices: CornerDevices,
    drive: SwitchDrive = { devices },
    figures: FigureChoice = { scope: 'all', sameCorner: false },
  ): CornerCircuit {
    const net = this.network;
    const model = cornerModel(net, this.plans, conduction, cycles, devices, this.period, drive);
    const { scope } = figures;
    const keepSign = scope === 'checked' && figures.sameCorner;
    if (keepSign && this.checkedSign === undefined) this.checkedSign = loadSign(model, net.load);
    const computed = circuitFigures(
      model,
      net.load,
      generatorEnergy(this.netLoads, this.plans, devices, cycles, this.netlist, this.gateEnergies),
      net.spec.startupCycles,
      keepSign ? { scope, sign: this.checkedSign } : { scope },
    );
    const sameLoad = net.lightLoad.current === net.load.current && net.lightLoad.conductance === net.load.conductance;
    const sign = computed.output < 0 ? -1 : 1;
    const bound = sign > 0 ? net.spec.requirements.output?.max : net.spec.requirements.output?.min;
    const needLight = !sameLoad && bound !== undefined;
    const lightOutput = needLight ? solve(withLoad(model, net.lightLoad, sign)).trace.outputMean : computed.output;
    return { ...computed, lightOutput, nodes: net.nodes, start: model.start };
  }
}
