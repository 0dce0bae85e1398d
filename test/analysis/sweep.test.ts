import { describe, it, expect } from 'vitest';
import {
  checkGridSize,
  gridPoint,
  gridSize,
  mergeColumns,
  parseAxis,
  parseRangeNumber,
  pointOverrides,
  summarizePoint,
  sweepColumns,
} from '../../src/analysis/sweep.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { loadResolved } from '../../src/cli/load.js';
import { csvHeader, csvRow, unlistedNames } from '../../src/report/sweep-format.js';
import { design, inputErrorMessage, inputIssues } from '../helpers.js';

describe('parseAxis', () => {
  it('reads a list as given and a range with both ends included', () => {
    expect(parseAxis('vdd=1.6,1.7,1.8').values).toEqual(['1.6', '1.7', '1.8']);
    expect(parseAxis('vdd=1.6V:2.0V:5').values).toEqual([1.6, 1.7, 1.8, 1.9, 2]);
    expect(parseAxis('clock.frequency=10MHz:40MHz:4').values).toEqual([10e6, 20e6, 30e6, 40e6]);
    expect(parseAxis('temperature=-40C:125C:2').values).toEqual([-40, 125]);
  });
  it.each([
    ['vdd=1:2:0', ['--vary', 'vdd']],
    ['vdd=', ['--vary', 'vdd']],
    ['vdd=1,,2', ['--vary', 'vdd']],
    ['novalue', ['--vary']],
    ['vdd=a:2:3', ['--vary', 'vdd']],
    ['vdd=1:2:2.5', ['--vary', 'vdd']],
  ])('rejects %s as option.invalid at %j', (spec, path) => {
    expect(inputIssues(() => parseAxis(spec))).toEqual([expect.objectContaining({ code: 'option.invalid', path })]);
  });
  it('refuses a range or list longer than the largest grid before expanding it', () => {
    expect(parseAxis('vdd=1:2:4', 4).values).toHaveLength(4);
    expect(inputErrorMessage(() => parseAxis('temperature=0:100:1000000000', 1000))).toBe(
      '--vary temperature: "0:100:1000000000" asks for 1000000000 points; a sweep has at most 1000 points (N from 1 to 1000)',
    );
    expect(inputIssues(() => parseAxis('vdd=1,2,3', 2))).toEqual([
      expect.objectContaining({ code: 'option.invalid', path: ['--vary', 'vdd'], value: '"3 values"' }),
    ]);
  });
  it('reads SI prefixes on range ends', () => {
    expect(parseRangeNumber('20fF')).toBeCloseTo(20e-15, 25);
    expect(parseRangeNumber('5m')).toBeCloseTo(5e-3, 15);
    expect(parseRangeNumber('-40C')).toBe(-40);
  });
});

describe('grid', () => {
  const axes = [parseAxis('a=1,2,3'), parseAxis('b=x,y')];
  it('has the product of the axis lengths as its size and walks the last axis fastest', () => {
    expect(gridSize(axes)).toBe(6);
    expect([0, 1, 2, 5].map((i) => gridPoint(axes, i))).toEqual([
      ['1', 'x'],
      ['1', 'y'],
      ['2', 'x'],
      ['3', 'y'],
    ]);
  });
  it('accepts a grid of exactly the largest size and refuses one point more, naming every axis', () => {
    expect(checkGridSize(axes, 6)).toBe(6);
    expect(inputIssues(() => checkGridSize(axes, 5))).toEqual([
      expect.objectContaining({ code: 'option.invalid', path: ['--vary'], value: '"a (3) x b (2)"' }),
    ]);
  });
  it('turns corner axes into one-value corner lists and paths into plain overrides', () => {
    expect(pointOverrides([parseAxis('vdd=1.7'), parseAxis('generator.stages=4')], ['1.7', '4'])).toEqual([
      'corners.vdd=[1.7]',
      'generator.stages=4',
    ]);
  });
});

describe('summarizePoint', () => {
  it('merges checks by name, so a corner that does not settle does not shift the others (500 MHz: some corners settle)', () => {
    const { resolved } = loadResolved(design('doubler'), ['clock.frequency=500MHz'], {}, () => undefined);
    const results = evaluateAll(resolved);
    expect(results.some((r) => !r.measurement.ok)).toBe(true);
    expect(results.some((r) => r.measurement.ok)).toBe(true);
    const row = summarizePoint(0, [], results);
    const nonOverlap = row.checks.find((c) => c.name === 'phases never both above 10 % of swing')!;
    const least = Math.min(...results.flatMap((r) => r.checks.filter((c) => c.name === nonOverlap.name).map((c) => c.margin!)));
    expect(nonOverlap.margin).toBe(least);
    expect(nonOverlap.kind).toBe('non-overlap');
    expect(row.checks.find((c) => c.kind === 'steady-state')!.margin).toBeNull();
  });
});

