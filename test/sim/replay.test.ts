import { describe, it, expect } from 'vitest';
import { Simulator, type SimulationResult } from '../../src/sim/engine.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { drawMismatch, mismatchBuffers, mismatchSigmas, type SampleMismatch } from '../../src/variation/mismatch.js';
import { design } from '../helpers.js';
import { compileNetlist } from '../../src/netlist/netlist.js';
import type { GateTiming } from '../../src/delay/model.js';
import { randomLcg, randomNormal } from 'd3-random';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import type { ResolvedDesign } from '../../src/analysis/resolve.js';

/** Each net's transitions as [net, rising, time, transition], ordered per net: what a replay must reproduce exactly. */
function perNet(result: SimulationResult): string[] {
  const rows: Array<[number, number, number, number, number]> = [];
  for (let i = 0; i < result.edges.count; i++) {
    rows.push([result.edges.net[i]!, i, result.edges.rising[i]!, result.edges.time[i]!, result.edges.transition[i]!]);
  }
  // Stable per net: within a net, the order of the edges themselves is kept.
  rows.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  return rows.map(([n, , r, t, tr]) => `${n} ${r} ${t} ${tr}`);
}

function summary(result: SimulationResult) {
  return {
    status: result.status,
    windowStart: result.windowStart,
    periods: result.periodsSimulated,
    glitches: result.glitches.length,
    start: Array.from(result.startValues),
    edges: perNet(result),
  };
}

/**
 * Runs the same sequence of Monte Carlo dies through a simulator that replays and one that always
 * simulates, both warm, and compares every run.
 */
function compareDies(resolved: ResolvedDesign, dies: number): { replayed: number; simulated: number } {
  const { design: d, netlist, loads, model, card } = resolved;
  const sigmas = mismatchSigmas(netlist, card, resolved.switches);
  const counts = { replayed: 0, simulated: 0 };
  for (const { corner } of resolved.corners.slice(0, 6)) {
    const devices = devicesAtCorner(card, corner);
    const clock = { period: 1 / d.clock.frequency, duty: corner.duty, transition: d.clock.transition };
    const fast = new Simulator(netlist);
    const plain = new Simulator(netlist);
    const buffers: SampleMismatch = mismatchBuffers(sigmas);
    for (let i = 0; i < dies; i++) {
      const die = drawMismatch(sigmas, 11, i, buffers);
      const timing = model.bind(netlist, loads, devices, die);
      const a = fast.run(timing, clock, { warm: true, replay: true });
      if (fast.replayed) counts.replayed++;
      else counts.simulated++;
      const b = plain.run(timing, clock, { warm: true });
      expect(plain.replayed).toBe(false);
      expect(summary(a)).toEqual(summary(b));
    }
  }
  return counts;
}

// Two equal inverters race from the clock into one NAND: which input falls first decides which
// pin (and which input ramp) times the NAND's output, so the order matters.
const racing = compileNetlist({
  clock: 'clk',
  phases: ['p1', 'p2'],
  complements: {},
  early: {},
  loads: {},
  gates: [
    { name: 'a', cell: 'INV', size: 1, inputs: ['clk'], output: 'n1' },
    { name: 'b', cell: 'INV', size: 1, inputs: ['clk'], output: 'n2' },
    { name: 'c', cell: 'NAND2', size: 1, inputs: ['n1', 'n2'], output: 'p1' },
    { name: 'd', cell: 'INV', size: 1, inputs: ['p1'], output: 'p2' },
  ],
});

describe('replay of the steady period', () => {
  const { design: d, card } = loadDesign(design('doubler'));
  const doubler = resolveDesign(d, card);

  it('gives exactly the simulated edges for ordinary mismatch, and is used for every die after the first', () => {
    const counts = compareDies(doubler, 60);
    // The first die of each corner starts cold and is simulated; every later one replays.
    expect(counts).toEqual({ replayed: 6 * 59, simulated: 6 });
  });

  it('falls back to simulation when a die reorders the edges reaching a gate, and still agrees', () => {
    const normal = randomNormal.source(randomLcg(0.25))(0, 5e-12);
    const base = new Float64Array(4);
    // Delay: a base per gate, a slope on the input ramp and a pin offset; the output ramp
    // follows the input ramp, so the cause of an edge shows in its transition too.
    const timing: GateTiming = {
      delay: (g, pin, rising, tin) => base[g]! + (rising ? 10e-12 : 0) + 0.2 * tin + pin * 3e-12,
      transition: (_g, pin, _rising, tin) => 40e-12 + 0.1 * tin + pin * 1e-12,
    };
    const clock = { period: 10e-9, duty: 0.5, transition: 100e-12 };
    const fast = new Simulator(racing);
    const plain = new Simulator(racing);
    let replayed = 0;
    let simulated = 0;
    for (let i = 0; i < 200; i++) {
      base[0] = 100e-12 + normal();
      base[1] = 100e-12 + normal();
      base[2] = 80e-12;
      base[3] = 60e-12;
      const a = fast.run(timing, clock, { warm: true, replay: true });
      if (fast.replayed) replayed++;
      else simulated++;
      expect(summary(a)).toEqual(summary(plain.run(timing, clock, { warm: true })));
    }
    // A die keeps the last simulated order about half the time.
    expect(replayed).toBeGreaterThan(40);
    expect(simulated).toBeGreaterThan(40);
  });

  it('falls back when an edge would land after the next clock rise, though every gate sees its edges in order', () => {
    const timing: GateTiming = { delay: (g) => [100e-12, 110e-12, 80e-12, 60e-12][g]!, transition: () => 50e-12 };
    const fast = new Simulator(racing);
    const plain = new Simulator(racing);
    const slow = { period: 10e-9, duty: 0.5, transition: 100e-12 };
    fast.run(timing, slow);
    plain.run(timing, slow);
    // The clock now falls at 0.85 ns, after the first half's edges end at 0.25 ns (so no gate sees
    // a new order), but p1 falls 190 ps later and p2 250 ps later, past the period's end at 1 ns.
    const short = { period: 1e-9, duty: 0.85, transition: 100e-12 };
    const a = fast.run(timing, short, { warm: true, replay: true });
    expect(fast.replayed).toBe(false);
    expect(summary(a)).toEqual(summary(plain.run(timing, short, { warm: true })));
  });
});
