/**
 * Proposals for the delay chains of a template generator: the chain length (stages per feedback
 * chain), the stage size and the delay capacitor on every chain node that pass every check at
 * every corner with a headroom on every margin, with the least wasted dead time, i.e. the smallest
 * largest dead time over the corners (the dead time beyond what the fast corner needs is taken from
 * the phase widths at the slow corner).
 *
 * The headroom is a fixed time, or by default what a proposal needs to survive the model's error
 * and mismatch: the model's error band (its gapBand, a fraction of the dead time, taken of the
 * candidate's largest dead time so that it covers every corner) plus z sigma, sigma the spread of
 * the least margin per die in a short seeded Monte Carlo at the candidate's limiting corners and
 * z = Φ⁻¹(minYield) (3 without one). The search runs again with that headroom until the proposal
 * it finds keeps the headroom its own Monte Carlo asks for.
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
import { VOLTAGE_KINDS, type Check } from '../checks/check.js';
import { chunkPlan, runChunk } from './montecarlo.js';
import { normalQuantile } from '../variation/normal-quantile.js';
import type { ResolvedDesign } from './resolve.js';

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
  /** Every failing check and the corners where it fails (empty when it passes). */
  readonly failing: readonly FailingCheck[];
  /** The headroom this candidate was held to (automatic headroom: set on proposals only). */
  readonly headroom: Headroom | null;
}

export interface FailingCheck {
  readonly check: string;
  readonly kind: Check['kind'];
  /** Corners where it fails, the least margin first (stable: corner order among equals). */
  readonly corners: readonly string[];
  /** Its least margin over those corners (s, or V for the switch bias kinds; null: unmeasurable). */
  readonly worst: number | null;
}

/** The automatic headroom: the model's error band plus z sigma of mismatch. */
export interface AutoHeadroom {
  /** Sigmas of mismatch to cover. */
  readonly z: number;
  /** Monte Carlo dies per limiting corner. */
  readonly dies: number;
  /** Limiting corners (least margins) the Monte Carlo runs at. */
  readonly corners: number;
  readonly seed: number;
}

/** The headroom a candidate is held to. */
export interface Headroom {
  /** The model's error band on the candidate's largest dead time, s. */
  readonly band: number;
  /** Largest sigma of the least margin per die over the Monte Carlo corners, s (0 with a fixed headroom). */
  readonly sigma: number;
  readonly z: number;
  /** band + z sigma, or the fixed headroom, s. */
  readonly total: number;
  /** Corners the Monte Carlo ran at. */
  readonly corners: readonly string[];
  readonly dies: number;
}

/** Requirements no searched chain can meet together. */
export interface Conflict {
  /** Requirement ends, s. */
  readonly min: number;
  readonly max: number;
  /** Largest over smallest dead time over the corners of the closest candidate, and the least of any settled searched candidate. */
  readonly spread: number;
  readonly leastSpread: number;
}

/** Why nothing passes. */
export interface Diagnosis {
  /** The closest candidate's failing checks. */
  readonly failing: readonly FailingCheck[];
  /** The dead-time minimum and maximum conflict: the corner spread of every searched chain exceeds max/min. */
  readonly conflict: Conflict | null;
  /** Whether a wider search (more stages or load) can help: only checks that want more delay fail, and no conflict. */
  readonly widen: boolean;
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
  /** Margin every check must keep beyond its requirement, s (0: just pass), or the automatic headroom. */
  readonly headroom: number | AutoHeadroom;
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
  /** When nothing passes (and no switch fault): what the closest candidate fails and why no chain can pass. */
  readonly diagnosis: Diagnosis | null;
}

/** Check kinds that more chain delay helps (the others want less of it, or a slower clock). */
export const WANTS_DELAY: ReadonlySet<string> = new Set(['non-overlap', 'dead-time-min', 'gap-min', 'break-before-make', 'order']);

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

/** Sigmas of mismatch covered without a minYield (99.87 % per corner, one-sided). */
export const DEFAULT_Z = 3;
export const HEADROOM_DIES = 200;
export const HEADROOM_CORNERS = 3;

/** z = Φ⁻¹(minYield) for the per-corner yield, or DEFAULT_Z. */
export function autoHeadroom(design: Design): AutoHeadroom {
  const y = design.requirements.minYield;
  return { z: y === undefined ? DEFAULT_Z : normalQuantile(y), dies: HEADROOM_DIES, corners: HEADROOM_CORNERS, seed: design.montecarlo?.seed ?? 1 };
}

