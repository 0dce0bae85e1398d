import { describe, expect, it } from 'vitest';
import { cli, design, TYPICAL_ONLY } from '../helpers.js';

interface Corner {
  name: string;
  circuit?: {
    output: number;
    ripple: number;
    lostCharge: number;
    reverseCharge: number;
    outputResistance: number;
    slowLimit: number;
    startupCycles: number | null;
  };
  checks: { kind: string; pass: boolean }[];
}

function corner(name: string, at: string): Corner {
  const run = cli('check', design(name), '--json', ...TYPICAL_ONLY);
  const report = JSON.parse(run.stdout) as { corners: Corner[] };
  return report.corners.find((c) => c.name === at)!;
}

describe('CircuitEvaluator.evaluate', () => {
  it('check of the demo pump gives 2 VDD less the slow-switching drop I/(f C) and no lost charge', () => {
    const c = corner('doubler-pump', 'tt/1.8V/27C').circuit!;
    // 50 uA at 20 MHz into 10 pF: 0.25 V below 2 VDD in the slow-switching limit (Seeman & Sanders 2008); R_on adds a little.
    expect(c.output).toBeLessThan(3.6 - 0.25);
    expect(c.output).toBeGreaterThan(3.6 - 0.25 - 0.05);
    expect(c.slowLimit).toBeGreaterThan(5000 * 0.99);
    expect(c.slowLimit).toBeLessThan(5000 * 1.05);
    expect(c.lostCharge).toBe(0);
    expect(c.startupCycles).toBeGreaterThan(5);
  });

  it('check of the unboosted pump shows the reverse conduction of s_chg as lost charge and the output collapse', () => {
    const good = corner('doubler-pump', 'tt/1.8V/27C');
    const bad = corner('doubler-unboosted-pump', 'tt/1.8V/27C');
    // s_chg's gate sits at VDD in phase 2, so the top plate is clamped near VDD + |V_TP| instead of 2 VDD.
    expect(bad.circuit!.output).toBeLessThan(1.3 * 1.8);
    expect(good.circuit!.output - bad.circuit!.output).toBeGreaterThan(1);
    expect(bad.circuit!.reverseCharge).toBeGreaterThan(5e-12);
    expect(bad.checks.find((k) => k.kind === 'output-min')!.pass).toBe(false);
    expect(bad.checks.find((k) => k.kind === 'lost-charge-max')!.pass).toBe(false);
    expect(
      good.checks.filter((k) => k.kind.startsWith('output') || k.kind.endsWith('-max') || k.kind === 'efficiency-min').every((k) => k.pass),
    ).toBe(true);
  });

  it('check of the diode pump gives the switch pump less two diode drops (Dickson 1976, eq. 7 with N = 1)', () => {
    const sw = corner('doubler-pump', 'tt/1.8V/27C').circuit!;
    const diode = corner('doubler-diode-pump', 'tt/1.8V/27C').circuit!;
    // Two 0.6 V drops; the 200 ohm diodes against the switches' R_on add a few tens of mV at 50 uA, and the
    // diode pump's switches' gate charge gives some back (measured 1.186 V).
    expect(sw.output - diode.output).toBeGreaterThan(1.15);
    expect(sw.output - diode.output).toBeLessThan(1.3);
  });

  it('check prints the per-corner circuit figures table when the design has a circuit', () => {
    const run = cli('check', design('doubler-pump'), ...TYPICAL_ONLY);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/circuit figures/);
    expect(run.stdout).toMatch(/tt\/1\.8V\/27C\s+3\.3\d V/);
  });
});
