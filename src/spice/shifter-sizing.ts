/**
 * The input ramp a deck's level shifter is sized for (its sizing is in
 * src/switches/shifter-sizing.ts, shared with the model): each gate net's transition at the card's
 * nominal corner as the model has it, the same numbers the model's shifters are sized with
 * (src/analysis/shifter-sizes.ts).
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import { nominalGateTransitions } from '../analysis/shifter-sizes.js';

/**
 * Full-swing transition of each gate net at the card's nominal corner as the model has it (mean of
 * both edges), s: the input ramp a shifter on that net is sized for. Null when the model finds no
 * steady state there.
 */
export function nominalTransitions(resolved: ResolvedDesign): ((net: string) => number) | null {
  return nominalGateTransitions(resolved);
}
