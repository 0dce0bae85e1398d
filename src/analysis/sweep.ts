/**
 * Sweep grids: axes with value lists or START:STOP:N ranges, their cartesian product walked by
 * index (nothing is materialised, so any grid size runs in flat memory), and one summary row per
 * point: the worst case over the corners the point leaves.
 */
import { inputError } from '../errors.js';
import { PREFIXES } from '../units/quantity.js';
import type { CornerResult } from './evaluate.js';
import { limitingCheck } from './evaluate.js';
import type { ResolvedDesign } from './resolve.js';
import { circuitCheckNames } from '../checks/circuit-checks.js';

export const CORNER_AXES = ['process', 'vdd', 'temperature', 'duty'] as const;

export interface SweepAxis {
  /** A corner axis or a design path such as clock.frequency or switches[0].w. */
  readonly path: string;
  /** Values as --set would take them (strings for lists, SI numbers for ranges). */
  readonly values: readonly (string | number)[];
}

/** A range end: a number with an optional SI prefix and unit, e.g. 1.6V, 10MHz, -40C, 20fF. */
export function parseRangeNumber(text: string): number | null {
  const m = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*([fpnuµmkMG]?)([A-Za-z°]*)$/.exec(text.trim());
  if (!m) return null;
  let prefix = m[2] ?? '';
  let unit = m[3] ?? '';
  // A lone prefix letter with no unit after it is taken as the prefix ("5m" = 5e-3).
  if (prefix === '' && unit.length === 1 && unit in PREFIXES && unit !== 'm') {
    prefix = unit;
    unit = '';
  }
  const scale = PREFIXES[prefix];
  return scale === undefined ? null : Number(m[1]) * scale;
}

/** Parses one `--vary AXIS=VALUES` argument; a range longer than `maxPoints` is refused before it is expanded. */
export function parseAxis(spec: string, maxPoints = Infinity): SweepAxis {
  const eq = spec.indexOf('=');
  if (eq <= 0)
    throw inputError('option.invalid', ['--vary'], spec, 'must read AXIS=VALUES, with VALUES a list (1.6,1.7,1.8) or a range START:STOP:N');
  const path = spec.slice(0, eq).trim();
  const text = spec.slice(eq + 1).trim();
  const range = /^([^:,]+):([^:,]+):([^:,]+)$/.exec(text);
  if (range) {
    const start = parseRangeNumber(range[1]!);
    const stop = parseRangeNumber(range[2]!);
    const n = Number(range[3]);
    if (start === null || stop === null)
      throw inputError(
        'option.invalid',
        ['--vary', path],
        text,
        'has a range end that is not a number (an SI prefix and unit may follow, e.g. 1.6V:2.0V:5)',
      );
    if (!Number.isInteger(n) || n < 1)
      throw inputError(
        'option.invalid',
        ['--vary', path],
        text,
        `asks for ${range[3]} points; N must be a whole number of at least 1 (the range is empty otherwise)`,
      );
    if (n > maxPoints)
      throw inputError(
        'option.invalid',
        ['--vary', path],
        text,
        `asks for ${range[3]} points; a sweep has at most ${maxPoints} points (N from 1 to ${maxPoints})`,
      );
    if (n === 1 && start !== stop)
      throw inputError('option.invalid', ['--vary', path], text, 'has one point but two different ends; use N >= 2 or equal ends');
    const values = Array.from({ length: n }, (_, i) => (n === 1 ? start : start + ((stop - start) * i) / (n - 1)));
    return { path, values: values.map((v) => Number(v.toPrecision(12))) };
  }
  const values = text.split(',').map((v) => v.trim());
  if (values.length > maxPoints)
    throw inputError('option.invalid', ['--vary', path], `${values.length} values`, `is too long; a sweep has at most ${maxPoints} points`);
  if (text === '' || values.some((v) => v === ''))
    throw inputError('option.invalid', ['--vary', path], text, 'is an empty list or has an empty item; give values separated by commas');
  return { path, values };
}

export function gridSize(axes: readonly SweepAxis[]): number {
  return axes.reduce((n, a) => n * a.values.length, 1);
}

/** Refuses a grid of more than `maxPoints` points, naming every axis and its length. */
export function checkGridSize(axes: readonly SweepAxis[], maxPoints: number): number {
  const size = gridSize(axes);
  if (size > maxPoints) {
    throw inputError(
      'option.invalid',
      ['--vary'],
      axes.map((a) => `${a.path} (${a.values.length})`).join(' x '),
      `makes ${size} points; a sweep has at most ${maxPoints} points`,
    );
  }
  return size;
}

/** The axis values of grid point `index` (last axis fastest). */
export function gridPoint(axes: readonly SweepAxis[], index: number): Array<string | number> {
  const out = new Array<string | number>(axes.length);
  let rest = index;
  for (let a = axes.length - 1; a >= 0; a--) {
    const values = axes[a]!.values;
    out[a] = values[rest % values.length]!;
    rest = Math.floor(rest / values.length);
  }
  return out;
}

/** The `--set` overrides that realise a grid point. */
export function pointOverrides(axes: readonly SweepAxis[], values: readonly (string | number)[]): string[] {
  return axes.map((axis, i) => {
    const v = values[i]!;
    const scalar = typeof v === 'number' ? String(v) : v;
    return (CORNER_AXES as readonly string[]).includes(axis.path) ? `corners.${axis.path}=[${scalar}]` : `${axis.path}=${scalar}`;
  });
}

