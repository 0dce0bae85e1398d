import { describe, it, expect } from 'vitest';
import { Simulator, type SimulationResult } from '../../src/sim/engine.js';
import { compileNetlist, netId, type CompiledNetlist, type GateSpec } from '../../src/netlist/netlist.js';
import type { GateTiming } from '../../src/delay/model.js';
import { measurePhases } from '../../src/measure/phases.js';
import { design, expectClose } from '../helpers.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { devicesAtCorner } from '../../src/process/device.js';

const ps = 1e-12;
const T = 10e-9;

const inv = (name: string, input: string, output: string): GateSpec => ({ name, cell: 'INV', size: 1, inputs: [input], output });
const nand = (name: string, a: string, b: string, output: string): GateSpec => ({ name, cell: 'NAND2', size: 1, inputs: [a, b], output });

function compile(gates: GateSpec[], phases: [string, string]): CompiledNetlist {
  return compileNetlist({ clock: 'clk', phases, complements: {}, early: {}, gates, loads: {} });
}

interface Fixed {
  /** Delay of the rising and falling output edge, s. */
  readonly rise: number;
  readonly fall: number;
  /** Extra delay per second of input transition (a slope term), dimensionless. */
  readonly slope?: number;
  /** Output transition, s. */
  readonly transition?: number;
}

/** Hand-made timing: a fixed delay per gate and edge, plus an optional slope term, so edge times are exact. */
function fixedTiming(per: readonly Fixed[]): GateTiming {
  return {
    delay: (g, _pin, rising, tin) => (rising ? per[g]!.rise : per[g]!.fall) + (per[g]!.slope ?? 0) * tin,
    transition: (g) => per[g]!.transition ?? 50 * ps,
  };
}

/** Transitions of the reported period as [net, offset from the window start (s), rising, transition]. */
function edges(result: SimulationResult, net: CompiledNetlist): Array<[string, number, number, number]> {
  const e = result.edges;
  return Array.from({ length: e.count }, (_, i) => [
    net.netNames[e.net[i]!]!,
    e.time[i]! - result.windowStart,
    e.rising[i]!,
    e.transition[i]!,
  ]);
}

function expectEdges(actual: Array<[string, number, number, number]>, expected: Array<[string, number, number, number]>): void {
  expect(actual.map((e) => [e[0], e[2]])).toEqual(expected.map((e) => [e[0], e[2]]));
  actual.forEach((e, i) => {
    expectClose(e[1], expected[i]![1], 1e-18, 'abs');
    expectClose(e[3], expected[i]![3], 1e-18, 'abs');
  });
}

describe('Simulator.run on an inverter chain', () => {
  const net = compile([inv('g0', 'clk', 'n1'), inv('g1', 'n1', 'n2')], ['n1', 'n2']);
  const timing = fixedTiming([
    { rise: 100 * ps, fall: 70 * ps, slope: 0.5, transition: 50 * ps },
    { rise: 40 * ps, fall: 30 * ps, slope: 0.5, transition: 80 * ps },
  ]);
  const clock = { period: T, duty: 0.3, transition: 20 * ps };

  it('settles after one recorded period when nothing is in flight at its ends, with exact edge times and slew propagated', () => {
    const result = new Simulator(net).run(timing, clock);
    expect(result.status).toBe('settled');
    expect(result.reason).toBe('');
    expect(result.periodsSimulated).toBe(1);
    expect(result.period).toBe(T);
    expectClose(result.windowStart, T, 1e-18, 'abs');
    // g0 sees the 20 ps clock edge (+10 ps slope term); g1 sees g0's 50 ps edge (+25 ps).
    expectEdges(edges(result, net), [
      ['clk', 0, 1, 20 * ps],
      ['n1', 80 * ps, 0, 50 * ps],
      ['n2', 80 * ps + 65 * ps, 1, 80 * ps],
      ['clk', 0.3 * T, 0, 20 * ps],
      ['n1', 0.3 * T + 110 * ps, 1, 50 * ps],
      ['n2', 0.3 * T + 110 * ps + 55 * ps, 0, 80 * ps],
    ]);
    expect(Array.from(result.startValues)).toEqual([0, 1, 0]);
    expect(result.glitches).toEqual([]);
  });

  it('gives identical results when one simulator is reused', () => {
    const sim = new Simulator(net);
    const first = sim.run(timing, clock);
    const second = sim.run(timing, clock);
    expect(second).toEqual(first);
  });
});

