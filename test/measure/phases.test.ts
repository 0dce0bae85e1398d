import { describe, it, expect } from 'vitest';
import { CycleIndex, deadTime, GAP_LEVEL, highWidth, measurePhases, type NetCycle } from '../../src/measure/phases.js';
import { compileNetlist, netId, type CompiledNetlist } from '../../src/netlist/netlist.js';
import type { SimulationResult } from '../../src/sim/engine.js';
import { expectClose } from '../helpers.js';

const ns = 1e-9;
const ps = 1e-12;
const T = 10 * ns;

/** Nets to hang hand-made edges on: two phases and an early phase (the gates are never simulated). */
const net: CompiledNetlist = compileNetlist({
  clock: 'clk',
  phases: ['p1', 'p2'],
  complements: {},
  early: { p1: 'p1e' },
  gates: [
    { name: 'a', cell: 'INV', size: 1, inputs: ['clk'], output: 'p1' },
    { name: 'b', cell: 'INV', size: 1, inputs: ['p1'], output: 'p2' },
    { name: 'c', cell: 'INV', size: 1, inputs: ['p2'], output: 'p1e' },
  ],
  loads: {},
});

type Edge = [net: string, time: number, rising: 0 | 1, transition: number];

/** A settled result whose reported period starts at `start` and holds `list` in time order. */
function result(list: Edge[], start = 0, startValues: Record<string, 0 | 1> = {}): SimulationResult {
  const sorted = [...list].sort((a, b) => a[1] - b[1]);
  const values = new Uint8Array(net.netNames.length);
  for (const [name, v] of Object.entries(startValues)) values[netId(net, name)] = v;
  return {
    status: 'settled',
    reason: '',
    period: T,
    windowStart: start,
    edges: {
      count: sorted.length,
      net: Int32Array.from(sorted, (e) => netId(net, e[0])),
      time: Float64Array.from(sorted, (e) => start + e[1]),
      rising: Uint8Array.from(sorted, (e) => e[2]),
      transition: Float64Array.from(sorted, (e) => e[3]),
    },
    startValues: values,
    glitches: [],
    periodsSimulated: 2,
  };
}

const cycle = (name: string, rise: number, fall: number, riseTransition = 100 * ps, fallTransition = 100 * ps): NetCycle => ({
  net: name,
  rise,
  fall,
  riseTransition,
  fallTransition,
});

describe('deadTime', () => {
  it('measures from the falling 50 % point of one phase to the rising 50 % point of the other', () => {
    const d = deadTime(cycle('p1', 1 * ns, 5 * ns), cycle('p2', 6 * ns, 9.5 * ns), T);
    expect(d.from).toBe('p1');
    expect(d.to).toBe('p2');
    expectClose(d.t50, 1 * ns, 1e-12);
    expect(d.start).toBe(5 * ns);
  });

  it('wraps around the period for the return handover', () => {
    // p2 falls at 9.5 ns, p1 rises at 1 ns of the next period: 1.5 ns.
    const d = deadTime(cycle('p2', 6 * ns, 9.5 * ns), cycle('p1', 1 * ns, 5 * ns), T);
    expectClose(d.t50, 1.5 * ns, 1e-12);
  });

  it('is minus the overlap when the next phase rises before this one falls', () => {
    const d = deadTime(cycle('p1', 1 * ns, 5 * ns), cycle('p2', 4.7 * ns, 9.5 * ns), T);
    expectClose(d.t50, -0.3 * ns, 1e-12);
  });

  it('gives the clean gap at 10 % of swing: dead - 0.4 * (t_fall of from + t_rise of to)', () => {
    // Linear ramps: the falling edge reaches 10 % 0.4 t_f after its 50 % point, the rising one
    // leaves 10 % 0.4 t_r before it. 1 ns - 0.4 * (200 ps + 300 ps) = 800 ps.
    expect(GAP_LEVEL).toBe(0.1);
    const d = deadTime(cycle('p1', 1 * ns, 5 * ns, 50 * ps, 200 * ps), cycle('p2', 6 * ns, 9.5 * ns, 300 * ps, 70 * ps), T);
    expectClose(d.gap, 800 * ps, 1e-12);
  });
});

