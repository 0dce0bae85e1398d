import { describe, it, expect } from 'vitest';
import {
  bentDrive,
  driveBend,
  DRIVER_INPUTS,
  driveLaw,
  driverPosition,
  drivenEdge,
  meyerDrain,
  RampResponse,
  SHIFT_POINTS,
  shiftPosition,
  solveEdge,
  stackFactor,
} from '../../src/delay/ramp-response.js';
import { expectClose } from '../helpers.js';

/** Sakurai & Newton, IEEE JSSC 25(2), 1990: fast-input delay in units of C V_DD / I_D0. */
/**
 * The 1990 paper's fast-input delay, (1/2 - (1 - v_T) P) s + 1/2, with P the drive law's mean over
 * the ramp, the integral of p(x) from 0 to 1: 1/(1 + alpha) for x^alpha (the paper's form); for the
 * bent square law (1 + m) x^2/(1 + m x), (1 + m)(m^2/2 - m + ln(1 + m))/m^3 (integrated by hand).
 */
const closedForm = (alpha: number, vT: number, s: number) => {
  const m = driveBend(alpha);
  const mean = m === 0 ? 1 / 3 : ((1 + m) * (m * m * 0.5 - m + Math.log1p(m))) / (m * m * m);
  return (0.5 - (1 - vT) * mean) * s + 0.5;
};

describe('driveBend', () => {
  // ngspice-39, fixtures/models/generic180.lib (level 3, THETA 0.55 n / 0.4 p), W/L = 1/0.18 um,
  // 27 C, V_DS = 1.8 V: I_D(V_GS) over I_D(1.8 V) at V_GS = 0.54, 0.72, 0.90, 1.08, 1.26, 1.44, 1.62 V,
  // x = (V_GS - 0.45)/1.35 (the card's vth0).
  const xs = [0.0667, 0.2, 0.3333, 0.4667, 0.6, 0.7333, 0.8667];
  const measured = {
    n: { alpha: 1.586, i: [0.00738, 0.06069, 0.1552, 0.28183, 0.43397, 0.60672, 0.79636] },
    p: { alpha: 1.659, i: [0.00661, 0.0556, 0.14501, 0.26787, 0.41873, 0.59325, 0.78795] },
  };

  it("follows generic180's level-3 current below full drive within 2 %, where x^alpha is up to 85 % high", () => {
    for (const { alpha, i } of Object.values(measured)) {
      const m = driveBend(alpha);
      xs.forEach((x, k) => {
        expectClose(bentDrive(m, x), i[k]!, 0.02);
        if (x < 0.25) expect(x ** alpha / i[k]!).toBeGreaterThan(1.2);
      });
    }
  });

  it('has the log slope alpha at full drive, so it keeps the card fit there; alpha = 2 is the square law', () => {
    for (const alpha of [1.2, 1.586, 1.9]) {
      const m = driveBend(alpha);
      const h = 1e-6;
      expectClose(Math.log(bentDrive(m, 1) / bentDrive(m, 1 - h)) / -Math.log(1 - h), alpha, 1e-5);
      expect(bentDrive(m, 1)).toBe(1);
    }
    expect(driveBend(2)).toBe(0);
    expect(bentDrive(0, 0.3)).toBeCloseTo(0.09, 12);
  });
});

