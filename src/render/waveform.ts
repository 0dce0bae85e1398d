/**
 * A corner's simulated edges as drawable ramps: per net, the level at the start of the reported
 * period and its transitions as linear ramps (50 % time, full-swing transition time), or, where the
 * delay model shapes the net's edges, as that shape: the times its edge crosses 5 %, 10 %, ...,
 * 95 % of the swing, so a switch instant read off the shaped edge sits on the drawn line. Times are
 * relative to the start of the reported period (a clock rising edge). The period repeats, so a
 * waveform can be sampled over any time range.
 */
import type { CornerResult } from '../analysis/evaluate.js';
import type { EdgeShape } from '../measure/levels.js';
import type { CompiledNetlist } from '../netlist/netlist.js';

export interface Ramp {
  /** 50 % time, s, relative to the start of the period. */
  readonly t50: number;
  /** Full-swing transition time, s. */
  readonly transition: number;
  readonly rising: boolean;
  /**
   * The edge as the delay model shapes it, in time order: (time from t50, s; level) from one rail
   * to the other. Absent: the linear ramp.
   */
  readonly shape?: readonly WavePoint[];
}

export interface NetWave {
  readonly net: string;
  /** Period, s. */
  readonly period: number;
  /** Logic level just before the period starts. */
  readonly initial: 0 | 1;
  /** Transitions in the period, in time order. */
  readonly ramps: readonly Ramp[];
}

/** A vertex of a waveform: time, s, and level as a fraction of the swing (0 low, 1 high). */
export type WavePoint = readonly [number, number];

export function netWave(result: CornerResult, netlist: CompiledNetlist, net: string, edgeShape?: EdgeShape): NetWave {
  const id = netlist.netIndex.get(net);
  if (id === undefined) throw new Error(`internal: ${net} is not a net of the netlist`);
  const sim = result.simulation;
  const ramps: Ramp[] = [];
  const rise = edgeShape ? shapeOf(edgeShape, net, true) : undefined;
  const fall = edgeShape ? shapeOf(edgeShape, net, false) : undefined;
  for (let i = 0; i < sim.edges.count; i++) {
    if (sim.edges.net[i] !== id) continue;
    const rising = sim.edges.rising[i] === 1;
    const shape = rising ? rise : fall;
    const ramp = { t50: sim.edges.time[i]! - sim.windowStart, transition: sim.edges.transition[i]!, rising };
    ramps.push(shape ? { ...ramp, shape } : ramp);
  }
  ramps.sort((a, b) => a.t50 - b.t50);
  return { net, period: sim.period, initial: sim.startValues[id] === 1 ? 1 : 0, ramps };
}

/** Levels an edge shape is drawn through: 5 %, 10 %, ..., 95 % of the swing. */
const SHAPE_LEVELS = Array.from({ length: 19 }, (_, k) => (k + 1) / 20);

/**
 * A net's shaped edge from rail to rail, times from its 50 % point, or undefined where the model
 * gives no shape or a shape that does not move one way: the 5 % to 95 % crossings, and each rail
 * reached where the line through the last two crossings meets it.
 */
function shapeOf(edgeShape: EdgeShape, net: string, rising: boolean): WavePoint[] | undefined {
  const points: WavePoint[] = [];
  for (const level of SHAPE_LEVELS) {
    const t = edgeShape(net, rising, level);
    if (t === null || !Number.isFinite(t)) return undefined;
    points.push([t, level]);
  }
  if (!rising) points.reverse();
  for (let k = 1; k < points.length; k++) if (!(points[k]![0] > points[k - 1]![0])) return undefined;
  const extend = (a: WavePoint, b: WavePoint, level: number): WavePoint => [b[0] + ((level - b[1]) * (b[0] - a[0])) / (b[1] - a[1]), level];
  const n = points.length;
  return [extend(points[1]!, points[0]!, rising ? 0 : 1), ...points, extend(points[n - 2]!, points[n - 1]!, rising ? 1 : 0)];
}

/**
 * Most periods a wave is repeated over. A drawing window spans about one period; only a transition
 * much longer than the period (an input no generator can settle on) would ask for more, and then
 * the periods around the window's middle are drawn instead of an unbounded number.
 */
export const MAX_REPEATED_PERIODS = 64;

