import { describe, expect, it } from 'vitest';
import { spiceThresholdShift, surfacePotentialAt } from '../../src/process/spice-temperature.js';
import { thermalVoltage } from '../../src/process/thermal.js';
import { expectClose } from '../helpers.js';

describe('surfacePotentialAt', () => {
  it('gives the stated 2 phi_F at t0 and moves it as ngspice moves PHI (0.824 / 0.506 V at -40 / 125 C from 0.7 V)', () => {
    expectClose(surfacePotentialAt(0.7, 27, 27), 0.7, 1e-12);
    // The 2 phi_F that reproduces ngspice-39's body effect on generic180's n device (gamma 0.45,
    // V_SB 0.8 V: 0.1650 / 0.1941 V at -40 / 125 C; test/process/device.test.ts).
    expectClose(surfacePotentialAt(0.7, 27, -40), 0.8244, 1e-3);
    expectClose(surfacePotentialAt(0.7, 27, 125), 0.5063, 1e-3);
  });

  it('holds a lightly doped body at four thermal voltages when hot instead of going through zero, so the threshold stays finite', () => {
    // 0.3 V at 27 C would fall below zero by 150 C under SPICE's law.
    expectClose(surfacePotentialAt(0.3, 27, 200), 4 * thermalVoltage(200), 1e-9);
    for (const t of [-60, 27, 150, 200]) expect(Number.isFinite(spiceThresholdShift('n', 0.45, 0.3, 27, t))).toBe(true);
  });
});

describe('spiceThresholdShift', () => {
  it('moves an n and a p threshold apart by the band-gap term (ngspice-39: +86.0 / +98.9 mV at -40 C)', () => {
    expectClose(spiceThresholdShift('n', 0.45, 0.7, 27, -40), 0.086, 0.3e-3, 'abs');
    expectClose(spiceThresholdShift('p', 0.4, 0.7, 27, -40), 0.0989, 0.3e-3, 'abs');
    expect(spiceThresholdShift('n', 0.45, 0.7, 27, 27)).toBe(0);
  });
});
