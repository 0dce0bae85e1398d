import { describe, it, expect } from 'vitest';
import { sampleStandardDeviation } from 'simple-statistics';
import { randomLcg, randomNormal } from 'd3-random';
import { drawMismatch, mismatchBuffers, mismatchSigmas, pelgromSigma, sampleSeed } from '../../src/variation/mismatch.js';
import { compileNetlist } from '../../src/netlist/netlist.js';
import { netLoads } from '../../src/netlist/loads.js';
import { analyticModel } from '../../src/delay/analytic.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { loadProcess } from '../../src/cli/load.js';
import { expectClose, processCard } from '../helpers.js';

describe('pelgromSigma', () => {
  // Pelgrom, Duinmaijer & Welbers, IEEE JSSC 24(5), 1989: sigma(Vth1 - Vth2) = A_VT/sqrt(W*L) for a
  // matched pair, so one device has A_VT/sqrt(2*W*L). A_VT = 5 mV*um: 5/sqrt(2) = 3.5355 mV at
  // 1x1 um, 5/sqrt(8) = 1.7678 mV at 4x1 um (derived by hand).
  it('gives 3.536 mV for one 1x1 um device and 1.768 mV for 4x1 um at A_VT = 5 mV*um per pair (Pelgrom 1989)', () => {
    expectClose(pelgromSigma(5e-9, 1e-6, 1e-6), 3.5355339e-3, 1e-7);
    expectClose(pelgromSigma(5e-9, 4e-6, 1e-6), 1.767767e-3, 1e-7);
    expectClose(pelgromSigma(5e-9, 1e-6, 1e-6, 'pair'), pelgromSigma(5e-9, 1e-6, 1e-6), 1e-15);
  });

  it('makes the difference of two independent devices A_VT/sqrt(WL), the pair Pelgrom 1989 defines', () => {
    const one = pelgromSigma(5e-9, 2e-6, 0.5e-6);
    expectClose(Math.sqrt(2) * one, 5e-9 / Math.sqrt(2e-6 * 0.5e-6), 1e-12);
  });

  it('takes A_VT per device as it is with the device convention: 5.0 mV at 1x1 um, 2.5 mV at 4x1 um', () => {
    expectClose(pelgromSigma(5e-9, 1e-6, 1e-6, 'device'), 5e-3, 1e-12);
    expectClose(pelgromSigma(5e-9, 4e-6, 1e-6, 'device'), 2.5e-3, 1e-12);
  });
});

const card = loadProcess(processCard('generic180'));
const inverter = compileNetlist({
  clock: 'clk',
  phases: ['a', 'b'],
  complements: {},
  early: {},
  loads: {},
  gates: [
    { name: 'u1', cell: 'INV', size: 1, inputs: ['clk'], output: 'a' },
    { name: 'u2', cell: 'NAND2', size: 2, inputs: ['clk', 'a'], output: 'b' },
  ],
});

describe('mismatchSigmas', () => {
  it("uses each device's area and divides a series stack by sqrt(depth)", () => {
    expect(card.avtConvention).toBe('pair');
    const s = mismatchSigmas(inverter, card, []);
    const lmin = card.lmin;
    expectClose(s.gateN[0]!, card.n.avt / Math.sqrt(2 * card.unit.wn * lmin), 1e-12);
    expectClose(s.gateP[0]!, card.p.avt / Math.sqrt(2 * card.unit.wp * lmin), 1e-12);
    // NAND2 of size 2: two series n devices of width 2*2*wn each, parallel p devices of 2*wp.
    expectClose(s.gateN[1]!, card.n.avt / Math.sqrt(2 * 4 * card.unit.wn * lmin) / Math.SQRT2, 1e-12);
    expectClose(s.gateP[1]!, card.p.avt / Math.sqrt(2 * 2 * card.unit.wp * lmin), 1e-12);
  });

  it('follows a card that gives A_VT per device: sqrt(2) larger than the pair convention', () => {
    const pair = mismatchSigmas(inverter, card, []);
    const device = mismatchSigmas(inverter, { ...card, avtConvention: 'device' }, []);
    expectClose(device.gateN[0]!, card.n.avt / Math.sqrt(card.unit.wn * card.lmin), 1e-12);
    expectClose(device.gateP[1]! / pair.gateP[1]!, Math.SQRT2, 1e-12);
  });
});