describe('Simulator.run inertial delay', () => {
  // A pulse generator: out = NAND(clk, delayed inverted clk) pulses low for the inverter's delay.
  const net = compile([inv('g0', 'clk', 'n1'), nand('g1', 'clk', 'n1', 'out')], ['n1', 'out']);
  const clock = { period: T, duty: 0.5, transition: 20 * ps };

  it('swallows a pulse shorter than the gate delay and reports it as a glitch', () => {
    const timing = fixedTiming([
      { rise: 100 * ps, fall: 100 * ps },
      { rise: 150 * ps, fall: 150 * ps },
    ]);
    const result = new Simulator(net).run(timing, clock);
    expect(result.status).toBe('settled');
    const out = netId(net, 'out');
    expect(result.glitches).toHaveLength(1);
    expect(result.glitches[0]!.net).toBe(out);
    expectClose(result.glitches[0]!.time - result.windowStart, 100 * ps, 1e-18, 'abs');
    expect(edges(result, net).some((e) => e[0] === 'out')).toBe(false);
    const m = measurePhases(result, net);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.reason).toBe('out never switches: it stays high (the generator is stuck)');
  });

  it('passes a pulse longer than the gate delay', () => {
    const timing = fixedTiming([
      { rise: 100 * ps, fall: 100 * ps },
      { rise: 50 * ps, fall: 50 * ps },
    ]);
    const result = new Simulator(net).run(timing, clock);
    expect(result.glitches).toEqual([]);
    const out = edges(result, net).filter((e) => e[0] === 'out');
    expect(out.map((e) => e[2])).toEqual([0, 1]);
    expectClose(out[0]![1], 50 * ps, 1e-18, 'abs');
    expectClose(out[1]![1], 150 * ps, 1e-18, 'abs');
  });
});

describe('Simulator.run failures', () => {
  // A ring of three inversions that runs while the clock is high.
  const ring = compile([nand('g0', 'clk', 'r3', 'r1'), inv('g1', 'r1', 'r2'), inv('g2', 'r2', 'r3')], ['r1', 'r2']);
  const clock = { period: T, duty: 0.5, transition: 20 * ps };

  it('returns an oscillating result with the reason instead of hanging', () => {
    const timing = fixedTiming([
      { rise: 1 * ps, fall: 1 * ps },
      { rise: 1 * ps, fall: 1 * ps },
      { rise: 1 * ps, fall: 1 * ps },
    ]);
    const result = new Simulator(ring).run(timing, clock);
    expect(result.status).toBe('oscillating');
    expect(result.reason).toMatch(/^the generator oscillates: .*busiest net r\d/);
    const m = measurePhases(result, ring);
    expect(m).toEqual({ ok: false, reason: result.reason });
  });

  it('reports a slower gated ring that repeats every period as settled but glitching', () => {
    const timing = fixedTiming([
      { rise: 300 * ps, fall: 300 * ps },
      { rise: 300 * ps, fall: 300 * ps },
      { rise: 300 * ps, fall: 300 * ps },
    ]);
    const result = new Simulator(ring).run(timing, clock);
    expect(result.status).toBe('settled');
    const m = measurePhases(result, ring);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.reason).toMatch(/^r1 switches \d+ times up and \d+ times down per period; a phase must switch once each way/);
  });

  it('says why when a divide-by-two never repeats within one clock period', () => {
    // Master-slave D flip-flop of NAND latches with its inverted output fed back: q toggles once per period.
    // The latch gates get slightly different delays so the start-up race resolves.
    const gates: GateSpec[] = [
      inv('ci', 'clk', 'clkb'),
      inv('di', 'sqb', 'dn'),
      nand('ma', 'sqb', 'clk', 'a'),
      nand('mb', 'dn', 'clk', 'b'),
      nand('mq', 'a', 'mqb', 'mq'),
      nand('mqbg', 'b', 'mq', 'mqb'),
      nand('sa', 'mq', 'clkb', 'c'),
      nand('sb', 'mqb', 'clkb', 'd'),
      nand('sq', 'c', 'sqb', 'sq'),
      nand('sqbg', 'd', 'sq', 'sqb'),
    ];
    const net = compile(gates, ['sq', 'sqb']);
    const timing = fixedTiming(gates.map((_, g) => ({ rise: (60 + 7 * g) * ps, fall: (50 + 5 * g) * ps })));
    const result = new Simulator(net).run(timing, clock, { maxPeriods: 12 });
    expect(result.status).toBe('unsettled');
    expect(result.periodsSimulated).toBe(12);
    expect(result.reason).toMatch(/^no periodic steady state after 12 clock periods/);
    // It really divides by two: q changes exactly once in the reported period.
    expect(edges(result, net).filter((e) => e[0] === 'sq')).toHaveLength(1);
    const m = measurePhases(result, net);
    expect(m).toEqual({ ok: false, reason: result.reason });
  });
});