/** The chain lengths and sizes tried by default: even lengths from the early tap up, the design's own size and 1 and 2. */
export function defaultSpace(design: Design): TuneSpace {
  const gen = templateOf(design);
  const stages: number[] = [];
  for (let n = gen.earlyTap; n <= Math.max(DEFAULT_MAX_STAGES, gen.stages); n += 2) stages.push(n);
  const own = typeof gen.stageSize === 'number' ? [gen.stageSize] : [];
  return { stages, stageSizes: [...new Set([...own, 1, 2])], maxLoad: Math.max(DEFAULT_MAX_LOAD, gen.stageLoad), loadStep: DEFAULT_LOAD_STEP, headroom: autoHeadroom(design) };
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

/** Least timing margin of one corner's checks (a failing voltage check counts; null margin: -Infinity). */
function leastMargin(checks: readonly Check[]): number {
  let least = Infinity;
  for (const c of checks) {
    if (c.margin === null) return -Infinity;
    if (c.pass && VOLTAGE_KINDS.has(c.kind)) continue;
    least = Math.min(least, c.margin);
  }
  return least;
}

function failingChecks(results: readonly CornerResult[]): FailingCheck[] {
  const byName = new Map<string, { kind: Check['kind']; at: Array<{ corner: string; margin: number }> }>();
  for (const r of results) {
    for (const c of r.checks) {
      if (c.pass) continue;
      const f = byName.get(c.name) ?? { kind: c.kind, at: [] };
      f.at.push({ corner: r.corner.name, margin: c.margin ?? -Infinity });
      byName.set(c.name, f);
    }
  }
  return [...byName].map(([check, { kind, at }]) => {
    const sorted = at.sort((a, b) => a.margin - b.margin);
    const worst = sorted[0]!.margin;
    return { check, kind, corners: sorted.map((x) => x.corner), worst: Number.isFinite(worst) ? worst : null };
  });
}

/**
 * The headroom a candidate needs: the model's band on its largest dead time plus z times the
 * largest sigma, over its `auto.corners` limiting corners, of the least margin per Monte Carlo die
 * (Infinity when a die cannot be measured).
 */
export function candidateHeadroom(resolved: ResolvedDesign, results: readonly CornerResult[], deadMax: number, auto: AutoHeadroom): Headroom {
  const band = (resolved.model.gapBand ?? 0) * deadMax;
  const limiting = results.map((r, i) => ({ i, least: leastMargin(r.checks) })).sort((a, b) => a.least - b.least || a.i - b.i).slice(0, auto.corners);
  const sub: ResolvedDesign = { ...resolved, corners: limiting.map(({ i }) => resolved.corners[i]!) };
  const chunks = chunkPlan(auto.dies).map(({ start, count }) => runChunk(sub, auto.seed, start, count));
  let sigma = 0;
  for (let c = 0; c < sub.corners.length; c++) {
    let n = 0;
    let mean = 0;
    let m2 = 0;
    for (const chunk of chunks) {
      for (const x of chunk.corners[c]!.leastMargin) {
        if (!Number.isFinite(x)) { m2 = Infinity; continue; }
        n++;
        const d = x - mean;
        mean += d / n;
        m2 += d * (x - mean);
      }
    }
    sigma = Math.max(sigma, n > 1 ? Math.sqrt(m2 / (n - 1)) : Infinity);
  }
  return { band, sigma, z: auto.z, total: band + auto.z * sigma, corners: sub.corners.map((c) => c.corner.name), dies: auto.dies };
}

/** Automatic headroom: searches again with a candidate's own headroom at most this many times. */
const HEADROOM_ROUNDS = 4;

export function tuneChains(design: Design, card: ProcessCard, model: DelayModel = analyticModel, space: TuneSpace = defaultSpace(design)): TuneResult {
  const gen = templateOf(design);
  let evaluations = 0;
  const seen = new Map<string, ChainCandidate>();
  let first: readonly CornerResult[] = [];
  const resolveKnobs = (knobs: ChainKnobs) => resolveDesign({ ...design, generator: { ...gen, ...knobs, stageSize: knobs.stageSize as TemplateGenerator['stageSize'] } }, card, model);
  const evaluate = (knobs: ChainKnobs): ChainCandidate => {
    const key = `${knobs.stages}/${String(knobs.stageSize)}/${knobs.stageLoad}`;
    const known = seen.get(key);
    if (known) return known;
    const results = evaluateAll(resolveKnobs(knobs));
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
    const candidate: ChainCandidate = { knobs, pass, meets: pass, deadMin, deadMax, limiting, failing: pass ? [] : failingChecks(results), headroom: null };
    seen.set(key, candidate);
    return candidate;
  };
  const meetsAt = (c: ChainCandidate, need: number) => c.pass && (c.limiting === null || (c.limiting.margin !== null && c.limiting.margin >= need));
  const current = evaluate({ stages: gen.stages, stageSize: gen.stageSize, stageLoad: gen.stageLoad });
  const faults = switchFaults(first.map((r) => ({ name: r.corner.name, checks: r.checks })));
  if (faults.length > 0) return { current, proposals: [], closest: null, space, evaluations, faults, diagnosis: null };
  let closest: ChainCandidate | null = null;
  const consider = (c: ChainCandidate) => {
    const margin = c.limiting?.margin ?? -Infinity;
    if (closest === null || margin > (closest.limiting?.margin ?? -Infinity)) closest = c;
  };
  const step = space.loadStep;
  const scan = [...SCAN.filter((c) => c < space.maxLoad), space.maxLoad];
  /** The least load step of this chain whose every margin is at least `need`. */
  const leastMeeting = (stages: number, size: number, need: number): ChainCandidate | null => {
    const at = (stageLoad: number) => evaluate({ stages, stageSize: size, stageLoad });
    let below = -1;
    let found: ChainCandidate | null = null;
    for (const load of scan) {
      const c = at(load);
      consider(c);
      if (meetsAt(c, need)) { found = c; break; }
      below = load;
    }
    if (!found || below < 0) return found;
    // Bisect on whole steps between the last failing and the first passing load, keeping a
    // failing step below and a passing one above, so the answer is the least passing step.
    let lo = Math.floor(below / step);
    let hi = Math.ceil(found.knobs.stageLoad / step);
    if (meetsAt(at(lo * step), need) || !meetsAt(at(hi * step), need)) return found;
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (meetsAt(at(mid * step), need)) hi = mid; else lo = mid;
    }
    return at(hi * step);
  };
  const fixed = (h: number): Headroom => ({ band: 0, sigma: 0, z: 0, total: h, corners: [], dies: 0 });
  const propose = (stages: number, size: number): ChainCandidate | null => {
    const auto = space.headroom;
    if (typeof auto === 'number') {
      const c = leastMeeting(stages, size, auto);
      return c && { ...c, headroom: fixed(auto) };
    }
    let need = 0;
    for (let round = 0; round < HEADROOM_ROUNDS; round++) {
      const c = leastMeeting(stages, size, need);
      if (!c) return null;
      const resolved = resolveKnobs(c.knobs);
      const h = candidateHeadroom(resolved, evaluateAll(resolved), c.deadMax, auto);
      evaluations += resolved.corners.length + h.corners.length * h.dies;
      if (!Number.isFinite(h.total)) return null;
      if (meetsAt(c, h.total)) return { ...c, headroom: h };
      need = Math.max(need, h.total);
    }
    return null;
  };
  const proposals: ChainCandidate[] = [];
  for (const stages of space.stages) {
    if (stages % 2 !== 0 || stages < gen.earlyTap) continue;
    for (const size of space.stageSizes) {
      const p = propose(stages, size);
      if (p) proposals.push(p);
    }
  }
  if (proposals.length > 0) return { current, proposals: rank(proposals), closest: null, space, evaluations, faults, diagnosis: null };
  return { current, proposals: [], closest, space, evaluations, faults, diagnosis: diagnose(design, closest, [...seen.values()]) };
}

