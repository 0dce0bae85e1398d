import { describe, it, expect } from 'vitest';
import { alphaPowerDelay, analyticModel, rampCoefficient } from '../../src/delay/analytic.js';
import { saturationCurrent, devicesAtCorner } from '../../src/process/device.js';
import { compileNetlist, type GateSpec } from '../../src/netlist/netlist.js';
import { CELLS, type PrimitiveCell } from '../../src/cells/library.js';
import { netLoads } from '../../src/netlist/loads.js';
import { processSchema, type ProcessCard } from '../../src/schema/process.js';
import { parseWith } from '../../src/schema/validate.js';
import { loadProcess } from '../../src/cli/load.js';
import { InputError } from '../../src/errors.js';
import type { Corner } from '../../src/process/corner.js';
import { expectClose, processCard } from '../helpers.js';

/**
 * An invented card for logical-effort checks: P/N width ratio 2, equal gate and drain capacitance
 * per width and no overlap counted apart, so the unit inverter's self-parasitic equals its input
 * capacitance (p_inv = 1).
 */
function effortCard(): ProcessCard {
  const device = (drive: number) => ({
    vth0: 0.4,
    alpha: 1.3,
    drive,
    vthTempco: 0.001,
    mobilityExponent: 1.5,
    gamma: 0.4,
    phi2f: 0.85,
    cgate: 1.5e-9,
    cdrain: 1.5e-9,
    cov: 0,
    avt: 5e-9,
    kprime: 100e-6,
  });
  return parseWith(processSchema, {
    name: 'effort-probe',
    lmin: 0.18e-6,
    vddNominal: 1.8,
    unit: { wn: 0.5e-6, wp: 1.0e-6 },
    n: device(340),
    p: device(150),
    corners: { tt: {} },
  });
}

const at = (process: string, vdd: number, temperature: number): Corner => ({
  name: `${process}/${vdd}V/${temperature}C`,
  process,
  vdd,
  temperature,
  duty: 0.5,
});

/** `driver` (a cell on net y fed by the clock) with `fanout` copies of a cell on y, each driving its own net. */
function fanoutNetlist(driver: GateSpec['cell'], fanout: number, load: GateSpec['cell'] = driver) {
  const gates: GateSpec[] = [];
  // Only the first pin of each load listens to y; the others are tied to the clock.
  const inputsOf = (cell: GateSpec['cell'], net: string) => [
    net,
    ...Array.from({ length: CELLS[cell as PrimitiveCell].inputs - 1 }, () => 'clk'),
  ];
  gates.push({ name: 'drv', cell: driver, size: 1, inputs: inputsOf(driver, 'clk'), output: 'y' });
  for (let k = 1; k <= fanout; k++) gates.push({ name: `ld${k}`, cell: load, size: 1, inputs: inputsOf(load, 'y'), output: `z${k}` });
  const phases: [string, string] = fanout >= 1 ? ['y', 'z1'] : ['y', 'y'];
  return compileNetlist({ clock: 'clk', phases, complements: {}, early: {}, gates, loads: {} });
}

describe('rampCoefficient', () => {
  // Sakurai & Newton, IEEE JSSC 25(2), 1990: the input-slope term 1/2 - (1 - v_T)/(1 + alpha).
  // By hand: v_T = 0.45/1.8 = 0.25; (1 - 0.25)/(1 + 1.3) = 0.75/2.3 = 0.326087; 0.5 - 0.326087 = 0.173913.
  it('is 0.173913 for Vth 0.45 V, VDD 1.8 V, alpha 1.3 (hand-computed)', () => {
    expectClose(rampCoefficient(0.45, 1.8, 1.3), 0.173913, 1e-5);
  });

  // Square-law limit alpha = 2 (Sakurai & Newton 1990): 1/2 - (1 - v_T)/3. v_T = 0.25 -> 0.5 - 0.25 = 0.25.
  it('reduces to 1/2 - (1 - v_T)/3 at the square-law limit alpha = 2', () => {
    expectClose(rampCoefficient(0.45, 1.8, 2), 0.25, 1e-12);
    for (const vt of [0.1, 0.2, 0.3, 0.4]) expectClose(rampCoefficient(vt * 2, 2, 2), 0.5 - (1 - vt) / 3, 1e-12);
  });

  it('grows with the threshold ratio: a higher threshold makes the delay more slope-sensitive', () => {
    expect(rampCoefficient(0.6, 1.8, 1.3)).toBeGreaterThan(rampCoefficient(0.45, 1.8, 1.3));
  });
});

