/**
 * Monte Carlo mismatch (docs/physics.md, "Variation"): dies drawn with Pelgrom's law, each evaluated at every corner.
 * Work is cut into chunks of consecutive dies whose size does not depend on the number of threads,
 * and chunk results are merged in chunk order, so any thread count gives identical numbers.
 */
import { CornerEvaluator, type DieChecks } from './evaluate.js';
import type { ResolvedDesign } from './resolve.js';
import { addValue, emptyStats, mergeStats, summarize, wilsonInterval, type RunningState, type StatsSummary } from '../variation/stats.js';
import { addToHistogram, emptyHistogram, hasEdges, setEdges, type StreamingHistogram } from '../variation/histogram.js';
import { drawMismatch, mismatchBuffers, mismatchSigmas, type SampleMismatch } from '../variation/mismatch.js';
import { devicesAtCorner, type CornerDevices } from '../process/device.js';
import type { Corner } from '../process/corner.js';
import { marginUnit, type CheckKind } from '../checks/check.js';

/** Dies per chunk: the unit of work handed to a thread. */
export const CHUNK_SIZE = 250;

/** What one chunk learned at one corner (plain data, safe to post between threads). */
export interface CornerChunk {
  passes: number;
  unsettled: number;
  /** Running statistics per quantity name (dead times, gaps, widths, check margins). */
  quantities: Record<string, RunningState>;
  kinds: Record<string, CheckKind | 'measure'>;
  failures: Record<string, number>;
  /** Least margin over all checks per die (-Infinity for a die that could not be measured). */
  leastMargin: Float64Array;
  /** 50 % dead times per die, s. */
  dead0: Float64Array;
  dead1: Float64Array;
}

export interface ChunkResult {
  readonly start: number;
  readonly count: number;
  readonly corners: CornerChunk[];
  /** Dies passing at every corner. */
  readonly passesEverywhere: number;
}

export function chunkPlan(samples: number): Array<{ start: number; count: number }> {
  const plan: Array<{ start: number; count: number }> = [];
  for (let start = 0; start < samples; start += CHUNK_SIZE) plan.push({ start, count: Math.min(CHUNK_SIZE, samples - start) });
  return plan;
}

/**
 * Per-corner accumulators addressed by position: checks come in a fixed order for a design, and
 * measurements after them, so a die costs no name lookups. Names are attached when the chunk ends.
 */
class CornerAccumulator {
  readonly stats: RunningState[] = [];
  readonly names: string[] = [];
  readonly kinds: Array<CheckKind | 'measure'> = [];
  readonly failures = new Map<string, number>();
  passes = 0;
  unsettled = 0;

  /** Adds a value to the quantity expected at `slot`; a die whose list differs is matched by name. */
  add(slot: number, name: string, kind: CheckKind | 'measure', value: number): void {
    let at = slot;
    if (this.names[at] !== name) {
      at = this.names.indexOf(name);
      if (at < 0) {
        at = this.names.length;
        this.names.push(name);
        this.kinds.push(kind);
        this.stats.push(emptyStats());
      }
    }
    addValue(this.stats[at]!, value);
  }

  fail(name: string): void {
    this.failures.set(name, (this.failures.get(name) ?? 0) + 1);
  }

  toChunk(leastMargin: Float64Array, dead0: Float64Array, dead1: Float64Array): CornerChunk {
    const quantities: Record<string, RunningState> = {};
    const kinds: Record<string, CheckKind | 'measure'> = {};
    this.stats.forEach((s, i) => {
      quantities[this.names[i]!] = s;
      kinds[this.names[i]!] = this.kinds[i]!;
    });
    return {
      passes: this.passes,
      unsettled: this.unsettled,
      quantities,
      kinds,
      failures: Object.fromEntries(this.failures),
      leastMargin,
      dead0,
      dead1,
    };
  }
}

/** Names of the measured quantities, made once per chunk rather than once per die. */
function measureNames(resolved: ResolvedDesign) {
  const src = resolved.netlist.source;
  const [a, b] = src.phases;
  const widthNets = [a, b, ...Object.values(src.early)];
  return {
    dead: [`dead ${a}->${b}`, `dead ${b}->${a}`],
    gap: [`gap ${a}->${b}`, `gap ${b}->${a}`],
    widthNets,
    width: Object.fromEntries(widthNets.map((n) => [n, `width ${n}`])) as Record<string, string>,
  };
}

/** Where one corner's dies leave their numbers. */
interface CornerOutputs {
  readonly acc: CornerAccumulator;
  readonly least: Float64Array;
  readonly dead0: Float64Array;
  readonly dead1: Float64Array;
  /** Shared by all corners: 1 for a die that failed somewhere. */
  readonly failedSomewhere: Uint8Array;
}

/**
 * The hot loop: every die at one corner. A function of its own, so the optimiser sees only this
 * loop and its callees, and the chunk's one-off setup around it cannot throw its code away.
 */
