/**
 * Edge envelopes of a corner overlay: for each edge of a signal, the region every corner's ramp
 * passes through, from the earliest to the latest crossing at each level. Each ramp is a line
 * t(v) = t50 + tT * (v - 1/2) (rising) in the level v, so the left side is the lower envelope of
 * lines and the right side the upper; both are exact polylines whose corners lie where two
 * lines cross, so those levels (and 0, 1/2, 1) are the only vertices needed.
 */
import type { DiagramRow } from '../diagram.js';
import { alignNear } from '../../switches/conduction.js';
import type { Ramp, WavePoint } from '../waveform.js';

export interface EdgeGroup {
  readonly rising: boolean;
  /** The ramps of every corner for this edge, aligned to the same period copy. */
  readonly ramps: readonly Ramp[];
  readonly corners: readonly string[];
  /** Earliest and latest 50 % time over the corners, s. */
  readonly t50Min: number;
  readonly t50Max: number;
}

export interface Band {
  /** Left boundary from level 0 to 1, then the right boundary from 1 to 0: a closed outline. */
  readonly outline: readonly WavePoint[];
}

/** Time a ramp reaches level v (fraction of the swing). */
export function crossingAt(r: Ramp, v: number): number {
  return r.t50 + r.transition * (r.rising ? v - 0.5 : 0.5 - v);
}

/** Groups each edge of the reference waveform with the same-direction edge of every corner nearest it. */
export function edgeGroups(row: DiagramRow): EdgeGroup[] {
  const T = row.reference.period;
  return row.reference.ramps.map((ref) => {
    const ramps: Ramp[] = [];
    const corners: string[] = [];
    for (const { corner, wave } of row.waves) {
      let best: Ramp | null = null;
      for (const r of wave.ramps) {
        if (r.rising !== ref.rising) continue;
        const t50 = alignNear(r.t50, ref.t50, T);
        if (best === null || Math.abs(t50 - ref.t50) < Math.abs(best.t50 - ref.t50)) best = { ...r, t50 };
      }
      if (best) {
        ramps.push(best);
        corners.push(corner);
      }
    }
    const t50s = ramps.map((r) => r.t50);
    return { rising: ref.rising, ramps, corners, t50Min: Math.min(...t50s), t50Max: Math.max(...t50s) };
  });
}

/** The exact envelope outline of a group's ramps over levels 0..1. */
export function bandOutline(group: EdgeGroup): Band {
  const levels = new Set<number>([0, 0.5, 1]);
  const rs = group.ramps;
  for (let i = 0; i < rs.length; i++) {
    for (let j = i + 1; j < rs.length; j++) {
      const a = rs[i]!;
      const b = rs[j]!;
      // t_a(v) = t_b(v), linear in v.
      const sa = a.rising ? a.transition : -a.transition;
      const sb = b.rising ? b.transition : -b.transition;
      if (sa === sb) continue;
      const v = 0.5 + (b.t50 - a.t50) / (sa - sb);
      if (v > 0 && v < 1) levels.add(v);
    }
  }
  const sorted = [...levels].sort((x, y) => x - y);
  const left = sorted.map((v): WavePoint => [Math.min(...rs.map((r) => crossingAt(r, v))), v]);
  const right = sorted.map((v): WavePoint => [Math.max(...rs.map((r) => crossingAt(r, v))), v]).reverse();
  return { outline: [...simplify(left), ...simplify(right)] };
}

/** Drops vertices that lie on the straight line through their neighbours. */
function simplify(path: readonly WavePoint[]): WavePoint[] {
  const out: WavePoint[] = [];
  for (let i = 0; i < path.length; i++) {
    const p = path[i]!;
    const a = out[out.length - 1];
    const b = path[i + 1];
    if (a && b && p[1] !== 0.5) {
      const cross = (p[0] - a[0]) * (b[1] - a[1]) - (p[1] - a[1]) * (b[0] - a[0]);
      if (Math.abs(cross) <= 1e-9 * Math.max(1e-12, Math.abs(b[0] - a[0]))) continue;
    }
    out.push(p);
  }
  return out;
}