describe('solveEdge', () => {
  // Square law (alpha = 2), step input: saturated from 1 down to d0 = 1 - v_T (time 1 - d0), then
  // the n-th power law's triode form (Sakurai & Newton, IEEE TED 38(4), 1991) dv/dt = -(2 - v/d0)(v/d0)
  // from d0 to 1/2, which integrates to (d0/2) ln(4 d0 - 1) (derived by hand).
  it('gives (1 - d0) + (d0/2) ln(4 d0 - 1) for a step input at the square law (derived)', () => {
    const d0 = 0.75;
    expectClose(solveEdge(2, 0.25, 0).delay, 1 - d0 + (d0 / 2) * Math.log(4 * d0 - 1), 1e-5); // the solver's step error
  });

  // The same integral with the saturation voltage as its own parameter (the n-th power law's V_D0,
  // here 0.9 of the overdrive at alpha 1.6 instead of alpha - 1 = 0.6): saturated from 1 down to
  // d0 = 0.9 (1 - v_T), then from d0 to level v the triode form gives (d0/2) ln(d0 (2 - v/d0) / v)
  // (derived by hand), for the 50 % point and the 10 % point alike.
  it("follows a card's own saturation voltage: a step's 50 % and 10 % times from the triode integral", () => {
    const vT = 0.25;
    const d0 = 0.9 * (1 - vT);
    const at = (v: number) => 1 - d0 + (d0 / 2) * Math.log((2 - v / d0) / (v / d0));
    const edge = solveEdge(driveLaw(1.6, 0.9), vT, 0);
    expectClose(edge.delay, at(0.5), 1e-4);
    expectClose(edge.delay + edge.crossings[17]!, at(0.1), 1e-4);
    // Toh, Ko and Meyer's default, alpha - 1, leaves the triode tail shorter
    const byDefault = solveEdge(1.6, vT, 0);
    expectClose(
      byDefault.delay + byDefault.crossings[17]!,
      1 - 0.6 * (1 - vT) + ((0.6 * (1 - vT)) / 2) * Math.log((2 - 0.1 / (0.6 * (1 - vT))) / (0.1 / (0.6 * (1 - vT)))),
      1e-4,
    );
    expect(byDefault.crossings[17]!).toBeLessThan(edge.crossings[17]!);
  });

  it('reduces to the 1990 closed form for a fast input with the output saturated at 50 %', () => {
    // alpha 1.3, v_T 0.25: d0 = 0.225 < 1/2; the input ends at 0.3 tau, the output is then near 0.9.
    // The opposing device, which the closed form leaves out, adds under 1 %.
    for (const s of [0.1, 0.3]) expectClose(solveEdge(1.3, 0.25, s).delay, closedForm(1.3, 0.25, s), 0.01);
  });

  it('lets a very slow input drag the output through the middle of the swing (delay a small fraction of the ramp)', () => {
    const s = 64;
    const { delay } = solveEdge(2, 0.25, s);
    expect(delay).toBeGreaterThan(0);
    expect(delay).toBeLessThan(0.1 * s);
  });

  it('stays stable near alpha = 1, where the triode region is thin: every level crossed, in order', () => {
    for (const s of [0, 10, 64]) {
      const { delay, crossings } = solveEdge(1.05, 0.25, s);
      expect(Number.isFinite(delay)).toBe(true);
      for (let i = 1; i < crossings.length; i++) expect(crossings[i]!).toBeGreaterThan(crossings[i - 1]!);
    }
    // A step at alpha ~ 1 stays saturated to the end: the 50 % point at half a tau.
    expectClose(solveEdge(1.05, 0.25, 0).delay, 0.5, 1e-6);
  });

  it('records level crossings in order around the 50 % point', () => {
    const { crossings } = solveEdge(1.4, 0.3, 2);
    for (let i = 1; i < crossings.length; i++) expect(crossings[i]!).toBeGreaterThan(crossings[i - 1]!);
    // crossings[8] is the 55 % point (0.45 of the swing to go), crossings[9] the 50 % point itself.
    expect(crossings[8]!).toBeLessThan(0);
    expectClose(crossings[9]!, 0, 1e-9, 'abs');
  });
});

describe('stackFactor', () => {
  it('is the device current alone for one device, depth times it at low drive, and the network current at full drive', () => {
    expect(stackFactor(0.3, 1)).toBe(0.3);
    expectClose(stackFactor(1, 2), 1, 1e-12);
    expectClose(stackFactor(1, 3), 1, 1e-12);
    expectClose(stackFactor(1e-6, 2), 2e-6, 1e-5);
    expectClose(stackFactor(1e-6, 3), 3e-6, 1e-5);
  });

  it('makes a stack faster than a single device for a ramp input, and the same for a step', () => {
    expectClose(solveEdge(2, 0.25, 0, 2).delay, solveEdge(2, 0.25, 0, 1).delay, 1e-9);
    expect(solveEdge(2, 0.25, 3, 2).delay).toBeLessThan(solveEdge(2, 0.25, 3, 1).delay);
  });
});

