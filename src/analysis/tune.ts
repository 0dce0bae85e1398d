/**
 * Proposals for the delay chains of a template generator: the chain length, the stage size and
 * the delay capacitor on every chain node, and where the template allows it the output buffer's
 * taper and the feedback tap (tune-knobs.ts), that pass every check at every corner with a
 * headroom on every margin (tune-headroom.ts), ranked by what the circuit gets: the longest least
 * useful conduction time over the corners, or the objective the design states (tune-objective.ts).
 *
 * Search, for every chain length and stage size with the design's own buffer and tap: the smallest
 * delay capacitor that keeps the headroom. More capacitance only adds delay, so the checks that
 * want delay (non-overlap, minimum dead time and gap, break-before-make) pass from some capacitance
 * up and the ones that want width (settling, minimum width, maximum dead time) pass up to another:
 * the passing loads are an interval, and its lower end wastes the least. A coarse scan finds the
 * first passing load; a bracketed secant on the limiting margin (bisection when it stalls) narrows
 * it to the least passing load step. The buffer tapers and feedback taps are then tried on the best
 * three chains.
 *
 * Headroom: the first chain found sets an estimate (its own Monte Carlo); candidates are found with
 * it, ranked, and the best are held to their own headroom in turn (a new search when it is larger)
 * until enough proposals keep it. With a simulator (injected: the command line starts ngspice),
 * the first proposals are simulated at their worst corners; a proposal the simulator finds short
 * is searched again with the shortfall added to its headroom, and proposals are ranked with those
 * the simulator confirms first.
 */
import { montecarloSettings, type Design } from '../schema/design.js';
import type { ProcessCard } from '../schema/process.js';
import type { DelayModel } from '../delay/model.js';
import { analyticModel } from '../delay/analytic.js';
import { resolveDesign, type ResolvedDesign } from './resolve.js';
import { CIRCUIT_KINDS } from '../checks/check.js';
import { evaluateAll, limitingCheck, type Limiting } from './evaluate.js';
import { switchFaults, type SwitchFault } from '../checks/bias-checks.js';
import {
  comboKey,
  ownKnobs,
  searchableTapers,
  searchableTaps,
  taperedBuffer,
  templateOf,
  withKnobs,
  type ChainKnobs,
} from './tune-knobs.js';
import {
  autoHeadroom,
  candidateHeadroom,
  fixedHeadroom,
  HEADROOM_CORNERS,
  HEADROOM_DIES,
  mismatchAtLimits,
  yieldTarget,
  type AutoHeadroom,
  type CornerYield,
  type Headroom,
} from './tune-headroom.js';
import { leastConduction, objectiveOf, score, type Conduction, type TuneObjective } from './tune-objective.js';
import { diagnose, failingChecks, stuckSwitches, type Diagnosis, type FailingCheck, type StuckSwitch } from './tune-diagnosis.js';
import { confirmation, type Confirmation, type Simulate } from './tune-confirm.js';

export type { ChainKnobs } from './tune-knobs.js';
export { proposalOverrides } from './tune-knobs.js';
export type { AutoHeadroom, CornerYield, Headroom } from './tune-headroom.js';
export { autoHeadroom, DEFAULT_Z, HEADROOM_CORNERS, HEADROOM_DIES } from './tune-headroom.js';
export type { Conflict, Diagnosis, FailingCheck, StuckSwitch } from './tune-diagnosis.js';
export { WANTS_DELAY } from './tune-diagnosis.js';
export type { Confirmation, Simulate, SimulatorRun } from './tune-confirm.js';

