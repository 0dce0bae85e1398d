/**
 * Measurements of one simulated period (SPEC 2.3): both dead times at the 50 % points, the clean
 * gap where neither phase is above 10 % of its swing, each phase's active width and duty, and
 * any overlap. All times in seconds.
 */
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { SimulationResult } from '../sim/engine.js';

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
  /** From's falling 10 % point to to's rising 10 % point, s. */
  readonly gap: number;
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
  /** Largest time both phases are above 50 % together, s (0 if none). */
  readonly overlap: number;
  /** Edges of every named net (phases, complements, early phases). */
  readonly cycles: Readonly<Record<string, NetCycle>>;
}

export interface MeasurementFailure {
  readonly ok: false;
  readonly reason: string;
}

/** Fraction of the swing at which the clean gap is measured. */
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

  constructor(result: SimulationResult, private readonly netlist: CompiledNetlist) {
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
    if (rises === 0 && falls === 0) return `${name} never switches: it stays ${this.result.startValues[id] === 1 ? 'high' : 'low'} (the generator is stuck)`;
    if (rises !== 1 || falls !== 1) return `${name} switches ${rises} times up and ${falls} times down per period; a phase must switch once each way (glitching)`;
    return { net: name, rise: this.rise[id]!, fall: this.fall[id]!, riseTransition: this.riseT[id]!, fallTransition: this.fallT[id]! };
  }
}

/** Positive remainder of x modulo m: a time folded into one period. */
export function wrapTime(x: number, m: number): number {
  const r = x % m;
  return r < 0 ? r + m : r;
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
 * the (positive) wait; if b rises while a is still high, it is minus the time they overlap.
 */
export function deadTime(a: NetCycle, b: NetCycle, period: number): DeadTime {
  const t50 = handover(a.fall, a.rise, b.rise, period);
  const gap = t50 - (0.5 - GAP_LEVEL) * (a.fallTransition + b.riseTransition);
  return { from: a.net, to: b.net, t50, gap, start: a.fall };
}

export function measurePhases(result: SimulationResult, netlist: CompiledNetlist, index = new CycleIndex(result, netlist)): PhaseMeasurement | MeasurementFailure {
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
  const deadTimes: [DeadTime, DeadTime] = [deadTime(c1, c2, T), deadTime(c2, c1, T)];
  const widths: Record<string, number> = {};
  const duty: Record<string, number> = {};
  for (const name of [p1, p2, ...Object.values(src.early)]) {
    widths[name] = highWidth(cycles[name]!, T);
    duty[name] = widths[name] / T;
  }
  const overlap = Math.max(0, -deadTimes[0].t50, -deadTimes[1].t50);
  return { ok: true, deadTimes, widths, duty, overlap, cycles };
}
