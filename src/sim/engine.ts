/**
 * Event-driven timing simulation of a gate netlist (docs/physics.md, "Generator simulation"). Each transition is a linear ramp
 * described by its 50 % time and its transition time. Delays are inertial: an output change that
 * its inputs take back before it happens is swallowed and reported as a glitch.
 *
 * The input clock starts low for one period (the netlist settles from all-low), then rises at
 * t0 + k*T and falls at t0 + (k + duty)*T; a warm start skips that first period.
 *
 * A period is the steady state when the next one is known to repeat it: either its own start and
 * end states agree with nothing in flight across either boundary (the next period then replays
 * it event for event), or, when something is in flight, two consecutive periods agree. Periods are simulated until two consecutive ones agree
 * (periodic steady state), or a limit is reached and the result says why it did not settle.
 * One simulator holds its scratch buffers and can be reused across corners and samples.
 *
 * For runs that differ only slightly (Monte Carlo dies at one corner), a warm run can replay the
 * last steady period instead of simulating: every edge is recomputed from the edge that caused it,
 * and the result is used only when it is provably what the simulation would give.
 */
import { CELLS, type CellShape } from '../cells/library.js';
import type { GateTiming } from '../delay/model.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import { EdgeBuffer, type Edges } from './edges.js';
import { EventQueue } from './queue.js';

export interface ClockDrive {
  /** Period, s. */
  readonly period: number;
  /** Fraction of the period the clock is high, (0, 1). */
  readonly duty: number;
  /** Full-swing transition time of the clock edges, s. */
  readonly transition: number;
}

export interface SimulationOptions {
  /** Most periods to simulate before giving up on steady state. */
  readonly maxPeriods?: number;
  /**
   * Hand out the simulator's own buffers instead of copies (no allocation). The result is then
   * valid only until the next run; for tight loops such as Monte Carlo.
   */
  readonly borrow?: boolean;
  /**
   * Start from the logic state at the start of the previous run's reported period (if that run
   * settled) instead of settling from all-low for one period. For runs of nearly the same
   * timing, such as Monte Carlo dies at one corner. The result is still only reported once two
   * consecutive periods agree.
   */
  readonly warm?: boolean;
  /**
   * With `warm`: first try to replay the previous steady period's chain of cause and effect with
   * the new delays, which skips the event queue. The replay is used only if it provably makes the
   * same decisions as a simulation would (see Simulator.replay); otherwise the run simulates.
   */
  readonly replay?: boolean;
}

export type SimulationStatus = 'settled' | 'unsettled' | 'oscillating';

export interface SimulationResult {
  readonly status: SimulationStatus;
  /** Why the run did not settle, in words; empty when settled. */
  readonly reason: string;
  readonly period: number;
  /** Start of the reported period (a clock rising edge), s. */
  readonly windowStart: number;
  /**
   * Transitions in the reported period (the last one simulated), in the order they happened; a
   * replayed run keeps that order per net and per gate, not always across unrelated nets.
   */
  readonly edges: Edges;
  /** Logic value of each net at windowStart. */
  readonly startValues: Uint8Array;
  /** Output changes swallowed by inertial delay during the reported period. */
  readonly glitches: ReadonlyArray<{ readonly net: number; readonly time: number }>;
  readonly periodsSimulated: number;
}

const DEFAULT_MAX_PERIODS = 24;
/** Cause of a scheduled transition: an index into the period's edges, or one of these. */
const CAUSE_CLOCK = -2;
const CAUSE_NONE = -3;
const EVENTS_PER_GATE_PER_PERIOD = 200;

export class Simulator {
  private readonly net: CompiledNetlist;
  private readonly value: Uint8Array;
  private readonly pendingActive: Uint8Array;
  private readonly pendingValue: Uint8Array;
  private readonly pendingTime: Float64Array;
  private readonly pendingTrans: Float64Array;
  private readonly pendingSeq: Float64Array;
  private readonly queue = new EventQueue(128);
  private current = new EdgeBuffer(128);
  private previous = new EdgeBuffer(128);
  private startCurrent: Uint8Array;
  private startPrevious: Uint8Array;
  /** Each gate's logic function as a truth table: bit `b` is the output for input bits `b`. */
  private readonly truth: Uint8Array;
  private seq = 0;
  /** Pending transitions, the clock's next edge included. */
  private inFlight = 0;
  private readonly glitches: Array<{ net: number; time: number }> = [];
  private readonly warmValues: Uint8Array;
  private warmReady = false;
  /** What scheduled each pending transition: the triggering edge's index in `current`, and its pin. */
  private readonly pendingCause: Int32Array;
  private readonly pendingPin: Int32Array;
  /** Cause and pin of each edge recorded in `current`. */
  private edgeCause = new Int32Array(128);
  private edgePin = new Int32Array(128);
  /** The last steady period as a chain of cause and effect, for replay (see replay()). */
  private trace = { count: 0, net: new Int32Array(128), rising: new Uint8Array(128), cause: new Int32Array(128), pin: new Int32Array(128) };
  private traceReady = false;
  /** Whether the last run was answered by a replay rather than a simulation. */
  replayed = false;
  /** Time of the last edge touching each gate (an input or its output) during a replay. */
  private readonly lastTouch: Float64Array;

