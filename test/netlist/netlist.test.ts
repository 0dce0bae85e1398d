import { describe, it, expect } from 'vitest';
import { compileNetlist, netId, type GateSpec, type Netlist } from '../../src/netlist/netlist.js';
import { netLoads } from '../../src/netlist/loads.js';
import { gatePinCapacitance } from '../../src/cells/card-widths.js';
import { parasiticCapacitance, pinCapacitance } from '../../src/cells/library.js';
import { loadProcess } from '../../src/cli/load.js';
import { expectClose, processCard, inputErrorMessage, inputIssues } from '../helpers.js';

const inv = (name: string, input: string, output: string, size = 1): GateSpec => ({ name, cell: 'INV', size, inputs: [input], output });

function netlist(gates: GateSpec[], phases: [string, string] = ['a', 'b'], extra: Partial<Netlist> = {}): Netlist {
  return { clock: 'clk', phases, complements: {}, early: {}, gates, loads: {}, ...extra };
}

const message = inputErrorMessage;
/** The one issue `fn` throws, as code, path and shown value. */
const issue = (fn: () => unknown) => {
  const [only, ...rest] = inputIssues(fn);
  expect(rest).toEqual([]);
  return [only!.code, only!.path, only!.value];
};

/** A cross-coupled NAND latch fed by the clock and its complement. */
const latch = (): GateSpec[] => [
  inv('ci', 'clk', 'clkb'),
  { name: 'g1', cell: 'NAND2', size: 1, inputs: ['clk', 'b'], output: 'a' },
  { name: 'g2', cell: 'NAND2', size: 1, inputs: ['clkb', 'a'], output: 'b' },
];

describe('compileNetlist', () => {
  it('indexes nets, drivers and fanout (gate, pin)', () => {
    const c = compileNetlist(netlist(latch()));
    expect(c.netNames).toEqual(['clk', 'clkb', 'b', 'a']);
    expect(c.clock).toBe(0);
    expect(Array.from(c.driver)).toEqual([-1, 0, 2, 1]);
    const fanout = (name: string) => {
      const n = netId(c, name);
      return Array.from({ length: c.fanoutStart[n + 1]! - c.fanoutStart[n]! }, (_, k) => [
        c.fanoutGate[c.fanoutStart[n]! + k],
        c.fanoutPin[c.fanoutStart[n]! + k],
      ]);
    };
    expect(fanout('clk')).toEqual([
      [0, 0],
      [1, 0],
    ]);
    expect(fanout('a')).toEqual([[2, 1]]);
    expect(fanout('b')).toEqual([[1, 1]]);
    expect(Array.from(c.gateSize)).toEqual([1, 1, 1]);
  });

  it('accepts a feedback loop that the clock controls from outside the loop', () => {
    expect(() => compileNetlist(netlist(latch()))).not.toThrow();
  });

  it.each([
    [
      'a wrong pin count',
      [{ name: 'g', cell: 'NAND2', size: 1, inputs: ['clk'], output: 'a' }, inv('i', 'a', 'b')],
      ['netlist.invalid', ['generator', 'gates', 0, 'inputs'], '["clk"]'],
    ],
    ['two gates with one name', [inv('u', 'clk', 'a'), inv('u', 'a', 'b')], ['value.duplicate', ['generator', 'gates', 1, 'name'], '"u"']],
    [
      'two drivers on a net',
      [inv('u1', 'clk', 'a'), inv('u2', 'clk', 'a'), inv('u3', 'a', 'b')],
      ['value.duplicate', ['generator', 'gates', 1, 'output'], '"a"'],
    ],
    [
      'a gate driving the clock',
      [inv('u1', 'a', 'clk'), inv('u2', 'clk', 'a'), inv('u3', 'a', 'b')],
      ['netlist.invalid', ['generator', 'gates', 0, 'output'], '"clk"'],
    ],
    [
      'an undriven net',
      [inv('u1', 'clk', 'a'), { name: 'g', cell: 'NAND2', size: 1, inputs: ['a', 'floating'], output: 'b' }],
      ['netlist.invalid', ['generator', 'gates', 1, 'inputs', 1], '"floating"'],
    ],
    ['a phase that no gate drives', [inv('u1', 'clk', 'a')], ['reference.unknown', ['generator', 'phases', 1], '"b"']],
  ] as const)('refuses %s, naming the gate or net', (_what, gates, expected) => {
    expect(issue(() => compileNetlist(netlist(gates as unknown as GateSpec[])))).toEqual(expected);
  });

  it('says which net is undriven and what would drive it, in words', () => {
    const gates = [inv('u1', 'clk', 'a'), { name: 'g', cell: 'NAND2', size: 1, inputs: ['a', 'floating'], output: 'b' } as GateSpec];
    expect(message(() => compileNetlist(netlist(gates)))).toBe(
      'generator.gates[1].inputs[1]: "floating" is not driven by any gate and is not the clock "clk"; every input net needs a driver',
    );
  });

  it('refuses a ring of inverters that no clock input reaches (combinational loop)', () => {
    const gates = [inv('r1', 'r3', 'r1o'), inv('r2', 'r1o', 'r2o'), inv('r3', 'r2o', 'r3'), inv('a', 'clk', 'a'), inv('b', 'r3', 'b')];
    expect(issue(() => compileNetlist(netlist(gates)))).toEqual(['netlist.invalid', ['generator', 'gates'], '"r1, r2, r3"']);
    expect(message(() => compileNetlist(netlist(gates)))).toMatch(
      /^generator\.gates: "r1, r2, r3" form a combinational loop that no input from the clock controls/,
    );
  });

  it('refuses a gate that feeds itself with no clock input', () => {
    const gates = [{ name: 'self', cell: 'NAND2', size: 1, inputs: ['a', 'a'], output: 'a' } as GateSpec, inv('b', 'clk', 'b')];
    expect(issue(() => compileNetlist(netlist(gates)))).toEqual(['netlist.invalid', ['generator', 'gates'], '"self"']);
  });

  it('refuses a loop whose only clock input comes from inside the loop', () => {
    // The loop l1 -> l2 -> l1 listens only to itself; a clocked gate outside reads it but does not control it.
    const gates: GateSpec[] = [
      { name: 'l1', cell: 'NAND2', size: 1, inputs: ['q2', 'q2'], output: 'q1' },
      inv('l2', 'q1', 'q2'),
      { name: 'a', cell: 'NAND2', size: 1, inputs: ['clk', 'q1'], output: 'a' },
      inv('b', 'a', 'b'),
    ];
    expect(issue(() => compileNetlist(netlist(gates)))).toEqual(['netlist.invalid', ['generator', 'gates'], '"l1, l2"']);
  });

  it('refuses a complement or early net keyed by something that is not a phase', () => {
    const gates = [...latch(), inv('cb', 'a', 'ab')];
    expect(issue(() => compileNetlist(netlist(gates, ['a', 'b'], { complements: { x: 'ab' } })))).toEqual([
      'reference.unknown',
      ['generator'],
      '"x"',
    ]);
  });

  it('uses the given path prefix in its messages', () => {
    expect(issue(() => compileNetlist(netlist([inv('u', 'nowhere', 'a'), inv('v', 'a', 'b')]), ['switches']))).toEqual([
      'netlist.invalid',
      ['switches', 0, 'inputs', 0],
      '"nowhere"',
    ]);
  });
});

