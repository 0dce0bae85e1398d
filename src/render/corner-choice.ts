/** Which corner a command draws: a corner name, `worst` (the corner of the limiting check) or `all`. */
import type { CornerResult } from '../analysis/evaluate.js';
import { limitingCheck } from '../analysis/evaluate.js';
import { inputError } from '../errors.js';
import { namesCorner } from '../process/corners.js';

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
  throw inputError(flag, value, `is not a corner of this design; allowed: worst, ${allowAll ? 'all, ' : ''}or one of ${names}`);
}
