/**
 * The circuit at one corner: rails at the corner's supply, each switch on (1/R_on) while its
 * gate conducts and a leak otherwise, the conduction instants the clock generator produces at
 * that corner, and for every off device a channel that conducts backwards if a terminal passes
 * its gate's off level by a threshold. A switch that never turns off (or on) at some signal
 * keeps its gate's own 50 % instants, so a wrongly driven device still shows what it does.
 * A switching switch's on-conductance follows its devices' overdrive at the node voltages
 * (`onConductance`, evaluated by the solver along the steady state); gOn, from the conduction's
 * worst R_on over the declared signal range, is only the first guess.
 */
import type { CycleIndex } from '../measure/phases.js';
import type { EdgeShape } from '../measure/levels.js';
import type { CornerDevices } from '../process/device.js';
import { levelAt } from '../schema/level.js';
import {
  bulkLevel,
  conductingState,
  deviceOnResistance,
  deviceShifter,
  gateWave,
  switchThreshold,
  type GateWave,
  type SwitchConduction,
} from '../switches/conduction.js';
import { bodyThreshold, triodeResistance } from '../switches/physics.js';
import { rangeHigh, rangeLow } from '../switches/nodes.js';
import type { SwitchPlan } from '../switches/plan.js';
import type { ShifterSizing } from '../switches/shifter-sizing.js';
import { oxidePerArea } from './injection.js';
import { overlapPerWidth } from '../process/gate-edge.js';
import type { CircuitModel, ModelChannel, ModelEdgeDevice, ModelGateCharge, ModelInterval, ModelSwitch } from './model.js';
import type { CircuitNetwork } from './network.js';

interface Window {
  readonly on: number;
  readonly off: number;
}

function wrap(t: number, period: number): number {
  const x = t % period;
  return x < 0 ? x + period : x;
}

function inWindow(t: number, w: Window, period: number): boolean {
  const length = wrap(w.off - w.on, period);
  return wrap(t - w.on, period) < length;
}

/** Threshold magnitude at the onset of reverse conduction, with body effect at the source it implies. */
function onsetThreshold(vth: number, gamma: number, phi2f: number, gate: number, bulk: number, n: boolean): number {
  let vt = vth;
  for (let k = 0; k < 4; k++) {
    const source = n ? gate - vt : gate + vt;
    vt = bodyThreshold(vth, gamma, phi2f, n ? source - bulk : bulk - source);
  }
  return vt;
}

/**
 * What sets a switch's on-resistance and its gate's edges: the devices (calibrated, if the run
 * calibrates R_on) and per-switch threshold shifts (mismatch), V; behind a level shifter, its
 * sizes per switch and device (analysis/shifter-sizes.ts) and its pull-down's threshold shift per
 * switch, V, so the gate ramps are the ones the switch instants come from (`switchConduction`).
 */
export interface SwitchDrive {
  readonly devices: CornerDevices;
  readonly dvth?: readonly (ArrayLike<number> | undefined)[];
  readonly shifterSizes?: ReadonlyArray<ReadonlyArray<ShifterSizing | null>>;
  readonly shifterDvth?: ArrayLike<number>;
  /** The delay model's edge shapes at this corner: the latch shifters' input slope (deviceShifter). */
  readonly shape?: EdgeShape;
}

/** Conductance of a switch's devices in parallel with n sources at nSource and p sources at pSource, S. */
export function onConductanceOf(
  plan: SwitchPlan,
  drive: SwitchDrive,
  dvth: ArrayLike<number> | undefined,
): (nSource: number, pSource: number) => number {
  return (nSource, pSource) => {
    let g = 0;
    plan.devices.forEach((device, i) => {
      const r = deviceOnResistance(plan, device, drive.devices, device.kind === 'n' ? nSource : pSource, dvth ? dvth[i]! : 0);
      if (Number.isFinite(r)) g += 1 / r;
    });
    return g;
  };
}

/** Mean of the switch's two terminals' declared ranges in the phase state it conducts in, V. */
function conductingLevel(plan: SwitchPlan, vdd: number): number {
  const state = conductingState(plan);
  let sum = 0;
  for (const t of plan.terminals) {
    const range = t.states[state];
    const lo = rangeLow(range, vdd);
    const hi = rangeHigh(range, vdd);
    sum += Number.isFinite(lo) && Number.isFinite(hi) ? (lo + hi) / 2 : (levelAt(plan.signal.min, vdd) + levelAt(plan.signal.max, vdd)) / 2;
  }
  return sum / plan.terminals.length;
}

