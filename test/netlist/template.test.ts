import { describe, it, expect } from 'vitest';
import { bufferStages, expandNetlist, expandTemplate } from '../../src/netlist/template.js';
import { compileNetlist, type Netlist } from '../../src/netlist/netlist.js';
import { netlistSchema, templateSchema } from '../../src/schema/design.js';
import { parseWith } from '../../src/schema/validate.js';
import { expectClose, inputErrorMessage, inputIssues } from '../helpers.js';

const template = (raw: Record<string, unknown>) => expandTemplate(parseWith(templateSchema, raw));

const message = inputErrorMessage;

const gate = (n: Netlist, name: string) => {
  const g = n.gates.find((x) => x.name === name);
  if (!g) throw new Error(`no gate ${name}`);
  return g;
};

/** Follows single-input inverters from `net` until a net no inverter reads; returns [end, count]. */
function followInverters(n: Netlist, net: string, stopAt: readonly string[] = []): [string, number] {
  let count = 0;
  for (;;) {
    if (stopAt.includes(net)) return [net, count];
    const next = n.gates.find((g) => g.cell === 'INV' && g.inputs[0] === net);
    if (!next) return [net, count];
    net = next.output;
    count++;
  }
}

describe('expandTemplate nand', () => {
  const n = template({ template: 'nand', stages: 4, buffer: [2, 6, 18], gateSize: 2 });

  it('cross-couples two NAND2 gates fed by the clock and its complement', () => {
    expect(gate(n, 'u_clkinv')).toMatchObject({ cell: 'INV', inputs: ['clk'], output: 'clkb' });
    expect(gate(n, 'u_gate1')).toMatchObject({ cell: 'NAND2', size: 2, inputs: ['clk', 'd2_4'], output: 'x1' });
    expect(gate(n, 'u_gate2')).toMatchObject({ cell: 'NAND2', size: 2, inputs: ['clkb', 'd1_4'], output: 'x2' });
  });

  it('puts the clock next to the rail with clockInput inner, and next to the output by default', () => {
    const inner = template({ template: 'nand', stages: 4, buffer: [2, 6, 18], gateSize: 2, clockInput: 'inner' });
    expect(gate(inner, 'u_gate1').inputs).toEqual(['d2_4', 'clk']);
    expect(gate(inner, 'u_gate2').inputs).toEqual(['d1_4', 'clkb']);
    const nor = template({ template: 'nor', stages: 2, buffer: [3, 12], clockInput: 'inner' });
    expect(gate(nor, 'u_gate1').inputs[1]).toBe('clkb');
  });

  it('puts the chain between each gate and the far gate, and an odd buffer to the phase', () => {
    expect(followInverters(n, 'x1', ['d1_4'])).toEqual(['d1_4', 4]);
    expect(followInverters(n, 'd1_4')).toEqual(['p1', 3]);
    expect(followInverters(n, 'd2_4')).toEqual(['p2', 3]);
    expect(n.gates.filter((g) => g.name.startsWith('u_buf1')).map((g) => g.size)).toEqual([2, 6, 18]);
    expect(n.gates).toHaveLength(1 + 2 * (1 + 4 + 3));
    expect(n.phases).toEqual(['p1', 'p2']);
    expect(n.clock).toBe('clk');
  });

  it('compiles without structural errors (the cross-coupled loop is clocked)', () => {
    expect(compileNetlist(n).gateCount).toBe(n.gates.length);
  });
});

describe('expandTemplate nor', () => {
  it('uses NOR2 gates, the complement on the first gate and an even buffer', () => {
    const n = template({ template: 'nor', stages: 2, buffer: [3, 9] });
    expect(gate(n, 'u_gate1')).toMatchObject({ cell: 'NOR2', inputs: ['clkb', 'd2_2'], output: 'x1' });
    expect(gate(n, 'u_gate2')).toMatchObject({ cell: 'NOR2', inputs: ['clk', 'd1_2'], output: 'x2' });
    expect(followInverters(n, 'd1_2')).toEqual(['p1', 2]);
  });

  it('connects the chain end to the phase directly when the buffer is empty', () => {
    const n = template({ template: 'nor', stages: 2, buffer: [] });
    expect(gate(n, 'u_chain1_2').output).toBe('p1');
    expect(gate(n, 'u_gate2').inputs).toEqual(['clk', 'p1']);
  });
});

