import { describe, expect, it } from 'vitest';
import {
  breakBeforeMakeCells,
  circuitFigureCells,
  circuitFigureTolerance,
  circuitFigureVerdict,
  quantityCells,
  renderConfirmText,
} from '../../src/report/confirm-text.js';
import type { CornerComparison } from '../../src/report/confirm-report.js';

const dead = (model: number, simulator: number) => ({
  quantity: 'dead p1->p2',
  kind: 'dead' as const,
  model,
  simulator,
  relativeError: (model - simulator) / simulator,
  pass: Math.abs((model - simulator) / simulator) <= 0.1,
});

const ronRow = (model: number, simulator: number) => ({
  label: 'R_on s_gnd @ 0 V',
  switch: 's_gnd',
  model,
  simulator,
  relativeError: (model - simulator) / simulator,
  pass: Math.abs((model - simulator) / simulator) <= 0.1,
});

function corner(name: string, pairs: Array<[number, number]>, rons: Array<[number, number]> = []): CornerComparison {
  const ron = rons.map(([m, s]) => ronRow(m, s));
  const breakBeforeMake = pairs.map(([model, simulator], i) => ({
    check: `s${i}/t${i} break-before-make`,
    model,
    simulator,
    agrees: model >= 0 === simulator >= 0,
  }));
  const quantities = [dead(1.0e-9, 0.98e-9)];
  return {
    corner: name,
    quantities,
    breakBeforeMake,
    ron,
    errors: [],
    pass: quantities.every((q) => q.pass) && breakBeforeMake.every((b) => b.agrees) && ron.every((r) => r.pass),
  };
}

const summary = (corners: CornerComparison[]) => ({ design: 'pump', model: 'analytic', simulator: 'ngspice-42', tolerance: 0.1, corners });

describe('renderConfirmText', () => {
  it('lists switch R_on, model vs simulator with the error, and flags one over 10 % (model 44 ohm vs 120 ohm: -63.3 %)', () => {
    const text = renderConfirmText(
      summary([corner('tt/1.8V/27C', [[300e-12, 290e-12]], [[44, 120]]), corner('ss/1.62V/125C', [[300e-12, 290e-12]], [[229, 225.7]])]),
    );
    expect(text).toMatch(/^tt\/1\.8V\/27C\s+R_on s_gnd @ 0 V\s+44\.0 ohm\s+120 ohm\s+-63\.3 %\s+OVER$/m);
    expect(text).toMatch(/^ss\/1\.62V\/125C\s+R_on s_gnd @ 0 V\s+229 ohm\s+226 ohm\s+\+1\.5 %\s+within$/m);
    expect(text).toContain('switch R_on: 1 of 2 over 10 %');
    expect(text).toMatch(/^verdict: DISAGREE \(2\/2 corners within tolerance/m);
  });

  it('closes with "disagree" and the count when a break-before-make pair disagrees', () => {
    // One pair holds in the model (+20 ps) and fails in the simulator (-15 ps).
    const text = renderConfirmText(
      summary([
        corner('ff/1.98V/-40C', [
          [20e-12, -15e-12],
          [300e-12, 290e-12],
        ]),
      ]),
    );
    expect(text).toMatch(/^ff\/1\.98V\/-40C\s+s0\/t0 break-before-make\s+\+20\.0 ps\s+-15\.0 ps\s+DISAGREES$/m);
    expect(text).toMatch(/^verdict: DISAGREE \(1\/1 corners within tolerance, break-before-make verdicts disagree for 1 of 2 pairs\)$/m);
    expect(text).not.toContain('verdicts alike');
  });

  it('closes with "alike" only when every pair agrees', () => {
    const text = renderConfirmText(summary([corner('tt/1.8V/27C', [[300e-12, 290e-12]]), corner('ss/1.62V/125C', [[-40e-12, -60e-12]])]));
    expect(text).toMatch(/^verdict: AGREE \(2\/2 corners within tolerance, break-before-make verdicts alike for all 2 pairs\)$/m);
  });

  it('heads every column of both tables', () => {
    const lines = renderConfirmText(summary([corner('tt/1.8V/27C', [[300e-12, 290e-12]])])).split('\n');
    expect(lines.some((l) => /^corner\s+quantity\s+model\s+ngspice-42\s+difference\s+tolerance$/.test(l))).toBe(true);
    expect(lines.some((l) => /^corner\s+check\s+model\s+ngspice-42\s+verdicts$/.test(l))).toBe(true);
    expect(lines.some((l) => /^tt\/1\.8V\/27C\s+dead p1->p2\s+1\.00 ns\s+980 ps\s+\+2\.0 %\s+within$/.test(l))).toBe(true);
  });

  it('names the one pair when only one was compared', () => {
    const text = renderConfirmText(summary([corner('tt/1.8V/27C', [[-10e-12, 5e-12]])]));
    expect(text).toMatch(/^verdict: DISAGREE \(1\/1 corners within tolerance, break-before-make verdicts disagree for 1 of 1 pair\)$/m);
    expect(renderConfirmText(summary([corner('tt/1.8V/27C', [[10e-12, 5e-12]])]))).toMatch(/verdicts alike for the one pair\)$/m);
  });

  it('leaves the pair clause out when no pair was compared', () => {
    const text = renderConfirmText(summary([corner('tt/1.8V/27C', [])]));
    expect(text).toMatch(/^verdict: AGREE \(1\/1 corners within tolerance\)$/m);
  });

  it("adds the circuit table, each run's settling and powers, and counts the corners whose circuit agrees", () => {
    const fig = (
      figure: 'output' | 'ripple' | 'efficiency' | 'lost charge',
      unit: 'V' | 'C' | '',
      model: number,
      simulator: number,
      difference: number | null,
      tolerance: number | null,
      pass: boolean,
    ) => ({ figure, unit, model, simulator, difference, tolerance, pass });
    const power = { input: 214e-6, generator: 134e-6, output: 167e-6 };
    const c = {
      ...corner('tt/1.8V/27C', []),
      circuit: {
        periods: 75,
        drift: -1.5e-5,
        settled: true,
        pass: false,
        power: { model: power, simulator: null },
        figures: [
          fig('output', 'V', 3.345, 3.334, 0.0063, 0.02, true),
          fig('ripple', 'V', 0.0199, 0.0228, -0.127, 0.1, false),
          fig('efficiency', '', 0.481, 0.444, 0.082, 0.1, true),
          fig('lost charge', 'C', 0, 271e-15, null, null, true),
        ],
      },
    };
    const text = renderConfirmText(summary([c]));
    expect(text).toMatch(/^tt\/1\.8V\/27C\s+output\s+3\.35 V\s+3\.33 V\s+\+0\.6 % of VDD\s+within$/m);
    expect(text).toMatch(/^tt\/1\.8V\/27C\s+ripple\s+19\.9 mV\s+22\.8 mV\s+-12\.7 %\s+OVER$/m);
    expect(text).toMatch(/^tt\/1\.8V\/27C\s+efficiency\s+48\.1 %\s+44\.4 %\s+\+8\.2 %\s+within$/m);
    expect(text).toMatch(/^tt\/1\.8V\/27C\s+lost charge\s+0 C\s+271 fC\s+-\s+shown$/m);
    expect(text).toContain(
      "tt/1.8V/27C: 75 periods from the solver's steady state, settled (drift -15.0 uV per period); model rails 214 uW, generator 134 uW, load 167 uW; ngspice-42 not measured",
    );
    expect(text).toMatch(/circuit figures within tolerance at 0\/1 corners\)$/m);
  });
});