describe('alphaPowerDelay', () => {
  // Sakurai & Newton 1990, t_d = (1/2 - (1 - v_T)/(1 + alpha)) t_T + C_L V_DD / (2 I_D0). Hand example:
  // Vth 0.45 V, VDD 1.8 V, alpha 1.3, t_T 200 ps, C_L 100 fF, I_D0 500 uA:
  //   slope term 0.173913 * 200 ps = 34.7826 ps; step term 100e-15 * 1.8 / (2 * 500e-6) = 180 ps;
  //   t_d = 214.7826 ps.
  it('gives 214.78 ps for the hand-computed example (Sakurai & Newton 1990)', () => {
    expectClose(alphaPowerDelay(100e-15, 1.8, 500e-6, 0.45, 1.3, 200e-12), 214.7826e-12, 1e-6);
  });

  // Same example at alpha = 2: 0.25 * 200 ps + 180 ps = 230 ps.
  it('gives 230 ps for the same example at the square-law limit', () => {
    expectClose(alphaPowerDelay(100e-15, 1.8, 500e-6, 0.45, 2, 200e-12), 230e-12, 1e-12);
  });

  it('is C_L V_DD / (2 I_D0) for a step input', () => {
    expectClose(alphaPowerDelay(100e-15, 1.8, 500e-6, 0.45, 1.3, 0), 180e-12, 1e-12);
  });
});

describe('saturationCurrent at alpha = 2', () => {
  // Square law (Sakurai & Newton 1990, alpha = 2 limit): current goes as the overdrive squared.
  it('quadruples when the overdrive doubles and is zero at or below threshold', () => {
    expectClose(saturationCurrent(150, 2, 0.8) / saturationCurrent(150, 2, 0.4), 4, 1e-12);
    expectClose(saturationCurrent(150, 2, 0.5), 150 * 0.25, 1e-12);
    expect(saturationCurrent(150, 2, 0)).toBe(0);
    expect(saturationCurrent(150, 2, -0.1)).toBe(0);
  });
});