describe('highWidth', () => {
  it('measures the high time, wrapping when the fall comes first in the window', () => {
    expectClose(highWidth(cycle('p1', 1 * ns, 5 * ns), T), 4 * ns, 1e-12);
    expectClose(highWidth(cycle('p1', 8 * ns, 2 * ns), T), 4 * ns, 1e-12);
  });
});

const netCycle = (r: SimulationResult, n: CompiledNetlist, name: string) => new CycleIndex(r, n).cycle(name);

describe('CycleIndex.cycle', () => {
  it('finds the one rise and one fall of a net with their transitions', () => {
    const r = result(
      [
        ['p1', 1 * ns, 1, 120 * ps],
        ['p1', 5 * ns, 0, 90 * ps],
      ],
      20 * ns,
    );
    const c = netCycle(r, net, 'p1');
    if (typeof c === 'string') throw new Error(c);
    expectClose(c.rise, 21 * ns, 1e-12);
    expectClose(c.fall, 25 * ns, 1e-12);
    expect([c.net, c.riseTransition, c.fallTransition]).toEqual(['p1', 120 * ps, 90 * ps]);
  });

  it.each([
    [[], { p1: 0 }, 'p1 never switches: it stays low (the generator is stuck)'],
    [[], { p1: 1 }, 'p1 never switches: it stays high (the generator is stuck)'],
    [
      [
        ['p1', 1 * ns, 1, 0],
        ['p1', 2 * ns, 0, 0],
        ['p1', 3 * ns, 1, 0],
        ['p1', 4 * ns, 0, 0],
      ],
      {},
      'p1 switches 2 times up and 2 times down per period; a phase must switch once each way (glitching)',
    ],
  ] as const)('explains a net that does not switch once each way (%#)', (list, start, reason) => {
    expect(netCycle(result(list as unknown as Edge[], 0, start), net, 'p1')).toBe(reason);
  });

  it('re-indexes a new result on reset, forgetting the old edges', () => {
    const index = new CycleIndex(
      result([
        ['p1', 1 * ns, 1, 0],
        ['p1', 2 * ns, 0, 0],
      ]),
      net,
    );
    index.reset(
      result([
        ['p1', 3 * ns, 1, 0],
        ['p1', 7 * ns, 0, 0],
      ]),
    );
    expect(index.cycle('p1')).toEqual({ net: 'p1', rise: 3 * ns, fall: 7 * ns, riseTransition: 0, fallTransition: 0 });
    index.reset(result([], 0, { p1: 1 }));
    expect(index.cycle('p1')).toBe('p1 never switches: it stays high (the generator is stuck)');
  });

  it('names a net that is not in the generator', () => {
    expect(netCycle(result([]), net, 'zz')).toBe('zz is not a net of the generator');
  });
});