/** A switch device's channel and overlap capacitance and gate levels, for its charge at the edges. */
function edgeDevice(plan: SwitchPlan, i: number, devices: CornerDevices, wave: GateWave, dvth: number): ModelEdgeDevice {
  const device = plan.devices[i]!;
  const n = device.kind === 'n';
  const d = n ? devices.n : devices.p;
  const vdd = devices.vdd;
  const { low, high } = wave.rise;
  return {
    polarity: device.kind,
    channel: oxidePerArea(d.params, devices.card.lmin) * device.w * device.l,
    overlap: overlapPerWidth(d.params) * device.w,
    gateOn: n ? high : low,
    gateOff: n ? low : high,
    onTransition: n ? wave.rise.transition : wave.fall.transition,
    offTransition: n ? wave.fall.transition : wave.rise.transition,
    beta: (d.kprime * device.w) / device.l,
    threshold: (source) => switchThreshold(plan, device, d, source, vdd, dvth),
  };
}

export function cornerModel(
  network: CircuitNetwork,
  plans: readonly SwitchPlan[],
  conduction: readonly SwitchConduction[],
  cycles: CycleIndex,
  devices: CornerDevices,
  period: number,
  drive: SwitchDrive = { devices },
): CircuitModel {
  const vdd = devices.vdd;
  const windows: (Window | null)[] = [];
  const switches: ModelSwitch[] = [];
  const channels: ModelChannel[] = [];
  const gateCharges: ModelGateCharge[] = [];
  plans.forEach((plan, k) => {
    const c = conduction[k];
    const [a, b] = network.switchTerminals[k]!;
    let window: Window | null = null;
    let gOn = 0;
    if (c && c.status === 'switching') {
      window = { on: c.on, off: c.off };
      gOn = 1 / c.ron;
    }
    const edgeDevices: ModelEdgeDevice[] = [];
    plan.devices.forEach((device, i) => {
      const shifter = deviceShifter(plan, i, cycles, drive.devices, {
        sizes: drive.shifterSizes?.[k],
        dvth: drive.shifterDvth?.[k] ?? 0,
        shape: drive.shape,
      });
      const wave = gateWave(plan, device, cycles, vdd, shifter);
      if (typeof wave === 'string') return;
      edgeDevices.push(edgeDevice(plan, i, devices, wave, drive.dvth?.[k]?.[i] ?? 0));
      const n = device.kind === 'n';
      const d = n ? devices.n : devices.p;
      const swing = wave.rise.high - wave.rise.low;
      const bulk = bulkLevel(plan, device.kind, vdd);
      const gate = n ? wave.rise.low : wave.rise.high;
      const vt = onsetThreshold(d.switchVth, d.gamma, d.phi2f, gate, bulk, n);
      const full = triodeResistance(d.kprime, device.w, device.l, swing - vt);
      if (!window && c?.status === 'always') {
        window = n ? { on: wave.rise.t50, off: wave.fall.t50 } : { on: wave.fall.t50, off: wave.rise.t50 };
        if (Number.isFinite(full)) gOn += 1 / full;
      }
      if (Number.isFinite(full)) channels.push({ switchIndex: k, a, b, polarity: n ? 'n' : 'p', gate, vt, g: 1 / full });
    });
    windows.push(window);
    if (window && edgeDevices.length > 0) {
      gateCharges.push({ switchIndex: k, devices: edgeDevices, sourceGuess: conductingLevel(plan, vdd) });
    }
    const onConductance = c?.status === 'switching' ? onConductanceOf(plan, drive, drive.dvth?.[k]) : undefined;
    switches.push(
      onConductance
        ? { name: plan.name, a, b, gOn, gOff: network.switchLeak, onConductance }
        : { name: plan.name, a, b, gOn, gOff: network.switchLeak },
    );
  });
  const events = new Set<number>();
  for (const w of windows)
    if (w) {
      events.add(wrap(w.on, period));
      events.add(wrap(w.off, period));
    }
  const times = [...events].sort((x, y) => x - y);
  if (times.length === 0) times.push(0);
  const intervals: ModelInterval[] = times.map((t, i) => {
    const end = i + 1 < times.length ? times[i + 1]! : times[0]! + period;
    const mid = (t + end) / 2;
    return { duration: end - t, on: Uint8Array.from(windows, (w) => (w && inWindow(mid, w, period) ? 1 : 0)) };
  });
  return {
    nodes: network.nodes,
    rails: Float64Array.from(network.railLevels, (l) => levelAt(l, vdd)),
    inverseCapacitance: network.inverseCapacitance,
    intervals,
    start: times[0]!,
    switches,
    channels,
    diodes: network.diodes,
    gateCharges,
    pairs: network.pairs,
    output: network.output,
    loadCurrent: 0,
    loadConductance: 0,
  };
}
