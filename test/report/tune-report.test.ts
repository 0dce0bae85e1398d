import { describe, it, expect } from 'vitest';
import { defaultSpace, tuneChains } from '../../src/analysis/tune.js';
import { renderTuneText, tuneReport, yieldText, CANDIDATES_SHOWN } from '../../src/report/tune-report.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';

const { design: d, card } = loadDesign(design('doubler'));
const space = { ...defaultSpace(d), stages: [2, 4], stageSizes: [1] };
const result = tuneChains(d, card, undefined, space);
const report = tuneReport(d.name, d.clock.frequency, 45, result, 2, 'skipped with --no-confirm');
const text = renderTuneText(report, 'doubler.yaml');

describe('tuneReport', () => {
  it("carries every proposal's conduction time, waste, yields and the unconfirmed note", () => {
    expect(report.proposals.length).toBe(2);
    const p = report.proposals[0]!;
    const c = result.proposals[0]!;
    expect(p.conduction).toBe(c.conduction.time);
    expect(p.waste).toBe(c.deadMax - 500e-12);
    expect(p.yields!.length).toBe(3);
    expect(report.confirmed).toBe(false);
    expect(report.confirmNote).toBe('skipped with --no-confirm');
    expect(report.yieldTarget).toBe(0.9973);
    expect(report.candidates.length).toBeLessThanOrEqual(CANDIDATES_SHOWN);
    // The chart's points: passing chains only, the least margin first.
    const margins = report.candidates.map((x) => x.limiting!.margin!);
    expect(report.candidates.every((x) => x.pass)).toBe(true);
    expect([...margins].sort((a, b) => a - b)).toEqual(margins);
  });
});

describe('yieldText', () => {
  it('gives the least yield over the corners with its Wilson interval', () => {
    // 197 of 200: 98.5 %, Wilson 95 % interval [95.68 %, 99.49 %] (Wilson 1927, computed).
    expect(
      yieldText([
        { corner: 'a', passes: 200, dies: 200, low: 0.9812, high: 1 },
        { corner: 'b', passes: 197, dies: 200, low: 0.9568, high: 0.9949 },
      ]),
    ).toBe('98.5 % [95.68 %, 99.49 %]');
    expect(yieldText(null)).toBe('');
  });
});

describe('renderTuneText', () => {
  it('shows the trade-off table, the yields, the headroom and the knobs searched', () => {
    expect(text).toMatch(/longest useful conduction time first/);
    expect(text).toMatch(/ {2}fast-corner margin +slow-corner dead time +waste +least conduction\n/);
    expect(text).toMatch(
      /proposal 1 +\+\d\d\.\d ps at ff\/1\.98V\/-40C +1\.\d\d ns at ss\/1\.62V\/125C +1\.\d\d ns +2\d\.\d ns at ss\/1\.62V\/125C\n/,
    );
    expect(text).toMatch(
      /Monte Carlo yield at each proposal's limiting corners \(200 dies each, 95 % Wilson interval; at least 99\.73 % required\):/,
    );
    expect(text).toContain(
      'knobs searched: chain length 2, 4; stage size 1; delay capacitor 0 .. 500 fF in 0.50 fF steps; buffer taper 2, 3, 4 (last size 18 kept) on the best chains; feedback tap 0, 2 buffer inverters after the chain end on the best chains;',
    );
    expect(text).toContain('unconfirmed in ngspice (skipped with --no-confirm)');
    expect(text).not.toContain('transistor-level confirmation');
  });

  it("lists the simulator's least margin of each confirmed proposal", () => {
    const confirmed = {
      ...result,
      proposals: result.proposals.map((p, i) =>
        i === 0
          ? {
              ...p,
              confirmation: {
                simulator: 'ngspice-39',
                corners: ['ss/1.62V/125C', 'ff/1.98V/-40C'],
                least: 43.3e-12,
                pass: true,
                meets: true,
                checks: [],
                limiting: { check: 'dead p2->p1 >= 500 ps', corner: 'ff/1.98V/-40C', model: 71.3e-12, simulator: 43.3e-12 },
              },
            }
          : p,
      ),
    };
    const t = renderTuneText(tuneReport(d.name, d.clock.frequency, 45, confirmed, 2), 'doubler.yaml');
    expect(t).toContain(
      '  proposal 1: confirmed at ss/1.62V/125C, ff/1.98V/-40C; least margin dead p2->p1 >= 500 ps at ff/1.98V/-40C: ngspice-39 43.3 ps, model 71.3 ps',
    );
    expect(t).toMatch(/proposal 2 .* unconfirmed /);
  });
});
