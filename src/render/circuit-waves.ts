/**
 * What the timing diagram shows of the circuit: the output and every capacitor plate that is a
 * circuit node, over one period of the periodic steady state, on the diagram's time base (s from
 * the start of the reported period), and the stretches where a charge packet lifts the output.
 */
import type { CornerResult } from '../analysis/evaluate.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { wrapTime } from '../measure/wrap-time.js';

export interface NodeTrace {
  /** Node name as the design file writes it. */
  readonly node: string;
  readonly role: 'output' | 'plate';
  /** Which capacitor plates the node is, e.g. "c_fly top plate"; "output" for the output. */
  readonly note: string;
  /** [s from the window start, V], ascending in time from 0 to the period (both ends included). */
  readonly points: ReadonlyArray<readonly [number, number]>;
  /** Least, greatest and time-averaged voltage over the period, V. */
  readonly min: number;
  readonly max: number;
  readonly mean: number;
}

/** A stretch in which the output moves away from ground: charge arriving from the pump. */
export interface ChargePacket {
  /** s from the window start; end may pass the period (it wraps). */
  readonly start: number;
  readonly end: number;
  /** Output change over the stretch, V (signed like the output). */
  readonly rise: number;
}

export interface CircuitWaves {
  readonly corner: string;
  readonly period: number;
  readonly nodes: readonly NodeTrace[];
  /** Mean output and its peak-to-peak ripple, V (the solver's figures). */
  readonly output: number;
  readonly ripple: number;
  readonly packets: readonly ChargePacket[];
}

/** Nodes drawn: the output, then each capacitor's plates that are circuit nodes, in file order. */
function drawnNodes(resolved: ResolvedDesign, solved: readonly string[]): Array<{ node: string; role: NodeTrace['role']; note: string }> {
  const spec = resolved.design.circuit!;
  const out: Array<{ node: string; role: NodeTrace['role']; note: string }> = [{ node: spec.output, role: 'output', note: 'output' }];
  const notes = new Map<string, string[]>();
  for (const c of spec.capacitors) {
    c.between.forEach((t, k) => {
      const name = typeof t === 'string' ? t.trim() : '';
      if (name === spec.output || !solved.includes(name)) return;
      if (!notes.has(name)) notes.set(name, []);
      notes.get(name)!.push(`${c.name} ${k === 0 ? 'top' : 'bottom'} plate`);
    });
  }
  for (const [node, list] of notes) out.push({ node, role: 'plate', note: list.join(', ') });
  return out;
}

/**
 * The reference corner's steady period as drawn waveforms; null when the design has no circuit
 * or that corner has no circuit figures (its generator did not settle).
 */
export function circuitWaves(resolved: ResolvedDesign, result: CornerResult): CircuitWaves | null {
  const c = result.circuit;
  if (!resolved.design.circuit || !c) return null;
  const period = result.simulation.period;
  const t = c.trace;
  const n = c.nodes.length;
  const count = t.times.length - 1;
  const offset = wrapTime(c.start - result.simulation.windowStart, period);
  // Samples of one period (the last boundary repeats the first), rotated to start at the window start.
  const order = Array.from({ length: count }, (_, k) => k)
    .map((k) => ({ k, at: wrapTime(offset + t.times[k]!, period) }))
    .sort((a, b) => a.at - b.at || a.k - b.k);
  const nodes = drawnNodes(resolved, c.nodes).map(({ node, role, note }) => {
    const i = c.nodes.indexOf(node);
    const samples = order.map(({ k, at }) => [at, t.voltages[k * n + i]!] as const);
    const first = samples[0]!;
    const last = samples[samples.length - 1]!;
    // The value at the period boundary, on the straight line from the last sample to the first one a period later.
    const span = first[0] + period - last[0];
    const edge = span > 0 ? last[1] + ((first[1] - last[1]) * (period - last[0])) / span : first[1];
    const points: Array<readonly [number, number]> = [];
    if (first[0] > 0) points.push([0, edge]);
    points.push(...samples);
    points.push([period, first[0] > 0 ? edge : first[1]]);
    let min = Infinity;
    let max = -Infinity;
    let area = 0;
    for (let p = 0; p < points.length; p++) {
      const [x, v] = points[p]!;
      if (v < min) min = v;
      if (v > max) max = v;
      if (p > 0) area += ((v + points[p - 1]![1]) / 2) * (x - points[p - 1]![0]);
    }
    const mean = role === 'output' ? c.output : area / period;
    return { node, role, note, points, min, max, mean };
  });
  return {
    corner: result.corner.name,
    period,
    nodes,
    output: c.output,
    ripple: c.ripple,
    packets: chargePackets(nodes[0]!.points, c.ripple, Math.sign(c.output) || 1),
  };
}

/**
 * Runs of samples in which the output moves away from ground by more than 2 % of the ripple per
 * step; a run that crosses the period's end is joined with the one at its start.
 */
export function chargePackets(points: ReadonlyArray<readonly [number, number]>, ripple: number, sign: number): ChargePacket[] {
  const threshold = ripple * 0.02;
  const runs: Array<{ a: number; b: number }> = [];
  let open: { a: number; b: number } | null = null;
  for (let p = 1; p < points.length; p++) {
    const up = sign * (points[p]![1] - points[p - 1]![1]) > threshold && points[p]![0] > points[p - 1]![0];
    if (up) open = open ? { a: open.a, b: p } : { a: p - 1, b: p };
    else if (open) {
      runs.push(open);
      open = null;
    }
  }
  if (open) runs.push(open);
  if (runs.length === 0 || ripple <= 0) return [];
  const period = points[points.length - 1]![0];
  const first = runs[0]!;
  const last = runs[runs.length - 1]!;
  const packets = runs.map((r) => ({ start: points[r.a]![0], end: points[r.b]![0], rise: points[r.b]![1] - points[r.a]![1] }));
  if (runs.length > 1 && last.b === points.length - 1 && first.a === 0) {
    const joined = {
      start: packets[packets.length - 1]!.start,
      end: period + packets[0]!.end,
      rise: packets[packets.length - 1]!.rise + packets[0]!.rise,
    };
    return [...packets.slice(1, -1), joined];
  }
  return packets;
}