export interface ChainCandidate {
  readonly knobs: ChainKnobs;
  /** Every check at every corner holds. */
  readonly pass: boolean;
  /** It passes with at least the asked headroom on every check. */
  readonly meets: boolean;
  /** Smallest and largest 50 % dead time over the corners and both handovers, s (NaN if a corner did not settle). */
  readonly deadMin: number;
  readonly deadMax: number;
  /** The check with the least margin over all corners (for a proposal, at the fast corner). */
  readonly limiting: Limiting | null;
  /** Least useful conduction time over the corners (phase width less dead times and switch delays), and where. */
  readonly conduction: Conduction;
  /** Corner of the largest dead time (the slow corner). */
  readonly slowCorner: string;
  /** Largest dead time beyond what the requirement needs (requirements.deadTime.min, else the least dead time), s: slow-corner waste. */
  readonly waste: number;
  /** The objective's score, s (larger is better). */
  readonly score: number;
  /** Every failing check and the corners where it fails (empty when it passes). */
  readonly failing: readonly FailingCheck[];
  /** Switches that never turn on or off at some corner. */
  readonly stuck: readonly StuckSwitch[];
  /** The headroom this candidate was held to (set on proposals only). */
  readonly headroom: Headroom | null;
  /** Monte Carlo yield at the limiting corners (set on proposals only). */
  readonly yields: readonly CornerYield[] | null;
  /** The simulator's margins at the worst corners (set on the confirmed proposals only). */
  readonly confirmation: Confirmation | null;
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
  /** Buffer taper ratios tried on the best chains, the last size kept (empty: the design's buffer only). */
  readonly tapers: readonly number[];
  /** Feedback taps tried on the best chains, buffer inverters after the chain end (the design's own only: not searched). */
  readonly feedbackTaps: readonly number[];
}

export interface TuneOptions {
  /** Simulates a candidate at its worst corners; none: the proposals stay unconfirmed. */
  readonly simulate?: Simulate | null;
  /** Proposals to confirm (default 3). */
  readonly confirmTop?: number;
  /** Proposals wanted (default 5). */
  readonly top?: number;
}

export interface TuneResult {
  /** The design as it stands. */
  readonly current: ChainCandidate;
  /** Passing proposals, best first; at most one per combination of knobs. */
  readonly proposals: readonly ChainCandidate[];
  /** Every passing chain evaluated in the search, the least margin first: the trade-off the proposals come from. */
  readonly candidates: readonly ChainCandidate[];
  /** When nothing passes: the searched candidate that came closest (largest least margin), and why. */
  readonly closest: ChainCandidate | null;
  readonly space: TuneSpace;
  readonly objective: TuneObjective;
  /** Yield each proposal must show at its limiting corners (requirements.minYield, else 99.73 %). */
  readonly yieldTarget: number;
  /** Corner evaluations made (Monte Carlo dies included). */
  readonly evaluations: number;
  /** Simulator runs made (one per candidate confirmed, each at its worst corners). */
  readonly simulations: number;
  /**
   * Switches whose off-state, on-state or stress check fails in the design as it stands. No delay
   * chain changes them, so when there are any the chains are not searched.
   */
  readonly faults: readonly SwitchFault[];
  /** When nothing passes (and no switch fault): what the closest candidate fails and why no chain can pass. */
  readonly diagnosis: Diagnosis | null;
}

const fF = 1e-15;
/** Coarse scan of the delay capacitor before the narrowing, F. */
const SCAN = [0, 1, 2, 5, 10, 20, 50, 100, 200, 500, 1000, 2000].map((c) => c * fF);
export const DEFAULT_MAX_STAGES = 16;
export const DEFAULT_LOAD_STEP = 0.5 * fF;
export const DEFAULT_MAX_LOAD = 500 * fF;
/** Chains (best first) the buffer tapers and feedback taps are tried on. */
export const KNOB_CHAINS = 3;
/** Automatic headroom: searches again with a candidate's own headroom at most this many times. */
const HEADROOM_ROUNDS = 4;
/** A proposal the simulator finds short is searched again at most this many times. */
const CONFIRM_ROUNDS = 3;

/** The knobs tried by default: even lengths from the early tap up, the design's own size and 1 and 2, every taper and tap the template allows. */
export function defaultSpace(design: Design): TuneSpace {
  const gen = templateOf(design);
  const stages: number[] = [];
  for (let n = gen.earlyTap; n <= Math.max(DEFAULT_MAX_STAGES, gen.stages); n += 2) stages.push(n);
  const own = typeof gen.stageSize === 'number' ? [gen.stageSize] : [];
  return {
    stages,
    stageSizes: [...new Set([...own, 1, 2])],
    maxLoad: Math.max(DEFAULT_MAX_LOAD, gen.stageLoad),
    loadStep: DEFAULT_LOAD_STEP,
    headroom: autoHeadroom(design),
    tapers: searchableTapers(gen),
    feedbackTaps: searchableTaps(gen),
  };
}

/**
 * Scores within this fraction of the best candidate's largest dead time count as equal, so that a
 * shorter chain or a smaller capacitor (less area and power) wins over a few picoseconds.
 */
export const TIE_FRACTION = 0.01;

