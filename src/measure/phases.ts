/**
 * Measurements of one simulated period (docs/physics.md, "Generator simulation"): both dead times at the 50 % points, the clean
 * gap where neither phase is above a level of its swing (10 % unless the design says otherwise),
 * each phase's active width and duty, and any overlap at that level. All times in seconds.
 */
import type { GateTiming } from '../delay/model.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { SimulationResult } from '../sim/engine.js';
import { linearCrossings, modelCrossings, type LevelCrossings } from './levels.js';
import { wrapTime } from './wrap-time.js';

/** One rising and one falling edge of a net in the period, with their transition times. */
export interface NetCycle {
  readonly net: string;
  /** 50 % times of the rising and falling edges, s (absolute). */
  readonly rise: number;
  readonly fall: number;
  readonly riseTransition: number;
  readonly fallTransition: number;
}

export interface DeadTime {
  /** Phase that turns off. */
  readonly from: string;
  /** Phase that turns on. */
  readonly to: string;
  /** From's falling 50 % point to to's rising 50 % point, s; negative when they overlap. */
  readonly t50: number;
  /** Clean gap: from's falling edge passing the gap level to to's rising edge passing it, s; negative when both are above it together. */
  readonly gap: number;
  /** The clean gap less the delay model's stated error band (what checks read), s. */
  readonly gapBound: number;
  /** Time of from's falling 50 % point, s (absolute). */
  readonly start: number;
}

export interface PhaseMeasurement {
  readonly ok: true;
  readonly deadTimes: readonly [DeadTime, DeadTime];
  /** Active (high) width of each phase and early phase at the 50 % points, s. */
  readonly widths: Readonly<Record<string, number>>;
  /** Active width over the period. */
  readonly duty: Readonly<Record<string, number>>;
  /** Largest time both phases are above the gap level together, s (0 if none). */
  readonly overlap: number;
  /** The gap level, fraction of the swing. */
  readonly level: number;
  /** Edges of every named net (phases, complements, early phases). */
  readonly cycles: Readonly<Record<string, NetCycle>>;
}

export interface MeasurementFailure {
  readonly ok: false;
  readonly reason: string;
}

/** Fraction of the swing at which the clean gap is measured unless the design sets another. */
export const GAP_LEVEL = 0.1;

/**
 * Every net's edges in the reported period, indexed once so each lookup is constant time: the
 * count of rising and falling edges and the last of each with its transition time.
 */
export class CycleIndex {
  private readonly rises: Uint16Array;
  private readonly falls: Uint16Array;
  private readonly rise: Float64Array;
  private readonly fall: Float64Array;
  private readonly riseT: Float64Array;
  private readonly fallT: Float64Array;

  private result: SimulationResult;

  constructor(
    result: SimulationResult,
    private readonly netlist: CompiledNetlist,
  ) {
    const n = netlist.netNames.length;
    this.rises = new Uint16Array(n);
    this.falls = new Uint16Array(n);
    this.rise = new Float64Array(n);
    this.fall = new Float64Array(n);
    this.riseT = new Float64Array(n);
    this.fallT = new Float64Array(n);
    this.result = result;
    this.index(result);
  }

  /** Re-indexes for another run of the same netlist, reusing the arrays. */
  reset(result: SimulationResult): this {
    this.rises.fill(0);
    this.falls.fill(0);
    this.result = result;
    this.index(result);
    return this;
  }

  private index(result: SimulationResult): void {
    const { edges } = result;
    for (let i = 0; i < edges.count; i++) {
      const id = edges.net[i]!;
      if (edges.rising[i] === 1) {
        this.rises[id]!++;
        this.rise[id] = edges.time[i]!;
        this.riseT[id] = edges.transition[i]!;
      } else {
        this.falls[id]!++;
        this.fall[id] = edges.time[i]!;
        this.fallT[id] = edges.transition[i]!;
      }
    }
  }

  get period(): number {
    return this.result.period;
  }

