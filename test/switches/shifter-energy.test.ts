/**
 * A level shifter's energy per period against the deck's own transistor-level shifter
 * (src/spice/level-shifter.ts) in ngspice-39 (Debian) on fixtures/models/generic180.lib: too-tight.yaml's
 * s_high sizing (inverting, VDD..2 VDD, pull-down 4 um against 1 um latch p devices, no node
 * capacitors) into its 40 um p switch gate, input ramp 422.4 ps, one period's charge from each
 * supply times its volts (the charge the output returns to the VDD supply, its low level, counted).
 */
import { describe, expect, it } from 'vitest';
import { loadProcess } from '../../src/cli/load.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { shifterEnergy } from '../../src/switches/shifter-energy.js';
import { switchGateCapacitance } from '../../src/switches/plan.js';
import { sizeShifter } from '../../src/switches/shifter-sizing.js';
import { expectClose, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const vdd = { scale: 1, offset: 0 };
const shifter = { delay: 250e-12, transition: 250e-12, low: vdd, high: { scale: 2, offset: 0 }, invert: true };
const load = switchGateCapacitance(card, 'p', 40e-6, 0.18e-6);
const size = sizeShifter(shifter, card, load, 422.4e-12);
const at = (process: string, v: number, temperature: number) =>
  shifterEnergy(shifter, size, load, devicesAtCorner(card, { name: '', process, vdd: v, temperature, duty: 0.5 }));

// ngspice-39, J per period, and the model's relative error when this test was written: the card's
// capacitances per width (1.0 fF/um drain, 1.6 fF/um gate) sit below what the model file's
// junctions and overlaps give, so the model stays 16 to 30 % low on this shifter.
const CASES = [
  { process: 'tt', vdd: 1.8, temperature: 27, ngspice: 1.089e-12, error: -0.252 },
  { process: 'ss', vdd: 1.62, temperature: 125, ngspice: 0.881e-12, error: -0.246 },
  { process: 'ff', vdd: 1.98, temperature: -40, ngspice: 1.359e-12, error: -0.281 },
  { process: 'sf', vdd: 1.62, temperature: 27, ngspice: 0.95e-12, error: -0.156 },
];

describe('shifterEnergy', () => {
  for (const c of CASES) {
    it(`gives ${(100 * c.error).toFixed(1)} % of ngspice's ${(c.ngspice * 1e12).toFixed(3)} pJ at ${c.process}/${c.vdd}V/${c.temperature}C`, () => {
      expectClose(at(c.process, c.vdd, c.temperature).total / c.ngspice - 1, c.error, 0.005, 'abs');
    });
  }

  it('adds its parts: nodes C V^2 by hand at tt/1.8V/27C, the output over the 1.8 V swing', () => {
    const e = at('tt', 1.8, 27);
    expectClose(e.total, e.core + e.latch + e.output + e.crowbar, 1e-12);
    // Output node: 64 fF gate + 1.0 fF/um drains of the output inverter, times (3.6 - 1.8)^2.
    expectClose(e.output, (load + 1e-9 * (size.outputN + size.outputP)) * 1.8 * 1.8, 1e-12);
    // Latch nodes: 4 um pull-down drain, 1 um p drain and gate each, the output gates on one of them.
    const side = 1e-9 * size.pullDown + 2.6e-9 * size.latchP;
    expectClose(e.latch, (2 * side + 1.6e-9 * (size.outputN + size.outputP)) * 3.6 * 3.6, 1e-12);
  });

  it('spends more in the fight where the n pull-down is weak beside the latch p device (sf against fs at 1.8 V, 27 C)', () => {
    expect(at('sf', 1.8, 27).crowbar).toBeGreaterThan(at('fs', 1.8, 27).crowbar);
  });
});