/** Best first: the highest score (to the tie band), then the shorter chain, then the smaller capacitor. */
function rank(list: ChainCandidate[]): ChainCandidate[] {
  if (list.length === 0) return list;
  const top = list.reduce((a, b) => (b.score > a.score ? b : a));
  const band = TIE_FRACTION * top.deadMax;
  const bucket = (c: ChainCandidate) => (Number.isFinite(c.score) ? Math.floor((top.score - c.score) / band) : Infinity);
  return list.sort(
    (a, b) => bucket(a) - bucket(b) || a.knobs.stages - b.knobs.stages || a.knobs.stageLoad - b.knobs.stageLoad || b.score - a.score,
  );
}

/** The simulator's word on a proposal, for the final order: meets, passes thin, not simulated, fails. */
function confirmGroup(c: ChainCandidate): number {
  if (!c.confirmation) return 2;
  return c.confirmation.meets ? 0 : c.confirmation.pass ? 1 : 3;
}

type Combo = Omit<ChainKnobs, 'stageLoad'>;

export function tuneChains(
  design: Design,
  card: ProcessCard,
  model: DelayModel = analyticModel,
  space: TuneSpace = defaultSpace(design),
  options: TuneOptions = {},
): TuneResult {
  const gen = templateOf(design);
  const objective = objectiveOf(design);
  const target = yieldTarget(design);
  const period = 1 / design.clock.frequency;
  const required = design.requirements.deadTime?.min;
  let evaluations = 0;
  let simulations = 0;
  const seen = new Map<string, ChainCandidate>();
  const resolveKnobs = (knobs: ChainKnobs) => resolveDesign(withKnobs(design, knobs), card, model);
  // The search weighs timing only (a circuit solve costs milliseconds per corner); proposals are
  // checked against the circuit's requirements below, before they are simulated.
  const resolveTiming = (knobs: ChainKnobs) => withoutCircuit(resolveKnobs(knobs));
  let firstFaults: SwitchFault[] = [];
  const evaluate = (knobs: ChainKnobs): ChainCandidate => {
    const key = `${comboKey(knobs)}/${knobs.stageLoad}`;
    const known = seen.get(key);
    if (known) return known;
    const results = evaluateAll(resolveTiming(knobs));
    if (seen.size === 0) firstFaults = switchFaults(results.map((r) => ({ name: r.corner.name, checks: r.checks })));
    evaluations += results.length;
    let deadMin = Infinity;
    let deadMax = -Infinity;
    let slowCorner = '';
    for (const r of results) {
      const m = r.measurement;
      if (!m.ok) {
        deadMin = NaN;
        deadMax = NaN;
        slowCorner = r.corner.name;
        break;
      }
      for (const d of m.deadTimes) {
        deadMin = Math.min(deadMin, d.t50);
        if (d.t50 > deadMax) {
          deadMax = d.t50;
          slowCorner = r.corner.name;
        }
      }
    }
    const pass = results.every((r) => r.pass);
    const limiting = limitingCheck(results);
    const conduction = leastConduction(results, period);
    const margin = limiting?.margin ?? -Infinity;
    const candidate: ChainCandidate = {
      knobs,
      pass,
      meets: pass,
      deadMin,
      deadMax,
      slowCorner,
      limiting,
      conduction,
      waste: deadMax - (required ?? deadMin),
      score: score(objective, { conduction: conduction.time, margin, deadMax }),
      failing: pass ? [] : failingChecks(results),
      stuck: pass ? [] : stuckSwitches(results),
      headroom: null,
      yields: null,
      confirmation: null,
    };
    seen.set(key, candidate);
    return candidate;
  };
  const meetsAt = (c: ChainCandidate, need: number) =>
    c.pass && (c.limiting === null || (c.limiting.margin !== null && c.limiting.margin >= need));
  let current = evaluate(ownKnobs(gen));
  const faults = firstFaults;
  const found: ChainCandidate[] = [];
  const passing = () =>
    [...seen.values()]
      .filter((c) => c.pass && c !== current)
      .sort((a, b) => (a.limiting?.margin ?? -Infinity) - (b.limiting?.margin ?? -Infinity));
  const result = (proposals: ChainCandidate[], closest: ChainCandidate | null, diagnosis: Diagnosis | null): TuneResult => ({
    current,
    proposals,
    candidates: passing(),
    closest,
    space,
    objective,
    yieldTarget: target,
    evaluations,
    simulations,
    faults,
    diagnosis,
  });
  if (faults.length > 0) return result([], null, null);
  let closest: ChainCandidate | null = null;
  /** Best least margin each combination reached, for choosing the chains the other knobs are tried on when few pass. */
  const reached = new Map<string, { combo: Combo; margin: number }>();
  const consider = (c: ChainCandidate) => {
    const margin = c.limiting?.margin ?? -Infinity;
    const key = comboKey(c.knobs);
    const prev = reached.get(key);
    if (!prev || margin > prev.margin) reached.set(key, { combo: c.knobs, margin });
    if (closest === null || margin > (closest.limiting?.margin ?? -Infinity)) closest = c;
  };
  const step = space.loadStep;
  /** The least load step of this combination whose every margin is at least `need`. */
  const leastMeeting = (combo: Combo, need: number): ChainCandidate | null => {
    const at = (stageLoad: number) => evaluate({ ...combo, stageLoad });
    const ok = (c: ChainCandidate) => meetsAt(c, need);
    let below = -1;
    let found: ChainCandidate | null = null;
    for (const load of [...SCAN.filter((c) => c < space.maxLoad), space.maxLoad]) {
      const c = at(load);
      consider(c);
      if (ok(c)) {
        found = c;
        break;
      }
      below = load;
    }
    if (!found || below < 0) return found;
    let lo = Math.floor(below / step);
    let hi = Math.ceil(found.knobs.stageLoad / step);
    let loC = at(lo * step);
    let hiC = at(hi * step);
    if (ok(loC) || !ok(hiC)) return found;
    let lastSide = 0;
    let stalls = 0;
    while (hi - lo > 1) {
      let mid = Math.floor((lo + hi) / 2);
      const mLo = loC.limiting?.margin ?? NaN;
      const mHi = hiC.limiting?.margin ?? NaN;
      // Margins grow about linearly with the load near the answer: aim the secant at `need`, and
      // bisect after the same end has moved twice (the secant stalls on a curved margin).
      if (stalls < 2 && Number.isFinite(mLo) && Number.isFinite(mHi) && mHi > mLo) {
        mid = Math.min(hi - 1, Math.max(lo + 1, Math.round(lo + ((need - mLo) / (mHi - mLo)) * (hi - lo))));
      }
      const c = at(mid * step);
      const side = ok(c) ? 1 : -1;
      if (side > 0) {
        hi = mid;
        hiC = c;
      } else {
        lo = mid;
        loC = c;
      }
      stalls = side === lastSide ? stalls + 1 : 0;
      lastSide = side;
    }
    return hiC;
  };
  const auto = space.headroom;
  /** The least load that keeps this combination's own headroom (plus `extra`) and the yield, from `need` up. */
  const verify = (combo: Combo, need: number, extra: number): ChainCandidate | null => {
    for (let round = 0; round < HEADROOM_ROUNDS; round++) {
      const c = leastMeeting(combo, need);
      if (!c) return null;
      const resolved = resolveTiming(c.knobs);
      const results = evaluateAll(resolved);
      const dies = typeof auto === 'number' ? HEADROOM_DIES : auto.dies;
      const run = mismatchAtLimits(
        resolved,
        results,
        typeof auto === 'number' ? HEADROOM_CORNERS : auto.corners,
        dies,
        typeof auto === 'number' ? montecarloSettings(design).seed : auto.seed,
      );
      evaluations += results.length + run.corners.length * dies;
      if (typeof auto === 'number') return { ...c, meets: meetsAt(c, auto), headroom: fixedHeadroom(auto, run, dies), yields: run.yields };
      const h = candidateHeadroom(resolved, c.deadMax, auto, run, extra);
      if (!Number.isFinite(h.total)) return null;
      const yieldOk = run.yields.every((y) => y.passes / y.dies >= target);
      if (meetsAt(c, h.total) && yieldOk) return { ...c, headroom: h, yields: run.yields };
      need = Math.max(need, h.total) + (yieldOk ? 0 : h.sigma);
    }
    return null;
  };
  // The first chain found sets the headroom estimate every combination is searched with.
  const combos: Combo[] = [];
  for (const stages of space.stages) {
    if (stages % 2 !== 0 || stages < gen.earlyTap) continue;
    for (const size of stages === 0 ? space.stageSizes.slice(0, 1) : space.stageSizes) {
      combos.push({ stages, stageSize: size, buffer: ownKnobs(gen).buffer, feedbackTap: ownKnobs(gen).feedbackTap });
    }
  }
  let estimate = typeof auto === 'number' ? auto : NaN;
  const search = (list: readonly Combo[]) => {
    for (const combo of list) {
      if (Number.isNaN(estimate)) {
        const v = verify(combo, 0, 0);
        if (v) estimate = v.headroom!.total;
      }
      const c = leastMeeting(combo, Number.isNaN(estimate) ? 0 : estimate);
      if (c) found.push(c);
    }
  };
  search(combos);
  const variants: Combo[] = [];
  const own = ownKnobs(gen);
  const taperOptions = [own.buffer, ...space.tapers.map((r) => taperedBuffer(own.buffer[own.buffer.length - 1]!, own.buffer.length, r))];
  const best = new Set<string>();
  const chains = [
    ...rank([...found]).map((c) => c.knobs),
    ...[...reached.values()].sort((a, b) => b.margin - a.margin).map((r) => r.combo),
  ];
  for (const c of chains) {
    if (best.size >= KNOB_CHAINS) break;
    if (best.has(comboKey(c))) continue;
    best.add(comboKey(c));
    for (const buffer of taperOptions) {
      for (const feedbackTap of space.feedbackTaps.length > 0 ? space.feedbackTaps : [own.feedbackTap]) {
        const v: Combo = { stages: c.stages, stageSize: c.stageSize, buffer, feedbackTap };
        const key = comboKey(v);
        if (!variants.some((x) => comboKey(x) === key) && !combos.some((x) => comboKey(x) === key)) variants.push(v);
      }
    }
  }
  search(variants);
  const want = Math.max(options.top ?? 5, options.confirmTop ?? 3);
  const proposals: ChainCandidate[] = [];
  const done = new Set<string>();
  for (const c of rank([...new Map(found.map((x) => [comboKey(x.knobs), x])).values()])) {
    if (proposals.length >= want) break;
    if (done.has(comboKey(c.knobs))) continue;
    done.add(comboKey(c.knobs));
    const v = verify(c.knobs, Number.isNaN(estimate) ? 0 : estimate, 0);
    if (v) proposals.push(v);
  }
  rank(proposals);
  /** The candidate with the circuit's requirements checked too (null when it meets them). */
  const circuitFailure = (c: ChainCandidate): ChainCandidate | null => {
    const results = evaluateAll(resolveKnobs(c.knobs));
    evaluations += results.length;
    const failing = failingChecks(results.map((r) => ({ ...r, checks: r.checks.filter((k) => CIRCUIT_KINDS.has(k.kind)) })));
    return failing.length === 0 ? null : { ...c, pass: false, meets: false, failing, limiting: limitingCheck(results) };
  };
  let circuitClosest: ChainCandidate | null = null;
  if (design.circuit !== undefined) {
    current = circuitFailure(current) ?? current;
    for (let i = proposals.length - 1; i >= 0; i--) {
      const failed = circuitFailure(proposals[i]!);
      if (!failed) continue;
      circuitClosest = failed;
      proposals.splice(i, 1);
    }
  }
  const simulate = options.simulate;
  if (simulate) {
    const n = Math.min(options.confirmTop ?? 3, proposals.length);
    for (let i = 0; i < n; i++) {
      let c = proposals[i]!;
      for (let round = 0; round < CONFIRM_ROUNDS; round++) {
        const spare = c.headroom ? c.headroom.z * c.headroom.sigma : 0;
        const run = simulate(resolveKnobs(c.knobs));
        if (!run) break;
        simulations++;
        const conf = confirmation(design, run, spare);
        c = { ...c, confirmation: conf };
        if (conf.meets || typeof auto === 'number' || !Number.isFinite(conf.least)) break;
        const shortfall = spare - conf.least;
        const again = verify(c.knobs, c.headroom!.total + shortfall, c.headroom!.simulator + shortfall);
        if (!again) break;
        c = again;
      }
      proposals[i] = c;
    }
    const order = new Map(proposals.map((p, i) => [p, i]));
    proposals.sort((a, b) => confirmGroup(a) - confirmGroup(b) || order.get(a)! - order.get(b)!);
  }
  if (proposals.length > 0) return result(proposals, null, null);
  const nearest = circuitClosest ?? closest;
  return result([], nearest, diagnose(design, nearest, [...seen.values()]));
}

/** The design without its circuit section: what the chain search evaluates. */
function withoutCircuit(resolved: ResolvedDesign): ResolvedDesign {
  if (resolved.design.circuit === undefined) return resolved;
  return { ...resolved, design: { ...resolved.design, circuit: undefined } };
}