  constructor(netlist: CompiledNetlist) {
    this.net = netlist;
    const n = netlist.netNames.length;
    this.value = new Uint8Array(n);
    this.pendingActive = new Uint8Array(n);
    this.pendingValue = new Uint8Array(n);
    this.pendingTime = new Float64Array(n);
    this.pendingTrans = new Float64Array(n);
    this.pendingSeq = new Float64Array(n);
    this.startCurrent = new Uint8Array(n);
    this.startPrevious = new Uint8Array(n);
    this.warmValues = new Uint8Array(n);
    this.pendingCause = new Int32Array(n);
    this.pendingPin = new Int32Array(n);
    this.lastTouch = new Float64Array(netlist.gateCount);
    this.truth = Uint8Array.from(netlist.gateCell, (cell) => truthTable(CELLS[cell]));
  }

  run(timing: GateTiming, clock: ClockDrive, options: SimulationOptions = {}): SimulationResult {
    const maxPeriods = options.maxPeriods ?? DEFAULT_MAX_PERIODS;
    const net = this.net;
    const T = clock.period;
    const warm = options.warm === true && this.warmReady;
    if (warm && options.replay === true && this.traceReady) {
      const replayed = this.replay(timing, clock, options.borrow === true);
      this.replayed = replayed !== null;
      if (replayed) return replayed;
    } else this.replayed = false;
    const t0 = warm ? 0 : T;
    const clockNet = net.clock;
    const eventLimit = EVENTS_PER_GATE_PER_PERIOD * (net.gateCount + 1);
    this.reset();
    if (warm) this.value.set(this.warmValues);
    this.warmReady = false;
    const glitchesCurrent = this.glitches;
    glitchesCurrent.length = 0;
    // Settle from the start state: every gate whose output disagrees with its inputs switches.
    for (let g = 0; g < net.gateCount; g++) this.evaluateGate(timing, g, 0, 0, clock.transition, null, CAUSE_NONE);
    this.schedule(clockNet, t0, 1, clock.transition, CAUSE_CLOCK, 0);
    let cycle = 0;
    let windowEnd = t0;
    let periods = 0;
    let recording = false;
    let quietStart = false;
    for (;;) {
      // Events before the next window boundary.
      let events = 0;
      while (this.queue.length > 0 && this.queue.peekTime() < windowEnd) {
        const time = this.queue.peekTime();
        const seq = this.queue.peekSeq();
        const n = this.queue.peekNet();
        this.queue.pop();
        if (this.pendingActive[n] !== 1 || this.pendingSeq[n] !== seq) continue;
        if (++events > eventLimit) {
          return this.failure('oscillating', oscillationReason(net, this.current), T, windowEnd - T, periods, glitchesCurrent);
        }
        const v = this.pendingValue[n]!;
        const trans = this.pendingTrans[n]!;
        this.pendingActive[n] = 0;
        this.inFlight--;
        this.value[n] = v;
        let cause = CAUSE_NONE;
        if (recording) {
          cause = this.current.count;
          this.recordEdge(n, time, v, trans);
        }
        if (n === clockNet) {
          if (v === 1) this.schedule(clockNet, t0 + (cycle + clock.duty) * T, 0, clock.transition, CAUSE_CLOCK, 0);
          else this.schedule(clockNet, t0 + ++cycle * T, 1, clock.transition, CAUSE_CLOCK, 0);
        }
        for (let i = net.fanoutStart[n]!; i < net.fanoutStart[n + 1]!; i++) {
          this.evaluateGate(timing, net.fanoutGate[i]!, net.fanoutPin[i]!, time, trans, recording ? glitchesCurrent : null, cause);
        }
      }
      if (recording) {
        periods++;
        // Only the clock's next edge is pending at a quiet boundary.
        const repeats = quietStart && this.inFlight === 1 && sameValues(this.startCurrent, this.value);
        if (repeats || (periods >= 2 && samePeriod(this.previous, this.current, T))) {
          this.warmValues.set(this.startCurrent);
          this.warmReady = true;
          this.traceReady = repeats && glitchesCurrent.length === 0 && this.captureTrace();
          return {
            status: 'settled',
            reason: '',
            period: T,
            windowStart: windowEnd - T,
            edges: options.borrow ? this.current : this.current.snapshot(),
            startValues: options.borrow ? this.startCurrent : this.startCurrent.slice(),
            glitches: options.borrow ? glitchesCurrent : glitchesCurrent.slice(),
            periodsSimulated: periods,
          };
        }
        if (periods >= maxPeriods) {
          return this.failure(
            'unsettled',
            unsettledReason(net, this.previous, this.current, maxPeriods),
            T,
            windowEnd - T,
            periods,
            glitchesCurrent,
          );
        }
      }
      // Open the next window.
      const swap = this.previous;
      this.previous = this.current;
      this.current = swap;
      this.current.clear();
      const swapStart = this.startPrevious;
      this.startPrevious = this.startCurrent;
      this.startCurrent = swapStart;
      this.startCurrent.set(this.value);
      quietStart = this.inFlight === 1;
      glitchesCurrent.length = 0;
      recording = true;
      windowEnd += T;
    }
  }