describe('RampResponse', () => {
  const grid = RampResponse.of(2);

  it('interpolates the solved grid within 1 % of a direct solution between grid points', () => {
    for (const [vT, s] of [
      [0.27, 0.4],
      [0.33, 2.2],
      [0.51, 7.3],
      [0.12, 30],
    ] as const) {
      const direct = solveEdge(2, vT, s);
      const pos = RampResponse.vtPosition(vT);
      expectClose(grid.delay(pos, s), direct.delay, 0.01);
      expectClose(grid.transition(pos, s), (direct.crossings[17]! - direct.crossings[1]!) / 0.8, 0.01);
      expectClose(grid.crossing(pos, s, 0.1), direct.crossings[17]!, 0.01);
    }
  });

  it('is built once per alpha, depth, input edge, opposing ratio and opposing threshold', () => {
    expect(RampResponse.of(2)).toBe(grid);
    expect(RampResponse.of(2, 2)).not.toBe(grid);
    expect(RampResponse.of(2, 2).depth).toBe(2);
    // a ramp has no driver shape: the shape index is ignored
    expect(RampResponse.of(2, 1, null, 3)).toBe(grid);
    expect(RampResponse.of(2, 1, 1.3, 1)).not.toBe(RampResponse.of(2, 1, 1.3, 2));
    expect(RampResponse.of(2, 1, 1.3, 1).driver).toBe(1.3);
    // a bare alpha is its law with the default saturation voltage; another saturation voltage is another grid
    expect(RampResponse.of(driveLaw(2))).toBe(grid);
    expect(RampResponse.of(driveLaw(2, 0.8))).not.toBe(grid);
    expect(RampResponse.of(driveLaw(2, 0.8)).law.saturation).toBe(0.8);
    expect(RampResponse.of(2, 1, driveLaw(1.3, 0.9), 1)).not.toBe(RampResponse.of(2, 1, 1.3, 1));
    expect(RampResponse.of(2, 1, null, 0, 2, shiftPosition(0))).toBe(grid);
    expect(RampResponse.of(2, 1, null, 0, 2, 4)).not.toBe(grid);
    expect(RampResponse.of(2, 1, null, 0, 2, 4).shift).toBe(4);
  });

  it('clamps v_T to its grid (0 ... 0.95)', () => {
    expect(RampResponse.vtPosition(-0.1)).toBe(0);
    expect(RampResponse.vtPosition(2)).toBeLessThan(19);
    expect(RampResponse.vtPosition(2)).toBeGreaterThan(18.99);
  });
});

describe('meyerDrain', () => {
  // J. E. Meyer, RCA Review 32, 1971: C_gd = (2/3) C_ox W L (1 - ((V_GS - V_T) / (2 (V_GS - V_T) - V_DS))^2).
  it('is half the channel at V_DS = 0 and nothing from saturation on', () => {
    expectClose(meyerDrain(0), 0.5, 1e-12);
    expect(meyerDrain(1)).toBe(0);
    expect(meyerDrain(1.5)).toBe(0);
    expectClose(meyerDrain(0.5), (2 / 3) * (1 - 1 / 2.25), 1e-12);
  });
});

describe('drivenEdge', () => {
  const edge = drivenEdge(2, 0.25, 2.35);
  const value = (x: number) => {
    const p = (x - edge.start) / edge.step;
    const i = Math.floor(p);
    return edge.u[i]! + (p - i) * (edge.u[i + 1]! - edge.u[i]!);
  };
  it('rises through 50 % at half a transition and from 10 % to 90 % in 0.8 of one', () => {
    expectClose(value(0.5), 0.5, 1e-3, 'abs');
    let lo = 0;
    while (edge.u[lo]! < 0.1) lo++;
    let hi = lo;
    while (edge.u[hi]! < 0.9) hi++;
    expectClose((hi - lo) * edge.step, 0.8, 0.01);
  });

  it('approaches the rail more slowly than the ramp of the same 10-90 % time (the triode tail)', () => {
    expect(value(1)).toBeLessThan(1);
    expect(value(1)).toBeGreaterThan(0.9);
    expect(edge.u.at(-1)!).toBeGreaterThan(0.99);
  });
});