describe('sweepColumns', () => {
  it.each([
    ['doubler', ['requirements.gap.min=100ps', 'requirements.width.min=5ns']],
    ['sc-integrator', []],
    ['lp-netlist', []],
    ['doubler-pump', ['corners.process=[tt]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]']],
  ])('names every check a settled corner of %s produces, in order', (name, sets) => {
    const { resolved } = loadResolved(design(name), sets, {}, () => undefined);
    const settled = evaluateAll(resolved).find((r) => r.measurement.ok)!;
    const columns = sweepColumns(resolved);
    expect(columns.checks).toEqual(settled.checks.map((c) => c.name));
    const row = summarizePoint(0, [], [settled]);
    expect(columns.deadTimes).toEqual(row.deadTimes.map((d) => d.label));
    expect(columns.widths).toEqual(row.widths.map((w) => w.phase));
  });

  it('sorts the circuit checks of doubler-pump by the unit of their margin', () => {
    const { resolved } = loadResolved(design('doubler-pump'), [], {}, () => undefined);
    const columns = sweepColumns(resolved);
    expect(columns.voltChecks.slice(0, 3)).toEqual(['V(out) >= 1.75 vdd', 'V(out) <= 2 vdd', 'ripple(out) <= 50.0 mV']);
    expect(columns.fractionChecks).toEqual(['efficiency >= 37.5 %']);
    expect(columns.chargeChecks).toEqual(['lost charge <= 1.00 pC']);
    const settle = columns.checks.indexOf('flying-cap charge settles to 0.001');
    expect(columns.checks.slice(settle + 4, settle + 7)).toEqual(['efficiency >= 37.5 %', 'lost charge <= 1.00 pC', 's_gnd holds off']);
  });

  it('merges column sets in first-seen order, each name once', () => {
    const a = { deadTimes: ['p1->p2'], widths: ['p1'], checks: ['x', 'y'], voltChecks: ['y'], chargeChecks: ['x'], fractionChecks: [] };
    const b = {
      deadTimes: ['p1->p2'],
      widths: ['p1', 'p1e'],
      checks: ['y', 'z'],
      voltChecks: ['y'],
      chargeChecks: [],
      fractionChecks: ['z'],
    };
    expect(mergeColumns([a, b])).toEqual({
      deadTimes: ['p1->p2'],
      widths: ['p1', 'p1e'],
      checks: ['x', 'y', 'z'],
      voltChecks: ['y'],
      chargeChecks: ['x'],
      fractionChecks: ['z'],
    });
  });
});

describe('csvRow', () => {
  it('fills columns by name and leaves what a row lacks empty', () => {
    const columns = {
      deadTimes: ['a->b'],
      widths: ['a', 'b'],
      checks: ['one', 'two'],
      voltChecks: ['one'],
      chargeChecks: [],
      fractionChecks: [],
    };
    const row = {
      index: 0,
      point: [1],
      corners: 3,
      verdict: 'pass' as const,
      limiting: null,
      deadTimes: [{ label: 'a->b', min: 1, max: 2, gapMin: 0.5 }],
      widths: [{ phase: 'b', min: 7 }],
      checks: [{ name: 'two', kind: 'order', margin: 4 }],
    };
    const header = csvHeader([{ path: 'x', values: [1] }], columns)
      .trim()
      .split(',');
    expect(header).toHaveLength(6 + 1 + 3 + 2 + 2);
    expect(header.slice(-2)).toEqual(['margin_V.one', 'margin_s.two']);
    expect(csvRow(row, columns)).toBe('1,3,pass,,,,,1,2,0.5,,7,,4\n');
  });
});

describe('unlistedNames', () => {
  it('names what a row carries beyond the columns, ignoring the margin-less steady-state check', () => {
    const columns = { deadTimes: ['a->b'], widths: ['a'], checks: ['one'], voltChecks: [], chargeChecks: [], fractionChecks: [] };
    const row = {
      index: 0,
      point: [],
      corners: 1,
      verdict: 'fail' as const,
      limiting: null,
      deadTimes: [
        { label: 'a->b', min: 1, max: 1, gapMin: 1 },
        { label: 'b->a', min: 1, max: 1, gapMin: 1 },
      ],
      widths: [{ phase: 'a', min: 1 }],
      checks: [
        { name: 'periodic steady state', kind: 'steady-state', margin: null },
        { name: 'one', kind: 'order', margin: 1 },
        { name: 'two', kind: 'order', margin: 2 },
      ],
    };
    expect(unlistedNames(row, columns)).toEqual(['b->a', 'two']);
    expect(unlistedNames({ ...row, deadTimes: [], checks: row.checks.slice(0, 2) }, columns)).toEqual([]);
  });
});
