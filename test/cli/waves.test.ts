import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { cli, design, tempDir } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('sigrok-cli', 'sigrok-cli');

/** Changes per signal name as read back by sigrok-cli (Debian package sigrok-cli), in its own timescale. */
function readWithSigrok(file: string): { unitSeconds: number; changes: Map<string, Array<[number, number]>> } {
  // sigrok's VCD input parses the file; its VCD output lists every change with "#time" and "<value><id>" tokens.
  const out = execFileSync('sigrok-cli', ['-I', 'vcd', '-i', file, '-O', 'vcd'], { encoding: 'utf8' });
  const scale = /\$timescale\s+([\d.]+)\s*(fs|ps|ns)\s+\$end/.exec(out);
  if (!scale) throw new Error(`no timescale in sigrok output:\n${out.slice(0, 400)}`);
  const unitSeconds = Number(scale[1]) * { fs: 1e-15, ps: 1e-12, ns: 1e-9 }[scale[2] as 'fs' | 'ps' | 'ns'];
  const names = new Map<string, string>();
  for (const m of out.matchAll(/\$var wire 1 (\S+) (\S+) \$end/g)) names.set(m[1]!, m[2]!);
  const changes = new Map<string, Array<[number, number]>>();
  let time = 0;
  for (const token of out.slice(out.indexOf('$enddefinitions')).split(/\s+/).slice(2)) {
    if (token.startsWith('#')) {
      time = Number(token.slice(1));
      continue;
    }
    const m = /^([01])(.+)$/.exec(token);
    if (!m) continue;
    const name = names.get(m[2]!)!;
    const list = changes.get(name) ?? [];
    list.push([time, Number(m[1])]);
    changes.set(name, list);
  }
  return { unitSeconds, changes };
}

describe('phasegap waves', () => {
  it("writes a VCD that sigrok-cli reads, with every 50 % crossing at the simulator's time in 1 fs units", () => {
    const dir = tempDir();
    const file = join(dir, 'w.vcd');
    const corner = 'ss/1.62V/125C';
    const run = cli('waves', design('sc-integrator'), '--corner', corner, '--periods', '1', '-o', file);
    expect(run.stderr).toBe('');
    expect([0, 1]).toContain(run.code);
    const { unitSeconds, changes } = readWithSigrok(file);
    expect(unitSeconds).toBeCloseTo(1e-15, 25);
    const { design: d, card } = loadDesign(design('sc-integrator'));
    const resolved = resolveDesign(d, card);
    const result = evaluateAll(resolved).find((r) => r.corner.name === corner)!;
    const { edges, windowStart } = result.simulation;
    for (const net of ['clk', 'p1', 'p2', 'p1b', 'p2b', 'p1e', 'p2e']) {
      const id = resolved.netlist.netIndex.get(net)!;
      const expected: Array<[number, number]> = [];
      for (let i = 0; i < edges.count; i++) {
        if (edges.net[i] !== id) continue;
        const t = Math.round((edges.time[i]! - windowStart) / 1e-15);
        if (t > 0) expected.push([t, edges.rising[i]!]);
      }
      const initial = changes.get(net)!.filter(([t]) => t === 0);
      expect(initial.length).toBe(1);
      expect(changes.get(net)!.filter(([t]) => t > 0)).toEqual(expected.sort((a, b) => a[0] - b[0]));
    }
  });

  it('writes switch conduction and, with --nets all, internal nodes at 10 fs', () => {
    const dir = tempDir();
    const file = join(dir, 'w.vcd');
    const run = cli('waves', design('doubler'), '--corner', 'tt/1.8V/27C', '--nets', 'all', '--timescale', '10fs', '-o', file);
    expect(run.code).toBe(0);
    const text = readFileSync(file, 'utf8');
    expect(text).toContain('$timescale 10 fs $end');
    expect(text).toContain('$scope module internal $end');
    expect(text).toContain('$scope module switches $end');
    const { unitSeconds, changes } = readWithSigrok(file);
    expect(unitSeconds).toBeCloseTo(1e-14, 25);
    const { design: d, card } = loadDesign(design('doubler'));
    const resolved = resolveDesign(d, card);
    const result = evaluateAll(resolved).find((r) => r.corner.name === 'tt/1.8V/27C')!;
    const s = result.switches.find((x) => x.name === 's_gnd')!;
    const T = result.simulation.period;
    const rel = (t: number) => Math.round(((((t - result.simulation.windowStart) % T) + T) % T) / 1e-14);
    const got = changes.get('s_gnd')!.filter(([t]) => t > 0 && t < T / 1e-14);
    expect(got).toEqual(
      [
        [rel(s.on), 1],
        [rel(s.off), 0],
      ].sort((a, b) => a[0]! - b[0]!),
    );
    expect(changes.has('x1')).toBe(true);
  });

  it("repeats every net's crossings in every period, the clock's rise at each period start included", () => {
    const dir = tempDir();
    const file = join(dir, 'w.vcd');
    const run = cli('waves', design('doubler'), '--corner', 'tt/1.8V/27C', '--periods', '3', '-o', file);
    expect(run.code).toBe(0);
    const { unitSeconds, changes } = readWithSigrok(file);
    const { design: d, card } = loadDesign(design('doubler'));
    const result = evaluateAll(resolveDesign(d, card)).find((r) => r.corner.name === 'tt/1.8V/27C')!;
    const T = Math.round(result.simulation.period / unitSeconds);
    for (const net of ['clk', 'clkb', 'p1', 'p2']) {
      const inPeriod = (k: number) =>
        changes
          .get(net)!
          .filter(([t]) => t >= k * T && t < (k + 1) * T && t > 0)
          .map(([t, v]) => [t - k * T, v]);
      expect(inPeriod(1).length).toBeGreaterThanOrEqual(2);
      expect(inPeriod(2)).toEqual(inPeriod(1));
    }
    // The clock rises at the start of periods 2 and 3 and falls at mid-period in each: 5 edges after time 0.
    expect(changes.get('clk')!.filter(([t]) => t > 0)).toEqual([
      [T / 2, 0],
      [T, 1],
      [1.5 * T, 0],
      [2 * T, 1],
      [2.5 * T, 0],
    ]);
  });

  it('writes to stdout with -o -', () => {
    const run = cli('waves', design('doubler'), '--corner', 'worst', '-o', '-');
    expect(run.stdout.startsWith('$comment')).toBe(true);
    expect(run.stdout).toContain('$enddefinitions $end');
  });

  it.each([
    [['--corner', 'all'], '--corner: "all" is not a corner of this design; allowed: worst, or one of tt/1.62V/-40C'],
    [['--corner', 'xx/1V/0C'], '--corner: "xx/1V/0C" is not a corner of this design'],
    [['--timescale', '1ps'], '--timescale: "1ps" is not offered; allowed: 1fs, 10fs'],
    [['--periods', '0'], '--periods: "0" must be a whole number of clock periods from 1 to 1000'],
    [['--nets', 'some'], '--nets: "some" is not a net selection; allowed: phases, all'],
  ])('refuses %j with exit 2 and writes nothing', (args, message) => {
    const dir = tempDir();
    const file = join(dir, 'w.vcd');
    const run = cli('waves', design('doubler'), ...args, '-o', file);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(existsSync(file)).toBe(false);
  });

  it('refuses a missing -o with exit 2', () => {
    const run = cli('waves', design('doubler'));
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('--out: is required: name the VCD file to write, or - for stdout');
  });
});
