import { describe, it, expect } from 'vitest';
import { centralTransitions, linearCrossings, modelCrossings, type EdgeShape } from '../../src/measure/levels.js';
import { CycleIndex, type NetCycle } from '../../src/measure/phases.js';
import { compileNetlist, netId } from '../../src/netlist/netlist.js';
import type { SimulationResult } from '../../src/sim/engine.js';
import { expectClose } from '../helpers.js';

const ps = 1e-12;
const net = compileNetlist({
  clock: 'clk',
  phases: ['a', 'b'],
  complements: {},
  early: {},
  loads: {},
  gates: [
    { name: 'u1', cell: 'INV', size: 1, inputs: ['clk'], output: 'a' },
    { name: 'u2', cell: 'INV', size: 1, inputs: ['a'], output: 'b' },
  ],
});

function settled(list: Array<[string, number, 0 | 1, number]>): SimulationResult {
  return {
    status: 'settled',
    reason: '',
    period: 10e-9,
    windowStart: 0,
    edges: {
      count: list.length,
      net: Int32Array.from(list, (e) => netId(net, e[0])),
      time: Float64Array.from(list, (e) => e[1]),
      rising: Uint8Array.from(list, (e) => e[2]),
      transition: Float64Array.from(list, (e) => e[3]),
    },
    startValues: new Uint8Array(net.netNames.length),
    glitches: [],
    periodsSimulated: 2,
  };
}

const cycle: NetCycle = { net: 'a', rise: 1e-9, fall: 6e-9, riseTransition: 200 * ps, fallTransition: 100 * ps };

describe('linearCrossings', () => {
  it('puts the 10 % point 0.4 transitions before a rising 50 % point and after a falling one', () => {
    const c = linearCrossings(cycle, 0.1);
    expectClose(c.rise, -80 * ps, 1e-12);
    expectClose(c.fall, 40 * ps, 1e-12);
  });

  it('is zero at the 50 % level', () => {
    const c = linearCrossings(cycle, 0.5);
    expect(Math.abs(c.rise)).toBe(0);
    expect(Math.abs(c.fall)).toBe(0);
  });
});

describe('modelCrossings', () => {
  const result = settled([
    ['clk', 0, 1, 100 * ps],
    ['a', 0.2e-9, 0, 100 * ps],
    ['clk', 5e-9, 0, 100 * ps],
    ['a', 5.1e-9, 1, 200 * ps],
  ]);
  const index = new CycleIndex(result, net);
  const a: NetCycle = { net: 'a', rise: 5.1e-9, fall: 0.2e-9, riseTransition: 200 * ps, fallTransition: 100 * ps };

  it("asks the model with the edge's own input transition and direction", () => {
    const calls: string[] = [];
    const timing = {
      delay: () => 0,
      transition: () => 0,
      crossing: (g: number, pin: number, rising: boolean, tin: number, level: number) => {
        calls.push(`${g} ${pin} ${rising} ${Math.round(tin / ps)} ${level}`);
        return rising ? -7 * ps : 9 * ps;
      },
    };
    const c = modelCrossings(a, index, net, timing, 0.1);
    expect(c).toEqual({ rise: -7 * ps, fall: 9 * ps });
    expect(calls).toEqual(['0 0 true 100 0.1', '0 0 false 100 0.1']);
  });

  it('keeps linear ramps for a model without edge shapes', () => {
    const c = modelCrossings(a, index, net, { delay: () => 0, transition: () => 0 }, 0.1);
    expect(c).toEqual(linearCrossings(a, 0.1));
  });
});

describe('centralTransitions', () => {
  // An edge's crossings as (fraction, time from 50 %) pairs: a tailed rising edge, 20 % at -90 ps
  // and 80 % at +150 ps; its falling edge unknown to the shape.
  const shape: EdgeShape = (net, rising, fraction) => {
    if (net !== 'p2' || !rising) return null;
    if (fraction === 0.2) return -90e-12;
    if (fraction === 0.8) return 150e-12;
    return null;
  };
  const cycle = { riseTransition: 525e-12, fallTransition: 610e-12 };

  it('takes the 20-80 % interval over 0.6, and the full-swing transition where the shape cannot say', () => {
    const t = centralTransitions('p2', cycle, shape);
    expectClose(t.riseTransition, 240e-12 / 0.6, 1e-9);
    expect(t.fallTransition).toBe(610e-12);
  });

  it('is the cycle itself without a shape, and for a net the shape does not know', () => {
    expect(centralTransitions('p2', cycle)).toBe(cycle);
    expect(centralTransitions('p1', cycle, shape)).toEqual(cycle);
  });
});