describe('measurePhases', () => {
  const handmade = (p2Rise: number): SimulationResult =>
    result(
      [
        ['p1', 1 * ns, 1, 100 * ps],
        ['p1', 5 * ns, 0, 150 * ps],
        ['p2', p2Rise, 1, 250 * ps],
        ['p2', 9.5 * ns, 0, 50 * ps],
        ['p1e', 0.9 * ns, 1, 100 * ps],
        ['p1e', 4.6 * ns, 0, 100 * ps],
      ],
      30 * ns,
    );

  it('reports both dead times, gaps, widths, duty and no overlap', () => {
    const m = measurePhases(handmade(6 * ns), net);
    if (!m.ok) throw new Error(m.reason);
    const [d12, d21] = m.deadTimes;
    expect([d12.from, d12.to, d21.from, d21.to]).toEqual(['p1', 'p2', 'p2', 'p1']);
    expectClose(d12.t50, 1 * ns, 1e-12);
    expectClose(d21.t50, 1.5 * ns, 1e-12);
    expectClose(d12.gap, 1 * ns - 0.4 * (150 + 250) * ps, 1e-12);
    expectClose(d21.gap, 1.5 * ns - 0.4 * (50 + 100) * ps, 1e-12);
    expect(Object.keys(m.widths)).toEqual(['p1', 'p2', 'p1e']);
    expectClose(m.widths.p1!, 4 * ns, 1e-12);
    expectClose(m.widths.p2!, 3.5 * ns, 1e-12);
    expectClose(m.widths.p1e!, 3.7 * ns, 1e-12);
    expectClose(m.duty.p2!, 0.35, 1e-12);
    expect(m.overlap).toBe(0);
  });

  it('reports an overlap as a negative dead time, and its length at the 10 % level', () => {
    const m = measurePhases(handmade(4.6 * ns), net);
    if (!m.ok) throw new Error(m.reason);
    expectClose(m.deadTimes[0].t50, -0.4 * ns, 1e-12);
    // Both above 10 %: from p2 passing 10 % (0.4 * 250 ps before its 50 % point) to p1 passing it
    // (0.4 * 150 ps after): 400 + 100 + 60 = 560 ps.
    expectClose(m.overlap, 560 * ps, 1e-12);
    expect(m.level).toBe(0.1);
  });

  it('measures the gap and the overlap at the level the design sets', () => {
    const m = measurePhases(handmade(6 * ns), net, undefined, { level: 0.3 });
    if (!m.ok) throw new Error(m.reason);
    // 1 ns - 0.2 * (150 + 250) ps = 920 ps.
    expectClose(m.deadTimes[0].gap, 920 * ps, 1e-12);
    expect(m.level).toBe(0.3);
  });

  it("takes the delay model's error band off the gap the checks read, in proportion to the dead time", () => {
    const m = measurePhases(handmade(6 * ns), net, undefined, { band: 0.05 });
    if (!m.ok) throw new Error(m.reason);
    const d = m.deadTimes[0];
    expectClose(d.gapBound, d.gap - 0.05 * 1 * ns, 1e-12);
  });

  it("places each phase edge's level crossing where the delay model shapes it", () => {
    // A model whose edges reach any level 30 ps (rising: before, falling: after) from the 50 % point.
    const shaped = {
      delay: () => 0,
      transition: () => 0,
      crossing: (_g: number, _p: number, rising: boolean) => (rising ? -30 * ps : 30 * ps),
    };
    const r = result(
      [
        ['clk', 0, 1, 100 * ps],
        ['clk', 5 * ns, 0, 100 * ps],
        ['p1', 1 * ns, 1, 100 * ps],
        ['p1', 5 * ns, 0, 150 * ps],
        ['p2', 6 * ns, 1, 250 * ps],
        ['p2', 9.5 * ns, 0, 50 * ps],
        ['p1e', 0.9 * ns, 1, 100 * ps],
        ['p1e', 4.6 * ns, 0, 100 * ps],
      ],
      30 * ns,
    );
    const m = measurePhases(r, net, undefined, { timing: shaped });
    if (!m.ok) throw new Error(m.reason);
    expectClose(m.deadTimes[0].gap, 1 * ns - 60 * ps, 1e-12);
  });

  it('passes on the reason of a run that did not settle', () => {
    const r: SimulationResult = { ...handmade(6 * ns), status: 'oscillating', reason: 'the generator oscillates: test' };
    expect(measurePhases(r, net)).toEqual({ ok: false, reason: 'the generator oscillates: test' });
  });

  it('fails when an early phase does not switch', () => {
    const r = result([
      ['p1', 1 * ns, 1, 0],
      ['p1', 5 * ns, 0, 0],
      ['p2', 6 * ns, 1, 0],
      ['p2', 9 * ns, 0, 0],
    ]);
    expect(measurePhases(r, net)).toEqual({ ok: false, reason: 'p1e never switches: it stays low (the generator is stuck)' });
  });
});