describe('analyticModel.bind: logical-effort units', () => {
  const card = effortCard();
  const devices = devicesAtCorner(card, at('tt', 1.8, 27));
  const cin = (card.unit.wn + card.unit.wp) * card.n.cgate;
  // tau of each edge: the unit inverter charging its own input capacitance, C_in V_DD / (2 I).
  const currentUp = card.unit.wp * card.p.drive * (1.8 - card.p.vth0) ** card.p.alpha;
  const currentDown = card.unit.wn * card.n.drive * (1.8 - card.n.vth0) ** card.n.alpha;
  const tauUp = (cin * 1.8) / (2 * currentUp);
  const tauDown = (cin * 1.8) / (2 * currentDown);

  function stepDelays(driver: GateSpec['cell'], fanout: number): { rise: number; fall: number } {
    const net = fanoutNetlist(driver, fanout);
    const timing = analyticModel.bind(net, netLoads(net, card), devices);
    return { rise: timing.delay(0, 0, true, 0), fall: timing.delay(0, 0, false, 0) };
  }

  it('sees p_inv = 1 on this card: the inverter parasitic equals its input capacitance', () => {
    const net = fanoutNetlist('INV', 0);
    expectClose(netLoads(net, card)[net.netIndex.get('y')!]!, cin, 1e-12);
  });

  // Logical Effort (1999): an inverter driving four copies of itself, d = g h + p = 1 * 4 + 1 = 5 tau,
  // with every pin at its full capacitance. Up to the 50 % point a fanout pin holds back a third of
  // the channel (0.8 of the gate capacitance) of its device turning on, which Meyer's model saturates
  // (2/3 C_ox W L): the n one (1/3 of the pin) behind a rising edge, the p one (2/3) behind a falling
  // one. By hand: h = 4 (1 - 0.8/9) = 3.6444 rising, 4 (1 - 1.6/9) = 3.2889 falling.
  it('makes the FO4 inverter delay g h + p tau for a step input, h the pins as charged to the 50 % point (Logical Effort, 1999; Meyer, 1971)', () => {
    const d = stepDelays('INV', 4);
    expectClose(d.rise / tauUp, 4.644444, 1e-6);
    expectClose(d.fall / tauDown, 4.288889, 1e-6);
  });

  // Derived from d = g h + p with g = 4/3, p = 2 (NAND2) and g = 5/3, p = 2 (NOR2) at gamma = 2, the
  // pins as above: a NAND2 pin is half n, half p, so h = 4 (1 - 0.8/6) both ways, d = 16/3 * 13/15 + 2
  // = 6.6222 tau; a NOR2 pin is 1/5 n, 4/5 p: rising 20/3 (1 - 0.8/15) + 2 = 8.3111 tau, falling
  // 20/3 (1 - 3.2/15) + 2 = 7.2444 tau.
  it('gives NAND2 and NOR2 at fanout 4 of their own kind g h + p with h as charged to the 50 % point (derived)', () => {
    const nand = stepDelays('NAND2', 4);
    expectClose(nand.rise / tauUp, 6.622222, 1e-6);
    expectClose(nand.fall / tauDown, 6.622222, 1e-6);
    const nor = stepDelays('NOR2', 4);
    expectClose(nor.rise / tauUp, 8.311111, 1e-6);
    expectClose(nor.fall / tauDown, 7.244444, 1e-6);
  });

  // Sakurai & Newton 1990: for a fast input (here a tenth of C_L V_DD / I_D0) the delay is their
  // closed form plus what it leaves out of the opposing device: its current (under 1 %, see
  // test/delay/ramp-response.test.ts) and Meyer's C_gd of its linear region coupling the input onto
  // the output, at most half its channel (0.8 of its gate capacitance) across the whole swing, moved
  // by the pulling device at full current.
  it('adds the Sakurai-Newton slope term of the pulling device for a fast ramp input, and the opposing device its Miller charge', () => {
    const net = fanoutNetlist('INV', 4);
    const timing = analyticModel.bind(net, netLoads(net, card), devices);
    const tT = 0.2 * 5 * tauDown;
    const rise = 4.644444 * tauUp + rampCoefficient(card.p.vth0, 1.8, card.p.alpha) * tT;
    const fall = 4.288889 * tauDown + rampCoefficient(card.n.vth0, 1.8, card.n.alpha) * tT;
    const millerRise = (0.5 * 0.8 * card.unit.wn * card.n.cgate * 1.8) / currentUp;
    const millerFall = (0.5 * 0.8 * card.unit.wp * card.p.cgate * 1.8) / currentDown;
    expect(timing.delay(0, 0, true, tT)).toBeGreaterThan(0.99 * rise);
    expect(timing.delay(0, 0, true, tT)).toBeLessThan(1.01 * rise + millerRise);
    expect(timing.delay(0, 0, false, tT)).toBeGreaterThan(0.99 * fall);
    expect(timing.delay(0, 0, false, tT)).toBeLessThan(1.01 * fall + millerFall);
    // The Miller charge is real: beyond the 1 % of the opposing current.
    expect(timing.delay(0, 0, false, tT)).toBeGreaterThan(1.02 * fall);
  });

  // The step-input transition with the triode tail (derived from the Sakurai-Newton 1991 triode
  // form, see test/delay/ramp-response.test.ts): V_D0 = (alpha - 1)(V_DD - Vth) = 0.3 * 1.4 V,
  // d0 = 0.23333; saturated from 0.9 to d0, triode from d0 to 0.1:
  // t10-90 = (0.9 - d0) + (d0/2) ln((2 - x)/x), x = 0.1/d0; full swing = t10-90 / 0.8, in C V_DD / I_D0.
  it('gives the step-input output transition of the saturated edge and its triode tail, with the channel charge of the tail', () => {
    const net = fanoutNetlist('INV', 4);
    const loads = netLoads(net, card);
    const timing = analyticModel.bind(net, loads, devices);
    const d0 = 0.3 * (1 - 0.4 / 1.8);
    const x = 0.1 / d0;
    const tenNinety = 0.9 - d0 + (d0 / 2) * Math.log((2 - x) / x);
    // Meyer's C_gd (2/3)(1 - 1/(2 - r)^2) C_ox W L over the triode part, r = V/V_DSAT from 1 down to
    // x, with dt = d0 dr / ((2 - r) r) (derived by hand); C_ox W L = 0.8 of the card's gate capacitance.
    const steps = 20000;
    let channel = 0;
    for (let i = 0; i < steps; i++) {
      const r = x + ((i + 0.5) * (1 - x)) / steps;
      channel += (((2 / 3) * (1 - 1 / ((2 - r) * (2 - r))) * d0) / ((2 - r) * r)) * ((1 - x) / steps);
    }
    // The load up to the 50 % point, as in the FO4 case above: 4.6444 tau's worth.
    const load = loads[net.gateOutput[0]!]! - ((4 * 0.8) / 3) * card.unit.wn * card.n.cgate;
    const m = (0.8 * card.unit.wp * card.p.cgate) / load;
    expectClose(timing.transition(0, 0, true, 0), ((tenNinety + m * channel) / 0.8) * 2 * 4.644444 * tauUp, 1e-3);
  });

  it('lengthens the output transition as the input transition grows, and moves the 10 % point with it', () => {
    const net = fanoutNetlist('INV', 4);
    const timing = analyticModel.bind(net, netLoads(net, card), devices);
    const fast = timing.transition(0, 0, false, 10e-12);
    const slow = timing.transition(0, 0, false, 1e-9);
    expect(slow).toBeGreaterThan(1.5 * fast);
    // A falling edge reaches 10 % after its 50 % point, a rising one leaves 10 % before it.
    expect(timing.crossing!(0, 0, false, 1e-9, 0.1)).toBeGreaterThan(0);
    expect(timing.crossing!(0, 0, true, 1e-9, 0.1)).toBeLessThan(0);
    expect(timing.crossing!(0, 0, false, 1e-9, 0.1)).toBeGreaterThan(timing.crossing!(0, 0, false, 10e-12, 0.1));
  });

  it("does not depend on which input pin switches a parallel network (a NAND's rising edge)", () => {
    const net = fanoutNetlist('NAND3', 2);
    const timing = analyticModel.bind(net, netLoads(net, card), devices);
    expect(timing.delay(0, 2, true, 1e-10)).toBe(timing.delay(0, 0, true, 1e-10));
  });
});