export interface SweepRow {
  readonly index: number;
  readonly point: readonly (string | number)[];
  readonly corners: number;
  readonly verdict: 'pass' | 'fail';
  /** Its margin is in volts for the switch bias kinds (off-state, on-state, stress), else seconds. */
  readonly limiting: { readonly corner: string; readonly check: string; readonly kind: string; readonly margin: number | null } | null;
  /** Per dead time (in the generator's order): min and max t50 and min gap over the corners, s. */
  readonly deadTimes: ReadonlyArray<{ readonly label: string; readonly min: number; readonly max: number; readonly gapMin: number }>;
  /** Smallest width per phase over the corners, s. */
  readonly widths: ReadonlyArray<{ readonly phase: string; readonly min: number }>;
  /** Worst margin per check (in check order), s; null when unmeasurable. */
  readonly checks: ReadonlyArray<{ readonly name: string; readonly kind: string; readonly margin: number | null }>;
}

/** Worst case of a point over its corners. */
export function summarizePoint(index: number, point: readonly (string | number)[], results: readonly CornerResult[]): SweepRow {
  const deadTimes: Array<{ label: string; min: number; max: number; gapMin: number }> = [];
  const widths = new Map<string, number>();
  const checks: Array<{ name: string; kind: string; margin: number | null }> = [];
  for (const r of results) {
    const m = r.measurement;
    if (m.ok) {
      m.deadTimes.forEach((d, k) => {
        deadTimes[k] ??= { label: `${d.from}->${d.to}`, min: Infinity, max: -Infinity, gapMin: Infinity };
        const slot = deadTimes[k];
        slot.min = Math.min(slot.min, d.t50);
        slot.max = Math.max(slot.max, d.t50);
        slot.gapMin = Math.min(slot.gapMin, d.gap);
      });
      for (const [phase, w] of Object.entries(m.widths)) widths.set(phase, Math.min(widths.get(phase) ?? Infinity, w));
    }
    // By name: a corner that does not settle has other checks than one that does.
    for (const c of r.checks) {
      const slot = checks.find((x) => x.name === c.name);
      if (!slot) checks.push({ name: c.name, kind: c.kind, margin: c.margin });
      else if (slot.margin !== null && (c.margin === null || c.margin < slot.margin)) slot.margin = c.margin;
    }
  }
  const lim = limitingCheck(results);
  return {
    index,
    point,
    corners: results.length,
    verdict: results.every((r) => r.pass) ? 'pass' : 'fail',
    limiting: lim ? { corner: lim.corner, check: lim.check, kind: lim.kind, margin: lim.margin } : null,
    deadTimes,
    widths: [...widths.entries()].map(([phase, min]) => ({ phase, min })),
    checks,
  };
}

/** The columns a sweep row of a design can fill: dead-time labels, phases with a width, check names. */
export interface SweepColumns {
  readonly deadTimes: readonly string[];
  readonly widths: readonly string[];
  readonly checks: readonly string[];
  /** The checks among `checks` whose margin is in volts (switch bias, circuit output and ripple). */
  readonly voltChecks: readonly string[];
  /** The checks among `checks` whose margin is in coulombs (circuit lost charge). */
  readonly chargeChecks: readonly string[];
  /** The checks among `checks` whose margin is a fraction (circuit efficiency); the rest are in seconds. */
  readonly fractionChecks: readonly string[];
}

/**
 * Every quantity and check a corner of this design can produce, in evaluation order (the names
 * follow src/checks/requirements.ts and switch-checks.ts). The periodic-steady-state check has no
 * margin and is left out: a point that does not settle says so in its verdict and limiting check.
 */
export function sweepColumns(resolved: ResolvedDesign): SweepColumns {
  const source = resolved.netlist.source;
  const [a, b] = source.phases;
  const req = resolved.design.requirements;
  const labels = resolved.labels;
  const widthNets = [a, b, ...Object.values(source.early)];
  const checks = [labels.overlap];
  for (let k = 0; k < 2; k++) {
    if (req.deadTime?.min !== undefined) checks.push(labels.deadMin[k]!);
    if (req.deadTime?.max !== undefined) checks.push(labels.deadMax[k]!);
    if (req.gap?.min !== undefined) checks.push(labels.gapMin[k]!);
  }
  if (req.width?.min !== undefined) checks.push(...widthNets.map((n) => labels.widthMin[n] ?? `width ${n}`));
  checks.push(...resolved.switchCheckNames);
  const voltChecks = resolved.biasNames.flatMap((n) => (n ? [n.off, n.on, n.stress] : []));
  const circuit = resolved.design.circuit;
  const names = circuit ? circuitCheckNames(circuit.requirements, circuit.output) : {};
  const defined = (list: ReadonlyArray<string | undefined>) => list.filter((n): n is string => n !== undefined);
  const circuitVolt = defined([names.outputMin, names.outputMax, names.ripple]);
  const fractionChecks = defined([names.efficiency]);
  const chargeChecks = defined([names.lostCharge]);
  checks.push(...defined([names.outputMin, names.outputMax, names.ripple, names.efficiency, names.lostCharge]), ...voltChecks);
  return {
    deadTimes: [`${a}->${b}`, `${b}->${a}`],
    widths: widthNets,
    checks,
    voltChecks: [...circuitVolt, ...voltChecks],
    chargeChecks,
    fractionChecks,
  };
}

/** The union of column sets, each name once, in first-seen order. */
export function mergeColumns(sets: readonly SweepColumns[]): SweepColumns {
  const union = (pick: (c: SweepColumns) => readonly string[]) => [...new Set(sets.flatMap(pick))];
  return {
    deadTimes: union((c) => c.deadTimes),
    widths: union((c) => c.widths),
    checks: union((c) => c.checks),
    voltChecks: union((c) => c.voltChecks),
    chargeChecks: union((c) => c.chargeChecks),
    fractionChecks: union((c) => c.fractionChecks),
  };
}
