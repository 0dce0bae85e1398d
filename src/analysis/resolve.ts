/** From a validated design and its process card to everything a run needs, computed once. */
import type { Design } from '../schema/design.js';
import type { ProcessCard } from '../schema/process.js';
import { expandCorners, type SourcedCorner } from '../process/corners.js';
import { compileNetlist, type CompiledNetlist } from '../netlist/netlist.js';
import { expandNetlist, expandTemplate } from '../netlist/template.js';
import { netLoads } from '../netlist/loads.js';
import type { DelayModel } from '../delay/model.js';
import { analyticModel } from '../delay/analytic.js';

export interface ResolvedDesign {
  readonly design: Design;
  readonly card: ProcessCard;
  readonly netlist: CompiledNetlist;
  /** Capacitance on every net, F. */
  readonly loads: Float64Array;
  readonly corners: readonly SourcedCorner[];
  readonly model: DelayModel;
}

export function resolveDesign(design: Design, card: ProcessCard, model: DelayModel = analyticModel): ResolvedDesign {
  const gen = design.generator;
  const netlist = compileNetlist(gen.template === 'netlist' ? expandNetlist(gen) : expandTemplate(gen));
  const loads = netLoads(netlist, card, { path: 'loads', caps: design.loads });
  const corners = expandCorners(design.corners, card, design.clock.duty);
  return { design, card, netlist, loads, corners, model };
}