describe('solveEdge against an opposing network', () => {
  it('is slower against a stronger opposing network for a slow input and unchanged for a step', () => {
    expect(solveEdge(2, 0.25, 4, 1, null, 2).delay).toBeGreaterThan(solveEdge(2, 0.25, 4, 1, null, 1).delay);
    expect(solveEdge(2, 0.25, 4, 1, null, 0.5).delay).toBeLessThan(solveEdge(2, 0.25, 4, 1, null, 1).delay);
    expectClose(solveEdge(2, 0.25, 0, 1, null, 2).delay, solveEdge(2, 0.25, 0).delay, 1e-12);
  });

  it('is faster against an opposing device of higher threshold for a slow input and unchanged for a step', () => {
    const mirror = solveEdge(2, 0.25, 4, 1, null, 1).delay;
    expect(solveEdge(2, 0.25, 4, 1, null, 1, undefined, 0.05).delay).toBeLessThan(mirror);
    expect(solveEdge(2, 0.25, 4, 1, null, 1, undefined, -0.05).delay).toBeGreaterThan(mirror);
    expectClose(solveEdge(2, 0.25, 4, 1, null, 1, undefined, 0).delay, mirror, 1e-12);
    expectClose(solveEdge(2, 0.25, 0, 1, null, 1, undefined, 0.1).delay, solveEdge(2, 0.25, 0).delay, 1e-12);
  });

  it('gives every crossing its channel term in order: none while saturated, growing through the triode tail', () => {
    const { channel, channelDelay } = solveEdge(2, 0.25, 0);
    // d0 = 0.75: the 50 % point is in the triode region already, the 95 % point (0.05 to go) far into it
    expect(channelDelay).toBeGreaterThan(0);
    expect(channel[18]!).toBeGreaterThan(channel[9]!);
    expectClose(channel[9]!, 0, 1e-9, 'abs');
  });
});

describe("solveEdge: the opposing device's Miller charge", () => {
  /**
   * The same output node solved directly, with the opposing device's Meyer C_gd on it as a real
   * capacitance: (1 + m g_o) dv/dt = -I + m g_o du/dt, square law, v_T 0.25 both ways, mirror
   * opposing device, ramp input of s tau; g_o = (2/3)(1 - 1/(2 - r)^2) below V_Dsat (Meyer, 1971).
   * Forward Euler at a fine step; returns the 50 % time.
   */
  function direct(s: number, m: number): number {
    const vT = 0.25;
    const sat = (x: number) => (x <= vT ? 0 : ((x - vT) / (1 - vT)) ** 2);
    const dev = (gate: number, vds: number) => {
      const i = sat(gate);
      const vdsat = gate - vT;
      if (vds >= vdsat) return i;
      const r = vds / vdsat;
      return i * (2 - r) * r;
    };
    const meyer = (r: number) => (r >= 1 ? 0 : (2 / 3) * (1 - 1 / ((2 - r) * (2 - r))));
    const h = 1e-5;
    let v = 1;
    let t = 0;
    while (v > 0.5) {
      const u = Math.min(t / s, 1);
      const du = t < s ? 1 / s : 0;
      const gate = 1 - u;
      const g = gate <= vT ? 0 : meyer((1 - v) / (gate - vT));
      const current = dev(u, v) - dev(gate, 1 - v);
      v += (h * (-current + m * g * du)) / (1 + m * g);
      t += h;
    }
    return t;
  }

  it('is what a real C_gd of the opposing device adds to the 50 % time, to first order', () => {
    for (const s of [0.5, 2, 6]) {
      const { opposedDelay } = solveEdge(2, 0.25, s);
      const m = 0.02;
      expectClose((direct(s, m) - direct(s, 0)) / m, opposedDelay, 0.05);
    }
  });

  it('is nothing for a step input, which leaves the opposing device off from the start', () => {
    const { opposed, opposedDelay } = solveEdge(2, 0.25, 0);
    expect(opposedDelay).toBe(0);
    for (const o of opposed) expect(o).toBe(0);
  });
});

