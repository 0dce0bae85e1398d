import { describe, expect, it } from 'vitest';
import { cliAsync, design } from '../helpers.js';

/** CSV text (no quoted fields in these sweeps) as objects keyed by the header. */
function csvRecords(text: string): Array<Record<string, string>> {
  const [head, ...lines] = text.trimEnd().split('\n');
  const names = head!.split(',');
  return lines.map((line) => {
    const cells = line.split(',');
    expect(cells).toHaveLength(names.length);
    return Object.fromEntries(names.map((n, i) => [n, cells[i]!]));
  });
}

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

  it('keeps every value under its own header when a later point has more checks than the first (2.2 GHz does not settle at any corner, 20 MHz does)', async () => {
    const mixed = await cliAsync('sweep', design('doubler'), '--vary', 'clock.frequency=2.2GHz,20MHz', '--workers', '1');
    const alone = await cliAsync('sweep', design('doubler'), '--vary', 'clock.frequency=20MHz', '--workers', '1');
    expect(mixed.code).toBe(1);
    expect(alone.code).toBe(0);
    const [slow, fast] = csvRecords(mixed.stdout);
    const [reference] = csvRecords(alone.stdout);
    expect(slow!.limiting_check).toBe('periodic steady state');
    expect(slow!['margin_s.phases_never_both_above_10_of_swing']).toBe('');
    expect(Object.keys(fast!)).toEqual(Object.keys(reference!));
    expect(fast).toEqual(reference);
    // The margin column is the dead-time column less the 500 ps minimum. The CSV keeps 9 significant
    // digits, so the least dead time (1.00313121 ns, above 1 ns) is printed to 10 fs and its margin
    // (+503.131212 ps) to 1 fs: the relation is checked on the unrounded values of --json, and each
    // column against the rounding of its own value.
    const full = await cliAsync('sweep', design('doubler'), '--vary', 'clock.frequency=20MHz', '--workers', '1', '--json');
    const [point] = JSON.parse(full.stdout) as Array<{
      deadTimes: Array<{ label: string; min: number }>;
      checks: Array<{ name: string; margin: number }>;
    }>;
    const dead = point!.deadTimes.find((d) => d.label === 'p1->p2')!.min;
    const margin = point!.checks.find((k) => k.name === 'dead p1->p2 >= 500 ps')!.margin;
    expect(margin).toBeCloseTo(dead - 500e-12, 18);
    expect(Number(fast!.dead_p1_p2_min_s)).toBe(Number(dead.toPrecision(9)));
    expect(Number(fast!['margin_s.dead_p1_p2_min'])).toBe(Number(margin.toPrecision(9)));
  });

  it('gives the same rows on one and two threads when points differ in their checks', async () => {
    const args = ['sweep', design('doubler'), '--vary', 'clock.frequency=2GHz,500MHz,20MHz', '--vary', 'vdd=1.62,1.98'];
    const one = await cliAsync(...args, '--workers', '1');
    const two = await cliAsync(...args, '--workers', '2');
    expect(two.stdout).toBe(one.stdout);
    expect(csvRecords(one.stdout)).toHaveLength(6);
  });
});