describe('quantityCells', () => {
  it('gives corner, quantity, model, simulator and the signed difference (1.00 ns against 980 ps: +2.0 %)', () => {
    expect(quantityCells('tt/1.8V/27C', dead(1.0e-9, 0.98e-9))).toEqual(['tt/1.8V/27C', 'dead p1->p2', '1.00 ns', '980 ps', '+2.0 %']);
  });

  it('says "not measured" and "-" when the simulator has no value', () => {
    const q = { ...dead(1.0e-9, 0.98e-9), simulator: null, relativeError: null };
    expect(quantityCells('ss', q).slice(3)).toEqual(['not measured', '-']);
  });
});

describe('breakBeforeMakeCells', () => {
  it('gives corner, check and both signed margins', () => {
    expect(breakBeforeMakeCells('ff', { check: 's0/t0 break-before-make', model: 20e-12, simulator: -15e-12, agrees: false })).toEqual([
      'ff',
      's0/t0 break-before-make',
      '+20.0 ps',
      '-15.0 ps',
    ]);
  });
});

describe('renderConfirmText quantity table', () => {
  it('lines the numbers up on the right and the words on the left, under a rule as wide as each column', () => {
    const lines = renderConfirmText(summary([corner('tt/1.8V/27C', [])])).split('\n');
    expect(lines.slice(2, 5)).toEqual([
      'corner       quantity       model  ngspice-42  difference  tolerance',
      '-----------  -----------  -------  ----------  ----------  ---------',
      'tt/1.8V/27C  dead p1->p2  1.00 ns      980 ps      +2.0 %  within',
    ]);
  });
});

describe('circuitFigureCells, circuitFigureVerdict and circuitFigureTolerance', () => {
  const output = {
    figure: 'output' as const,
    unit: 'V' as const,
    model: 3.345,
    simulator: 3.2,
    difference: 0.0806,
    tolerance: 0.02,
    pass: false,
  };
  const lost = {
    figure: 'lost charge' as const,
    unit: 'C' as const,
    model: 0,
    simulator: null,
    difference: null,
    tolerance: null,
    pass: true,
  };

  it('gives the output difference as a share of VDD, and OVER past its 2 % (3.345 V against 3.20 V at 1.8 V: +8.1 %)', () => {
    expect(circuitFigureCells('tt', output)).toEqual(['tt', 'output', '3.35 V', '3.20 V', '+8.1 % of VDD']);
    expect(circuitFigureVerdict(output)).toBe('OVER');
    expect(circuitFigureTolerance(output)).toBe('±2.0 % of VDD');
  });

  it('shows a figure without a tolerance as shown, not judged', () => {
    expect(circuitFigureCells('tt', lost)).toEqual(['tt', 'lost charge', '0 C', 'not measured', '-']);
    expect(circuitFigureVerdict(lost)).toBe('shown');
    expect(circuitFigureTolerance(lost)).toBe('not judged');
    expect(circuitFigureTolerance({ ...output, figure: 'efficiency', unit: '', tolerance: 0.1 })).toBe('±10.0 %');
  });
});
