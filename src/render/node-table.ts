/**
 * The node voltages per phase state, as the review page lists them: every node the switches
 * connect (declared nodes and rails written in place), its level or range while each phase is
 * active and in the dead time, as written and in volts at the card's nominal supply, and the
 * switches on it.
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import type { Level } from '../schema/level.js';
import { extremeLevels, rangeHigh, rangeLow, type NodeLevels, type VoltageRange } from '../switches/nodes.js';

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

/** A range as written ("vdd", "1.6vdd .. 2vdd"; a dead-time default by its ends at the supply) and in volts at that supply. */
export function rangeText(range: VoltageRange, vdd: number): string {
  const { min, max } = extremeLevels(range, vdd);
  const a = rangeLow(range, vdd);
  const b = rangeHigh(range, vdd);
  const written = b - a > 1e-9 ? `${levelText(min)} .. ${levelText(max)}` : levelText(min);
  if (min.scale === 0 && max.scale === 0) return written;
  return `${written} (${b - a > 1e-9 ? `${a.toFixed(2)} .. ${b.toFixed(2)} V` : `${a.toFixed(2)} V`})`;
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
    head: ['node', labels[0], labels[1], labels[2].replace(/^the /, ''), 'switches'],
    rows: [
      ...[...nodes.values()].map(({ node, switches }) => ({
        cells: [node.rail ? `${node.name} (rail)` : node.name, ...node.states.map((s) => rangeText(s, vdd)), switches.join(', ')],
      })),
      ...unused.map((n) => ({ cells: [n, '', '', '', 'no switch'] })),
    ],
  };
}
