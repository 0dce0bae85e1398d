/**
 * A level shifter's energy per period against the deck's own transistor-level shifter
 * (src/spice/level-shifter.ts) in ngspice-39 (Debian) on fixtures/models/generic180.lib: too-tight.yaml's
 * s_high sizing (inverting, VDD..2 VDD, pull-down 4 um against 1 um latch p devices, no node
 * capacitors) into its 40 um p switch gate, input ramp 422.4 ps. The shifter down to a negative
 * level (src/spice/down-shifter.ts) likewise: negative-pump.yaml's s_gnd shifter (inverting,
 * -VDD..0, 300 ps delay, 250 ps transition) into its 40 um p switch gate, input ramp 200 ps. Each
 * shifter sized as the model sizes it, its output into a linear capacitor of the gate's capacitance,
 * one period's charge from every source times its volts (the third 50 ns period, 5 ps steps):
 * scripts/shifter-energy-bench.mjs prints every ngspice figure here.
 */
import { describe, expect, it } from 'vitest';
import { loadProcess } from '../../src/cli/load.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { downShifterEnergy, shifterEnergy } from '../../src/switches/shifter-energy.js';
import { sizeDownShifter } from '../../src/switches/down-shifter-sizing.js';
import { switchGateCapacitance } from '../../src/switches/plan.js';
import { sizeShifter } from '../../src/switches/shifter-sizing.js';
import { flipCrowbarCharge } from '../../src/switches/latch-flip.js';
import { expectClose, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const vdd = { scale: 1, offset: 0 };
const shifter = { delay: 250e-12, transition: 250e-12, low: vdd, high: { scale: 2, offset: 0 }, invert: true };
const load = switchGateCapacitance(card, 'p', 40e-6, 0.18e-6);
const size = sizeShifter(shifter, card, load, 422.4e-12);
const at = (process: string, v: number, temperature: number) =>
  shifterEnergy(shifter, size, load, devicesAtCorner(card, { name: '', process, vdd: v, temperature, duty: 0.5 }), 422.4e-12);

// ngspice-39, J per period, and the model's relative error. The crowbar is the latch flip integrated
// in time (latch-flip.ts); with the fought device taken at full saturation current over the whole
// span, as before, the model read -8.4 to +38.3 % here, +38.3 % at sf/1.62V/27C, where the slow
// 4 um n pull-down fights the fast 1 um latch p device. What is left low is 6.1 to 8.8 % with the
// shifter sized by the fits re-made on ngspice-39 (6.5 to 9.3 % on the earlier sizing, where it was
// about half in the front and half in the latch: at tt/1.8V/27C, ngspice with the front's drive
// made ideal, 27 and 41 fJ), not found.
const CASES = [
  { process: 'tt', vdd: 1.8, temperature: 27, ngspice: 1.213e-12, error: -0.07 },
  { process: 'ss', vdd: 1.62, temperature: 125, ngspice: 0.979e-12, error: -0.076 },
  { process: 'ff', vdd: 1.98, temperature: -40, ngspice: 1.5093e-12, error: -0.073 },
  { process: 'sf', vdd: 1.62, temperature: 27, ngspice: 1.0568e-12, error: -0.061 },
  { process: 'fs', vdd: 1.62, temperature: -40, ngspice: 0.9426e-12, error: -0.088 },
];

describe('shifterEnergy', () => {
  for (const c of CASES) {
    it(`gives ${(100 * c.error).toFixed(1)} % of ngspice's ${(c.ngspice * 1e12).toFixed(3)} pJ at ${c.process}/${c.vdd}V/${c.temperature}C`, () => {
      expectClose(at(c.process, c.vdd, c.temperature).total / c.ngspice - 1, c.error, 0.005, 'abs');
    });
  }

  it('adds its parts: nodes C V^2 by hand at tt/1.8V/27C, the output over the 1.8 V swing', () => {
    const e = at('tt', 1.8, 27);
    expectClose(e.total, e.core + e.latch + e.output + e.crowbar + e.front, 1e-12);
    // Output node: 76.8 fF gate + the output inverter's drains (1.2 fF/um junction, 0.2 fF/um
    // overlap), times (3.6 - 1.8)^2.
    expectClose(load, 76.8e-15, 1e-12);
    expectClose(e.output, (load + 1.4e-9 * (size.outputN + size.outputP)) * 1.8 * 1.8, 1e-12);
    // Latch nodes: 4 um pull-down drain, 1 um p drain and gate each, the output gates on one of them.
    const side = 1.4e-9 * size.pullDown + 3.32e-9 * size.latchP;
    expectClose(e.latch, (2 * side + 1.92e-9 * (size.outputN + size.outputP)) * 3.6 * 3.6, 1e-12);
  });

  it('spends more in the fight where the n pull-down is weak beside the latch p device (sf against fs at 1.8 V, 27 C)', () => {
    expect(at('sf', 1.8, 27).crowbar).toBeGreaterThan(at('fs', 1.8, 27).crowbar);
  });
});

const down = { delay: 300e-12, transition: 250e-12, low: { scale: -1, offset: 0 }, high: { scale: 0, offset: 0 }, invert: true };
const downSize = sizeDownShifter(down, card, load, 200e-12);
const downAt = (process: string, v: number, temperature: number) =>
  downShifterEnergy(down, downSize, load, devicesAtCorner(card, { name: '', process, vdd: v, temperature, duty: 0.5 }), 200e-12);

// ngspice-39, J per period (see the header), and the model's relative error. With the fought device
// at full current over the whole span, as before, the model read -5.9 to +228.8 %: at fs/1.62V/-40C
// the weak 8 um p pull-up barely beats the 0.48 um n latch device at twice VDD of gate drive, and
// the crowbar took 3.93 pJ of the model's 4.67; ngspice's fight is short because the fought device
// starts with no voltage across it and the other side regenerates from its threshold on.
const DOWN_CASES = [
  { process: 'tt', vdd: 1.8, temperature: 27, ngspice: 1.5195e-12, error: -0.015 },
  { process: 'ss', vdd: 1.62, temperature: 125, ngspice: 1.2443e-12, error: -0.029 },
  { process: 'ff', vdd: 1.98, temperature: -40, ngspice: 1.8242e-12, error: -0.01 },
  { process: 'sf', vdd: 1.62, temperature: 27, ngspice: 1.1984e-12, error: -0.036 },
  { process: 'fs', vdd: 1.62, temperature: -40, ngspice: 1.4205e-12, error: 0.05 },
];

describe('downShifterEnergy', () => {
  for (const c of DOWN_CASES) {
    it(`gives ${(100 * c.error).toFixed(1)} % of ngspice's ${(c.ngspice * 1e12).toFixed(3)} pJ at ${c.process}/${c.vdd}V/${c.temperature}C`, () => {
      expectClose(downAt(c.process, c.vdd, c.temperature).total / c.ngspice - 1, c.error, 0.005, 'abs');
    });
  }

  it('adds its parts: the latch nodes over VDD - low (3.6 V at tt/1.8V/27C), the output over the 1.8 V swing', () => {
    const e = downAt('tt', 1.8, 27);
    expectClose(e.total, e.core + e.latch + e.output + e.crowbar + e.front, 1e-12);
    // Drains: junction and gate-drain overlap (0.2 fF/um on generic180).
    const n = card.n.cdrain + 0.2e-9;
    const p = card.p.cdrain + 0.2e-9;
    expectClose(e.output, (load + n * downSize.outputN + p * downSize.outputP) * 1.8 * 1.8, 1e-12);
    const side = p * downSize.pullUp + (n + card.n.cgate) * downSize.latchN + downSize.latchCap;
    expectClose(e.latch, (2 * side + card.n.cgate * downSize.outputN + card.p.cgate * downSize.outputP) * 3.6 * 3.6, 1e-12);
  });

  it('spends more in the fight where the p pull-up is weak beside the latch n device (fs against sf at 1.8 V, 27 C)', () => {
    expect(downAt('fs', 1.8, 27).crowbar).toBeGreaterThan(downAt('sf', 1.8, 27).crowbar);
  });
});

describe('flipCrowbarCharge', () => {
  // ngspice-39 (scripts/shifter-energy-bench.mjs, last figure): negative-pump's s_gnd latch alone at
  // tt/1.62V/27C, 8 um p pull-ups against 0.482 um n latch devices on -VDD, pull gates stepped in
  // 10 ps by ideal sources, the output inverter replaced by its gates' capacitance: the fought device
  // passes 61.3 fC while the set node is pulled up and 66.3 fC while the other node is.
  const devices = devicesAtCorner(card, { name: '', process: 'tt', vdd: 1.62, temperature: 27, duty: 0.5 });
  const size = sizeDownShifter(down, card, load, 400e-12);
  const pull = { device: devices.p, w: size.pullUp, l: card.lmin };
  const latch = { device: devices.n, w: size.latchN, l: card.lmin };
  const drain = (d: typeof devices.n) => d.cdrain + 0.2e-9;
  const side = drain(devices.p) * size.pullUp + (drain(devices.n) + card.n.cgate) * size.latchN;
  const setNode = side + card.n.cgate * size.outputN + card.p.cgate * size.outputP;
  const flip = (node: number, other: number) =>
    flipCrowbarCharge({ pull, pullDrive: 1.62, latch, span: 3.24, node, other, injection: (card.p.cgate / 2) * size.pullUp });

  it("passes ngspice's charge within 15 %: 67.0 fC against 61.3 fC (set node), 65.9 fC against 66.3 fC (other node)", () => {
    expect(size.pullUp).toBe(8e-6);
    expectClose(flip(setNode, side), 66.98e-15, 0.005);
    expectClose(flip(side, setNode), 65.91e-15, 0.005);
    expectClose(flip(setNode, side) / 61.3e-15, 1, 0.15);
    expectClose(flip(side, setNode) / 66.3e-15, 1, 0.15);
  });

  it('passes none when the latch device cannot turn on, and more when the pull device is weaker', () => {
    const off = { device: { ...devices.n, vth: 5 }, w: size.latchN, l: card.lmin };
    expect(flipCrowbarCharge({ pull, pullDrive: 1.62, latch: off, span: 3.24, node: setNode, other: side, injection: 0 })).toBe(0);
    const weak = { ...pull, w: pull.w / 2 };
    expect(flipCrowbarCharge({ pull: weak, pullDrive: 1.62, latch, span: 3.24, node: setNode, other: side, injection: 0 })).toBeGreaterThan(
      flipCrowbarCharge({ pull, pullDrive: 1.62, latch, span: 3.24, node: setNode, other: side, injection: 0 }),
    );
  });
});
