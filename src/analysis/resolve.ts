/** From a validated design and its process card to everything a run needs, computed once. */
import type { Design } from '../schema/design.js';
import type { ProcessCard } from '../schema/process.js';
import { expandCorners, type SourcedCorner } from '../process/corners.js';
import { compileNetlist, type CompiledNetlist } from '../netlist/netlist.js';
import { expandNetlist, expandTemplate } from '../netlist/template.js';
import { netLoads } from '../netlist/loads.js';
import type { DelayModel } from '../delay/model.js';
import { analyticModel } from '../delay/analytic.js';
import { checkLevelShifters, expandSwitches, type SwitchPlan } from '../switches/plan.js';
import { checkConstraintReferences } from '../switches/references.js';
import { requirementLabels, type RequirementLabels } from '../checks/requirements.js';
import { switchCheckLabels, type SwitchCheckLabels } from '../checks/switch-checks.js';
import { checkPhysicalLimits } from './physical-limits.js';
import { resolveNodes } from '../switches/nodes.js';
import { biasCheckNames, DEFAULT_OFF_DECADES, type BiasCheckNames, type BiasSettings } from '../checks/bias-checks.js';

export interface ResolvedDesign {
  readonly design: Design;
  readonly card: ProcessCard;
  /** The generator plus the switches' driver cells. */
  readonly netlist: CompiledNetlist;
  /** Capacitance on every net, F, switch gates included. */
  readonly loads: Float64Array;
  readonly corners: readonly SourcedCorner[];
  readonly switches: readonly SwitchPlan[];
  readonly model: DelayModel;
  /** Requirement values formatted once for check names. */
  readonly labels: RequirementLabels;
  /** Names of the switch constraint checks, in order. */
  readonly switchCheckNames: readonly string[];
  /** Names and subjects of the switch constraint checks, in order. */
  readonly switchCheckLabels: SwitchCheckLabels;
  /** Switch name -> its position in `switches`. */
  readonly switchIndex: ReadonlyMap<string, number>;
  /** Names of each switch's off-state, on-state and stress checks (null: none), and their settings. */
  readonly biasNames: ReadonlyArray<BiasCheckNames | null>;
  readonly bias: BiasSettings;
  /** What the checks cannot see in this design (undeclared terminals), for every report. */
  readonly warnings: readonly string[];
}

export function resolveDesign(design: Design, card: ProcessCard, model: DelayModel = analyticModel): ResolvedDesign {
  const gen = design.generator;
  const base = gen.template === 'netlist' ? expandNetlist(gen) : expandTemplate(gen);
  const expansion = expandSwitches(base, design.switches, card, resolveNodes(design.nodes));
  const netlist = compileNetlist(expansion.netlist);
  const loads = netLoads(netlist, card, { path: ['loads'], caps: design.loads }, { path: ['switches'], caps: expansion.loads });
  const corners = expandCorners(design.corners, card, design.clock.duty);
  checkPhysicalLimits(design, card, corners);
  checkLevelShifters(expansion.plans, [...new Set(corners.map((c) => c.corner.vdd))]);
  checkConstraintReferences(
    design.constraints,
    expansion.plans.map((p) => p.name),
  );
  const switchLabels = switchCheckLabels(
    design.constraints,
    design.requirements.guard,
    design.clock.dutyTolerance * (1 / design.clock.frequency),
  );
  return {
    design,
    card,
    netlist,
    loads,
    corners,
    switches: expansion.plans,
    model,
    labels: requirementLabels(design.requirements, netlist.source.phases, [
      ...netlist.source.phases,
      ...Object.values(netlist.source.early),
    ]),
    switchCheckNames: switchLabels.names,
    switchCheckLabels: switchLabels,
    switchIndex: new Map(expansion.plans.map((p, i) => [p.name, i])),
    biasNames: biasCheckNames(expansion.plans, card.n.ratings !== undefined && card.p.ratings !== undefined),
    bias: {
      offDecades: design.requirements.offDecades ?? DEFAULT_OFF_DECADES,
      offMargin: design.requirements.offMargin,
      stateLabels: [`phase ${base.phases[0]}`, `phase ${base.phases[1]}`, 'the dead time'],
    },
    warnings: expansion.warnings,
  };
}
