/**
 * The exported Verilog against the engine: with fixed rise/fall delays, Icarus Verilog (Debian
 * package iverilog: iverilog + vvp) must put every phase edge where phasegap's event simulation
 * does, to the timescale's resolution (1 ps).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, tempDir } from '../helpers.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { Simulator } from '../../src/sim/engine.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { fixedDelayModel } from '../../src/verilog/fixed.js';
import { DEFAULT_TIMESCALE, delayText, verilogModule, verilogTestbench } from '../../src/verilog/export.js';
import { verilogIdentifier } from '../../src/verilog/identifiers.js';
import { steadyStateDelays } from '../../src/verilog/delays.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { measurePhases } from '../../src/measure/phases.js';
import { requireTool } from '../tools.js';

requireTool('iverilog', 'iverilog');

/** Value changes of the top scope's 1-bit signals, times in VCD ticks. */
function readVcd(text: string): { tick: string; changes: Map<string, Array<[number, string]>> } {
  const names = new Map<string, string>();
  const changes = new Map<string, Array<[number, string]>>();
  let depth = 0;
  let time = 0;
  const tick = /\$timescale\s+(\S+)\s+\$end/.exec(text)?.[1] ?? '';
  const [header, body] = text.split('$enddefinitions');
  const tokens = header!.split(/\s+/);
  tokens.forEach((token, i) => {
    if (token === '$scope') depth++;
    else if (token === '$upscope') depth--;
    else if (token === '$var' && depth === 1) {
      const [id, name] = [tokens[i + 3]!, tokens[i + 4]!];
      names.set(id, name);
      changes.set(name, []);
    }
  });
  for (const token of body!.split(/\s+/)) {
    if (token.startsWith('#')) time = Number(token.slice(1));
    else if (/^[01xz]./.test(token) && names.has(token.slice(1))) changes.get(names.get(token.slice(1))!)!.push([time, token[0]!]);
  }
  return { tick, changes };
}

function compareWithIcarus(designName: string): void {
  const { design: d, card } = loadDesign(design(designName));
  const resolved = resolveDesign(d, card);
  const corner = resolved.corners[0]!.corner;
  const n = resolved.netlist.gateCount;
  // Fixed, distinct whole-picosecond delays per gate and edge.
  const rise = Float64Array.from({ length: n }, (_, g) => (90 + 7 * g) * 1e-12);
  const fall = Float64Array.from({ length: n }, (_, g) => (70 + 11 * (n - g)) * 1e-12);
  const model = fixedDelayModel({ rise, fall });
  const period = 1 / d.clock.frequency;
  const result = new Simulator(resolved.netlist).run(model.bind(resolved.netlist, resolved.loads, devicesAtCorner(card, corner)), {
    period,
    duty: corner.duty,
    transition: d.clock.transition,
  });
  expect(result.status).toBe('settled');
  const dir = tempDir();
  const module = verilogModule(resolved.netlist, { rise, fall }, 'gen', ['test export']);
  const periods = Math.round(result.windowStart / period) + 2;
  const source = join(dir, 'gen.v');
  writeFileSync(source, module.text + verilogTestbench(module, period, corner.duty, periods, 'gen.vcd'));
  const compile = spawnSync('iverilog', ['-o', join(dir, 'gen.vvp'), source], { encoding: 'utf8' });
  expect(compile.stderr).toBe('');
  expect(compile.status).toBe(0);
  const sim = spawnSync('vvp', ['-n', 'gen.vvp'], { encoding: 'utf8', cwd: dir });
  expect(sim.status).toBe(0);
  const vcd = readVcd(readFileSync(join(dir, 'gen.vcd'), 'utf8'));
  expect(vcd.tick).toBe('1ps');
  const start = Math.round(result.windowStart * 1e12);
  const end = start + Math.round(period * 1e12);
  for (const net of module.outputs) {
    const id = resolved.netlist.netIndex.get(net)!;
    const engine: Array<[number, string]> = [];
    for (let i = 0; i < result.edges.count; i++) {
      if (result.edges.net[i] === id) engine.push([Math.round(result.edges.time[i]! * 1e12), result.edges.rising[i] ? '1' : '0']);
    }
    const icarus = vcd.changes.get(net)!.filter(([t]) => t >= start && t < end);
    expect(engine.length, net).toBe(2);
    expect(icarus, net).toEqual(engine);
  }
}

describe('phasegap verilog vs Icarus Verilog', () => {
  it('puts every phase edge of the NAND doubler where the engine does, to 1 ps', () => compareWithIcarus('doubler'), 60_000);
  it('does so for the NOR generator with complements and early phases', () => compareWithIcarus('sc-integrator'), 60_000);
});

describe('verilog export', () => {
  it('writes gate primitives with the delays in ns at ps precision', () => {
    expect(delayText(1.2344e-9, DEFAULT_TIMESCALE)).toBe('1.234');
    expect(delayText(85e-12, DEFAULT_TIMESCALE)).toBe('0.085');
    const r = cli('verilog', design('doubler'), '--corner', 'tt/1.8V/27C');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^`timescale 1ns \/ 1ps$/m);
    expect(r.stdout).toMatch(/^module doubler_clock \(clk, p1, p2\);$/m);
    expect(r.stdout).toMatch(/^ {2}nand #\(\d+\.\d{3}, \d+\.\d{3}\) u_gate1 \(x1, clk, d2_6\);$/m);
    // The generator's inverters and the driver of s_vdd; s_chg and s_out hang on level shifters, which have no gate.
    expect(r.stdout.match(/^ {2}not /gm)?.length).toBe(20);
    expect(r.stdout).toMatch(/^ {2}not #\([\d.]+, [\d.]+\) \\s_vdd\.drv_p10 +\(\\s_vdd\.p1 , p2\);$/m);
  });

  it('exports the delays the model has in its steady state: the fixed-delay run keeps its dead times', () => {
    const { design: d, card } = loadDesign(design('doubler'));
    const resolved = resolveDesign(d, card);
    for (const { corner } of [resolved.corners[0]!, resolved.corners[44]!]) {
      const delays = steadyStateDelays(resolved, corner);
      const model = fixedDelayModel(delays);
      const sim = new Simulator(resolved.netlist).run(model.bind(resolved.netlist, resolved.loads, devicesAtCorner(card, corner)), {
        period: 1 / d.clock.frequency,
        duty: corner.duty,
        transition: d.clock.transition,
      });
      const fixed = measurePhases(sim, resolved.netlist);
      const reference = evaluateCorner(resolved, corner).measurement;
      if (!fixed.ok || !reference.ok) throw new Error('expected both runs to settle');
      fixed.deadTimes.forEach((dt, i) => {
        expect(Math.abs(dt.t50 - reference.deadTimes[i]!.t50)).toBeLessThan(1e-15);
      });
    }
  });

  it('escapes names that are not simple identifiers', () => {
    expect(verilogIdentifier('p1')).toBe('p1');
    expect(verilogIdentifier('s.x')).toBe('\\s.x ');
    expect(verilogIdentifier('nand')).toBe('\\nand ');
  });

  it('refuses a missing corner, exit 2', () => {
    const r = cli('verilog', design('doubler'), '--corner', 'zz/1V/0C');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--corner: "zz\/1V\/0C" is not a corner of the design/);
  });
});
