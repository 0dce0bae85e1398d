import { describe, it, expect } from 'vitest';
import {
  deviceAtCorner,
  derivedTheta,
  devicesAtCorner,
  mobilityScale,
  saturationCurrent,
  shiftFactor,
  thresholdAt,
} from '../../src/process/device.js';
import { loadProcess } from '../../src/cli/load.js';
import { InputError } from '../../src/errors.js';
import type { Corner } from '../../src/process/corner.js';
import { expectClose, inputIssues, processCard } from '../helpers.js';
import { parseWith } from '../../src/schema/validate.js';
import { processSchema } from '../../src/schema/process.js';
import { bodyThreshold } from '../../src/switches/physics.js';

const card = loadProcess(processCard('generic180'));
const at = (process: string, vdd: number, temperature: number): Corner => ({
  name: `${process}/${vdd}V/${temperature}C`,
  process,
  vdd,
  temperature,
  duty: 0.5,
});

function thrown(fn: () => unknown): InputError {
  try {
    fn();
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  throw new Error('expected an InputError');
}

describe('thresholdAt', () => {
  it('adds the corner shift and falls by the tempco per kelvin above t0', () => {
    // 0.45 V + 60 mV - 1.56 mV/K * (125 - 27) K = 0.51 - 0.15288 = 0.35712 V
    expectClose(thresholdAt(card.n, 0.06, 125, 27), 0.35712, 1e-12);
    // 0.45 V - 60 mV + 1.56 mV/K * 67 K = 0.39 + 0.10452 = 0.49452 V
    expectClose(thresholdAt(card.n, -0.06, -40, 27), 0.49452, 1e-12);
    expect(thresholdAt(card.p, 0, 27, 27)).toBe(card.p.vth0);
  });
});

describe('mobilityScale', () => {
  // BSIM3 default mobility exponent UTE = -1.5: mu(125 C)/mu(27 C) = 0.6545 and
  // mu(-40 C)/mu(27 C) = 1.461 (derived from (T/T0)^UTE in kelvin). generic180's n triode section
  // carries that law (its model file's T^-1.5); the alpha-power fit's own exponent is 1.632.
  it('gives 0.6545 at 125 C and 1.461 at -40 C for m = 1.5 (BSIM3 mobility law, derived)', () => {
    const triode = { mobilityExponent: card.n.triode?.mobilityExponent ?? Number.NaN };
    expect(triode.mobilityExponent).toBe(1.5);
    expectClose(mobilityScale(triode, 125, 27), 0.6545, 1e-4);
    expectClose(mobilityScale(triode, -40, 27), 1.461, 1e-3);
    expect(mobilityScale(triode, 27, 27)).toBe(1);
  });

  it("gives 0.6306 at 125 C and 1.510 at -40 C for the card's fitted m = 1.632", () => {
    // (398.15 / 300.15)^-1.632 = exp(-1.632 * 0.282546) = exp(-0.461116) = 0.6306;
    // (233.15 / 300.15)^-1.632 = exp(1.632 * 0.252600) = exp(0.412244) = 1.5102 (by hand).
    expect(card.n.mobilityExponent).toBe(1.632);
    expectClose(mobilityScale(card.n, 125, 27), 0.6306, 1e-4);
    expectClose(mobilityScale(card.n, -40, 27), 1.5102, 1e-4);
    expect(mobilityScale(card.n, 27, 27)).toBe(1);
  });
});

describe('saturationCurrent', () => {
  it('is K * overdrive^alpha above threshold and zero at or below it', () => {
    // 338 * 1.35^1.3 = 499.287 A/m (hand-computed: ln 1.35 = 0.300105, * 1.3 = 0.390137, exp = 1.477182)
    expectClose(saturationCurrent(338, 1.3, 1.35), 499.287, 1e-5);
    expect(saturationCurrent(338, 1.3, 0)).toBe(0);
    expect(saturationCurrent(338, 1.3, -0.2)).toBe(0);
  });
});

describe('deviceAtCorner', () => {
  it('matches the card comment at tt/1.8V/27C: about 497 uA/um for n and 230 uA/um for p', () => {
    // ln 1.35 = 0.300105: 308.6 * 1.35^1.586 = 308.6 * exp(0.475966) = 308.6 * 1.609568 = 496.713 A/m;
    // 139.6 * 1.35^1.659 = 139.6 * exp(0.497874) = 139.6 * 1.645219 = 229.673 A/m (by hand).
    const tt = devicesAtCorner(card, at('tt', 1.8, 27));
    expectClose(tt.n.idsatPerWidth, 496.713, 1e-5);
    expectClose(tt.p.idsatPerWidth, 229.673, 1e-5);
    expect(tt.n.vth).toBe(0.45);
    expect(tt.vdd).toBe(1.8);
  });

  it('combines the corner drive, mobility and threshold at ss/1.62V/125C', () => {
    // Vth = 0.35712 V; K = 308.6 * 0.85 * 0.630580 = 165.407; I = K * (1.62 - 0.35712)^1.586
    // = 165.407 * exp(1.586 * 0.233395) = 165.407 * 1.447972 = 239.505 A/m (by hand).
    const n = deviceAtCorner(card, 'n', at('ss', 1.62, 125));
    expectClose(n.vth, 0.35712, 1e-12);
    expectClose(n.driveConstant, 308.6 * 0.85 * 0.6305796285, 1e-8);
    expectClose(n.idsatPerWidth, 239.505, 1e-5);
  });

  it('shifts n and p separately at the skewed corners', () => {
    const fs = devicesAtCorner(card, at('fs', 1.8, 27));
    const tt = devicesAtCorner(card, at('tt', 1.8, 27));
    expect(fs.n.idsatPerWidth).toBeGreaterThan(tt.n.idsatPerWidth);
    expect(fs.p.idsatPerWidth).toBeLessThan(tt.p.idsatPerWidth);
    expectClose(fs.n.vth, 0.39, 1e-12);
    expectClose(fs.p.vth, 0.51, 1e-12);
  });

  it("scales the triode k' with the corner drive and temperature", () => {
    // (398.15 / 300.15)^-1.5 = 0.6545418829 (generic180 n triode mobilityExponent 1.5, not the fit's 1.632).
    const n = deviceAtCorner(card, 'n', at('ff', 1.8, 125));
    expectClose(n.kprime, 194.6e-6 * 1.15 * 0.6545418829, 1e-8);
  });

  it("gives switches the card's triode threshold drift: vth + (1.56 - 1.36) mV/K * 98 K = vth + 19.6 mV at 125 C", () => {
    // A card with a straight triode law: vth = 0.45 - 0.06 - 1.56 mV/K * 98 K = 0.23712 V;
    // switchVth = 0.23712 + 0.0196 = 0.25672 V = 0.45 - 0.06 - 1.36 mV/K * 98 K.
    const straight = { ...card, n: { ...card.n, triode: { vthTempco: 0.00136 } } };
    const hot = deviceAtCorner(straight, 'n', at('ff', 1.8, 125));
    expectClose(hot.vth, 0.23712, 1e-12);
    expectClose(hot.switchVth, hot.vth + 0.0002 * 98, 1e-12);
    expectClose(hot.switchVth, 0.25672, 1e-12);
    const room = deviceAtCorner(straight, 'n', at('ff', 1.8, 27));
    expect(room.switchVth).toBe(room.vth);
  });

  it("follows SPICE level 3's own threshold and 2 phi_F with temperature where the card says vthTempco: spice (ngspice-39, @m[von] of generic180's models)", () => {
    // ngspice-39, fixtures/models/generic180.lib at tt, V_DS = 50 mV: n 0.5360 / 0.3114 V and
    // p 0.5489 / 0.2887 V at -40 / 125 C; at V_SB = 0.8 V the n device's threshold rises by 0.1650 /
    // 0.1746 / 0.1941 V at -40 / 27 / 125 C.
    const expected = { n: [0.536, 0.3114], p: [0.5489, 0.2887] } as const;
    for (const type of ['n', 'p'] as const) {
      const [cold, warm] = [-40, 125].map((t) => deviceAtCorner(card, type, at('tt', 1.8, t)));
      expectClose(cold!.switchVth, expected[type][0], 0.3e-3, 'abs');
      expectClose(warm!.switchVth, expected[type][1], 0.3e-3, 'abs');
    }
    const body = [-40, 27, 125].map((t) => {
      const d = deviceAtCorner(card, 'n', at('tt', 1.8, t));
      return bodyThreshold(d.switchVth, d.gamma, d.phi2f, 0.8) - d.switchVth;
    });
    for (const [i, v] of [0.165, 0.1746, 0.1941].entries()) expectClose(body[i]!, v, 0.3e-3, 'abs');
  });

  it('refuses a supply at or below threshold with the corner and the threshold named', () => {
    const corner = at('ss', 0.5, -40); // Vth = 0.45 + 0.06 + 1.56 mV/K * 67 K = 0.61452 V
    const error = thrown(() => deviceAtCorner(card, 'n', corner));
    expect(error.issues).toEqual([expect.objectContaining({ code: 'physics.device-off', path: ['corners'] })]);
    expect(error.message).toContain(corner.name);
    expect(error.message).toContain('0.615 V');
    expect(error.message).toContain('n-device');
    expect(error.message).not.toMatch(/NaN/);
  });

  it('refuses a process corner the card does not define, listing the ones it does', () => {
    const error = thrown(() => deviceAtCorner(card, 'p', at('snff', 1.8, 27)));
    expect(error.issues).toEqual([expect.objectContaining({ code: 'reference.unknown', path: ['corners', 'process'], value: '"snff"' })]);
    expect(error.message).toContain('"snff"');
    expect(error.message).toContain('tt, ss, ff, fs, sf');
  });
});

describe('shiftFactor', () => {
  it('equals (1 - u)^alpha to 1e-13 relative across the series range and beyond it', () => {
    for (const alpha of [1.05, 1.3, 1.4, 2]) {
      for (let u = -0.1; u <= 0.1; u += 0.0025) {
        expectClose(shiftFactor(u, alpha), (1 - u) ** alpha, 1e-13);
      }
    }
  });
  it('is zero when the shift reaches the whole overdrive (the device cannot turn on)', () => {
    expect(shiftFactor(1, 1.3)).toBe(0);
    expect(shiftFactor(1.2, 1.3)).toBe(0);
  });
});

describe('derivedTheta', () => {
  // By hand for generic180's n device without its theta: V_ov = 1.8 - 0.45 = 1.35 V; square law
  // (194.6e-6 / 2 / 0.18e-6) * 1.35^2 = 985.2 A/m; alpha-power 308.6 * 1.35^1.586 = 496.7 A/m;
  // theta = (985.2 / 496.7 - 1) / 1.35 = 0.728 /V, above the model file's 0.55 (it folds in the bulk-charge factor that lowers the saturation current).
  it("gives 0.73 /V for generic180 n, more than its transistor model's THETA of 0.55 (so R_on errs high)", () => {
    const { theta: _omit, ...n } = card.n;
    expectClose(derivedTheta({ ...card, n }, 'n'), 0.7285, 2e-3);
  });

  it("is what deviceAtCorner uses when the card gives no theta, and the card's value otherwise", () => {
    const { theta: _omit, ...n } = card.n;
    const corner = { name: 'tt', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 };
    expect(deviceAtCorner({ ...card, n }, 'n', corner).theta).toBe(derivedTheta({ ...card, n }, 'n'));
    expect(deviceAtCorner(card, 'n', corner).theta).toBe(0.55);
  });
});

describe('the drain saturation voltage a card states (vdsatRatio)', () => {
  const tt: Corner = { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 };

  it("takes the card's ratio, and alpha - 1 (velocity saturation) where the card gives none", () => {
    // generic180 states its level-3 model file's V_Dsat over the overdrive at 1.8 V, 27 C (card comment: 1.190 V / 1.35 V)
    expect(deviceAtCorner(card, 'n', tt).saturation).toBe(0.881);
    expect(deviceAtCorner(card, 'p', tt).saturation).toBe(0.893);
    const { vdsatRatio: _n, ...n } = card.n;
    const without = { ...card, n };
    expectClose(deviceAtCorner(without, 'n', tt).saturation, card.n.alpha - 1, 1e-12);
  });

  it('refuses a ratio of zero or above 1.5, naming the field', () => {
    for (const bad of [0, 1.6]) {
      const issues = inputIssues(() => parseWith(processSchema, { ...card, n: { ...card.n, vdsatRatio: bad } }));
      expect(issues.map((i) => [i.code, i.path.join('.')])).toEqual([['value.out-of-range', 'n.vdsatRatio']]);
    }
  });
});

describe('the triode threshold law on the card', () => {
  const card = loadProcess(processCard('generic180'));

  it("takes 'spice' or a fall per kelvin, and refuses anything else naming the field and both forms", () => {
    expect(parseWith(processSchema, { ...card, n: { ...card.n, triode: { vthTempco: 'spice' } } }).n.triode?.vthTempco).toBe('spice');
    expect(parseWith(processSchema, { ...card, n: { ...card.n, triode: { vthTempco: '1.4mV' } } }).n.triode?.vthTempco).toBeCloseTo(
      0.0014,
      12,
    );
    const issues = inputIssues(() => parseWith(processSchema, { ...card, n: { ...card.n, triode: { vthTempco: 'spicy' } } }));
    expect(issues.map((i) => i.path.join('.'))).toEqual(['n.triode.vthTempco']);
    expect(JSON.stringify(issues[0])).toMatch(/expected \\"spice\\".*is not a voltage/);
  });
});
