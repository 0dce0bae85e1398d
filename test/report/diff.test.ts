import { describe, expect, it } from 'vitest';
import { diffReports, renderDiffText, type DiffInput } from '../../src/report/diff.js';

const tolerance = { time: 5e-12, voltage: 1e-3 };

function report(corners: Array<{ name: string; dead: number; checks: Array<[string, string, number | null, boolean]> }>): DiffInput {
  return {
    tool: 'phasegap',
    design: 'd',
    corners: corners.map((c) => ({
      name: c.name,
      verdict: c.checks.every((k) => k[3]) ? 'pass' : 'fail',
      deadTimes: [{ from: 'p1', to: 'p2', t50: c.dead, gap: c.dead - 1e-10 }],
      checks: c.checks.map(([kind, name, margin, pass]) => ({ kind, name, margin, pass })),
    })),
  };
}

const before = report([
  {
    name: 'tt',
    dead: 1e-9,
    checks: [
      ['dead-time', 'dead >= 500 ps', 500e-12, true],
      ['width', 'width', 2e-9, true],
      ['off-state', 's holds off', 0.05, true],
    ],
  },
  {
    name: 'ss',
    dead: 2e-9,
    checks: [
      ['dead-time', 'dead >= 500 ps', -10e-12, false],
      ['width', 'width', 1e-9, true],
      ['off-state', 's holds off', 0.05, true],
    ],
  },
]);

describe('diffReports', () => {
  it('passes two equal reports with nothing listed', () => {
    const d = diffReports(before, before, { old: 'a.json', new: 'b.json' }, tolerance);
    expect(d.verdict).toBe('pass');
    expect([d.newFailures, d.fixedFailures, d.marginLosses, d.marginGains, d.deadTimeShifts].map((x) => x.length)).toEqual([0, 0, 0, 0, 0]);
    expect(d.changes).toHaveLength(6);
    expect(d.changes.every((c) => c.delta === 0)).toBe(true);
  });

  it('finds a new failure, a fixed one, margin moves beyond the tolerance only, and dead-time shifts', () => {
    const after = report([
      {
        name: 'tt',
        dead: 1.004e-9,
        checks: [
          ['dead-time', 'dead >= 500 ps', 504e-12, true],
          ['width', 'width', -1e-12, false],
          ['off-state', 's holds off', 0.047, true],
        ],
      },
      {
        name: 'ss',
        dead: 2.1e-9,
        checks: [
          ['dead-time', 'dead >= 500 ps', 90e-12, true],
          ['width', 'width', 0.9e-9, true],
          ['off-state', 's holds off', 0.0505, true],
        ],
      },
    ]);
    const d = diffReports(before, after, { old: 'a.json', new: 'b.json' }, tolerance);
    expect(d.verdict).toBe('fail');
    expect(d.newFailures.map((c) => `${c.check}@${c.corner}`)).toEqual(['width@tt']);
    expect(d.fixedFailures.map((c) => `${c.check}@${c.corner}`)).toEqual(['dead >= 500 ps@ss']);
    // Losses, timing first and largest first: width at tt (-2.001 ns), width at ss (-100 ps), then off-state at tt (-3 mV, beyond 1 mV); +4 ps at tt is within 5 ps.
    expect(d.marginLosses.map((c) => `${c.check}@${c.corner}`)).toEqual(['width@tt', 'width@ss', 's holds off@tt']);
    expect(d.marginLosses[0]!.delta).toBeCloseTo(-2.001e-9, 18);
    expect(d.marginGains.map((c) => `${c.check}@${c.corner}`)).toEqual(['dead >= 500 ps@ss']);
    expect(d.deadTimeShifts).toHaveLength(1);
    expect(d.deadTimeShifts[0]).toMatchObject({ corner: 'ss', edge: 'p1->p2', old: 2e-9, new: 2.1e-9 });
    expect(d.deadTimeShifts[0]!.shift).toBeCloseTo(1e-10, 20);
  });

  it('lists corners and checks present on one side only, and counts a failing check new to the report as a new failure', () => {
    const after = report([
      {
        name: 'tt',
        dead: 1e-9,
        checks: [
          ['dead-time', 'dead >= 500 ps', 500e-12, true],
          ['settle', 'settles', -1e-9, false],
        ],
      },
      { name: 'ff', dead: 0.8e-9, checks: [['dead-time', 'dead >= 500 ps', 300e-12, true]] },
    ]);
    const d = diffReports(before, after, { old: 'a.json', new: 'b.json' }, tolerance);
    expect(d.onlyInOld).toEqual({ corners: ['ss'], checks: ['width', 's holds off'] });
    expect(d.onlyInNew).toEqual({ corners: ['ff'], checks: ['settles'] });
    expect(d.newFailures.map((c) => `${c.check}@${c.corner}`)).toEqual(['settles@tt']);
    expect(d.verdict).toBe('fail');
  });
});

describe('renderDiffText', () => {
  it('heads with the verdict and its reasons and shows control characters from the file as ?', () => {
    const hostile = report([{ name: 'tt\u001b[2J', dead: 1e-9, checks: [['width', 'w\u0007idth', -1e-12, false]] }]);
    const base = report([{ name: 'tt\u001b[2J', dead: 1e-9, checks: [['width', 'w\u0007idth', 1e-9, true]] }]);
    const text = renderDiffText(diffReports(base, hostile, { old: 'a.json', new: 'b.json' }, tolerance));
    expect(text.split('\n')[0]).toBe('verdict: FAIL (1 new failure, 1 margin loss beyond 5.00 ps, 1.00 mV)');
    expect(text).not.toMatch(/[\u0007\u001b]/);
    expect(text).toContain('w?idth');
    expect(text).toContain('tt?[2J');
    expect(text).toMatch(/^w\?idth +tt\?\[2J +\+1\.00 ns +-1\.00 ps +-1\.00 ns$/m);
  });
});
