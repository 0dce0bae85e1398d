/** Which of a design's corners to simulate: `all`, `worst` (the extremes the model finds), or names. */
import { inputError } from '../errors.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { evaluateAll, limitingCheck } from '../analysis/evaluate.js';
import type { Corner } from '../process/corner.js';
import { namesCorner } from '../process/corners.js';

/**
 * `worst`: for each dead time the corners with the smallest and the largest value, plus the corner
 * of the limiting check; in the design's corner order.
 */
export function worstCorners(resolved: ResolvedDesign): Corner[] {
  const results = evaluateAll(resolved);
  const picked = new Set<string>();
  const limiting = limitingCheck(results);
  if (limiting) picked.add(limiting.corner);
  for (const i of [0, 1]) {
    let lo: string | undefined; let hi: string | undefined;
    let loV = Infinity; let hiV = -Infinity;
    for (const r of results) {
      if (!r.measurement.ok) { picked.add(r.corner.name); continue; }
      const v = r.measurement.deadTimes[i]!.t50;
      if (v < loV) { loV = v; lo = r.corner.name; }
      if (v > hiV) { hiV = v; hi = r.corner.name; }
    }
    if (lo) picked.add(lo);
    if (hi) picked.add(hi);
  }
  return resolved.corners.map((c) => c.corner).filter((c) => picked.has(c.name));
}

export function chooseCorners(resolved: ResolvedDesign, spec: string, flag = '--corners'): Corner[] {
  const all = resolved.corners.map((c) => c.corner);
  if (spec === 'all') return all;
  if (spec === 'worst') return worstCorners(resolved);
  const names = spec.split(',').map((s) => s.trim()).filter((s) => s !== '');
  if (names.length === 0) throw inputError(flag, spec, 'names no corner; give worst, all, or corner names separated by commas');
  return names.map((name) => {
    const corner = all.find((c) => namesCorner(name, c));
    if (!corner) throw inputError(flag, name, `is not a corner of the design; its corners are ${all.map((c) => c.name).join(', ')}`);
    return corner;
  });
}