/** What the closest candidate fails, whether the dead-time requirements conflict, and whether a wider search can help. */
function diagnose(design: Design, closest: ChainCandidate | null, searched: readonly ChainCandidate[]): Diagnosis | null {
  if (!closest) return null;
  const failing = closest.failing;
  const req = design.requirements.deadTime;
  let conflict: Conflict | null = null;
  if (req?.min !== undefined && req.max !== undefined && req.min > 0) {
    const spreads = searched.filter((c) => Number.isFinite(c.deadMax) && c.deadMin > 0).map((c) => c.deadMax / c.deadMin);
    const leastSpread = Math.min(...spreads);
    if (spreads.length > 0 && leastSpread > req.max / req.min) {
      const spread = Number.isFinite(closest.deadMax) && closest.deadMin > 0 ? closest.deadMax / closest.deadMin : leastSpread;
      conflict = { min: req.min, max: req.max, spread, leastSpread };
    }
  }
  // A candidate that passes without the headroom fails only its limiting check's headroom.
  const kinds = failing.length > 0 ? failing.map((f) => f.kind) : closest.limiting ? [closest.limiting.kind] : [];
  const widen = conflict === null && kinds.length > 0 && kinds.every((k) => WANTS_DELAY.has(k));
  return { failing, conflict, widen };
}

/** The `--set` overrides that apply a proposal to the design file. */
export function proposalOverrides(knobs: ChainKnobs, formatLoad: (farads: number) => string): string[] {
  const size = typeof knobs.stageSize === 'number' ? String(knobs.stageSize) : `[${knobs.stageSize.join(',')}]`;
  return [`generator.stages=${knobs.stages}`, `generator.stageSize=${size}`, `generator.stageLoad=${formatLoad(knobs.stageLoad)}`];
}
