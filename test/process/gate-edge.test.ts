/**
 * One gate edge integrated in time: its unloaded limit against Veendrick's closed form, the load's
 * effect on the short-circuit charge, and the output transition against the constant-current bound.
 */
import { describe, expect, it } from 'vitest';
import type { DeviceAtCorner } from '../../src/process/device.js';
import { drainCurrent, gateEdge, overlapPerWidth, type GateEdges } from '../../src/process/gate-edge.js';
import { expectClose } from '../helpers.js';

const VDD = 1.8;
const VT = 0.45;
const L = 0.18e-6;
const W = 1e-6;
// A square-law device: alpha 2, and k' chosen so the triode current meets K W V_ov^2 at V_DS = V_ov (beta = k' W / L = 2 K W).
const K = 100;
const square = { vth: VT, alpha: 2, driveConstant: K, kprime: 2 * K * L, theta: 0 } as DeviceAtCorner;
const beta = 2 * K * W;

function inverter(load: number, ramp: number): GateEdges {
  return {
    pullDown: { device: square, w: W, l: L },
    pullUp: { device: square, w: W, l: L },
    load,
    miller: 0,
    inputRise: ramp,
    inputFall: ramp,
    vdd: VDD,
  };
}

/** Energy per period beyond C V^2, J. */
function shortCircuit(g: GateEdges): number {
  return VDD * (gateEdge(g, true).charge + gateEdge(g, false).charge - g.load * VDD);
}

describe('drainCurrent', () => {
  it('is the square law in saturation and below it in triode, odd in V_DS', () => {
    expectClose(drainCurrent({ device: square, w: W, l: L }, 1.45, 1.5), K * W * 1, 1e-12);
    expect(drainCurrent({ device: square, w: W, l: L }, 1.45, 0.5)).toBeLessThan(K * W);
    expectClose(drainCurrent({ device: square, w: W, l: L }, 1.45, 0.5), beta * (1 * 0.5 - 0.125), 1e-12);
    expectClose(drainCurrent({ device: square, w: W, l: L }, 1.0, -0.3), -drainCurrent({ device: square, w: W, l: L }, 1.3, 0.3), 1e-12);
    expect(drainCurrent({ device: square, w: W, l: L }, 0.4, 1)).toBe(0);
  });
});

describe('gateEdge', () => {
  it("nearly unloaded, draws Veendrick's (beta / 12)(V_DD - 2 V_T)^3 tau per period (H. J. M. Veendrick, IEEE JSSC 19(4), 1984)", () => {
    const tau = 200e-12;
    const veendrick = (beta / 12) * (VDD - 2 * VT) ** 3 * tau;
    expectClose(shortCircuit(inverter(1e-17, tau)), veendrick, 0.02);
  });

  it('draws less short-circuit charge the more its output is loaded, for the same input ramp', () => {
    const tau = 200e-12;
    const light = shortCircuit(inverter(5e-15, tau));
    const heavy = shortCircuit(inverter(50e-15, tau));
    expect(heavy).toBeGreaterThan(0);
    expect(heavy).toBeLessThan(light);
    expect(light).toBeLessThan((beta / 12) * (VDD - 2 * VT) ** 3 * tau);
  });

  it('gives a step-driven output a transition no shorter than C V_DD over the saturation current', () => {
    const load = 100e-15;
    const edge = gateEdge(inverter(load, 1e-12), true, true);
    const bound = (load * VDD) / (K * W * (VDD - VT) ** 2);
    expect(edge.transition).toBeGreaterThan(bound);
    expect(edge.transition).toBeLessThan(1.5 * bound);
  });

  it('leaves the transition unknown unless asked to follow the output', () => {
    expect(Number.isNaN(gateEdge(inverter(10e-15, 100e-12), true).transition)).toBe(true);
  });
});

describe('overlapPerWidth', () => {
  it("takes the card's cov, else an eighth of its gate capacitance per width", () => {
    expect(overlapPerWidth({ cov: 2e-10, cgate: 1.92e-9 })).toBe(2e-10);
    expect(overlapPerWidth({ cgate: 1.6e-9 })).toBe(2e-10);
  });
});