describe('analyticModel.bind at corners', () => {
  const card = loadProcess(processCard('generic180'));
  const net = fanoutNetlist('INV', 4);
  const loads = netLoads(net, card);
  const delays = (corner: Corner) => {
    const timing = analyticModel.bind(net, loads, devicesAtCorner(card, corner));
    return { rise: timing.delay(0, 0, true, 100e-12), fall: timing.delay(0, 0, false, 100e-12) };
  };

  it('drives the falling edge with the n device and the rising edge with the p device (fs vs tt)', () => {
    const tt = delays(at('tt', 1.8, 27));
    const fs = delays(at('fs', 1.8, 27));
    const sf = delays(at('sf', 1.8, 27));
    expect(fs.fall).toBeLessThan(tt.fall);
    expect(fs.rise).toBeGreaterThan(tt.rise);
    expect(sf.fall).toBeGreaterThan(tt.fall);
    expect(sf.rise).toBeLessThan(tt.rise);
  });

  it('slows down at the slow corner, low supply and heat, and speeds up at the fast one', () => {
    const slow = delays(at('ss', 1.62, 125));
    const typical = delays(at('tt', 1.8, 27));
    const fast = delays(at('ff', 1.98, -40));
    expect(slow.rise).toBeGreaterThan(typical.rise);
    expect(typical.rise).toBeGreaterThan(fast.rise);
    expect(slow.fall).toBeGreaterThan(typical.fall);
    expect(typical.fall).toBeGreaterThan(fast.fall);
  });

  it('refuses a mismatch sample that pushes a device below threshold, naming the corner', () => {
    const corner = at('tt', 1.8, 27);
    const mismatch = { dvthN: new Float64Array(net.gateCount), dvthP: new Float64Array(net.gateCount).fill(1.5) };
    let error: unknown;
    try {
      analyticModel.bind(net, loads, devicesAtCorner(card, corner), mismatch);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).issues).toEqual([expect.objectContaining({ code: 'physics.device-off', path: ['corners'] })]);
    expect((error as InputError).message).toContain(corner.name);
    expect((error as InputError).message).toContain('p-device');
  });

  it('applies a mismatch threshold shift to one gate only, on its opposing network too', () => {
    const corner = at('tt', 1.8, 27);
    const dvthN = new Float64Array(net.gateCount);
    dvthN[0] = 0.05;
    const base = analyticModel.bind(net, loads, devicesAtCorner(card, corner));
    const shifted = analyticModel.bind(net, loads, devicesAtCorner(card, corner), { dvthN, dvthP: new Float64Array(net.gateCount) });
    const slower = shifted.delay(0, 0, false, 1e-10) - base.delay(0, 0, false, 1e-10);
    expect(slower).toBeGreaterThan(0);
    // The weaker n network holds the rising edge back less: a little faster, far less than the falling edge moves.
    const faster = base.delay(0, 0, true, 1e-10) - shifted.delay(0, 0, true, 1e-10);
    expect(faster).toBeGreaterThan(0);
    expect(faster).toBeLessThan(0.5 * slower);
    // Gate 1's own drive is untouched: under a step its delay stays. (Under a slower edge it moves a
    // little, as the edge's shape is read from its driver, gate 0.)
    expect(shifted.delay(1, 0, false, 0)).toBe(base.delay(1, 0, false, 0));
    expect(shifted.delay(1, 0, true, 0)).toBe(base.delay(1, 0, true, 0));
  });
});

