import { describe, it, expect } from 'vitest';
import { gridPoint, gridSize, parseAxis, parseRangeNumber, pointOverrides } from '../../src/analysis/sweep.js';
import { cliAsync, design } from '../helpers.js';

describe('parseAxis', () => {
  it('reads a list as given and a range with both ends included', () => {
    expect(parseAxis('vdd=1.6,1.7,1.8').values).toEqual(['1.6', '1.7', '1.8']);
    expect(parseAxis('vdd=1.6V:2.0V:5').values).toEqual([1.6, 1.7, 1.8, 1.9, 2]);
    expect(parseAxis('clock.frequency=10MHz:40MHz:4').values).toEqual([10e6, 20e6, 30e6, 40e6]);
    expect(parseAxis('temperature=-40C:125C:2').values).toEqual([-40, 125]);
  });
  it.each(['vdd=1:2:0', 'vdd=', 'vdd=1,,2', 'novalue', 'vdd=a:2:3', 'vdd=1:2:2.5'])('rejects %s', (spec) => {
    expect(() => parseAxis(spec)).toThrow(/--vary/);
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
    expect([0, 1, 2, 5].map((i) => gridPoint(axes, i))).toEqual([['1', 'x'], ['1', 'y'], ['2', 'x'], ['3', 'y']]);
  });
  it('turns corner axes into one-value corner lists and paths into plain overrides', () => {
    expect(pointOverrides([parseAxis('vdd=1.7'), parseAxis('generator.stages=4')], ['1.7', '4'])).toEqual(['corners.vdd=[1.7]', 'generator.stages=4']);
  });
});

describe('phasegap sweep', () => {
  it('writes one CSV row per grid point after a header, and the same rows on two threads', async () => {
    const args = ['sweep', design('doubler'), '--vary', 'vdd=1.62:1.98:3', '--vary', 'generator.stages=4,6'];
    const one = await cliAsync(...args, '--workers', '1');
    const two = await cliAsync(...args, '--workers', '2');
    const lines = one.stdout.trim().split('\n');
    expect(lines).toHaveLength(1 + 3 * 2);
    expect(lines[0]!.split(',').slice(0, 4)).toEqual(['vdd', 'generator.stages', 'corners', 'verdict']);
    expect(lines[1]!.split(',').slice(0, 3)).toEqual(['1.62', '4', '15']);
    expect(two.stdout).toBe(one.stdout);
  });

  it('reports a longer chain never giving a shorter worst-case dead time', async () => {
    const r = await cliAsync('sweep', design('doubler'), '--vary', 'generator.stages=2:10:5', '--json', '--workers', '1');
    const rows = JSON.parse(r.stdout) as Array<{ deadTimes: Array<{ min: number }> }>;
    expect(rows).toHaveLength(5);
    for (let i = 1; i < rows.length; i++) expect(rows[i]!.deadTimes[0]!.min).toBeGreaterThan(rows[i - 1]!.deadTimes[0]!.min);
  });

  it.each([
    ['an unknown design path', 'generator.stagez=2,4', 'unknown key "stagez"'],
    ['an empty range', 'vdd=1.6:2.0:0', '--vary vdd'],
    ['an invalid value at one point', 'generator.stages=3,4', 'generator.stages=3'],
  ])('exits 2 on %s, naming it', async (_what, vary, words) => {
    const r = await cliAsync('sweep', design('doubler'), '--vary', vary);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(words);
    expect(r.stdout).toBe('');
  });
});