  private reset(): void {
    this.value.fill(0);
    this.pendingActive.fill(0);
    this.queue.clear();
    this.current.clear();
    this.previous.clear();
    this.seq = 0;
    this.inFlight = 0;
  }

  private schedule(n: number, time: number, v: number, trans: number, cause: number, pin: number): void {
    const seq = ++this.seq;
    if (this.pendingActive[n] !== 1) this.inFlight++;
    this.pendingActive[n] = 1;
    this.pendingValue[n] = v;
    this.pendingTime[n] = time;
    this.pendingTrans[n] = trans;
    this.pendingSeq[n] = seq;
    this.pendingCause[n] = cause;
    this.pendingPin[n] = pin;
    this.queue.push(time, seq, n);
  }

  /** Records a processed transition in the current period, with what caused it. */
  private recordEdge(n: number, time: number, v: number, trans: number): void {
    const i = this.current.count;
    if (i === this.edgeCause.length) {
      const cause = new Int32Array(2 * i);
      cause.set(this.edgeCause);
      this.edgeCause = cause;
      const pin = new Int32Array(2 * i);
      pin.set(this.edgePin);
      this.edgePin = pin;
    }
    this.edgeCause[i] = this.pendingCause[n]!;
    this.edgePin[i] = this.pendingPin[n]!;
    this.current.push(n, time, v, trans);
  }

  /**
   * Keeps the current period as a trace if every edge in it was caused by the clock or by an
   * earlier edge of the same period (nothing carried over from before it).
   */
  private captureTrace(): boolean {
    const edges = this.current;
    const count = edges.count;
    for (let i = 0; i < count; i++) {
      const cause = this.edgeCause[i]!;
      if (cause !== CAUSE_CLOCK && !(cause >= 0 && cause < i)) return false;
    }
    let trace = this.trace;
    if (trace.net.length < count) {
      trace = {
        count: 0,
        net: new Int32Array(count),
        rising: new Uint8Array(count),
        cause: new Int32Array(count),
        pin: new Int32Array(count),
      };
      this.trace = trace;
    }
    trace.net.set(edges.net.subarray(0, count));
    trace.rising.set(edges.rising.subarray(0, count));
    trace.cause.set(this.edgeCause.subarray(0, count));
    trace.pin.set(this.edgePin.subarray(0, count));
    trace.count = count;
    return true;
  }

  /**
   * Recomputes the traced steady period with new delays: each edge at its cause's time plus the
   * delay its gate now has. The simulation would make exactly the same decisions, and so give
   * exactly these edges, if every gate still sees the edges on its inputs and its output in the
   * same order (each gate's decision depends only on its input values and whether its output
   * change is still pending) and every edge still lands before the next clock rise (the period
   * stays quiet at its end). The replay checks both, strictly (a tie is not trusted), and returns
   * null when either fails. Edges come out in the traced order, which is time order per net
   * (and per gate) but not necessarily across unrelated nets.
   */
  private replay(timing: GateTiming, clock: ClockDrive, borrow: boolean): SimulationResult | null {
    const net = this.net;
    const trace = this.trace;
    const edges = this.current;
    const T = clock.period;
    const fall = clock.duty * T;
    const touch = this.lastTouch;
    touch.fill(-Infinity);
    edges.clear();
    for (let i = 0; i < trace.count; i++) {
      const n = trace.net[i]!;
      const rising = trace.rising[i]!;
      let time: number;
      let trans: number;
      const driver = net.driver[n]!;
      if (n === net.clock) {
        time = rising === 1 ? 0 : fall;
        trans = clock.transition;
      } else {
        const c = trace.cause[i]!;
        const pin = trace.pin[i]!;
        const inputTrans = edges.transition[c]!;
        time = edges.time[c]! + timing.delay(driver, pin, rising === 1, inputTrans);
        trans = timing.transition(driver, pin, rising === 1, inputTrans);
        if (!(time < T) || !(time > touch[driver]!)) return null;
        touch[driver] = time;
      }
      for (let k = net.fanoutStart[n]!; k < net.fanoutStart[n + 1]!; k++) {
        const g = net.fanoutGate[k]!;
        if (!(time > touch[g]!)) return null;
        touch[g] = time;
      }
      edges.push(n, time, rising, trans);
    }
    this.startCurrent.set(this.warmValues);
    this.glitches.length = 0;
    return {
      status: 'settled',
      reason: '',
      period: T,
      windowStart: 0,
      edges: borrow ? edges : edges.snapshot(),
      startValues: borrow ? this.startCurrent : this.startCurrent.slice(),
      glitches: borrow ? this.glitches : [],
      periodsSimulated: 1,
    };
  }

