/**
 * Which corners a command works on. `worst` means the corner of the limiting check where one corner
 * is drawn, written or exported (`--corner`), and that corner plus the extremes of each dead time
 * where several are simulated (`--corners`).
 */
import { greatest, least } from 'd3-array';
import { inputError } from '../errors.js';
import type { Corner } from '../process/corner.js';
import { namesCorner } from '../process/corners.js';
import { evaluateAll, limitingCheck, type CornerResult } from './evaluate.js';
import type { ResolvedDesign } from './resolve.js';

/** Index of the corner holding the limiting check (the first corner when there are no checks). */
export function worstCornerIndex(results: readonly CornerResult[]): number {
  const limiting = limitingCheck(results);
  const index = limiting === null ? 0 : results.findIndex((r) => r.corner.name === limiting.corner);
  return Math.max(0, index);
}

export type CornerSelection = { readonly kind: 'corner'; readonly index: number } | { readonly kind: 'all'; readonly reference: number };

/** Reads `--corner`; `all` is allowed only where the caller says so. */
export function selectCorner(results: readonly CornerResult[], value: string, allowAll: boolean, flag = '--corner'): CornerSelection {
  if (value === 'worst') return { kind: 'corner', index: worstCornerIndex(results) };
  if (value === 'all' && allowAll) return { kind: 'all', reference: worstCornerIndex(results) };
  const index = results.findIndex((r) => namesCorner(value, r.corner));
  if (index >= 0) return { kind: 'corner', index };
  const names = results.map((r) => r.corner.name).join(', ');
  throw inputError(
    'reference.unknown',
    [flag],
    value,
    `is not a corner of this design; allowed: worst, ${allowAll ? 'all, ' : ''}or one of ${names}`,
  );
}

/** The name of the one corner `--corner` asks for: `worst` is the corner of the limiting check. */
export function oneCornerName(resolved: ResolvedDesign, value: string): string {
  return value === 'worst' ? resolved.corners[worstCornerIndex(evaluateAll(resolved))]!.corner.name : value;
}

/**
 * `worst` for a set of corners: for each dead time the corners with the smallest and the largest
 * value, plus the corner of the limiting check; in the design's corner order.
 */
export function worstCorners(resolved: ResolvedDesign): Corner[] {
  const results = evaluateAll(resolved);
  const picked = new Set<string>();
  const limiting = limitingCheck(results);
  if (limiting) picked.add(limiting.corner);
  const measured: Array<{ readonly name: string; readonly deadTimes: readonly { readonly t50: number }[] }> = [];
  for (const r of results) {
    if (r.measurement.ok) measured.push({ name: r.corner.name, deadTimes: r.measurement.deadTimes });
    else picked.add(r.corner.name);
  }
  for (const i of [0, 1]) {
    const lo = least(measured, (m) => m.deadTimes[i]!.t50);
    const hi = greatest(measured, (m) => m.deadTimes[i]!.t50);
    if (lo) picked.add(lo.name);
    if (hi) picked.add(hi.name);
  }
  return resolved.corners.map((c) => c.corner).filter((c) => picked.has(c.name));
}

/** Reads `--corners`: `all`, `worst` (see worstCorners) or corner names separated by commas. */
export function chooseCorners(resolved: ResolvedDesign, spec: string, flag = '--corners'): Corner[] {
  const all = resolved.corners.map((c) => c.corner);
  if (spec === 'all') return all;
  if (spec === 'worst') return worstCorners(resolved);
  const names = spec
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
  if (names.length === 0)
    throw inputError('option.invalid', [flag], spec, 'names no corner; give worst, all, or corner names separated by commas');
  return names.map((name) => {
    const corner = all.find((c) => namesCorner(name, c));
    if (!corner)
      throw inputError(
        'reference.unknown',
        [flag],
        name,
        `is not a corner of the design; its corners are ${all.map((c) => c.name).join(', ')}`,
      );
    return corner;
  });
}