describe('netLoads', () => {
  const card = loadProcess(processCard('generic180'));
  const unit = { wn: card.unit.wn, wp: card.unit.wp };
  // A drain carries its junction and its gate overlap twice (Miller): generic180's 1.2 + 2 x 0.2 fF/um.
  const caps = { cgateN: card.n.cgate, cgateP: card.p.cgate, cdrainN: 1.6e-9, cdrainP: 1.6e-9 };

  it('sums fanout pins, the driver parasitic, the generator capacitors and the declared loads', () => {
    const gates = [
      inv('d', 'clk', 'a', 2),
      { name: 'g', cell: 'NAND2', size: 3, inputs: ['a', 'clk'], output: 'b' } as GateSpec,
      inv('h', 'a', 'c', 4),
    ];
    const c = compileNetlist(netlist(gates, ['a', 'b'], { loads: { a: 10e-15 } }));
    const loads = netLoads(c, card, { path: ['loads'], caps: { a: 100e-15 } });
    const expected =
      pinCapacitance('NAND2', 3, unit, caps) +
      pinCapacitance('INV', 4, unit, caps) +
      parasiticCapacitance('INV', 2, unit, caps) +
      10e-15 +
      100e-15;
    expectClose(loads[netId(c, 'a')]!, expected, 1e-12);
    // b has no fanout: only its driver's parasitic.
    expectClose(loads[netId(c, 'b')]!, parasiticCapacitance('NAND2', 3, unit, caps), 1e-12);
    // The clock has no driver: only the pins it feeds.
    expectClose(loads[netId(c, 'clk')]!, pinCapacitance('INV', 2, unit, caps) + pinCapacitance('NAND2', 3, unit, caps), 1e-12);
    expect(Array.from(gatePinCapacitance(c, card))).toEqual([2, 3, 4].map((s, i) => pinCapacitance(gates[i]!.cell, s, unit, caps)));
  });

  it('names the declaring path and the nets when a load names no net', () => {
    const c = compileNetlist(netlist(latch()));
    expect(issue(() => netLoads(c, card, { path: ['loads'], caps: { p9: 1e-12 } }))).toEqual([
      'reference.unknown',
      ['loads', 'p9'],
      '"p9"',
    ]);
    expect(message(() => netLoads(c, card, { path: ['loads'], caps: { p9: 1e-12 } }))).toBe(
      'loads.p9: "p9" is not a net of the generator; nets are clk, clkb, b, a',
    );
  });
});
