/**
 * Where each phase edge crosses a level of the swing, from its 50 % point. A delay model that
 * knows the shape of its edges (GateTiming.crossing) answers for the edge's own driver and input
 * transition; otherwise the edge is the linear ramp of its transition time.
 */
import type { GateTiming } from '../delay/model.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { CycleIndex, NetCycle } from './phases.js';
import { wrapTime } from './wrap-time.js';

/** Time from the 50 % point to the level crossing of the rising and of the falling edge, s. */
export interface LevelCrossings {
  /** Negative when the level is below 50 %: the rising edge passes it first. */
  readonly rise: number;
  /** Positive when the level is below 50 %: the falling edge passes it last. */
  readonly fall: number;
}

/** Crossings of linear ramps. */
export function linearCrossings(cycle: NetCycle, level: number): LevelCrossings {
  return { rise: (level - 0.5) * cycle.riseTransition, fall: (0.5 - level) * cycle.fallTransition };
}

/**
 * Crossings of a net's edges as the delay model shapes them. Each edge is caused by the latest
 * opposite edge on one of its driver's inputs (every library cell inverts); an input that does
 * not switch exactly once each way leaves that edge a linear ramp.
 */
export function modelCrossings(
  cycle: NetCycle,
  index: CycleIndex,
  netlist: CompiledNetlist,
  timing: GateTiming,
  level: number,
): LevelCrossings {
  const linear = linearCrossings(cycle, level);
  const id = netlist.netIndex.get(cycle.net);
  const g = id === undefined ? -1 : netlist.driver[id]!;
  if (g < 0 || !timing.crossing) return linear;
  const rise = edgeCrossing(g, true, cycle.rise, index, netlist, timing, level);
  const fall = edgeCrossing(g, false, cycle.fall, index, netlist, timing, level);
  return { rise: rise ?? linear.rise, fall: fall ?? linear.fall };
}

/**
 * The time from a net's 50 % point to where its rising or falling edge crosses `fraction` of the
 * swing, s, as the delay model shapes it; null where it cannot (no model shape, a clock source,
 * an input that does not switch once each way, or a level outside the recorded 5 ... 95 %, which
 * the caller then takes from the linear ramp).
 */
export type EdgeShape = (net: string, rising: boolean, fraction: number) => number | null;

/**
 * The delay model's edge shapes of a corner's nets. Read while the timing is bound to this
 * corner: an evaluator that reuses its timing rebinds it for the next.
 */
export function modelEdgeShape(index: CycleIndex, netlist: CompiledNetlist, timing: GateTiming): EdgeShape | undefined {
  if (!timing.crossing) return undefined;
  return (net, rising, fraction) => {
    if (!(fraction >= SHAPED_LOW && fraction <= SHAPED_HIGH)) return null;
    const id = netlist.netIndex.get(net);
    const g = id === undefined ? -1 : netlist.driver[id]!;
    if (g < 0) return null;
    const cycle = index.cycle(net);
    if (typeof cycle === 'string') return null;
    return edgeCrossing(g, rising, rising ? cycle.rise : cycle.fall, index, netlist, timing, fraction);
  };
}

/**
 * A net's edges as the full-swing transitions of ramps with their central slope, the 20-80 %
 * crossing interval over 0.6 (each edge its own full-swing transition where `shape` cannot say).
 * A cell that switches mid-swing sees the edge's middle: a tailed edge's 10-90 % time overstates
 * how fast its input swings there.
 */
export function centralTransitions(
  net: string,
  cycle: Pick<NetCycle, 'riseTransition' | 'fallTransition'>,
  shape?: EdgeShape,
): Pick<NetCycle, 'riseTransition' | 'fallTransition'> {
  if (!shape) return cycle;
  const central = (rising: boolean, full: number) => {
    const low = shape(net, rising, CENTRAL_LOW);
    const high = shape(net, rising, 1 - CENTRAL_LOW);
    if (low === null || high === null) return full;
    const t = Math.abs(high - low) / (1 - 2 * CENTRAL_LOW);
    return t > 0 && Number.isFinite(t) ? t : full;
  };
  return { riseTransition: central(true, cycle.riseTransition), fallTransition: central(false, cycle.fallTransition) };
}

/** Lower end of an edge's central part, fraction of the swing (the upper is 1 minus it). */
const CENTRAL_LOW = 0.2;

/** The levels the delay models record an edge's crossings at: 5 % to 95 % of the swing. */
const SHAPED_LOW = 0.05;
const SHAPED_HIGH = 0.95;

function edgeCrossing(
  g: number,
  rising: boolean,
  time: number,
  index: CycleIndex,
  netlist: CompiledNetlist,
  timing: GateTiming,
  level: number,
): number | null {
  let best = Infinity;
  let pin = -1;
  let inputTransition = 0;
  const start = netlist.gateInputStart[g]!;
  for (let k = start; k < netlist.gateInputStart[g + 1]!; k++) {
    const input = index.cycle(netlist.netNames[netlist.gateInputs[k]!]!);
    if (typeof input === 'string') continue;
    const wait = wrapTime(time - (rising ? input.fall : input.rise), index.period);
    if (wait < best) {
      best = wait;
      pin = k - start;
      inputTransition = rising ? input.fallTransition : input.riseTransition;
    }
  }
  return pin < 0 ? null : timing.crossing!(g, pin, rising, inputTransition, level);
}
