import { describe, it, expect } from 'vitest';
import { offStateMargin, onOverdrive, thresholdAt } from '../../src/switches/bias.js';
import type { DeviceAtCorner } from '../../src/process/device.js';
import { expectClose } from '../helpers.js';

/**
 * A device at a corner with only what the bias rules read: threshold, gamma, 2phiF. The switch
 * threshold equals the fit's here (no triode shift: as at t0, or a card without a triode section).
 */
function device(vth: number, gamma: number, phi2f: number): DeviceAtCorner {
  return { vth, switchVth: vth, gamma, phi2f } as DeviceAtCorner;
}

const n = device(0.45, 0.45, 0.85);
const p = device(0.45, 0.4, 0.85);

describe('thresholdAt', () => {
  // Body effect V_T = V_T0 + gamma (sqrt(2phiF + V_SB) - sqrt(2phiF)) (Sedra & Smith, Microelectronic
  // Circuits, body effect; Razavi, Design of Analog CMOS Integrated Circuits, ch. 2):
  // n: 0.45 + 0.45 (sqrt(1.15) - sqrt(0.85)) = 0.517692 V with the source 0.3 V above the body.
  it('raises an n threshold to 0.5177 V with its source 0.3 V above the body', () => {
    expectClose(thresholdAt('n', n, 0.3, 0, 0), 0.517692, 1e-6);
  });

  // p: body 0.36 V above the source, 0.45 + 0.4 (sqrt(1.21) - sqrt(0.85)) = 0.521218 V (hand arithmetic).
  it('raises a p threshold to 0.5212 V with its body 0.36 V above the source', () => {
    expectClose(thresholdAt('p', p, 3.6, 3.96, 0), 0.521218, 1e-6);
  });

  it('adds a mismatch shift to the magnitude', () => {
    expectClose(thresholdAt('n', n, 0, 0, 0.01), 0.46, 1e-12);
  });

  // Away from t0 the switch threshold follows the card's triode law, not the alpha-power fit's:
  // generic180 n at 125 C has vth 0.45 - 1.56 mV/K * 98 K = 0.29712 V, switchVth 0.45 - 1.36 mV/K * 98 K = 0.31672 V.
  it("reads the triode law's threshold (switchVth), not the saturation fit's", () => {
    const hot = { ...n, vth: 0.29712, switchVth: 0.31672 } as DeviceAtCorner;
    expectClose(thresholdAt('n', hot, 0, 0, 0), 0.31672, 1e-12);
  });
});

describe('offStateMargin', () => {
  // n switch off with its gate at 0 V, terminals at 0.3 V and above, body at 0 V, allowance 0.1 V:
  // V_T(V_SB = 0.3) - 0.1 - (V_G - V_S) = 0.517692 - 0.1 + 0.3 = 0.717692 V (hand arithmetic).
  it('counts a negative V_GS toward holding an n device off, with the body effect at the lower terminal', () => {
    expectClose(offStateMargin('n', n, 0, 0.3, 0, 0, 0.1), 0.717692, 1e-6);
  });

  // The unboosted charge switch in phase 2 at tt/1.8V/27C: p device, gate 1.8 V, the top plate
  // at 3.6 V acting as source, body 1.8 V (forward, so no body effect): |V_T| 0.45 V less two
  // decades at n = 1.5 (2 * 1.5 * kT/q * ln 10 = 0.178669 V at 300.15 K) less V_SG 1.8 V = -1.528669 V.
  it('is -1.529 V for a p switch whose 3.6 V terminal sees a 1.8 V gate (reverse conduction)', () => {
    expectClose(offStateMargin('p', p, 1.8, 3.6, 1.8, 0, 0.178669), -1.528669, 1e-6);
  });

  it('loses one for one what mismatch takes from the threshold', () => {
    const base = offStateMargin('n', n, 0, 0, 0, 0, 0.18);
    expectClose(base, 0.27, 1e-12);
    expectClose(offStateMargin('n', n, 0, 0, 0, -0.02, 0.18), base - 0.02, 1e-12);
  });
});

describe('onOverdrive', () => {
  // n switch with a 1.8 V gate passing 0.3 V over a 0 V body: 1.8 - 0.3 - 0.517692 = 0.982308 V.
  it('is V_GS - V_T(V_SB) for an n device', () => {
    expectClose(onOverdrive('n', n, 1.8, 0.3, 0, 0), 0.982308, 1e-6);
  });

  // p switch with gate at VDD = 1.62 V passing 1.6 VDD = 2.592 V, body at 2 VDD = 3.24 V:
  // V_SG 0.972 V less 0.45 + 0.4 (sqrt(0.85 + 0.648) - sqrt(0.85)) = 0.570789 V -> 0.401211 V (hand arithmetic).
  it('is V_SG - |V_T(V_BS)| for a p device', () => {
    expectClose(onOverdrive('p', p, 1.62, 2.592, 3.24, 0), 0.401211, 1e-5);
    expect(onOverdrive('p', p, 1.62, 1.62, 1.62, 0)).toBeLessThan(0);
  });
});
