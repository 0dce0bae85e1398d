/**
 * The delay model's edge shapes of one corner result's nets, for drawing: the model bound afresh at
 * the result's corner (no mismatch) over its own steady period, so the shapes hold however the
 * evaluator that made the result reuses its timing.
 */
import type { EdgeShape } from '../measure/levels.js';
import { modelEdgeShape } from '../measure/levels.js';
import { CycleIndex } from '../measure/phases.js';
import { devicesAtCorner } from '../process/device.js';
import type { CornerResult } from './evaluate.js';
import type { ResolvedDesign } from './resolve.js';

export function resultEdgeShape(resolved: ResolvedDesign, result: CornerResult): EdgeShape | undefined {
  const { netlist, loads, model, card } = resolved;
  const timing = model.bind(netlist, loads, devicesAtCorner(card, result.corner));
  return modelEdgeShape(new CycleIndex(result.simulation, netlist), netlist, timing);
}