describe('analyticModel.bind against the opposing device threshold', () => {
  // Two cards whose p-devices give the same full-drive current at tt/1.8V/27C, one with a threshold
  // 0.1 V higher (its drive scaled by (1.4 / 1.3)^1.3 to match): the falling edge's opposing current
  // is the same at full drive but lets go sooner as a slow input rises.
  const card = effortCard();
  const higher = parseWith(processSchema, {
    ...card,
    p: { ...card.p, vth0: card.p.vth0 + 0.1, drive: card.p.drive * (1.4 / 1.3) ** 1.3 },
  });
  const net = fanoutNetlist('INV', 4);
  const corner = at('tt', 1.8, 27);
  const bind = (c: ProcessCard) => analyticModel.bind(net, netLoads(net, c), devicesAtCorner(c, corner));

  it('gives a slow-input falling edge less delay against a p-device of higher threshold, and a step the same', () => {
    expectClose(devicesAtCorner(higher, corner).p.idsatPerWidth, devicesAtCorner(card, corner).p.idsatPerWidth, 1e-9);
    const slow = 400e-12;
    expect(bind(higher).delay(0, 0, false, slow)).toBeLessThan(bind(card).delay(0, 0, false, slow));
    expectClose(bind(higher).delay(0, 0, false, 0), bind(card).delay(0, 0, false, 0), 1e-9);
  });
});

describe('temperature dependence of the gate drive', () => {
  // A step input isolates the drive current (C_L V_DD / 2 I_D0); the slope term is checked above.
  const fo4 = (cardName: string, vdd: number, temperature: number): number => {
    const card = loadProcess(processCard(cardName));
    const net = fanoutNetlist('INV', 4);
    const timing = analyticModel.bind(net, netLoads(net, card), devicesAtCorner(card, at('tt', vdd, temperature)));
    return timing.delay(0, 0, true, 0) + timing.delay(0, 0, false, 0);
  };
  const temperatures = [-40, 0, 27, 85, 125];

  it('falls as temperature rises on generic-lp at a low supply of 0.9 V (temperature inversion emerges)', () => {
    const d = temperatures.map((t) => fo4('generic-lp', 0.9, t));
    for (let i = 1; i < d.length; i++) expect(d[i]!).toBeLessThan(d[i - 1]!);
  });

  it('rises with temperature on generic-lp well above its zero-temperature-coefficient supply (1.3 V)', () => {
    const d = temperatures.map((t) => fo4('generic-lp', 1.3, t));
    for (let i = 1; i < d.length; i++) expect(d[i]!).toBeGreaterThan(d[i - 1]!);
  });

  it('rises with temperature on generic180 at its nominal 1.8 V', () => {
    const d = temperatures.map((t) => fo4('generic180', 1.8, t));
    for (let i = 1; i < d.length; i++) expect(d[i]!).toBeGreaterThan(d[i - 1]!);
  });
});

