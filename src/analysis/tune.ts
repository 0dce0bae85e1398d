/**
 * Proposals for the delay chains of a template generator: the chain length (stages per feedback
 * chain), the stage size and the delay capacitor on every chain node that pass every check at
 * every corner (optionally with a headroom on every margin) with the least wasted dead time, i.e. the smallest largest dead time over the
 * corners (the dead time beyond what the fast corner needs is taken from the phase widths at the
 * slow corner).
 *
 * Proposals whose largest dead times differ by less than TIE_FRACTION are ranked by chain length
 * and then capacitor, the cheaper first.
 *
 * Search: for every chain length and stage size, the smallest delay capacitor that passes. More
 * capacitance only adds delay, so the checks that want delay (non-overlap, minimum dead time and
 * gap, break-before-make) pass from some capacitance up and the ones that want width (settling,
 * minimum width, maximum dead time) pass up to another: the passing loads are an interval, and
 * its lower end has the least dead time. A coarse scan finds the first passing load and a
 * bisection on whole load steps narrows it to the least passing step.
 */
import { inputError } from '../errors.js';
import type { Design } from '../schema/design.js';
import type { ProcessCard } from '../schema/process.js';
import type { DelayModel } from '../delay/model.js';
import { analyticModel } from '../delay/analytic.js';
import { resolveDesign } from './resolve.js';
import { evaluateAll, limitingCheck, type CornerResult, type Limiting } from './evaluate.js';
import { switchFaults, type SwitchFault } from '../checks/bias-checks.js';

export interface ChainKnobs {
  /** Inverters per feedback chain (even). */
  readonly stages: number;
  /** Size of every chain inverter, or one size per stage when the design lists them (kept as given). */
  readonly stageSize: number | readonly number[];
  /** Extra capacitance on every chain node, F. */
  readonly stageLoad: number;
}

export interface ChainCandidate {
  readonly knobs: ChainKnobs;
  /** Every check at every corner holds. */
  readonly pass: boolean;
  /** It passes with at least the asked headroom on every check. */
  readonly meets: boolean;
  /** Smallest and largest 50 % dead time over the corners and both handovers, s (NaN if a corner did not settle). */
  readonly deadMin: number;
  readonly deadMax: number;
  /** The check with the least margin over all corners. */
  readonly limiting: Limiting | null;
}

export interface TuneSpace {
  /** Chain lengths to try (even). */
  readonly stages: readonly number[];
  /** Stage sizes to try. */
  readonly stageSizes: readonly number[];
  /** Largest delay capacitor per node, F. */
  readonly maxLoad: number;
  /** Resolution of the capacitor, F; proposals are whole multiples of it. */
  readonly loadStep: number;
  /** Margin every check must keep beyond its requirement, s (0: just pass). */
  readonly headroom: number;
}

export interface TuneResult {
  /** The design as it stands. */
  readonly current: ChainCandidate;
  /** Passing proposals, the least wasted dead time first; at most one per chain length and stage size. */
  readonly proposals: readonly ChainCandidate[];
  /** When nothing passes: the searched candidate that came closest (largest least margin), and why. */
  readonly closest: ChainCandidate | null;
  readonly space: TuneSpace;
  /** Corner evaluations made. */
  readonly evaluations: number;
  /**
   * Switches whose off-state, on-state or stress check fails in the design as it stands. No delay
   * chain changes them, so when there are any the chains are not searched.
   */
  readonly faults: readonly SwitchFault[];
}

const fF = 1e-15;
/** Coarse scan of the delay capacitor before the bisection, F. */
const SCAN = [0, 1, 2, 5, 10, 20, 50, 100, 200, 500, 1000, 2000].map((c) => c * fF);
export const DEFAULT_MAX_STAGES = 16;
export const DEFAULT_LOAD_STEP = 0.5 * fF;
export const DEFAULT_MAX_LOAD = 500 * fF;

type TemplateGenerator = Extract<Design['generator'], { template: 'nand' | 'nor' }>;

function templateOf(design: Design): TemplateGenerator {
  const gen = design.generator;
  if (gen.template === 'netlist') {
    throw inputError('generator.template', 'netlist', 'is a free-form netlist; tune adjusts the delay chains of the nand or nor template');
  }
  return gen;
}

/** The chain lengths and sizes tried by default: even lengths from the early tap up, the design's own size and 1 and 2. */
export function defaultSpace(design: Design): TuneSpace {
  const gen = templateOf(design);
  const stages: number[] = [];
  for (let n = gen.earlyTap; n <= Math.max(DEFAULT_MAX_STAGES, gen.stages); n += 2) stages.push(n);
  const own = typeof gen.stageSize === 'number' ? [gen.stageSize] : [];
  return { stages, stageSizes: [...new Set([...own, 1, 2])], maxLoad: Math.max(DEFAULT_MAX_LOAD, gen.stageLoad), loadStep: DEFAULT_LOAD_STEP, headroom: 0 };
}

