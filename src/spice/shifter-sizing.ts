/**
 * The input ramp a deck's level shifter is sized for (its sizing is in
 * src/switches/shifter-sizing.ts, shared with the model): each gate net's transition at the card's
 * nominal corner as the model has it.
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import { evaluateCorner } from '../analysis/evaluate.js';
import { CycleIndex } from '../measure/phases.js';
import { nominalCorner } from '../switches/shifter-sizing.js';

/**
 * Full-swing transition of each gate net at the card's nominal corner as the model has it (mean of
 * both edges), s: the input ramp a shifter on that net is sized for. Null when the model finds no
 * steady state there.
 */
export function nominalTransitions(resolved: ResolvedDesign, duty: number): ((net: string) => number) | null {
  const result = evaluateCorner(resolved, nominalCorner(resolved.card, duty));
  if (!result.measurement.ok) return null;
  const cycles = new CycleIndex(result.simulation, resolved.netlist);
  return (net) => {
    const cycle = cycles.cycle(net);
    return typeof cycle === 'string' ? 0 : (cycle.riseTransition + cycle.fallTransition) / 2;
  };
}
