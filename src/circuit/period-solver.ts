/**
 * One period of a circuit model as a chain of exact linear substeps, and its periodic steady
 * state found directly: the period is an affine map x -> P x + p, whose fixed point solves
 * (I - P) x = p. Piecewise-linear parts take one segment per substep; the segments are chosen
 * from the steady state's own voltages at each substep start and the fixed point solved again
 * until they agree. Each interval between switch events is cut into SUBSTEPS equal substeps, so
 * a diode or channel may change segment at an eighth of an interval. Where switches with gate
 * charge turn off, a substep of no length steps the nodes by their charge; where they turn on,
 * the interval's first substep draws it (injection.ts).
 */
import { LuDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';
import { branchCharge, CHANNEL, chooseSegments, DIODE, pwlCount } from './branches.js';
import type { CircuitModel } from './model.js';
import type { Branch } from './branches.js';
import { drawBranches, edgeMap } from './injection.js';
import { SubstepBuilder, type SubstepMap } from './substep.js';

export const SUBSTEPS = 8;
/** Most rounds of segment choice before the steady state is found by running periods instead. */
const SEGMENT_ROUNDS = 40;
/** Most periods run when the segment choice does not settle. */
const FALLBACK_PERIODS = 20_000;
/** Largest change over one period, V, at which running periods counts as settled. */
const PERIOD_TOLERANCE = 1e-7;
/** Periods run from rest for the first guess of the segments. */
const WARM_UP_PERIODS = 20;
/** While periods are run, a direct solve is tried every RETRY_PERIODS periods, with at most RETRY_ROUNDS rounds. */
const RETRY_PERIODS = 25;
const RETRY_ROUNDS = 3;
/** A steady state beyond this multiple of the largest rail (plus 1 V) is taken for an unphysical segment choice. */
const WILD_VOLTAGE = 100;
/** Most re-choices of the segments within one substep. */
const REFINE_ROUNDS = 4;

export interface SteadyState {
  /** Node voltages at the start of the period, V. */
  readonly x0: Float64Array;
  /** Segments of the piecewise-linear parts in each substep. */
  readonly segments: readonly Uint8Array[];
  /** 'direct' when the fixed point was solved, 'periods' when it was found by running periods, 'none' when neither settled. */
  readonly method: 'direct' | 'periods' | 'none';
  readonly rounds: number;
}

export class PeriodSolver {
  readonly n: number;
  /** Interval of each substep. */
  readonly substepInterval: Int32Array;
  readonly substepLength: Float64Array;
  /** The step of each substep that is a switch edge's charge, else null. */
  readonly edges: readonly (SubstepMap | null)[];
  /** Charge drawn by switches turning on, in the first substep of their interval, else null. */
  private readonly draws: readonly (readonly Branch[] | null)[];
  private readonly builder: SubstepBuilder;
  private readonly cache = new Map<number | string, SubstepMap>();
  /** Segment codes fit a number below 2^53 (base 3 per part, times the interval count). */
  private readonly numericKeys: boolean;
  private readonly pwl: number;
  private readonly voltages: Float64Array;
  private readonly scratch: Float64Array;
  private readonly integrals: Float64Array;
  private readonly end: Float64Array;
  private readonly endSegments: Uint8Array;

  constructor(readonly model: CircuitModel) {
    this.n = model.nodes.length;
    this.pwl = pwlCount(model);
    this.builder = new SubstepBuilder(model);
    const intervals: number[] = [];
    const lengths: number[] = [];
    const edges: (SubstepMap | null)[] = [];
    const draws: (readonly Branch[] | null)[] = [];
    model.intervals.forEach((iv, i) => {
      if (!(iv.duration > 0)) return;
      const edge = edgeMap(model, i);
      if (edge) {
        intervals.push(i);
        lengths.push(0);
        edges.push(edge);
        draws.push(null);
      }
      const draw = drawBranches(model, i, iv.duration / SUBSTEPS);
      for (let k = 0; k < SUBSTEPS; k++) {
        intervals.push(i);
        lengths.push(iv.duration / SUBSTEPS);
        edges.push(null);
        draws.push(k === 0 && draw.length > 0 ? draw : null);
      }
    });
    this.edges = edges;
    this.draws = draws;
    this.substepInterval = Int32Array.from(intervals);
    this.substepLength = Float64Array.from(lengths);
    this.voltages = new Float64Array(this.n + model.rails.length);
    this.voltages.set(model.rails, this.n);
    this.scratch = new Float64Array(this.n);
    this.integrals = new Float64Array(this.n);
    this.end = new Float64Array(this.n);
    this.endSegments = new Uint8Array(this.pwl);
    this.numericKeys = 3 ** this.pwl * 2 * model.intervals.length < Number.MAX_SAFE_INTEGER;
  }

  get substeps(): number {
    return this.substepInterval.length;
  }

  /** The exact map of substep k with the given segments (cached). */
  map(k: number, segments: Uint8Array): SubstepMap {
    const edge = this.edges[k];
    if (edge) return edge;
    const interval = this.substepInterval[k]!;
    const draw = this.draws[k];
    // The first substep after a turn-on has its own maps.
    const slot = draw ? interval + this.model.intervals.length : interval;
    let key: number | string = slot;
    if (this.numericKeys) {
      for (let i = 0; i < this.pwl; i++) key = key * 3 + segments[i]!;
    } else key = `${slot}:${segments.join('')}`;
    let m = this.cache.get(key);
    if (!m) {
      m = this.builder.build(interval, segments, this.substepLength[k]!, draw ?? undefined);
      this.cache.set(key, m);
    }
    return m;
  }

  /** x <- E x + e of one substep (in place). */
  step(map: SubstepMap, x: Float64Array): void {
    const n = this.n;
    const y = this.scratch;
    for (let i = 0; i < n; i++) {
      let sum = map.e[i]!;
      for (let j = 0; j < n; j++) sum += map.E[i * n + j]! * x[j]!;
      y[i] = sum;
    }
    x.set(y);
  }

  /** Segments every part takes at node voltages x (circuit nodes only) in substep k. */
  decide(k: number, x: ArrayLike<number>, out: Uint8Array): Uint8Array {
    for (let i = 0; i < this.n; i++) this.voltages[i] = x[i]!;
    return chooseSegments(this.model, this.substepInterval[k]!, this.voltages, out);
  }

  /** The period's affine map x -> P x + p for fixed segments. */
  periodMap(segments: readonly Uint8Array[]): { P: Float64Array; p: Float64Array } {
    const n = this.n;
    let P = new Float64Array(n * n);
    for (let i = 0; i < n; i++) P[i * n + i] = 1;
    const p = new Float64Array(n);
    let next = new Float64Array(n * n);
    for (let k = 0; k < this.substeps; k++) {
      const m = this.map(k, segments[k]!);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          let sum = 0;
          for (let l = 0; l < n; l++) sum += m.E[i * n + l]! * P[l * n + j]!;
          next[i * n + j] = sum;
        }
      }
      [P, next] = [next, P];
      this.step(m, p);
    }
    return { P, p };
  }

  /** Solves (I - P) x = p; a singular system (a node with no path to any rail) takes the least-squares answer. */
  fixedPoint(P: Float64Array, p: Float64Array): Float64Array {
    const n = this.n;
    const a = new Matrix(n, n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) a.set(i, j, (i === j ? 1 : 0) - P[i * n + j]!);
    const b = Matrix.columnVector(Array.from(p));
    const lu = new LuDecomposition(a);
    let x = lu.isSingular() ? null : lu.solve(b);
    if (!x || x.to1DArray().some((v) => !Number.isFinite(v))) x = new SingularValueDecomposition(a, { autoTranspose: true }).solve(b);
    return Float64Array.from(x.to1DArray());
  }

  /**
   * Segments for substep k from x that hold over the whole substep: picked from the start
   * voltages, then a conducting part that would pass net charge backwards is turned off and an
   * off part that the end voltages turn on is turned on, until nothing changes (a clock edge at
   * the substep start would otherwise leave a diode clamping a node it should let go).
   */
  refine(k: number, x: Float64Array, out: Uint8Array): Uint8Array {
    if (this.edges[k]) return out.fill(0);
    this.decide(k, x, out);
    if (this.pwl === 0) return out;
    const n = this.n;
    const base = this.model.channels.length;
    const integrals = this.integrals;
    const end = this.end;
    for (let round = 0; round < REFINE_ROUNDS; round++) {
      const m = this.map(k, out);
      for (let i = 0; i < n; i++) {
        let sum = m.f[i]!;
        for (let j = 0; j < n; j++) sum += m.F[i * n + j]! * x[j]!;
        integrals[i] = sum;
      }
      let changed = false;
      for (const b of m.branches) {
        if ((b.tag === CHANNEL || b.tag === DIODE) && b.segment > 0 && branchCharge(this.model, b, integrals, m.h) < 0) {
          out[b.tag === CHANNEL ? b.part : base + b.part] = 0;
          changed = true;
        }
      }
      if (!changed) {
        end.set(x);
        this.step(m, end);
        this.decide(k, end, this.endSegments);
        for (let i = 0; i < this.pwl; i++) {
          if (out[i] === 0 && this.endSegments[i] !== 0) {
            out[i] = this.endSegments[i]!;
            changed = true;
          }
        }
      }
      if (!changed) break;
    }
    return out;
  }

  /** Segments chosen along a period from x0 with the given segments held, per substep. */
  consistentSegments(x0: Float64Array, segments: readonly Uint8Array[]): Uint8Array[] {
    const x = Float64Array.from(x0);
    const out: Uint8Array[] = [];
    for (let k = 0; k < this.substeps; k++) {
      out.push(this.refine(k, x, new Uint8Array(this.pwl)));
      this.step(this.map(k, segments[k]!), x);
    }
    return out;
  }

  /** Runs one period from x (in place), each substep taking the segments that hold over it. */
  runPeriod(x: Float64Array, segments: Uint8Array[]): void {
    for (let k = 0; k < this.substeps; k++) this.step(this.map(k, this.refine(k, x, segments[k]!)), x);
  }

  /**
   * Where the direct solve fails, periods are run until they settle, at most `maxPeriods`. `near`,
   * a steady state of the same network with other element values (the same substeps), is tried
   * first: its segments and voltages.
   */
  steadyState(options: { maxPeriods?: number; near?: Pick<SteadyState, 'x0' | 'segments'> } = {}): SteadyState {
    const near = options.near;
    if (near && this.pwl > 0 && near.segments.length === this.substeps) {
      const seeded = this.iterate(
        near.segments.map((s) => Uint8Array.from(s)),
        Float64Array.from(near.x0),
      );
      if (seeded.method === 'direct') return seeded;
    }
    const off = (): Uint8Array[] => Array.from({ length: this.substeps }, () => new Uint8Array(this.pwl));
    const first = this.iterate(off(), new Float64Array(this.n));
    if (first.method === 'direct' || this.pwl === 0) return first;
    // Starting from every part off can land on a consistent but unphysical answer (every diode
    // reverse biased by a load current forced through their leakage) or cycle: guess the
    // segments again from a few periods run from rest.
    const x = new Float64Array(this.n);
    let segments = off();
    for (let period = 0; period < WARM_UP_PERIODS; period++) this.runPeriod(x, segments);
    segments = this.consistentSegments(x, segments);
    const second = this.iterate(segments, x);
    if (second.method === 'direct') return second;
    return this.runToSteadyState(second.x0, second.segments as Uint8Array[], options.maxPeriods ?? FALLBACK_PERIODS);
  }

  /** Rounds of: solve the fixed point for the segments, re-choose them along it; 'none' if they do not agree. */
  private iterate(start: Uint8Array[], guess: Float64Array, rounds = SEGMENT_ROUNDS): SteadyState {
    let segments = start;
    let x0 = guess;
    const bound = WILD_VOLTAGE * (1 + this.model.rails.reduce((m, v) => Math.max(m, Math.abs(v)), 0));
    for (let round = 1; round <= rounds; round++) {
      const { P, p } = this.periodMap(segments);
      const x = this.fixedPoint(P, p);
      if (!x.every((v) => Math.abs(v) < bound)) break;
      x0 = x;
      if (this.pwl === 0) return { x0, segments, method: 'direct', rounds: round };
      const chosen = this.consistentSegments(x0, segments);
      if (chosen.every((s, k) => s.every((v, i) => v === segments[k]![i]))) return { x0, segments, method: 'direct', rounds: round };
      segments = chosen;
    }
    return { x0, segments, method: 'none', rounds };
  }

  /** The steady state found by running periods from x0 until a period changes no node by more than PERIOD_TOLERANCE. */
  private runToSteadyState(start: Float64Array, segments: Uint8Array[], maxPeriods: number): SteadyState {
    const x = Float64Array.from(start);
    const before = new Float64Array(this.n);
    for (let period = 1; period <= maxPeriods; period++) {
      before.set(x);
      this.runPeriod(x, segments);
      let change = 0;
      for (let i = 0; i < this.n; i++) change = Math.max(change, Math.abs(x[i]! - before[i]!));
      if (change < PERIOD_TOLERANCE) return { x0: x, segments: this.consistentSegments(x, segments), method: 'periods', rounds: period };
      // Once the parts have stopped changing segment, the fixed point for their segments is the steady state:
      // a slow pump (hundreds of periods to settle) is solved directly instead of run out.
      if (period % RETRY_PERIODS === 0 && this.pwl > 0) {
        const direct = this.iterate(this.consistentSegments(x, segments), x, RETRY_ROUNDS);
        if (direct.method === 'direct') return direct;
      }
    }
    return { x0: x, segments, method: 'none', rounds: maxPeriods };
  }
}
