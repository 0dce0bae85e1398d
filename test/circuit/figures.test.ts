import { describe, expect, it } from 'vitest';
import { circuitFigures } from '../../src/circuit/figures.js';
import { expectClose } from '../helpers.js';
import { idealDickson, idealDoubler, idealNegativePump } from './ideal.js';

const VDD = 1.8;
const F = 20e6;
const C = 10e-12;
const I = 100e-6;
const noLoad = { current: 0, conductance: 0 };

describe('circuitFigures', () => {
  it('circuitFigures of an ideal doubler meets 2 VDD - I/(f C) within 1 % (slow-switching limit, Seeman & Sanders 2008)', () => {
    const f = circuitFigures(idealDoubler({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron: 1 }), { current: I, conductance: 0 }, 0, 20000);
    expect(f.method).toBe('direct');
    expectClose(f.noLoadOutput, 2 * VDD, 0.01);
    expectClose(f.output, 2 * VDD - I / (F * C), 0.01);
    expectClose(f.outputResistance!, 1 / (F * C), 0.01);
  });

  it('circuitFigures of an ideal doubler gives R_SSL = 1/(f C) and R_FSL = 2 sum R_i a_i^2 = 8 R_on (charge multipliers 1, Seeman & Sanders 2008)', () => {
    const ron = 20;
    const f = circuitFigures(idealDoubler({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron }), { current: I, conductance: 0 }, 0, 20000);
    expectClose(f.slowLimit!, 1 / (F * C), 0.01);
    expectClose(f.fastLimit!, 8 * ron, 0.01);
    // Between the asymptotes, near their root-sum-square (Seeman & Sanders 2008, eq. for R_out approx).
    expect(f.outputResistance!).toBeGreaterThan(Math.max(f.slowLimit!, f.fastLimit!));
    expect(f.outputResistance!).toBeLessThan(f.slowLimit! + f.fastLimit!);
  });

  it('circuitFigures of an ideal negative pump meets -VDD + I/(f C) within 1 %', () => {
    const f = circuitFigures(
      idealNegativePump({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron: 1 }),
      { current: I, conductance: 0 },
      0,
      20000,
    );
    expect(f.output).toBeLessThan(0);
    expect(f.loadCurrent).toBeLessThan(0);
    expectClose(f.output, -VDD + I / (F * C), 0.01);
  });

  it('circuitFigures of a 3-stage Dickson pump with ideal diodes meets VDD + N (VDD C/(C+Cs) - I/(f (C+Cs))) within 1 % (Dickson 1976, IEEE JSSC 11(3), eq. 7 with V_d = 0)', () => {
    const cs = 1e-12;
    const f = circuitFigures(
      idealDickson({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron: 1, cs }, 3, 0, 1),
      { current: I, conductance: 0 },
      0,
      20000,
    );
    const expected = VDD + 3 * ((VDD * C) / (C + cs) - I / (F * (C + cs)));
    expectClose(f.output, expected, 0.01);
    // With Cs = 0 this is the (N + 1) VDD - N I/(f C) form.
    const bare = circuitFigures(
      idealDickson({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron: 1 }, 3, 0, 1),
      { current: I, conductance: 0 },
      0,
      20000,
    );
    expectClose(bare.output, 4 * VDD - (3 * I) / (F * C), 0.01);
  });

  it('circuitFigures of a Dickson pump with 0.5 V diode drops loses one drop per diode (Dickson 1976, eq. 7)', () => {
    const f = circuitFigures(idealDickson({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron: 1 }, 3, 0.5, 1), noLoad, 0, 20000);
    expectClose(f.output, 4 * VDD - 4 * 0.5, 0.01);
  });

  it('circuitFigures counts shoot-through charge only when the phases overlap', () => {
    const clean = circuitFigures(
      idealDoubler({ vdd: VDD, frequency: F, c: C, cout: 1e-9, ron: 20, dead: 1e-9 }),
      { current: I, conductance: 0 },
      0,
      20000,
    );
    expect(clean.shootThroughCharge).toBe(0);
    expect(clean.efficiency!).toBeGreaterThan(0.5);
    expect(clean.efficiency!).toBeLessThanOrEqual(1);
    // Ideal doubler: input charge 2 q per q delivered, so efficiency = V_out / (2 VDD) (charge-conservation bound, common practice).
    expectClose(clean.efficiency!, clean.output / (2 * VDD), 0.01);
    expect(clean.startupCycles).toBeGreaterThan(1);
  });
});