describe('Simulator.run steady state', () => {
  // Two 4 ns inverters: the clock's fall at 0.5 T reaches n2 at 0.5 T + 8 ns, past the period
  // boundary, so a transition is always in flight there and two periods are compared. (One
  // inverter slower than the clock's low time could not do it: inertial delay would swallow it.)
  const net = compile([inv('g0', 'clk', 'n1'), inv('g1', 'n1', 'n2')], ['n1', 'n2']);
  const clock = { period: T, duty: 0.5, transition: 20 * ps };
  const long = 4e-9;

  /**
   * g0's delay shrinks by 10 ps per call down to `long` from the 7th call on (call 0 is the
   * start-up settle, then one call per clock edge). Recorded period k uses calls 2k (through n2's
   * fall carried over from period k-1), 2k+1 and 2k+2, so periods k-1 and k first agree at k = 4:
   * five recorded periods.
   */
  function slowingTiming(): GateTiming {
    let calls = 0;
    return {
      delay: (g) => (g === 0 ? long + 10 * ps * Math.max(0, 6 - calls++) : long),
      transition: () => 40 * ps,
    };
  }

  it('compares the last two periods when a transition is in flight: it stops at the first pair that agree', () => {
    const result = new Simulator(net).run(slowingTiming(), clock);
    expect(result.status).toBe('settled');
    expect(result.periodsSimulated).toBe(5);
    expectClose(result.windowStart, 5 * T, 1e-18, 'abs');
    expectEdges(edges(result, net), [
      ['clk', 0, 1, 20 * ps],
      ['n2', 0.5 * T + 2 * long - T, 0, 40 * ps],
      ['n1', long, 0, 40 * ps],
      ['clk', 0.5 * T, 0, 20 * ps],
      ['n2', 2 * long, 1, 40 * ps],
      ['n1', 0.5 * T + long, 1, 40 * ps],
    ]);
  });

  it('settles a fixed timing with a transition in flight after three recorded periods', () => {
    // The first period has no carried-over fall of n2 (the clock was low before it), so it differs
    // from the second; the second and third agree.
    const fixed = fixedTiming([
      { rise: long, fall: long },
      { rise: long, fall: long },
    ]);
    const result = new Simulator(net).run(fixed, clock);
    expect(result.status).toBe('settled');
    expect(result.periodsSimulated).toBe(3);
    expect(edges(result, net).filter((e) => e[0] === 'n2')).toHaveLength(2);
  });

  it('gives up at maxPeriods with the counts of the two last periods in the reason', () => {
    const result = new Simulator(net).run(slowingTiming(), clock, { maxPeriods: 4 });
    expect(result.status).toBe('unsettled');
    expect(result.periodsSimulated).toBe(4);
    // n2 comes first in the period (its carried-over fall), so it is named among equals.
    expect(result.reason).toBe(
      'no periodic steady state after 4 clock periods (the last two differ: 6 vs 6 transitions; busiest net n2 (2 transitions))',
    );
  });

  it('reuses a simulator cleanly after a failed run', () => {
    const sim = new Simulator(net);
    const fixed = fixedTiming([
      { rise: long, fall: long },
      { rise: long, fall: long },
    ]);
    const fresh = new Simulator(net).run(fixed, clock);
    expect(sim.run(slowingTiming(), clock, { maxPeriods: 3 }).status).toBe('unsettled');
    expect(sim.run(fixed, clock)).toEqual(fresh);
  });
});

describe('Simulator.run reported period on the demo design', () => {
  it('repeats: starting again from its start state reproduces it edge for edge at every corner', () => {
    const { design: d, card } = loadDesign(design('doubler'));
    const resolved = resolveDesign(d, card);
    const sim = new Simulator(resolved.netlist);
    const clockOf = (duty: number) => ({ period: 1 / d.clock.frequency, duty, transition: d.clock.transition });
    for (const { corner } of resolved.corners) {
      const timing = resolved.model.bind(resolved.netlist, resolved.loads, devicesAtCorner(card, corner));
      const cold = sim.run(timing, clockOf(corner.duty));
      const warm = sim.run(timing, clockOf(corner.duty), { warm: true });
      expect(cold.status).toBe('settled');
      expect(warm.status).toBe('settled');
      expect(warm.edges.count).toBe(cold.edges.count);
      for (let i = 0; i < cold.edges.count; i++) {
        expect(warm.edges.net[i]).toBe(cold.edges.net[i]);
        expectClose(warm.edges.time[i]! - warm.windowStart, cold.edges.time[i]! - cold.windowStart, 1e-21, 'abs');
      }
    }
  });
});