function evaluateDies(
  evaluator: CornerEvaluator,
  corner: Corner,
  devices: CornerDevices,
  dies: readonly SampleMismatch[],
  names: ReturnType<typeof measureNames>,
  out: CornerOutputs,
): void {
  const a = out.acc;
  for (let i = 0; i < dies.length; i++) {
    const r = evaluator.evaluate(corner, dies[i], devices);
    let leastMargin = Infinity;
    let slot = 0;
    const checks = r.checks;
    for (let k = 0; k < checks.length; k++) {
      const check = checks[k]!;
      if (check.margin === null) leastMargin = -Infinity;
      else {
        // A passing margin in volts, coulombs or a fraction is not compared with timing margins (s).
        if (check.margin < leastMargin && !(check.pass && marginUnit(check.kind) !== 's')) leastMargin = check.margin;
        a.add(slot, check.name, check.kind, check.margin);
      }
      slot++;
      if (!check.pass) a.fail(check.name);
    }
    const m = r.measurement;
    if (m.ok) {
      for (let k = 0; k < 2; k++) {
        const d = m.deadTimes[k]!;
        a.add(slot++, names.dead[k]!, 'measure', d.t50);
        a.add(slot++, names.gap[k]!, 'measure', d.gap);
      }
      for (const phase of names.widthNets) a.add(slot++, names.width[phase]!, 'measure', m.widths[phase]!);
      out.dead0[i] = m.deadTimes[0].t50;
      out.dead1[i] = m.deadTimes[1].t50;
    } else {
      a.unsettled++;
      out.dead0[i] = NaN;
      out.dead1[i] = NaN;
    }
    out.least[i] = leastMargin;
    if (r.pass) a.passes++;
    else out.failedSomewhere[i] = 1;
  }
}

/** Evaluates dies [start, start + count) at every corner. Pure: same inputs, same result. */
export function runChunk(resolved: ResolvedDesign, seed: number, start: number, count: number, checks: DieChecks): ChunkResult {
  const sigmas = mismatchSigmas(resolved.netlist, resolved.card, resolved.switches);
  // Each die is drawn once and used at every corner.
  const dies = Array.from({ length: count }, (_, i) => drawMismatch(sigmas, seed, start + i, mismatchBuffers(sigmas)));
  const corners = resolved.corners.map(({ corner }) => ({ corner, devices: devicesAtCorner(resolved.card, corner) }));
  const acc = corners.map(() => new CornerAccumulator());
  const least = corners.map(() => new Float64Array(count));
  const dead0 = corners.map(() => new Float64Array(count));
  const dead1 = corners.map(() => new Float64Array(count));
  const failedSomewhere = new Uint8Array(count);
  const names = measureNames(resolved);
  // Corner by corner, so each simulation starts warm from the previous die at the same corner.
  for (let c = 0; c < corners.length; c++) {
    const out: CornerOutputs = { acc: acc[c]!, least: least[c]!, dead0: dead0[c]!, dead1: dead1[c]!, failedSomewhere };
    evaluateDies(CornerEvaluator.forDies(resolved, checks), corners[c]!.corner, corners[c]!.devices, dies, names, out);
  }
  const passesEverywhere = failedSomewhere.reduce((n, f) => n + (f === 0 ? 1 : 0), 0);
  return { start, count, corners: acc.map((a, c) => a.toChunk(least[c]!, dead0[c]!, dead1[c]!)), passesEverywhere };
}

export interface QuantityReport extends StatsSummary {
  readonly name: string;
  readonly kind: CheckKind | 'measure';
  /** For checks: dies failing it. */
  readonly failures?: number;
  /** For checks: mean margin over its sigma, (mean - requirement)/sigma. */
  readonly sigmaMargin?: number | null;
}

export interface McCornerReport {
  readonly name: string;
  readonly samples: number;
  readonly passes: number;
  readonly unsettled: number;
  readonly yield: number;
  /** 95 % Wilson score interval of the yield. */
  readonly yieldInterval: { readonly low: number; readonly high: number };
  readonly quantities: readonly QuantityReport[];
  /** The die with the least margin at this corner, for --replay. */
  readonly worstSample: { readonly index: number; readonly leastMargin: number | null };
}

export interface McResult {
  readonly samples: number;
  readonly seed: number;
  readonly corners: readonly McCornerReport[];
  /** Dies that pass at every corner. */
  readonly yieldEverywhere: number;
  readonly yieldEverywhereInterval: { readonly low: number; readonly high: number };
  /** Dead-time histograms of each corner (for plots and quantiles), s; see variation/histogram.ts for their resolution. */
  readonly deadTimes: ReadonlyArray<readonly [StreamingHistogram, StreamingHistogram]>;
}

