/**
 * The sized shifter's edges per corner against the deck's own transistor-level shifter
 * (src/spice/level-shifter.ts) in ngspice-39 (Debian) on fixtures/models/generic180.lib, sized as
 * the deck sizes too-tight.yaml's s_high (inverting, VDD..2 VDD, 250 ps declared, a 40 um p switch
 * gate of 76.8 fF, pull-down 4 um against 1 um latch p devices), input ramp 422.4 ps (0 to 100 %) at every corner.
 * Delay: input 50 % to output 50 %. The recorded values are ngspice's; the model's ratio to the
 * nominal corner is compared with ngspice's ratio.
 */
import { describe, expect, it } from 'vitest';
import { loadProcess } from '../../src/cli/load.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { shifterEdges } from '../../src/switches/shifter-edges.js';
import { switchGateCapacitance } from '../../src/switches/plan.js';
import { nominalDevices, sizeShifter } from '../../src/switches/shifter-sizing.js';
import { expectClose, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const vdd = { scale: 1, offset: 0 };
const shifter = { delay: 250e-12, transition: 250e-12, low: vdd, high: { scale: 2, offset: 0 }, invert: true };
const load = switchGateCapacitance(card, 'p', 40e-6, 0.18e-6);
const input = { rise: 422.4e-12, fall: 422.4e-12 };
const size = sizeShifter(shifter, card, load, input.rise);
const nominal = nominalDevices(card);
const at = (process: string, v: number, temperature: number, dvth = 0) =>
  shifterEdges(shifter, size, devicesAtCorner(card, { name: '', process, vdd: v, temperature, duty: 0.5 }), nominal, input, dvth);

// ngspice-39, s: output rising and falling delay at the nominal corner, then per corner with the
// model's relative error on the ratio to nominal as measured when this test was written (5 ps step,
// delays to 1 ps; re-measured with the card's capacitances from its model file, which widen the
// output inverter). The model's errors are re-pinned to the refitted alpha-power card (alpha 1.586 n,
// 1.659 p), which moves them by up to 12.5 points (sf/1.62V/27C falling edge: 2.0 % before, 14.5 % now).
// Over all 45 corners of too-tight.yaml, with an earlier card (not re-measured since): median 4.7 %,
// worst 20.6 % (the swing / n-drive scale it replaces in the measurement: median 8.7 %, worst 25.6 %).
const NOMINAL = { rise: 274e-12, fall: 333e-12 };
const CASES = [
  { process: 'ss', vdd: 1.62, temperature: 125, rise: 463e-12, fall: 581e-12, errRise: -0.042, errFall: 0.005 },
  { process: 'ff', vdd: 1.98, temperature: -40, rise: 170e-12, fall: 199e-12, errRise: 0.116, errFall: 0.042 },
  { process: 'fs', vdd: 1.98, temperature: -40, rise: 186e-12, fall: 251e-12, errRise: 0.161, errFall: -0.075 },
  { process: 'sf', vdd: 1.62, temperature: 27, rise: 330e-12, fall: 399e-12, errRise: -0.008, errFall: 0.145 },
  { process: 'tt', vdd: 1.8, temperature: 125, rise: 352e-12, fall: 418e-12, errRise: -0.039, errFall: 0.014 },
];

describe('shifterEdges', () => {
  it("gives the sizing's own estimates at the nominal corner (320 / 338 ps: 250 ps cannot be reached; ngspice 274 / 333 ps)", () => {
    const e = at('tt', 1.8, 27);
    expectClose(e.rise, size.estimate.rise, 1e-12);
    expectClose(e.fall, size.estimate.fall, 1e-12);
    expectClose((e.riseTransition + e.fallTransition) / 2, size.estimate.transition, 1e-12);
    expectClose(e.rise, 319.6e-12, 0.002);
    expectClose(e.fall, 338.2e-12, 0.002);
  });

  for (const c of CASES) {
    it(`follows ngspice's ratio to nominal at ${c.process}/${c.vdd}V/${c.temperature}C per edge (${(100 * c.errRise).toFixed(1)} %, ${(100 * c.errFall).toFixed(1)} %)`, () => {
      const base = at('tt', 1.8, 27);
      const here = at(c.process, c.vdd, c.temperature);
      expectClose(here.rise / base.rise / (c.rise / NOMINAL.rise) - 1, c.errRise, 0.005, 'abs');
      expectClose(here.fall / base.fall / (c.fall / NOMINAL.fall) - 1, c.errFall, 0.005, 'abs');
    });
  }

  it('slows the shifter when its pull-downs get a higher threshold (+30 mV at tt/1.8V/27C) and never flips when they lose the fight', () => {
    const base = at('tt', 1.8, 27);
    const slow = at('tt', 1.8, 27, 0.03);
    expect(slow.rise).toBeGreaterThan(base.rise);
    expect(slow.fall).toBeGreaterThan(base.fall);
    expect(at('tt', 1.8, 27, 1.2).rise).toBe(Infinity);
  });
});
