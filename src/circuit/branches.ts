/**
 * The network in one configuration (an interval's gate states and a segment per piecewise-linear
 * part) as branches: each an affine current I = c1 V[j1] + c2 V[j2] + k flowing from node f to
 * node t. The same list stamps the state equations and integrates the charge each part passes.
 */
import type { CircuitModel } from './model.js';

export const SWITCH = 0;
export const CHANNEL = 1;
export const DIODE = 2;
export const LOAD = 3;
/** A switch's gate charge drawn at its turn-on (injection.ts), from ground. */
export const INJECTION = 4;
export type BranchTag = typeof SWITCH | typeof CHANNEL | typeof DIODE | typeof LOAD | typeof INJECTION;

export interface Branch {
  readonly f: number;
  readonly t: number;
  readonly j1: number;
  readonly c1: number;
  /** -1 when the current depends on one voltage only. */
  readonly j2: number;
  readonly c2: number;
  readonly k: number;
  readonly tag: BranchTag;
  /** Index of the part within its kind. */
  readonly part: number;
  /** Segment of a piecewise-linear part (0 off, 1 or 2 conducting), 0 otherwise. */
  readonly segment: number;
}

/** Piecewise-linear parts: the channels, then the diodes. */
export function pwlCount(model: CircuitModel): number {
  return model.channels.length + model.diodes.length;
}

/** A part turns on only this far past its onset, V: a node resting exactly at a diode's drop stays off instead of chattering. */
export const ONSET_MARGIN = 1e-6;

/** The segment each piecewise-linear part takes for node voltages v (circuit nodes then rails), in interval `interval`. */
export function chooseSegments(model: CircuitModel, interval: number, v: ArrayLike<number>, out: Uint8Array): Uint8Array {
  const on = model.intervals[interval]!.on;
  const channels = model.channels;
  for (let i = 0; i < channels.length; i++) {
    const c = channels[i]!;
    if (on[c.switchIndex] === 1) {
      out[i] = 0;
      continue;
    }
    const va = v[c.a]!;
    const vb = v[c.b]!;
    if (c.polarity === 'p') {
      const high = va >= vb;
      out[i] = (high ? va : vb) - c.gate - c.vt > ONSET_MARGIN ? (high ? 1 : 2) : 0;
    } else {
      const low = va <= vb;
      out[i] = c.gate - c.vt - (low ? va : vb) > ONSET_MARGIN ? (low ? 1 : 2) : 0;
    }
  }
  const base = channels.length;
  for (let i = 0; i < model.diodes.length; i++) {
    const d = model.diodes[i]!;
    out[base + i] = v[d.a]! - v[d.b]! > d.drop + ONSET_MARGIN ? 1 : 0;
  }
  return out;
}

export function branchesFor(model: CircuitModel, interval: number, segments: Uint8Array, extra: readonly Branch[] = []): Branch[] {
  const branches: Branch[] = [...extra];
  const { on, g: drive } = model.intervals[interval]!;
  model.switches.forEach((s, i) => {
    const gOn = drive ? drive[i]! : s.gOn;
    const g = on[i] === 1 && gOn > 0 ? gOn : s.gOff;
    if (g > 0) branches.push({ f: s.a, t: s.b, j1: s.a, c1: g, j2: s.b, c2: -g, k: 0, tag: SWITCH, part: i, segment: 0 });
  });
  model.channels.forEach((c, i) => {
    const seg = segments[i]!;
    if (seg === 0) return;
    const source = seg === 1 ? c.a : c.b;
    const drain = seg === 1 ? c.b : c.a;
    if (c.polarity === 'p')
      branches.push({
        f: source,
        t: drain,
        j1: source,
        c1: c.g,
        j2: -1,
        c2: 0,
        k: -c.g * (c.gate + c.vt),
        tag: CHANNEL,
        part: i,
        segment: seg,
      });
    else
      branches.push({
        f: drain,
        t: source,
        j1: source,
        c1: -c.g,
        j2: -1,
        c2: 0,
        k: c.g * (c.gate - c.vt),
        tag: CHANNEL,
        part: i,
        segment: seg,
      });
  });
  const base = model.channels.length;
  model.diodes.forEach((d, i) => {
    const seg = segments[base + i]!;
    const g = seg === 1 ? d.gOn : d.gOff;
    if (g > 0)
      branches.push({ f: d.a, t: d.b, j1: d.a, c1: g, j2: d.b, c2: -g, k: seg === 1 ? -g * d.drop : 0, tag: DIODE, part: i, segment: seg });
  });
  const ground = model.nodes.length;
  if (model.loadConductance > 0) {
    branches.push({
      f: model.output,
      t: ground,
      j1: model.output,
      c1: model.loadConductance,
      j2: -1,
      c2: 0,
      k: 0,
      tag: LOAD,
      part: 0,
      segment: 0,
    });
  }
  if (model.loadCurrent !== 0)
    branches.push({ f: model.output, t: ground, j1: -1, c1: 0, j2: -1, c2: 0, k: model.loadCurrent, tag: LOAD, part: 1, segment: 0 });
  return branches;
}

/**
 * Writes the rate equations dv/dt = G v + s of the circuit nodes (before the capacitance
 * inverse): g is n x n row-major, s length n; both are cleared first.
 */
export function stamp(model: CircuitModel, branches: readonly Branch[], g: Float64Array, s: Float64Array): void {
  const n = model.nodes.length;
  g.fill(0);
  s.fill(0);
  const add = (row: number, sign: number, b: Branch) => {
    if (row >= n) return;
    if (b.j1 >= 0) {
      if (b.j1 < n) g[row * n + b.j1]! += sign * b.c1;
      else s[row]! += sign * b.c1 * model.rails[b.j1 - n]!;
    }
    if (b.j2 >= 0) {
      if (b.j2 < n) g[row * n + b.j2]! += sign * b.c2;
      else s[row]! += sign * b.c2 * model.rails[b.j2 - n]!;
    }
    s[row]! += sign * b.k;
  };
  for (const b of branches) {
    add(b.f, -1, b);
    add(b.t, 1, b);
  }
}

/**
 * Charge a branch passes from f to t over a substep of length h, C, given the integrals of the
 * circuit node voltages over it (V s).
 */
export function branchCharge(model: CircuitModel, b: Branch, integrals: ArrayLike<number>, h: number): number {
  const n = model.nodes.length;
  const integral = (j: number) => (j < n ? integrals[j]! : model.rails[j - n]! * h);
  let q = b.k * h;
  if (b.j1 >= 0) q += b.c1 * integral(b.j1);
  if (b.j2 >= 0) q += b.c2 * integral(b.j2);
  return q;
}
