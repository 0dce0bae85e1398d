import { describe, it, expect } from 'vitest';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { gapBand } from '../../src/delay/error-band.js';
import { expectClose, inputIssues, resolveYaml } from '../helpers.js';

const design = (requirements: string) => `
name: t
process: unused
clock: { frequency: 20MHz, transition: 200ps }
generator: { template: nand, stages: 4, stageLoad: 30fF, buffer: [2, 6, 18] }
loads: { p1: 0.5pF, p2: 0.5pF }
corners: { process: [tt], vdd: [1.8V], temperature: [27] }
requirements: ${requirements}
`;

function run(requirements: string) {
  const resolved = resolveYaml(design(requirements));
  const r = evaluateCorner(resolved, resolved.corners[0]!.corner);
  if (!r.measurement.ok) throw new Error(r.measurement.reason);
  return { checks: r.checks, m: r.measurement };
}

describe('requirementChecks: overlap at the gap level', () => {
  it("names the level and takes its margin from the clean gap less the model's band, not the 50 % dead time", () => {
    const { checks, m } = run('{}');
    const overlap = checks.find((c) => c.kind === 'non-overlap')!;
    expect(overlap.name).toBe('phases never both above 10 % of swing');
    const [d12, d21] = m.deadTimes;
    // The band is the analytic model's measured optimistic gap error on generic180: 2.5 % of the dead time.
    expect(gapBand('analytic', 'generic180')).toBe(0.025);
    expectClose(d12.gapBound, d12.gap - 0.025 * d12.t50, 1e-12);
    expectClose(overlap.margin!, Math.min(d12.gapBound, d21.gapBound), 1e-12);
    expect(overlap.margin!).toBeLessThan(Math.min(d12.t50, d21.t50));
  });

  it('measures the gap at requirements.gap.level: a higher level gives a longer gap', () => {
    const low = run('{}');
    const high = run('{ gap: { level: 0.3, min: 100ps } }');
    expect(high.m.level).toBe(0.3);
    expect(high.checks.find((c) => c.kind === 'non-overlap')!.name).toBe('phases never both above 30 % of swing');
    expect(high.m.deadTimes[0].gap).toBeGreaterThan(low.m.deadTimes[0].gap);
    expect(high.m.deadTimes[0].gap).toBeLessThan(high.m.deadTimes[0].t50);
    const gapMin = high.checks.find((c) => c.kind === 'gap-min')!;
    expectClose(gapMin.margin!, high.m.deadTimes[0].gapBound - 100e-12, 1e-15, 'abs');
  });

  it('refuses a gap level outside (0, 0.5), naming the field', () => {
    expect(inputIssues(() => resolveYaml(design('{ gap: { level: 0.6 } }')))).toEqual([
      expect.objectContaining({ code: 'value.out-of-range', path: ['requirements', 'gap', 'level'], value: '0.6' }),
    ]);
  });
});

describe('requirementChecks: subjects', () => {
  it("gives non-overlap both dead times with each one's gap margin, and each limit check its one dead time", () => {
    const { checks, m } = run('{ deadTime: { min: 300ps, max: 5ns } }');
    const overlap = checks.find((c) => c.kind === 'non-overlap')!;
    expect(overlap.subject).toEqual({ type: 'dead-time', deadTimes: [0, 1], level: 'gap', limit: null });
    expect(overlap.parts).toEqual([{ margin: m.deadTimes[0].gapBound }, { margin: m.deadTimes[1].gapBound }]);
    const mins = checks.filter((c) => c.kind === 'dead-time-min');
    expect(mins.map((c) => c.subject)).toEqual([
      { type: 'dead-time', deadTimes: [0], level: 't50', limit: 300e-12 },
      { type: 'dead-time', deadTimes: [1], level: 't50', limit: 300e-12 },
    ]);
    expect(mins[1]!.margin).toBe(m.deadTimes[1].t50 - 300e-12);
  });
});
