import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { cli, expectClose, processCard, tempDir, design, TYPICAL_ONLY } from '../helpers.js';
import { bilinear, bracket } from '../../src/delay/interpolate.js';
import { cornerTables } from '../../src/delay/table-corner.js';
import { tableModel } from '../../src/delay/table.js';
import { selectModel } from '../../src/delay/select.js';
import { analyticModel } from '../../src/delay/analytic.js';
import { loadDesign, loadTables } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { devicesAtCorner } from '../../src/process/device.js';
import type { CornerTables, DelayTables } from '../../src/schema/tables.js';
import { requireTool } from '../tools.js';

const plane = (a: number, b: number, c: number, d: number) => (x: number, y: number) => a + b * x + c * y + d * x * y;

describe('bilinear', () => {
  it('reproduces a bilinear function exactly inside the grid and extends it outside', () => {
    const f = plane(1, 2, -3, 0.5);
    const xs = [0, 1, 4];
    const ys = [0, 2, 3];
    const grid = xs.map((x) => ys.map((y) => f(x, y)));
    for (const [x, y] of [
      [0.5, 0.5],
      [2, 2.5],
      [4, 3],
      [0, 0],
      [3.9, 1],
    ] as const) {
      expectClose(bilinear(grid, bracket(xs, x), bracket(ys, y)), f(x, y), 1e-12, 'abs');
    }
    const outside = bracket(xs, 5);
    expect(outside.outside).toBe(true);
    expectClose(bilinear(grid, outside, bracket(ys, 1)), f(5, 1), 1e-12, 'abs');
    expect(bracket(xs, 4).outside).toBe(false);
    expect(bracket(xs, -0.1).outside).toBe(true);
  });
});

function fakeCorner(name: string, process: string, vdd: number, temperature: number, delay: number): CornerTables {
  const g = [
    [delay, 2 * delay],
    [3 * delay, 4 * delay],
  ];
  const pin = { capacitance: 1e-15 * vdd, rise: { delay: g, transition: g }, fall: { delay: g, transition: g } };
  return { name, process, vdd, temperature, cells: { INV: { pins: [pin] } } };
}

const FAKE: DelayTables = {
  format: 'phasegap-tables/1',
  process: 'x',
  size: 1,
  transitions: [1e-10, 1e-9],
  loads: [1e-15, 1e-14],
  corners: [
    fakeCorner('tt/1.6V/0C', 'tt', 1.6, 0, 1e-10),
    fakeCorner('tt/2V/0C', 'tt', 2, 0, 2e-10),
    fakeCorner('tt/1.6V/100C', 'tt', 1.6, 100, 3e-10),
    fakeCorner('tt/2V/100C', 'tt', 2, 100, 5e-10),
  ],
};

describe('cornerTables', () => {
  const corner = (vdd: number, temperature: number) => ({ name: `tt/${vdd}V/${temperature}C`, process: 'tt', vdd, temperature, duty: 0.5 });

  it('returns a characterized corner as it is', () => {
    expect(cornerTables(FAKE, corner(2, 100), () => undefined)).toBe(FAKE.corners[3]);
  });

  it('blends linearly in supply and temperature between characterized corners', () => {
    const warnings: string[] = [];
    const t = cornerTables(FAKE, corner(1.8, 50), (m) => warnings.push(m));
    // mid-point of 1, 2, 3, 5 (x 1e-10)
    expectClose(t.cells.INV!.pins[0]!.rise.delay[0]![0]!, 2.75e-10, 1e-12);
    expectClose(t.cells.INV!.pins[0]!.capacitance, 1.8e-15, 1e-12);
    expect(warnings).toEqual([]);
  });

  it('warns when it must extrapolate, and refuses an unknown process corner', () => {
    const warnings: string[] = [];
    cornerTables(FAKE, corner(2.2, 50), (m) => warnings.push(m));
    expect(warnings[0]).toMatch(/tt\/2.2V\/50C lies outside the characterized supplies/);
    expect(() => cornerTables(FAKE, { ...corner(1.8, 27), process: 'ss', name: 'ss/1.8V/27C' }, () => undefined)).toThrow(
      /no tables for process corner "ss"/,
    );
  });
});