describe('solveEdge: the kickback onto a driven input', () => {
  // A driver in its linear tail restores its output exponentially, u = 1 - exp(-t/T): the input edge
  // here, its 50 % point at half its full-swing time T ln 9 / 0.8 (the InputEdge convention).
  const T = 1;
  const s = (T * Math.log(9)) / 0.8;
  const start = 0.5 - (T * Math.log(2)) / s;
  const step = 0.001;
  const edge = { start, step, u: Float64Array.from({ length: Math.ceil(12 / step) }, (_, i) => 1 - Math.exp(-(i * step * s) / T)) };

  /**
   * The two nodes solved directly: the pulling device's Meyer C_gd (m_k of the input net's
   * capacitance) loads the input, C_in du/dt = C_in (1 - u)/T - C_gd (du/dt - dv/dt); the output,
   * square law, v_T 0.25 both ways, mirror opposing device, dv/dt = -I. Forward Euler; the time
   * the output reaches `level`.
   */
  function direct(m: number, level: number): number {
    const vT = 0.25;
    const sat = (x: number) => (x <= vT ? 0 : ((x - vT) / (1 - vT)) ** 2);
    const dev = (gate: number, vds: number) => {
      const i = sat(gate);
      if (i === 0 || vds >= gate - vT) return i;
      const r = vds / (gate - vT);
      return i * (2 - r) * r;
    };
    const meyer = (r: number) => (r >= 1 ? 0 : (2 / 3) * (1 - 1 / ((2 - r) * (2 - r))));
    const h = 1e-5;
    let u = 0;
    let v = 1;
    let t = 0;
    while (v > level) {
      const current = dev(u, v) - dev(1 - u, 1 - v);
      const g = u <= vT ? 0 : meyer(v / (u - vT));
      const du = t < s * start ? 0 : ((1 - u) / T - m * g * current) / (1 + m * g);
      u += h * du;
      v -= h * current;
      t += h;
    }
    return t;
  }

  // It acts in the triode tail: little at the 50 % point, most by the 10 % point (level 17).
  it("is what the pulling device's C_gd on the input net adds to the 10 % time, to first order", () => {
    const { kick, kickDelay } = solveEdge(2, 0.25, s, 1, edge);
    const tail = kickDelay + kick[17]!;
    expect(tail).toBeGreaterThan(10 * kickDelay);
    const m = 0.05;
    expectClose((direct(m, 0.1) - direct(0, 0.1)) / m, tail, 0.05);
  });

  it('is nothing for a ramp, a clock source that no load slows', () => {
    const { kick, kickDelay } = solveEdge(2, 0.25, 2);
    expect(kickDelay).toBe(0);
    for (const k of kick) expect(k).toBe(0);
  });
});

describe('driverPosition', () => {
  const vT = 0.25;
  const pos = RampResponse.vtPosition(vT);
  /** Output transition, in tau, of a driver at input transition sd whose own input is a like gate's edge (as the model builds it). */
  const transition = (alpha: number, sd: number) => {
    const { crossings } = solveEdge(alpha, vT, sd, 1, drivenEdge(alpha, vT, sd), 1);
    return (crossings[17]! - crossings[1]!) / 0.8;
  };

  it("maps a driver's own output transition back to the input transition it was solved at", () => {
    for (let j = 0; j < DRIVER_INPUTS.length - 1; j++)
      expectClose(driverPosition(2, pos, transition(2, DRIVER_INPUTS[j]!), 0, 2), j, 1e-6, 'abs');
  });

  it('clamps to the step below its step response and to the slowest input above the last grid point', () => {
    expect(driverPosition(2, pos, 0.5)).toBe(0);
    expect(driverPosition(2, pos, 100)).toBeCloseTo(DRIVER_INPUTS.length - 1, 6);
  });

  it('follows the driver alpha: the same output transition means a slower input at alpha 1.3 than at 2', () => {
    expect(driverPosition(1.3, pos, 1.5)).toBeGreaterThan(driverPosition(2, pos, 1.5) + 0.5);
  });
});

describe('shiftPosition', () => {
  it('puts equal thresholds on the middle grid point, 0.05 of the supply one point apart, clamped at both ends', () => {
    const middle = (SHIFT_POINTS - 1) / 2;
    expect(shiftPosition(0)).toBe(middle);
    expectClose(shiftPosition(0.05) - shiftPosition(0), 1, 1e-12);
    expectClose(shiftPosition(-0.025), middle - 0.5, 1e-12);
    expect(shiftPosition(1)).toBeCloseTo(SHIFT_POINTS - 1, 6);
    expect(shiftPosition(1)).toBeLessThan(SHIFT_POINTS - 1);
    expect(shiftPosition(-1)).toBe(0);
  });
});