/** What the run keeps of one corner: running statistics, counts, the worst die and two histograms. */
interface CornerTotals {
  readonly quantities: Record<string, RunningState>;
  readonly kinds: Record<string, CheckKind | 'measure'>;
  readonly failures: Record<string, number>;
  passes: number;
  unsettled: number;
  worstIndex: number;
  worstMargin: number;
  readonly dead: readonly [StreamingHistogram, StreamingHistogram];
}

/**
 * Folds chunk results into the run's totals as they arrive, in chunk order whatever order they
 * come in (a chunk that arrives early waits, at most a few per thread), so the numbers do not
 * depend on the thread count and memory does not grow with the number of dies.
 */
export class McMerger {
  private readonly totals: CornerTotals[];
  private readonly waiting = new Map<number, ChunkResult>();
  private next = 0;
  private everywhere = 0;

  constructor(
    private readonly resolved: ResolvedDesign,
    private readonly seed: number,
    private readonly samples: number,
  ) {
    this.totals = resolved.corners.map(() => ({
      quantities: {},
      kinds: {},
      failures: {},
      passes: 0,
      unsettled: 0,
      worstIndex: -1,
      worstMargin: Infinity,
      dead: [emptyHistogram(), emptyHistogram()],
    }));
  }

  add(chunk: ChunkResult): void {
    this.waiting.set(chunk.start, chunk);
    for (let ready = this.waiting.get(this.next); ready; ready = this.waiting.get(this.next)) {
      this.waiting.delete(this.next);
      this.fold(ready);
      this.next += ready.count;
    }
  }

  private fold(chunk: ChunkResult): void {
    this.everywhere += chunk.passesEverywhere;
    chunk.corners.forEach((part, c) => {
      const t = this.totals[c]!;
      t.passes += part.passes;
      t.unsettled += part.unsettled;
      for (const [q, s] of Object.entries(part.quantities)) {
        if (!t.quantities[q]) t.quantities[q] = emptyStats();
        mergeStats(t.quantities[q]!, s);
        t.kinds[q] = part.kinds[q]!;
      }
      for (const [q, n] of Object.entries(part.failures)) t.failures[q] = (t.failures[q] ?? 0) + n;
      const least = part.leastMargin;
      for (let i = 0; i < least.length; i++) {
        if (least[i]! < t.worstMargin || t.worstIndex < 0) {
          t.worstMargin = least[i]!;
          t.worstIndex = chunk.start + i;
        }
      }
      [part.dead0, part.dead1].forEach((values, k) => {
        const h = t.dead[k]!;
        if (!hasEdges(h) && !setEdges(h, values)) return;
        for (let i = 0; i < values.length; i++) addToHistogram(h, values[i]!);
      });
    });
  }

  finish(): McResult {
    if (this.next !== this.samples) throw new Error(`internal: Monte Carlo merged ${this.next} of ${this.samples} dies`);
    const samples = this.samples;
    const corners = this.resolved.corners.map(({ corner }, c): McCornerReport => {
      const { quantities, kinds, failures, passes, unsettled, worstIndex, worstMargin } = this.totals[c]!;
      const reports = Object.entries(quantities).map(([q, s]): QuantityReport => {
        const summary = summarize(s);
        if (kinds[q] === 'measure') return { name: q, kind: 'measure', ...summary };
        return {
          name: q,
          kind: kinds[q]!,
          ...summary,
          failures: failures[q] ?? 0,
          sigmaMargin: summary.sigma > 0 ? summary.mean / summary.sigma : null,
        };
      });
      for (const [q, n] of Object.entries(failures)) {
        if (!quantities[q])
          reports.push({
            name: q,
            kind: 'steady-state',
            count: 0,
            mean: NaN,
            sigma: 0,
            min: NaN,
            max: NaN,
            failures: n,
            sigmaMargin: null,
          });
      }
      return {
        name: corner.name,
        samples,
        passes,
        unsettled,
        yield: passes / samples,
        yieldInterval: wilsonInterval(passes, samples),
        quantities: reports,
        worstSample: { index: worstIndex, leastMargin: Number.isFinite(worstMargin) ? worstMargin : null },
      };
    });
    return {
      samples,
      seed: this.seed,
      corners,
      yieldEverywhere: this.everywhere / samples,
      yieldEverywhereInterval: wilsonInterval(this.everywhere, samples),
      deadTimes: this.totals.map((t) => t.dead),
    };
  }
}

/** Merges chunk results (in any order) into the run's report. */
export function mergeChunks(resolved: ResolvedDesign, seed: number, samples: number, chunks: readonly ChunkResult[]): McResult {
  const merger = new McMerger(resolved, seed, samples);
  for (const chunk of chunks) merger.add(chunk);
  return merger.finish();
}

/** Single-threaded run of every chunk. */
export function runMonteCarlo(resolved: ResolvedDesign, samples: number, seed: number, checks: DieChecks = { circuit: true }): McResult {
  const merger = new McMerger(resolved, seed, samples);
  for (const { start, count } of chunkPlan(samples)) merger.add(runChunk(resolved, seed, start, count, checks));
  return merger.finish();
}