describe('tableModel.bind', () => {
  const tables = loadTables(join(import.meta.dirname, '../../fixtures/tables/generic180.json'));
  const { design: d, card } = loadDesign(design('doubler'));
  const model = tableModel(tables);
  const resolved = resolveDesign({ ...d, corners: { process: ['ss'], vdd: [1.8], temperature: [27] } }, card, model);
  const devices = devicesAtCorner(card, resolved.corners[0]!.corner);
  const { netlist, loads } = resolved;
  const mismatch = (seed: number) => ({
    dvthN: Float64Array.from({ length: netlist.gateCount }, (_, g) => 0.004 * Math.sin(seed + g)),
    dvthP: Float64Array.from({ length: netlist.gateCount }, (_, g) => 0.004 * Math.cos(seed * 3 + g)),
  });

  it('reuses one timing per corner for every die, with the same delays as a fresh bind', () => {
    const warm = model.bind(netlist, loads, devices, mismatch(1));
    for (const seed of [2, 3]) {
      const again = model.bind(netlist, loads, devices, mismatch(seed), warm);
      expect(again).toBe(warm);
      const fresh = tableModel(tables).bind(netlist, loads, devices, mismatch(seed));
      for (let g = 0; g < netlist.gateCount; g++) {
        for (const rising of [false, true]) {
          expect(again.delay(g, 0, rising, 1e-10)).toBe(fresh.delay(g, 0, rising, 1e-10));
          expect(again.transition(g, 0, rising, 3e-10)).toBe(fresh.transition(g, 0, rising, 3e-10));
        }
      }
    }
  });

  it("scales each delay by the analytic ratio with and without the die's mismatch", () => {
    const g = 1;
    const plain = model.bind(netlist, loads, devices).delay(g, 0, true, 1e-10);
    const die = mismatch(5);
    const shifted = model.bind(netlist, loads, devices, die).delay(g, 0, true, 1e-10);
    const ratio =
      analyticModel.bind(netlist, loads, devices, die).delay(g, 0, true, 0) /
      analyticModel.bind(netlist, loads, devices).delay(g, 0, true, 0);
    expectClose(shifted / plain, ratio, 1e-12);
    expect(ratio).not.toBe(1);
  });

  it('gives each input pin its own characterized row', () => {
    const nand = netlist.gateCell.indexOf('NAND2');
    const timing = model.bind(netlist, loads, devices);
    expect(timing.delay(nand, 0, false, 1e-10)).not.toBe(timing.delay(nand, 1, false, 1e-10));
  });
});

describe('selectModel', () => {
  it('takes the table model when tables exist, unless analytic is asked for', () => {
    expect(selectModel(undefined, FAKE, () => undefined).name).toBe('table');
    expect(selectModel('analytic', FAKE, () => undefined)).toBe(analyticModel);
    expect(selectModel(undefined, undefined, () => undefined)).toBe(analyticModel);
    expect(() => selectModel('table', undefined, () => undefined)).toThrow(/needs delay tables/);
  });

  it('rejects an unknown --model with exit 2', () => {
    const r = cli('--model', 'spline', 'check', design('doubler'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--model: "spline" is not a delay model; allowed: analytic, table/);
  });
});

function monotonic(values: readonly number[]): 1 | -1 | 0 {
  const up = values.every((v, i) => i === 0 || v > values[i - 1]!);
  const down = values.every((v, i) => i === 0 || v < values[i - 1]!);
  return up ? 1 : down ? -1 : 0;
}

describe('characterized tables (ngspice, Debian package ngspice)', () => {
  requireTool('ngspice', 'ngspice');
  const file = join(tempDir(), 'tt.json');

  it('rise in delay and transition with load everywhere, and the table model follows the simulator in input transition', () => {
    const made = cli('characterize', processCard('generic180'), '--corners', 'tt/1.8V/27C', '--grid', 'coarse', '--jobs', '2', '-o', file);
    expect(made.code).toBe(0);
    const tables = loadTables(file);
    const corner = tables.corners[0]!;
    const { design: d, card } = loadDesign(design('doubler'));
    const warnings: string[] = [];
    const model = tableModel(tables, { warn: (m) => warnings.push(m) });
    let checkedSlew = 0;
    for (const [cell, entry] of Object.entries(corner.cells)) {
      entry.pins.forEach((pin, p) => {
        for (const edge of ['rise', 'fall'] as const) {
          for (const kind of ['delay', 'transition'] as const) {
            const grid = pin[edge][kind];
            grid.forEach((row, i) => {
              expect(monotonic(row), `${cell} pin ${p} ${edge} ${kind} row ${i} in load`).toBe(1);
            });
            // In input transition: wherever the simulator's column is monotonic, so is the model between the points.
            tables.loads.forEach((_, j) => {
              const column = grid.map((row) => row[j]!);
              const sense = monotonic(column);
              if (sense === 0) return;
              const xs = Array.from(
                { length: 31 },
                (_, k) => tables.transitions[0]! * (tables.transitions.at(-1)! / tables.transitions[0]!) ** (k / 30),
              );
              const ys = xs.map((x) => bilinear(grid, bracket(tables.transitions, x), bracket(tables.loads, tables.loads[j]!)));
              expect(monotonic(ys), `${cell} pin ${p} ${edge} ${kind} load ${j} in input transition`).toBe(sense);
              checkedSlew++;
            });
          }
        }
      });
    }
    expect(checkedSlew).toBeGreaterThan(0);
    // The model on the demo design at the characterized corner: no extrapolation, and delays of both edges.
    const resolved = resolveDesign({ ...d, corners: { process: ['tt'], vdd: [1.8], temperature: [27] } }, card, model);
    const timing = model.bind(resolved.netlist, resolved.loads, devicesAtCorner(card, resolved.corners[0]!.corner));
    expect(timing.delay(1, 1, true, 2e-10)).toBeGreaterThan(0);
    expect(timing.delay(1, 1, false, 2e-10)).toBeGreaterThan(0);
    expect(warnings).toEqual([]);
    // A load beyond the grid is extrapolated with one clear warning on stderr.
    const r = cli('check', design('doubler'), '--tables', file, ...TYPICAL_ONLY, '--set', 'loads.p1=5pF');
    expect(
      r.stderr.match(/warning: table model: u_buf1_3 \(INV\) drives [\d.]+ fF per characterized size, outside the table's/g)?.length,
    ).toBe(1);
    expect(r.stdout).toMatch(/table model/);
  });
});
