/**
 * Node voltages per phase state, resolved from the `nodes:` section: what each switch terminal
 * (and a bulk tied to a node) sees while phase 1 is active, while phase 2 is active and in the
 * dead times. A range is kept as lists of levels (its low end is the least of `lo` at the corner's
 * supply, its high end the greatest of `hi`), so a default dead-time range that spans both phases
 * stays exact at every supply.
 */
import { max, min } from 'd3-array';
import { inputError, type IssuePath } from '../errors.js';
import { levelAt, parseLevel, type Level } from '../schema/level.js';
import type { LevelRangeSpec, NodesSpec } from '../schema/nodes.js';

/** Phase states in order: phase 1 active, phase 2 active, dead time (both phases low). */
export const STATE_KEYS = ['phase1', 'phase2', 'dead'] as const;
export type StateIndex = 0 | 1 | 2;

export interface VoltageRange {
  readonly lo: readonly Level[];
  readonly hi: readonly Level[];
}

export interface NodeLevels {
  /** Node name, or the level as written for a fixed rail. */
  readonly name: string;
  /** A fixed level written in place (a rail), not a declared node. */
  readonly rail: boolean;
  /** Range in each phase state, in STATE_KEYS order. */
  readonly states: readonly [VoltageRange, VoltageRange, VoltageRange];
}

export function rangeLow(range: VoltageRange, vdd: number): number {
  return min(range.lo, (l) => levelAt(l, vdd)) ?? Infinity;
}

export function rangeHigh(range: VoltageRange, vdd: number): number {
  return max(range.hi, (l) => levelAt(l, vdd)) ?? -Infinity;
}

function rangeOf(spec: LevelRangeSpec): VoltageRange {
  return 'min' in spec ? { lo: [spec.min], hi: [spec.max] } : { lo: [spec], hi: [spec] };
}

/** The range from the lowest to the highest of several. */
export function hull(...ranges: readonly VoltageRange[]): VoltageRange {
  return { lo: ranges.flatMap((r) => r.lo), hi: ranges.flatMap((r) => r.hi) };
}

/** A node at one level or range in every phase state. */
export function fixedNode(name: string, range: VoltageRange, rail: boolean): NodeLevels {
  return { name, rail, states: [range, range, range] };
}

export function resolveNodes(spec: NodesSpec): ReadonlyMap<string, NodeLevels> {
  const nodes = new Map<string, NodeLevels>();
  for (const [name, node] of Object.entries(spec)) {
    if (parseLevel(name) !== null) {
      throw inputError(
        'value.invalid',
        ['nodes', name],
        name,
        'reads as a voltage level; name nodes so they cannot be taken for a rail (e.g. "top", "v_out")',
      );
    }
    if (typeof node === 'object' && 'phase1' in node) {
      const p1 = rangeOf(node.phase1);
      const p2 = rangeOf(node.phase2);
      // A node no switch drives in the dead time holds what it had: either phase's voltage.
      const dead = node.dead === undefined ? hull(p1, p2) : rangeOf(node.dead);
      nodes.set(name, { name, rail: false, states: [p1, p2, dead] });
    } else {
      nodes.set(name, fixedNode(name, rangeOf(node), false));
    }
  }
  return nodes;
}

/** A terminal or bulk as written: a declared node's name or a fixed level. */
export function resolveTerminal(raw: string | number, nodes: ReadonlyMap<string, NodeLevels>, path: IssuePath): NodeLevels {
  if (typeof raw === 'string') {
    const node = nodes.get(raw.trim());
    if (node) return node;
  }
  const level = parseLevel(raw);
  if (level) return fixedNode(String(raw), { lo: [level], hi: [level] }, true);
  const declared = [...nodes.keys()];
  throw inputError(
    'reference.unknown',
    path,
    raw,
    `is neither a node declared under \`nodes\` (${declared.length > 0 ? declared.join(', ') : 'none declared'}) nor a voltage level ("vdd", "2vdd", "0V")`,
  );
}

/** Lowest and highest level of a range at a nominal supply: the range as two levels for a single-supply view. */
export function extremeLevels(range: VoltageRange, vdd: number): { min: Level; max: Level } {
  const pick = (levels: readonly Level[], better: (a: number, b: number) => boolean) =>
    levels.reduce((best, l) => (better(levelAt(l, vdd), levelAt(best, vdd)) ? l : best));
  return { min: pick(range.lo, (a, b) => a < b), max: pick(range.hi, (a, b) => a > b) };
}