  private evaluateGate(
    timing: GateTiming,
    g: number,
    pin: number,
    time: number,
    inputTransition: number,
    glitches: Array<{ net: number; time: number }> | null,
    cause: number,
  ): void {
    const net = this.net;
    let bits = 0;
    const start = net.gateInputStart[g]!;
    const end = net.gateInputStart[g + 1]!;
    for (let i = start; i < end; i++) bits |= this.value[net.gateInputs[i]!]! << (i - start);
    const next = (this.truth[g]! >> bits) & 1;
    const out = net.gateOutput[g]!;
    const pending = this.pendingActive[out] === 1;
    const projected = pending ? this.pendingValue[out]! : this.value[out]!;
    if (next === projected) return;
    if (pending) {
      // The inputs took the change back before it reached the output: inertial rejection.
      this.pendingActive[out] = 0;
      this.inFlight--;
      if (glitches) glitches.push({ net: out, time });
      return;
    }
    const rising = next === 1;
    const delay = timing.delay(g, pin, rising, inputTransition);
    this.schedule(out, time + delay, next, timing.transition(g, pin, rising, inputTransition), cause, pin);
  }

  private failure(
    status: SimulationStatus,
    reason: string,
    T: number,
    windowStart: number,
    periods: number,
    glitches: Array<{ net: number; time: number }>,
  ): SimulationResult {
    return {
      status,
      reason,
      period: T,
      windowStart,
      edges: this.current.snapshot(),
      startValues: this.startCurrent.slice(),
      glitches: glitches.slice(0, 50),
      periodsSimulated: periods,
    };
  }
}

/** The cell's outputs for every combination of its (at most three) inputs, one bit each. */
function truthTable(cell: CellShape): number {
  if (cell.inputs > 3) throw new Error(`a truth table of one byte holds cells of up to 3 inputs, not ${cell.inputs}`);
  let table = 0;
  for (let bits = 0; bits < 1 << cell.inputs; bits++) table |= cell.evaluate(bits) << bits;
  return table;
}

function sameValues(a: Uint8Array, b: Uint8Array): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Two periods agree when they hold the same transitions, shifted by one period. */
function samePeriod(a: EdgeBuffer, b: EdgeBuffer, T: number): boolean {
  if (a.count !== b.count) return false;
  const tol = 1e-9 * T + 1e-16;
  for (let i = 0; i < a.count; i++) {
    if (a.net[i] !== b.net[i] || a.rising[i] !== b.rising[i]) return false;
    if (Math.abs(b.time[i]! - a.time[i]! - T) > tol) return false;
    if (Math.abs(b.transition[i]! - a.transition[i]!) > tol) return false;
  }
  return true;
}

function busiestNet(net: CompiledNetlist, edges: EdgeBuffer): string {
  const counts = new Map<number, number>();
  for (let i = 0; i < edges.count; i++) counts.set(edges.net[i]!, (counts.get(edges.net[i]!) ?? 0) + 1);
  let best = -1;
  let most = -1;
  for (const [n, c] of counts) if (n !== net.clock && c > most) [best, most] = [n, c];
  return best < 0 ? '(none)' : `${net.netNames[best]} (${most} transitions)`;
}

function oscillationReason(net: CompiledNetlist, edges: EdgeBuffer): string {
  return `the generator oscillates: more transitions in one clock period than the netlist can make from the clock alone; busiest net ${busiestNet(net, edges)}`;
}

function unsettledReason(net: CompiledNetlist, previous: EdgeBuffer, current: EdgeBuffer, periods: number): string {
  return `no periodic steady state after ${periods} clock periods (the last two differ: ${previous.count} vs ${current.count} transitions; busiest net ${busiestNet(net, current)})`;
}