  /** The one rising and one falling edge of a net in the period, or why there are not exactly two. */
  cycle(name: string): NetCycle | string {
    const id = this.netlist.netIndex.get(name);
    if (id === undefined) return `${name} is not a net of the generator`;
    const rises = this.rises[id]!;
    const falls = this.falls[id]!;
    if (rises === 0 && falls === 0)
      return `${name} never switches: it stays ${this.result.startValues[id] === 1 ? 'high' : 'low'} (the generator is stuck)`;
    if (rises !== 1 || falls !== 1)
      return `${name} switches ${rises} times up and ${falls} times down per period; a phase must switch once each way (glitching)`;
    return { net: name, rise: this.rise[id]!, fall: this.fall[id]!, riseTransition: this.riseT[id]!, fallTransition: this.fallT[id]! };
  }
}

/**
 * Time from one thing stopping (at `stop`, next starting again at `restart`) to another starting
 * (at `start`), all modulo the period: the positive wait when the other starts while the first is
 * off, minus the overlap when it starts while the first is still on. Dead times between phases and
 * gaps between switches are both this.
 */
export function handover(stop: number, restart: number, start: number, period: number): number {
  const offTime = wrapTime(restart - stop, period);
  const wait = wrapTime(start - stop, period);
  return wait <= offTime ? wait : -wrapTime(stop - start, period);
}

/** Active (high) width of a cycle, s. */
export function highWidth(cycle: NetCycle, period: number): number {
  return wrapTime(cycle.fall - cycle.rise, period);
}

/**
 * Dead time from `a` turning off to `b` turning on. If b rises while a is low, the dead time is
 * the (positive) wait; if b rises while a is still high, it is minus the time they overlap. The
 * clean gap takes each edge's crossing of the gap level (linear ramps at 10 % unless given).
 */
export function deadTime(
  a: NetCycle,
  b: NetCycle,
  period: number,
  aLevels: LevelCrossings = linearCrossings(a, GAP_LEVEL),
  bLevels: LevelCrossings = linearCrossings(b, GAP_LEVEL),
  band = 0,
): DeadTime {
  const t50 = handover(a.fall, a.rise, b.rise, period);
  const gap = t50 + bLevels.rise - aLevels.fall;
  return { from: a.net, to: b.net, t50, gap, gapBound: gap - band * Math.abs(t50), start: a.fall };
}

/** How the gap is measured: at which level, and with which model's edge shapes (linear ramps without one). */
export interface GapOptions {
  /** Fraction of the swing, 0 < level < 0.5. */
  readonly level?: number;
  readonly timing?: GateTiming;
  /** The delay model's gap error band on the card, fraction of the dead time (`gapBand`, src/delay/error-band.ts). */
  readonly band?: number;
}

export function measurePhases(
  result: SimulationResult,
  netlist: CompiledNetlist,
  index = new CycleIndex(result, netlist),
  options: GapOptions = {},
): PhaseMeasurement | MeasurementFailure {
  if (result.status !== 'settled') return { ok: false, reason: result.reason };
  const src = netlist.source;
  const names = [...src.phases, ...Object.values(src.complements), ...Object.values(src.early)];
  const cycles: Record<string, NetCycle> = {};
  for (const name of names) {
    const cycle = index.cycle(name);
    if (typeof cycle === 'string') return { ok: false, reason: cycle };
    cycles[name] = cycle;
  }
  const [p1, p2] = src.phases;
  const c1 = cycles[p1]!;
  const c2 = cycles[p2]!;
  const T = result.period;
  const level = options.level ?? GAP_LEVEL;
  const timing = options.timing;
  const l1 = timing ? modelCrossings(c1, index, netlist, timing, level) : linearCrossings(c1, level);
  const l2 = timing ? modelCrossings(c2, index, netlist, timing, level) : linearCrossings(c2, level);
  const deadTimes: [DeadTime, DeadTime] = [deadTime(c1, c2, T, l1, l2, options.band), deadTime(c2, c1, T, l2, l1, options.band)];
  const widths: Record<string, number> = {};
  const duty: Record<string, number> = {};
  for (const name of [p1, p2, ...Object.values(src.early)]) {
    widths[name] = highWidth(cycles[name]!, T);
    duty[name] = widths[name] / T;
  }
  const overlap = Math.max(0, -deadTimes[0].gap, -deadTimes[1].gap);
  return { ok: true, deadTimes, widths, duty, overlap, level, cycles };
}
