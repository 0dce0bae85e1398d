import { describe, expect, it } from 'vitest';
import { circuitCheckNames, circuitChecks } from '../../src/checks/circuit-checks.js';
import type { CornerCircuit } from '../../src/circuit/corner-circuit.js';
import { figureErrorFor, type FigureError } from '../../src/circuit/figure-error.js';
import type { Check } from '../../src/checks/check.js';
import { formatMargin } from '../../src/report/margin-format.js';

const figures = {
  method: 'direct',
  output: 3.3,
  lightOutput: 3.5,
  ripple: 0.02,
  efficiency: 0.55,
  lostCharge: 2e-12,
} as unknown as CornerCircuit;
const req = {
  output: { min: { scale: 1.8, offset: 0 }, max: { scale: 2, offset: 0 } },
  ripple: { max: 0.05 },
  efficiency: { min: 0.6 },
  lostCharge: { max: 1e-12 },
};

/** No measured error: the margins are the model's own. */
const EXACT: FigureError = { card: 'exact', output: [0, 0], ripple: [0, 0], efficiency: [0, 0], corners: 0 };
/** An invented error band: output -0.5 .. +1 % of VDD, ripple -10 .. +5 %, efficiency -2 .. +4 %. */
const BAND: FigureError = { card: 'band', output: [-0.005, 0.01], ripple: [-0.1, 0.05], efficiency: [-0.02, 0.04], corners: 1 };

describe('circuitChecks', () => {
  it('circuitChecks gives margins in V, fraction and C, positive when met', () => {
    const out: Check[] = [];
    circuitChecks(figures, req, circuitCheckNames(req, 'out'), 1.8, EXACT, out);
    const by = Object.fromEntries(out.map((c) => [c.kind, c]));
    expect(by['output-min']!.margin).toBeCloseTo(3.3 - 3.24, 12);
    expect(by['output-max']!.margin).toBeCloseTo(3.6 - 3.5, 12);
    expect(by['ripple-max']!.margin).toBeCloseTo(0.03, 12);
    expect(by['efficiency-min']!.pass).toBe(false);
    expect(by['lost-charge-max']!.margin).toBeCloseTo(-1e-12, 20);
    expect(by['output-min']!.name).toBe('V(out) >= 1.8 vdd');
    expect(formatMargin(by['efficiency-min']!.margin, 'efficiency-min')).toBe('-5.0 %');
    expect(formatMargin(by['lost-charge-max']!.margin, 'lost-charge-max')).toMatch(/^-1\.00 pC$/);
  });

  it('circuitChecks fails every check without a margin when the circuit did not settle', () => {
    const out: Check[] = [];
    circuitChecks({ ...figures, method: 'none' }, req, circuitCheckNames(req, 'out'), 1.8, EXACT, out);
    expect(out).toHaveLength(5);
    expect(out.every((c) => !c.pass && c.margin === null && c.detail === 'the circuit reached no periodic steady state')).toBe(true);
  });

  it('reads each margin at the end of the measured error that could hide a failure (by hand)', () => {
    const out: Check[] = [];
    circuitChecks(figures, req, circuitCheckNames(req, 'out'), 1.8, BAND, out);
    const by = Object.fromEntries(out.map((c) => [c.kind, c]));
    // The model's output may be 1 % of VDD high: the minimum is met by 3.3 - 0.018 - 3.24 V.
    expect(by['output-min']!.margin).toBeCloseTo(3.3 - 0.018 - 3.24, 12);
    // ... or 0.5 % low: the maximum by 3.6 - (3.5 + 0.009) V.
    expect(by['output-max']!.margin).toBeCloseTo(3.6 - 3.509, 12);
    // Its ripple may be 10 % low: ngspice's up to 0.02 / 0.9.
    expect(by['ripple-max']!.margin).toBeCloseTo(0.05 - 0.02 / 0.9, 12);
    // Its efficiency may be 4 % high: ngspice's down to 0.55 / 1.04.
    expect(by['efficiency-min']!.margin).toBeCloseTo(0.55 / 1.04 - 0.6, 12);
    expect(by['lost-charge-max']!.margin).toBeCloseTo(-1e-12, 20);
  });

  it('fails a figure that meets its requirement only inside the measured error, and says so', () => {
    // Output 3.25 V against a 3.24 V minimum: the model meets it by 10 mV, its error is 18 mV.
    const out: Check[] = [];
    circuitChecks({ ...figures, output: 3.25 }, req, circuitCheckNames(req, 'out'), 1.8, BAND, out);
    const min = out.find((c) => c.kind === 'output-min')!;
    expect(min.pass).toBe(false);
    expect(min.margin).toBeCloseTo(-0.008, 12);
    expect(min.detail).toBe(
      "the model meets it by 10.00 mV, less than the model's measured circuit error there (18.0 mV); confirm it with ngspice",
    );
    const eff: Check[] = [];
    circuitChecks({ ...figures, efficiency: 0.61 }, req, circuitCheckNames(req, 'out'), 1.8, BAND, eff);
    const e = eff.find((c) => c.kind === 'efficiency-min')!;
    expect(e.pass).toBe(false);
    expect(e.detail).toMatch(/^the model meets it by 1\.00 points, less than the model's measured circuit error there \(2\.35 points\)/);
  });

  it('holds a card never measured to the widest error measured on any, and generic180 to its own', () => {
    const g = figureErrorFor('generic180');
    expect(g.corners).toBe(225);
    const other = figureErrorFor('elsewhere');
    expect(other.efficiency).toEqual(g.efficiency);
    expect(other.corners).toBe(0);
  });
});