describe('expandTemplate options', () => {
  it('drives the gate output into the buffer directly with zero stages', () => {
    const n = template({ template: 'nand', stages: 0, buffer: [2, 6, 18] });
    expect(n.gates.some((g) => g.name.startsWith('u_chain'))).toBe(false);
    expect(gate(n, 'u_gate1').output).toBe('x1');
    expect(gate(n, 'u_gate2').inputs).toEqual(['clkb', 'x1']);
  });

  it('expands a nand design that leaves the buffer to its default (the default must suit the style)', () => {
    for (const style of ['nand', 'nor'] as const) {
      const n = template({ template: style, stages: 2 });
      expect(followInverters(n, 'd1_2')[0]).toBe('p1');
    }
  });

  it('takes one size per stage', () => {
    const n = template({ template: 'nand', stages: 4, stageSize: [1, 2, 3, 4], buffer: [2, 6, 18] });
    expect([1, 2, 3, 4].map((k) => gate(n, `u_chain2_${k}`).size)).toEqual([1, 2, 3, 4]);
  });

  it('puts the stage load on every chain node', () => {
    const n = template({ template: 'nand', stages: 2, stageLoad: '40fF', buffer: [4] });
    expect(Object.keys(n.loads).sort()).toEqual(['d1_1', 'd1_2', 'd2_1', 'd2_2']);
    for (const cap of Object.values(n.loads)) expectClose(cap, 40e-15, 1e-12);
  });

  it('names the phases from the design', () => {
    const n = template({
      template: 'nand',
      stages: 2,
      phases: ['phi1', 'phi2'],
      complementary: true,
      buffer: [2, 6, 18],
      complementSize: 6,
    });
    expect(n.phases).toEqual(['phi1', 'phi2']);
    expect(n.complements).toEqual({ phi1: 'phi1b', phi2: 'phi2b' });
    expect(gate(n, 'u_comp1')).toMatchObject({ cell: 'INV', inputs: ['phi1'], output: 'phi1b', size: 6 });
  });

  it('taps the early phase the given number of stages before the chain end', () => {
    const n = template({ template: 'nor', stages: 6, buffer: [3, 9], earlyTap: 2, earlyBuffer: [2, 6] });
    expect(n.early).toEqual({ p1: 'p1e', p2: 'p2e' });
    expect(gate(n, 'u_early1_1').inputs).toEqual(['d1_4']);
    expect(followInverters(n, 'd1_4', ['p1e', 'd1_6'])).toEqual(['d1_6', 2]);
    expect(gate(n, 'u_early1_2').output).toBe('p1e');
    expect(compileNetlist(n).gateCount).toBe(n.gates.length);
  });

  it.each([
    [{ template: 'nand', stages: 5 }, 'netlist.invalid', 'stages', '5'],
    [{ template: 'nor', stages: 3, buffer: [2, 4] }, 'netlist.invalid', 'stages', '3'],
    [{ template: 'nand', stages: 4, stageSize: [1, 2] }, 'netlist.invalid', 'stageSize', '[1,2]'],
    [{ template: 'nand', stages: 2, buffer: [2, 6] }, 'netlist.invalid', 'buffer', '[2,6]'],
    [{ template: 'nor', stages: 2, buffer: [3] }, 'netlist.invalid', 'buffer', '[3]'],
    [{ template: 'nand', stages: 2, earlyTap: 4, buffer: [4] }, 'netlist.invalid', 'earlyTap', '4'],
    [{ template: 'nand', stages: 2, phases: ['a', 'a'], buffer: [4] }, 'value.duplicate', 'phases', '["a","a"]'],
  ])('refuses %j with its code at generator.<field>', (raw, code, field, value) => {
    expect(inputIssues(() => template(raw))).toEqual([expect.objectContaining({ code, path: ['generator', field], value })]);
  });

  it('says why a chain length is refused, in words', () => {
    expect(message(() => template({ template: 'nand', stages: 5 }))).toMatch(/^generator\.stages: 5 is odd/);
    expect(message(() => template({ template: 'nand', stages: 2, buffer: [2, 6] }))).toMatch(
      /^generator\.buffer: \[2,6\] has 2 inverters; the nand template needs an odd count/,
    );
  });
});

describe('bufferStages', () => {
  it.each([
    [8, [2, 8]],
    [2, [1, 2]],
    [0.5, [0.5, 0.5]],
    [16, [4, 16]],
  ] as const)('splits a BUF of size %d into %j', (size, stages) => {
    expect(bufferStages(size)).toEqual(stages);
  });
});

describe('expandNetlist', () => {
  it('expands a BUF into two inverters through <name>.mid and keeps other cells', () => {
    const n = expandNetlist(
      parseWith(netlistSchema, {
        template: 'netlist',
        phases: ['a', 'b'],
        gates: [
          { name: 'u1', cell: 'BUF', size: 8, inputs: ['clk'], output: 'a' },
          { name: 'u2', cell: 'INV', inputs: ['clk'], output: 'b' },
        ],
      }),
    );
    expect(n.gates).toEqual([
      { name: 'u1.1', cell: 'INV', size: 2, inputs: ['clk'], output: 'u1.mid' },
      { name: 'u1.2', cell: 'INV', size: 8, inputs: ['u1.mid'], output: 'a' },
      { name: 'u2', cell: 'INV', size: 1, inputs: ['clk'], output: 'b' },
    ]);
    expect(n.loads).toEqual({});
    expect(n.origins).toEqual([0, 0, 1]);
  });

  it('names the gate the user wrote when a gate after a BUF is wrong', () => {
    const spec = (third: object) =>
      parseWith(netlistSchema, {
        template: 'netlist',
        phases: ['a', 'b'],
        gates: [
          { name: 'u1', cell: 'BUF', inputs: ['clk'], output: 'a' },
          { name: 'u2', cell: 'BUF', inputs: ['a'], output: 'b' },
          { name: 'u3', cell: 'INV', ...third },
        ],
      });
    // Expanded, u3 is gate 4; the user wrote it third.
    expect(message(() => compileNetlist(expandNetlist(spec({ inputs: ['nowhere'], output: 'c' }))))).toBe(
      'generator.gates[2].inputs[0]: "nowhere" is not driven by any gate and is not the clock "clk"; every input net needs a driver',
    );
    expect(inputIssues(() => compileNetlist(expandNetlist(spec({ inputs: ['clk'], output: 'a' }))))).toEqual([
      expect.objectContaining({ code: 'value.duplicate', path: ['generator', 'gates', 2, 'output'], value: '"a"' }),
    ]);
  });

  it('refuses a BUF with more than one input', () => {
    const spec = parseWith(netlistSchema, {
      template: 'netlist',
      phases: ['a', 'b'],
      gates: [{ name: 'u1', cell: 'BUF', inputs: ['clk', 'clk'], output: 'a' }],
    });
    expect(inputIssues(() => expandNetlist(spec))).toEqual([
      expect.objectContaining({ code: 'netlist.invalid', path: ['generator', 'gates', 0, 'inputs'], value: '["clk","clk"]' }),
    ]);
  });
});