describe('drawMismatch', () => {
  const sigmas = mismatchSigmas(inverter, card, []);
  it('is reproducible for a seed and die, and differs between dies and seeds', () => {
    const a = drawMismatch(sigmas, 7, 3, mismatchBuffers(sigmas));
    const b = drawMismatch(sigmas, 7, 3, mismatchBuffers(sigmas));
    const c = drawMismatch(sigmas, 7, 4, mismatchBuffers(sigmas));
    const d = drawMismatch(sigmas, 8, 3, mismatchBuffers(sigmas));
    expect(Array.from(a.dvthN)).toEqual(Array.from(b.dvthN));
    expect(a.dvthN[0]).not.toBe(c.dvthN[0]);
    expect(a.dvthN[0]).not.toBe(d.dvthN[0]);
    expect(sampleSeed(7, 3)).toBeGreaterThanOrEqual(0);
    expect(sampleSeed(7, 3)).toBeLessThan(1);
  });

  it("draws shifts whose sigma is Pelgrom's within 2 % over 20,000 dies", () => {
    const buf = mismatchBuffers(sigmas);
    const xs = Array.from({ length: 20000 }, (_, i) => drawMismatch(sigmas, 1, i, buf).dvthN[0]!);
    expectClose(sampleStandardDeviation(xs), sigmas.gateN[0]!, 0.02);
  });
});

describe('gate delay under mismatch', () => {
  // First-order propagation through the alpha-power delay (Sakurai & Newton, IEEE JSSC 1990):
  // t = (1/2 - (1 - Vth/VDD)/(1 + alpha)) tT + C VDD / (2 W K (VDD - Vth)^alpha), so
  // dt/dVth = tT/(VDD (1 + alpha)) + alpha C VDD / (2 W K (VDD - Vth)^(alpha + 1)),
  // and sigma(t) ~ |dt/dVth| * sigma(Vth) for a small sigma. The input is fast (20 ps, under a
  // third of tau), where the closed form is the model's exact limit.
  it('has the sigma of the first-order sensitivity times sigma(Vth), within 5 % at 20,000 samples', () => {
    const devices = devicesAtCorner(card, { name: 'tt', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 });
    const loads = netLoads(inverter, card);
    const sigma = 0.01;
    const tIn = 20e-12;
    const n = devices.n;
    const width = card.unit.wn;
    const c = loads[inverter.netIndex.get('a')!]!;
    const sensitivity = tIn / (1.8 * (1 + n.alpha)) + (n.alpha * c * 1.8) / (2 * width * n.driveConstant * (1.8 - n.vth) ** (n.alpha + 1));
    const buf = { dvthN: new Float64Array(2), dvthP: new Float64Array(2), switches: [] };
    const normal = randomNormal.source(randomLcg(0.42))(0, 1);
    const delays: number[] = [];
    for (let k = 0; k < 20000; k++) {
      buf.dvthN[0] = sigma * normal();
      delays.push(analyticModel.bind(inverter, loads, devices, buf).delay(0, 0, false, tIn));
    }
    expectClose(sampleStandardDeviation(delays), sensitivity * sigma, 0.05);
  });
});

describe('mismatchSigmas of level shifters', () => {
  // By hand: generic180 n avt 5 mV*um per pair, pull-down 4 x 0.5 um at 0.18 um:
  // 5e-9 / sqrt(2 * 2e-6 * 0.18e-6) = 5.893 mV. s_gnd and s_vdd have no shifter.
  it("gives the doubler's shifted switches 5.89 mV on the pull-down, the others 0, drawn after all other shifts", async () => {
    const { resolveYaml } = await import('../helpers.js');
    const { readFileSync } = await import('node:fs');
    const { design } = await import('../helpers.js');
    const resolved = resolveYaml(readFileSync(design('doubler'), 'utf8'));
    const sigmas = mismatchSigmas(resolved.netlist, resolved.card, resolved.switches);
    expect(resolved.switches.map((s) => s.name)).toEqual(['s_gnd', 's_chg', 's_vdd', 's_out']);
    expectClose(sigmas.shifters[1]!, 5.893e-3, 1e-3);
    expectClose(sigmas.shifters[3]!, 5.893e-3, 1e-3);
    expect([sigmas.shifters[0], sigmas.shifters[2]]).toEqual([0, 0]);
    const withShifters = drawMismatch(sigmas, 7, 3, mismatchBuffers(sigmas));
    const without = drawMismatch({ ...sigmas, shifters: new Float64Array(4) }, 7, 3, mismatchBuffers(sigmas));
    expect(Array.from(withShifters.dvthN)).toEqual(Array.from(without.dvthN));
    expect(withShifters.switches.map((s) => Array.from(s))).toEqual(without.switches.map((s) => Array.from(s)));
    expect(withShifters.shifters![1]).not.toBe(0);
  });
});
