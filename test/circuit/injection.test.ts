/**
 * Charge a switch puts on its terminals at its edges (src/circuit/injection.ts): the split of the
 * channel charge between the terminals, the turn-off step and the turn-on draw, and the pedestal a
 * single n switch leaves on a sampling capacitor.
 */
import { describe, expect, it } from 'vitest';
import { channelShare, drawBranches, edgeMap } from '../../src/circuit/injection.js';
import { bodyThreshold } from '../../src/switches/physics.js';
import { modelPedestal, SAMPLE, samplingModel } from './sampling.js';

describe('channelShare', () => {
  it('splits a fast edge equally (kappa -> 0, common practice)', () => {
    expect(channelShare(0, 1e-12, 4e-12)).toBeCloseTo(0.5, 12);
    expect(channelShare(1e-6, 1e-12, Infinity)).toBeCloseTo(0.5, 6);
  });

  it('divides a slow edge as the capacitances (the channel evens the terminals out), a rail taking all', () => {
    expect(channelShare(1e6, 1e-12, 9e-12)).toBeCloseTo(0.1, 3);
    expect(channelShare(1e6, 1e-12, Infinity)).toBeCloseTo(0, 3);
    expect(channelShare(1e6, Infinity, 1e-12)).toBeCloseTo(1, 3);
  });

  it('moves monotonically from the equal split to the capacitance split as the edge slows', () => {
    const shares = [0.01, 0.1, 1, 10, 100].map((k) => channelShare(k, 1e-12, Infinity));
    for (let i = 1; i < shares.length; i++) expect(shares[i]!).toBeLessThan(shares[i - 1]!);
    expect(channelShare(1, 2e-12, 2e-12)).toBeCloseTo(0.5, 12);
  });
});

describe('edgeMap and drawBranches', () => {
  it('edgeMap steps only where a switch turns off, and drawBranches draws back at turn-on what turn-off releases', () => {
    const model = samplingModel();
    expect(edgeMap(model, 0)).toBeNull();
    const off = edgeMap(model, 1)!;
    const h = 1e-9;
    const draw = drawBranches(model, 0, h);
    expect(drawBranches(model, 1, h)).toEqual([]);
    // Charge onto the node at the source voltage: the step's charge against the draw's, C.
    const cnode = SAMPLE.hold + SAMPLE.cov * SAMPLE.w;
    const released = (off.e[0]! + (off.E[0]! - 1) * SAMPLE.input) * cnode;
    const drawn = draw.reduce((sum, b) => sum + b.k * h, 0);
    expect(released).toBeLessThan(0);
    expect(drawn).toBeCloseTo(-released, 20);
  });

  it('the turn-off step is affine in the source voltage: a higher input leaves less channel charge', () => {
    const off = edgeMap(samplingModel(), 1)!;
    // d(step)/dV: the channel's share of C_ch (1 + dV_T/dV_S) over the node capacitance, positive.
    expect(off.E[0]! - 1).toBeGreaterThan(0);
    expect(off.E[0]! - 1).toBeLessThan((SAMPLE.cox * SAMPLE.w * SAMPLE.l * 1.5) / SAMPLE.hold);
  });
});

describe('the pedestal of one n switch sampling onto 1 pF', () => {
  it('is its half channel charge and overlap coupling over the capacitance (hand estimate, common practice)', () => {
    const { w, l, cox, cov, hold, input, vdd } = SAMPLE;
    const vt = bodyThreshold(0.45, 0.45, 0.85, input);
    const estimate = -((cox * w * l * (vdd - input - vt)) / 2 + cov * w * vdd) / (hold + cov * w);
    const pedestal = modelPedestal(samplingModel());
    // The 100 ps edge is fast against this switch and capacitor, so the split is near half.
    expect(pedestal).toBeLessThan(0);
    expect(Math.abs(pedestal - estimate) / Math.abs(estimate)).toBeLessThan(0.05);
  });
});