/** The ramps of a wave repeated over whole periods so that they cover [from, to] (at most MAX_REPEATED_PERIODS + 1 periods). */
export function rampsBetween(wave: NetWave, from: number, to: number): Ramp[] {
  const T = wave.period;
  if (!(T > 0 && Number.isFinite(from) && Number.isFinite(to))) return [];
  const widest = wave.ramps.reduce((m, r) => Math.max(m, r.transition), 0);
  let first = Math.floor((from - widest) / T) - 1;
  let last = Math.ceil((to + widest) / T) + 1;
  if (!(last - first <= MAX_REPEATED_PERIODS)) {
    first = Math.floor((from + to) / 2 / T) - MAX_REPEATED_PERIODS / 2;
    last = first + MAX_REPEATED_PERIODS;
  }
  const out: Ramp[] = [];
  for (let k = first; k <= last; k++) {
    for (const r of wave.ramps) {
      const t50 = r.t50 + k * T;
      if (t50 + r.transition / 2 >= from - T && t50 - r.transition / 2 <= to + T) out.push({ ...r, t50 });
    }
  }
  return out;
}

/** Level of a ramp's straight line at time t (not clamped). */
function line(r: Ramp, t: number): number {
  const x = (t - r.t50) / r.transition;
  return r.rising ? 0.5 + x : 0.5 - x;
}

/**
 * Vertices of the waveform over [from, to]. Each ramp runs from one rail to the other; when the
 * next ramp starts before this one ends (a short pulse), the two lines meet where they cross.
 */
export function wavePoints(wave: NetWave, from: number, to: number): WavePoint[] {
  const ramps = rampsBetween(wave, from, to);
  const raw: WavePoint[] = [];
  if (ramps.length === 0)
    return [
      [from, wave.initial],
      [to, wave.initial],
    ];
  // A shaped edge is drawn as shaped where it keeps clear of its neighbours, else as its ramp.
  const shaped = ramps.map((r, i) => {
    if (!r.shape) return false;
    const prev = ramps[i - 1];
    const next = ramps[i + 1];
    return (!prev || latestEnd(prev) <= startOf(r, true)) && (!next || endOf(r, true) <= earliestStart(next));
  });
  let start: WavePoint = [startOf(ramps[0]!, shaped[0]!), ramps[0]!.rising ? 0 : 1];
  raw.push([-Infinity, start[1]]);
  for (let i = 0; i < ramps.length; i++) {
    const r = ramps[i]!;
    const next = ramps[i + 1];
    const level = r.rising ? 1 : 0;
    if (shaped[i]) {
      for (const [dt, v] of r.shape!) raw.push([r.t50 + dt, v]);
      if (next) start = [startOf(next, shaped[i + 1]!), level];
      continue;
    }
    const end: WavePoint = [endOf(r, false), level];
    raw.push(start);
    if (next && !shaped[i + 1] && startOf(next, false) < end[0]) {
      // The lines of r and next cross; r stops there and next starts from there.
      const slope = (r.rising ? 1 : -1) / r.transition - (next.rising ? 1 : -1) / next.transition;
      const cross = slope === 0 ? end[0] : Math.max(start[0], r.t50 + (line(next, r.t50) - 0.5) / slope);
      const meet: WavePoint = [cross, Math.min(1, Math.max(0, line(r, cross)))];
      start = meet;
    } else {
      raw.push(end);
      if (next) start = [startOf(next, shaped[i + 1]!), level];
    }
  }
  raw.push([Infinity, raw[raw.length - 1]![1]]);
  return clip(raw, from, to);
}

/** Where a ramp leaves its rail and where it reaches the other, drawn shaped or as its line, s. */
function startOf(r: Ramp, shaped: boolean): number {
  return shaped && r.shape ? r.t50 + r.shape[0]![0] : r.t50 - r.transition / 2;
}

function endOf(r: Ramp, shaped: boolean): number {
  return shaped && r.shape ? r.t50 + r.shape[r.shape.length - 1]![0] : r.t50 + r.transition / 2;
}

/** The widest a neighbour may reach, either way it is drawn. */
function earliestStart(r: Ramp): number {
  return Math.min(startOf(r, false), startOf(r, true));
}

function latestEnd(r: Ramp): number {
  return Math.max(endOf(r, false), endOf(r, true));
}

/** Cuts a polyline (increasing times, infinite ends) to [from, to], interpolating at the cuts. */
function clip(points: readonly WavePoint[], from: number, to: number): WavePoint[] {
  const at = (t: number): number => {
    for (let i = 1; i < points.length; i++) {
      const [t1, v1] = points[i]!;
      const [t0, v0] = points[i - 1]!;
      if (t <= t1) return !Number.isFinite(t0) || t1 === t0 || !Number.isFinite(t1) ? v1 : v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);
    }
    return points[points.length - 1]![1];
  };
  const out: WavePoint[] = [[from, at(from)]];
  for (const p of points) if (p[0] > from && p[0] < to) out.push(p);
  out.push([to, at(to)]);
  return out;
}
