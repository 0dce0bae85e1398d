import { describe, expect, it } from 'vitest';
import { circuitCheckNames, circuitChecks } from '../../src/checks/circuit-checks.js';
import type { CornerCircuit } from '../../src/circuit/corner-circuit.js';
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

describe('circuitChecks', () => {
  it('circuitChecks gives margins in V, fraction and C, positive when met', () => {
    const out: Check[] = [];
    circuitChecks(figures, req, circuitCheckNames(req, 'out'), 1.8, out);
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
    circuitChecks({ ...figures, method: 'none' }, req, circuitCheckNames(req, 'out'), 1.8, out);
    expect(out).toHaveLength(5);
    expect(out.every((c) => !c.pass && c.margin === null && c.detail === 'the circuit reached no periodic steady state')).toBe(true);
  });
});
