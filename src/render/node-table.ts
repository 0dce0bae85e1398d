/**
 * The node voltages per phase state, as the review page lists them: every node the switches
 * connect (declared nodes and rails written in place), its level or range while each phase is
 * active and in the dead time, as written and in volts at the card's nominal supply, and the
 * switches on it.
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import type { Level } from '../schema/level.js';
import { rangeHigh, rangeLow, type NodeLevels, type VoltageRange } from '../switches/nodes.js';

export interface NodeTable {
  readonly head: readonly string[];
  readonly rows: ReadonlyArray<{ readonly cells: readonly string[] }>;
}

/** A level as a designer writes it: 0 V, 1.2 V, vdd, 2vdd, vdd+0.5 V. */
export function levelText(level: Level): string {
  if (level.scale === 0) return `${Number(level.offset.toFixed(4))} V`;
  const base = level.scale === 1 ? 'vdd' : `${Number(level.scale.toFixed(4))}vdd`;
  if (level.offset === 0) return base;
  return `${base}${level.offset > 0 ? '+' : '-'}${Number(Math.abs(level.offset).toFixed(4))} V`;
}

function unique(levels: readonly Level[]): Level[] {
  return levels.filter((l, i) => levels.findIndex((m) => m.scale === l.scale && m.offset === l.offset) === i);
}

/** A range as written ("vdd", "1.6vdd .. 2vdd", "0 V .. vdd") and in volts at a supply. */
export function rangeText(range: VoltageRange, vdd: number): string {
  const lo = unique(range.lo);
  const hi = unique(range.hi);
  const same = lo.length === 1 && hi.length === 1 && lo[0]!.scale === hi[0]!.scale && lo[0]!.offset === hi[0]!.offset;
  const pick = (levels: Level[], low: boolean) => (levels.length === 1 ? levelText(levels[0]!)
    : (low ? 'least of ' : 'most of ') + levels.map(levelText).join(', '));
  const written = same ? levelText(lo[0]!) : `${pick(lo, true)} .. ${pick(hi, false)}`;
  const a = rangeLow(range, vdd);
  const b = rangeHigh(range, vdd);
  const volts = b - a > 1e-9 ? `${a.toFixed(2)} .. ${b.toFixed(2)} V` : `${a.toFixed(2)} V`;
  return written === volts || (same && lo[0]!.scale === 0) ? written : `${written} (${volts})`;
}

export function nodeTable(resolved: ResolvedDesign): NodeTable {
  const vdd = resolved.card.vddNominal;
  const nodes = new Map<string, { node: NodeLevels; switches: string[] }>();
  for (const plan of resolved.switches) {
    if (!plan.declared) continue;
    for (const t of plan.terminals) {
      const entry = nodes.get(t.name) ?? { node: t, switches: [] };
      if (!entry.switches.includes(plan.name)) entry.switches.push(plan.name);
      nodes.set(t.name, entry);
    }
  }
  const labels = resolved.bias.stateLabels;
  const unused = [...Object.keys(resolved.design.nodes)].filter((n) => !nodes.has(n));
  return {
    head: ['node', labels[0], labels[1], labels[2], 'switches'],
    rows: [
      ...[...nodes.values()].map(({ node, switches }) => ({
        cells: [node.rail ? `${node.name} (rail)` : node.name, ...node.states.map((s) => rangeText(s, vdd)), switches.join(', ')],
      })),
      ...unused.map((n) => ({ cells: [n, '', '', '', 'no switch'] })),
    ],
  };
}
