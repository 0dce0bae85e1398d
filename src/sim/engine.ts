/**
 * Event-driven timing simulation of a gate netlist (SPEC 2.3). Each transition is a linear ramp
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
 */
import { CELLS } from '../cells/library.js';
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
}

export type SimulationStatus = 'settled' | 'unsettled' | 'oscillating';

export interface SimulationResult {
  readonly status: SimulationStatus;
  /** Why the run did not settle, in words; empty when settled. */
  readonly reason: string;
  readonly period: number;
  /** Start of the reported period (a clock rising edge), s. */
  readonly windowStart: number;
  /** Transitions in the reported period (the last one simulated). */
  readonly edges: Edges;
  /** Logic value of each net at windowStart. */
  readonly startValues: Uint8Array;
  /** Output changes swallowed by inertial delay during the reported period. */
  readonly glitches: ReadonlyArray<{ readonly net: number; readonly time: number }>;
  readonly periodsSimulated: number;
}

const DEFAULT_MAX_PERIODS = 24;
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
  private readonly gateFunction: Array<(bits: number) => 0 | 1>;
  private seq = 0;
  /** Pending transitions, the clock's next edge included. */
  private inFlight = 0;
  private readonly glitches: Array<{ net: number; time: number }> = [];
  private readonly warmValues: Uint8Array;
  private warmReady = false;

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
    this.gateFunction = netlist.gateCell.map((cell) => CELLS[cell].evaluate);
  }

  run(timing: GateTiming, clock: ClockDrive, options: SimulationOptions = {}): SimulationResult {
    const maxPeriods = options.maxPeriods ?? DEFAULT_MAX_PERIODS;
    const net = this.net;
    const T = clock.period;
    const warm = options.warm === true && this.warmReady;
    const t0 = warm ? 0 : T;
    const clockNet = net.clock;
    const eventLimit = EVENTS_PER_GATE_PER_PERIOD * (net.gateCount + 1);
    this.reset();
    if (warm) this.value.set(this.warmValues);
    this.warmReady = false;
    const glitchesCurrent = this.glitches;
    glitchesCurrent.length = 0;
    // Settle from the start state: every gate whose output disagrees with its inputs switches.
    for (let g = 0; g < net.gateCount; g++) this.evaluateGate(timing, g, 0, 0, clock.transition, null);
    this.schedule(clockNet, t0, 1, clock.transition);
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
        if (recording) this.current.push(n, time, v, trans);
        if (n === clockNet) {
          if (v === 1) this.schedule(clockNet, t0 + (cycle + clock.duty) * T, 0, clock.transition);
          else this.schedule(clockNet, t0 + ++cycle * T, 1, clock.transition);
        }
        for (let i = net.fanoutStart[n]!; i < net.fanoutStart[n + 1]!; i++) {
          this.evaluateGate(timing, net.fanoutGate[i]!, net.fanoutPin[i]!, time, trans, recording ? glitchesCurrent : null);
        }
      }
      if (recording) {
        periods++;
        // Only the clock's next edge is pending at a quiet boundary.
        const repeats = quietStart && this.inFlight === 1 && sameValues(this.startCurrent, this.value);
        if (repeats || (periods >= 2 && samePeriod(this.previous, this.current, T))) {
          this.warmValues.set(this.startCurrent);
          this.warmReady = true;
          return {
            status: 'settled', reason: '', period: T, windowStart: windowEnd - T,
            edges: options.borrow ? this.current : this.current.snapshot(),
            startValues: options.borrow ? this.startCurrent : this.startCurrent.slice(),
            glitches: options.borrow ? glitchesCurrent : glitchesCurrent.slice(),
            periodsSimulated: periods,
          };
        }
        if (periods >= maxPeriods) {
          return this.failure('unsettled', unsettledReason(net, this.previous, this.current, maxPeriods), T, windowEnd - T, periods, glitchesCurrent);
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

  private schedule(n: number, time: number, v: number, trans: number): void {
    const seq = ++this.seq;
    if (this.pendingActive[n] !== 1) this.inFlight++;
    this.pendingActive[n] = 1;
    this.pendingValue[n] = v;
    this.pendingTime[n] = time;
    this.pendingTrans[n] = trans;
    this.pendingSeq[n] = seq;
    this.queue.push(time, seq, n);
  }

  private evaluateGate(timing: GateTiming, g: number, pin: number, time: number, inputTransition: number,
    glitches: Array<{ net: number; time: number }> | null): void {
    const net = this.net;
    let bits = 0;
    const start = net.gateInputStart[g]!;
    const end = net.gateInputStart[g + 1]!;
    for (let i = start; i < end; i++) bits |= this.value[net.gateInputs[i]!]! << (i - start);
    const next = this.gateFunction[g]!(bits);
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
    this.schedule(out, time + delay, next, timing.transition(g, pin, rising, inputTransition));
  }

  private failure(status: SimulationStatus, reason: string, T: number, windowStart: number, periods: number,
    glitches: Array<{ net: number; time: number }>): SimulationResult {
    return {
      status, reason, period: T, windowStart, edges: this.current.snapshot(), startValues: this.startCurrent.slice(),
      glitches: glitches.slice(0, 50), periodsSimulated: periods,
    };
  }
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