/**
 * Largest dead times within this fraction of the best count as equal, so that a shorter chain or a
 * smaller capacitor (less area and power) wins over a few picoseconds.
 */
export const TIE_FRACTION = 0.01;

/** Proposals best first: the least largest dead time (to TIE_FRACTION), then the shorter chain, then the smaller capacitor. */
function rank(proposals: ChainCandidate[]): ChainCandidate[] {
  if (proposals.length === 0) return proposals;
  const best = Math.min(...proposals.map((p) => p.deadMax));
  const bucket = (p: ChainCandidate) => Math.floor((p.deadMax - best) / (TIE_FRACTION * best));
  return proposals.sort((a, b) => bucket(a) - bucket(b) || a.knobs.stages - b.knobs.stages || a.knobs.stageLoad - b.knobs.stageLoad || a.deadMax - b.deadMax);
}

export function tuneChains(design: Design, card: ProcessCard, model: DelayModel = analyticModel, space: TuneSpace = defaultSpace(design)): TuneResult {
  const gen = templateOf(design);
  let evaluations = 0;
  const seen = new Map<string, ChainCandidate>();
  let first: readonly CornerResult[] = [];
  const evaluate = (knobs: ChainKnobs): ChainCandidate => {
    const key = `${knobs.stages}/${String(knobs.stageSize)}/${knobs.stageLoad}`;
    const known = seen.get(key);
    if (known) return known;
    const resolved = resolveDesign({ ...design, generator: { ...gen, ...knobs, stageSize: knobs.stageSize as TemplateGenerator['stageSize'] } }, card, model);
    const results = evaluateAll(resolved);
    if (seen.size === 0) first = results;
    evaluations += results.length;
    let deadMin = Infinity;
    let deadMax = -Infinity;
    for (const r of results) {
      const m = r.measurement;
      if (!m.ok) { deadMin = NaN; deadMax = NaN; break; }
      for (const d of m.deadTimes) {
        deadMin = Math.min(deadMin, d.t50);
        deadMax = Math.max(deadMax, d.t50);
      }
    }
    const pass = results.every((r) => r.pass);
    const limiting = limitingCheck(results);
    const meets = pass && (limiting === null || (limiting.margin !== null && limiting.margin >= space.headroom));
    const candidate: ChainCandidate = { knobs, pass, meets, deadMin, deadMax, limiting };
    seen.set(key, candidate);
    return candidate;
  };
  const current = evaluate({ stages: gen.stages, stageSize: gen.stageSize, stageLoad: gen.stageLoad });
  const faults = switchFaults(first.map((r) => ({ name: r.corner.name, checks: r.checks })));
  if (faults.length > 0) return { current, proposals: [], closest: null, space, evaluations, faults };
  const proposals: ChainCandidate[] = [];
  let closest: ChainCandidate | null = null;
  const consider = (c: ChainCandidate) => {
    const margin = c.limiting?.margin ?? -Infinity;
    if (closest === null || margin > (closest.limiting?.margin ?? -Infinity)) closest = c;
  };
  const step = space.loadStep;
  const scan = [...SCAN.filter((c) => c < space.maxLoad), space.maxLoad];
  for (const stages of space.stages) {
    if (stages % 2 !== 0 || stages < gen.earlyTap) continue;
    for (const size of space.stageSizes) {
      const at = (stageLoad: number) => evaluate({ stages, stageSize: size, stageLoad });
      let below = -1;
      let found: ChainCandidate | null = null;
      for (const load of scan) {
        const c = at(load);
        consider(c);
        if (c.meets) { found = c; break; }
        below = load;
      }
      if (!found) continue;
      if (below < 0) { proposals.push(found); continue; }
      // Bisect on whole steps between the last failing and the first passing load, keeping a
      // failing step below and a passing one above, so the answer is the least passing step.
      let lo = Math.floor(below / step);
      let hi = Math.ceil(found.knobs.stageLoad / step);
      if (at(lo * step).meets || !at(hi * step).meets) { proposals.push(found); continue; }
      while (hi - lo > 1) {
        const mid = Math.floor((lo + hi) / 2);
        if (at(mid * step).meets) hi = mid; else lo = mid;
      }
      proposals.push(at(hi * step));
    }
  }
  return { current, proposals: rank(proposals), closest: proposals.length > 0 ? null : closest, space, evaluations, faults };
}

/** The `--set` overrides that apply a proposal to the design file. */
export function proposalOverrides(knobs: ChainKnobs, formatLoad: (farads: number) => string): string[] {
  const size = typeof knobs.stageSize === 'number' ? String(knobs.stageSize) : `[${knobs.stageSize.join(',')}]`;
  return [`generator.stages=${knobs.stages}`, `generator.stageSize=${size}`, `generator.stageLoad=${formatLoad(knobs.stageLoad)}`];
}