describe('analyticModel input position', () => {
  const base = loadProcess(processCard('generic180'));
  const netlist = compileNetlist({
    clock: 'a',
    phases: ['y', 'y'],
    complements: {},
    early: {},
    loads: {},
    gates: [
      { name: 'g', cell: 'NOR2', size: 1, inputs: ['c', 'b'], output: 'y' },
      { name: 'i', cell: 'INV', size: 1, inputs: ['a'], output: 'b' },
      { name: 'j', cell: 'INV', size: 1, inputs: ['a'], output: 'c' },
    ],
  } as never);
  const corner: Corner = { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 };
  const loads = new Float64Array(netlist.netNames.length).fill(10e-15);

  // With a step input the delay is tau times a constant, so the inner input's delay over the
  // outer one's is (C_L + C_node) / C_L exactly.
  const step = (t: ReturnType<typeof analyticModel.bind>, pin: number, rising: boolean) => t.delay(0, pin, rising, 0);

  it("gives the inner input of a stack half the near device's channel and the internal junction more when the card's stacks carry junctions", () => {
    const card = { ...base, spice: { ...base.spice!, stackJunctions: true } };
    const t = analyticModel.bind(netlist, loads, devicesAtCorner(card, corner));
    // NOR2 p stack: each device 2 x the unit p width; the node adds W_p (0.4 cgate_p + cdrain_p) to the rising edge of pin 1
    const node = 2 * card.unit.wp * (0.4 * card.p.cgate + card.p.cdrain);
    expectClose(step(t, 1, true) / step(t, 0, true), 1 + node / 10e-15, 1e-9);
    // the parallel n devices: no stack, no difference
    expect(t.delay(0, 1, false, 1e-10)).toBe(t.delay(0, 0, false, 1e-10));
  });

  it("gives the inner input half the near device's channel without stack junctions", () => {
    const t = analyticModel.bind(netlist, loads, devicesAtCorner(base, corner));
    expectClose(step(t, 1, true) / step(t, 0, true), 1 + (2 * base.unit.wp * 0.4 * base.p.cgate) / 10e-15, 1e-9);
    expect(t.delay(0, 1, true, 1e-10)).toBeGreaterThan(t.delay(0, 0, true, 1e-10));
  });
});

describe('analyticModel driven edges', () => {
  const card = loadProcess(processCard('generic180'));
  const corner: Corner = { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 };
  // a drives b drives c: gate 1 (b) is driven by gate 0 (a), whose load is set per case.
  const netlist = compileNetlist({
    clock: 'clk',
    phases: ['c', 'c'],
    complements: {},
    early: {},
    loads: {},
    gates: [
      { name: 'a', cell: 'INV', size: 1, inputs: ['clk'], output: 'b' },
      { name: 'b', cell: 'INV', size: 1, inputs: ['b'], output: 'c' },
    ],
  } as never);
  const bind = (driverLoad: number) => {
    const loads = new Float64Array(netlist.netNames.length).fill(10e-15);
    loads[netlist.gateOutput[0]!] = driverLoad;
    return analyticModel.bind(netlist, loads, devicesAtCorner(card, corner));
  };

  it("reads the driving edge's shape from its driver: the same input transition from a driver with more tau gives another delay", () => {
    const light = bind(10e-15);
    const heavy = bind(40e-15);
    // A 300 ps input edge is slow for the lightly loaded driver (tau about 80 ps: a ramp-like edge)
    // and the step response of the heavy one (a saturated start and a long triode tail).
    for (const rising of [true, false]) {
      const a = light.delay(1, 0, rising, 300e-12);
      const b = heavy.delay(1, 0, rising, 300e-12);
      expect(Math.abs(a - b) / a).toBeGreaterThan(0.005);
    }
  });
});
