import { describe, it, expect } from 'vitest';
import {
  bitsToError,
  bodyThreshold,
  offStateAllowance,
  rampCrossing,
  settlingTimeConstants,
  subthresholdSwing,
  triodeResistance,
} from '../../src/switches/physics.js';
import { thermalVoltage } from '../../src/process/thermal.js';
import { expectClose } from '../helpers.js';

describe('rampCrossing', () => {
  // Worked example derived from the linear ramp (derived by hand; docs/physics.md, "Switches and constraints"): an nmos passing
  // V_S = 0.3 V with V_TN = 0.45 V on a 1.8 V -> 0 ramp of t_f = 600 ps opens
  // (1/2 - (V_S + V_TN)/V_DD) * t_f = (0.5 - 0.75/1.8) * 600 ps = 50.0 ps after the 50 % point.
  it('puts an nmos turn-off 50 ps after the 50 % point of a 600 ps falling ramp (V_S 0.3 V, V_TN 0.45 V)', () => {
    const t = rampCrossing({ t50: 1e-9, transition: 600e-12, low: 0, high: 1.8, rising: false }, 0.3 + 0.45);
    expectClose(t - 1e-9, 50e-12, 1e-9);
  });

  // Same ramp with body effect, common-practice law V_T = V_T0 + gamma*(sqrt(2phiF + V_SB) - sqrt(2phiF)):
  // gamma 0.45, 2phiF 0.85 V, V_SB 0.3 V -> V_T = 0.45 + 0.45*(1.072381 - 0.921954) = 0.517692 V,
  // crossing (0.5 - 0.817692/1.8) * 600 ps = 27.436 ps after 50 % (arithmetic by hand).
  it('moves the turn-off to 27.4 ps after 50 % when the body effect raises V_T to 0.5177 V', () => {
    const vt = bodyThreshold(0.45, 0.45, 0.85, 0.3);
    expectClose(vt, 0.517692, 1e-5);
    const t = rampCrossing({ t50: 0, transition: 600e-12, low: 0, high: 1.8, rising: false }, 0.3 + vt);
    expectClose(t, 27.436e-12, 1e-3);
  });

  it('places a rising crossing symmetrically: level at 25 % of the swing is a quarter ramp before 50 %', () => {
    const t = rampCrossing({ t50: 0, transition: 400e-12, low: 1, high: 3, rising: true }, 1.5);
    expectClose(t, -100e-12, 1e-12);
  });

  it('moves a crossing away from the 50 % point in proportion to the transition time', () => {
    const at = (transition: number) => rampCrossing({ t50: 0, transition, low: 0, high: 1.8, rising: false }, 0.45);
    expect(at(800e-12)).toBeGreaterThan(at(400e-12));
    expectClose(at(800e-12) / at(400e-12), 2, 1e-12);
  });
});

describe('bodyThreshold', () => {
  it('equals V_T0 at zero source-bulk voltage and clamps a forward bias', () => {
    expect(bodyThreshold(0.45, 0.45, 0.85, 0)).toBe(0.45);
    expect(bodyThreshold(0.45, 0.45, 0.85, -0.2)).toBe(0.45);
  });
});

describe('triodeResistance', () => {
  // Derived by hand (docs/physics.md, "Switches and constraints"): mu*Cox = 200 uA/V^2, W/L = 10, V_ov = 1 V -> 500 ohm (common-practice formula).
  it("gives 500 ohm for k' = 200 uA/V^2, W/L = 10, 1 V overdrive", () => {
    expectClose(triodeResistance(200e-6, 10e-6, 1e-6, 1), 500, 1e-12);
  });
  it('is infinite when the device is not on', () => {
    expect(triodeResistance(200e-6, 10e-6, 1e-6, 0)).toBe(Infinity);
    expect(triodeResistance(200e-6, 10e-6, 1e-6, -0.1)).toBe(Infinity);
  });
});

describe('settling time constants', () => {
  // Derived by hand (docs/physics.md, "Switches and constraints"): ln(2^(N+1)) half-LSB: 10 b -> 7.6246 tau, 12 b -> 9.0109 tau; one LSB at 12 b 8.3178 tau.
  it.each([
    [10, 7.6246],
    [12, 9.0109],
  ])('needs ln(2^(N+1)) tau for %i bits at half an LSB', (bits, taus) => {
    expectClose(settlingTimeConstants(bitsToError(bits)), taus, 1e-4);
  });
  it('needs 8.3178 tau for one LSB at 12 bits', () => {
    expectClose(settlingTimeConstants(2 ** -12), 8.3178, 1e-4);
  });
  // Derived by hand (docs/physics.md, "Switches and constraints"): 500 ohm with 1 pF is tau = 0.5 ns; 10-bit half-LSB settling takes 3.812 ns.
  it('settles 500 ohm into 1 pF to 10 bits in 3.812 ns', () => {
    expectClose(settlingTimeConstants(bitsToError(10)) * 500 * 1e-12, 3.812e-9, 1e-3);
  });
});

describe('thermalVoltage', () => {
  // kT/q at 300 K = 1.380649e-23 * 300 / 1.602176634e-19 = 25.852 mV (CODATA 2018 exact constants).
  it('is 25.852 mV at 300 K (26.85 °C)', () => {
    expectClose(thermalVoltage(26.85), 0.025852, 1e-6);
  });
});

describe('subthresholdSwing', () => {
  // S = n kT/q ln 10: about 60 mV/decade per unit n at room temperature (common textbook fact,
  // e.g. Sze & Ng, Physics of Semiconductor Devices); 25.852 mV * 2.302585 = 59.526 mV at 300 K.
  it('is 59.5 mV/decade for n = 1 at 300 K and scales with n and absolute temperature', () => {
    expectClose(subthresholdSwing(1, 26.85), 0.0595264, 1e-6);
    expectClose(subthresholdSwing(1.5, 26.85), 1.5 * 0.0595264, 1e-6);
    expectClose(subthresholdSwing(1, 126.85) / subthresholdSwing(1, 26.85), 400 / 300, 1e-12);
  });
});

describe('offStateAllowance', () => {
  // Two decades at n = 1.5, 300 K: 2 * 1.5 * 59.526 mV = 178.58 mV (hand arithmetic from the swing above).
  it('is k decades of the sub-threshold swing: 178.6 mV for k = 2, n = 1.5 at 300 K', () => {
    expectClose(offStateAllowance(2, 1.5, 26.85), 0.178579, 1e-5);
    expect(offStateAllowance(0, 1.5, 26.85)).toBe(0);
  });
});

describe('triodeResistance with mobility degradation', () => {
  // By hand: k' 194.6 uA/V^2, W/L 10/0.18, V_ov 1.35 V, theta 0.55/V:
  // (1 + 0.7425) / (194.6e-6 * 55.556 * 1.35) = 1.7425 / 0.014595 = 119.39 ohm.
  it('divides by mu_eff = mu0 / (1 + theta V_ov): 119.4 ohm for the generic180 s_gnd at tt', () => {
    expectClose(triodeResistance(194.6e-6, 10e-6, 0.18e-6, 1.35, 0.55), 119.39, 1e-3);
  });

  it('reduces to 1 / (k W/L V_ov) with theta 0 and is Infinity when not on', () => {
    expectClose(triodeResistance(300e-6, 10e-6, 0.18e-6, 1.35, 0), 1 / (300e-6 * (10 / 0.18) * 1.35), 1e-12);
    expect(triodeResistance(300e-6, 10e-6, 0.18e-6, 0, 0.5)).toBe(Infinity);
  });
});
