import { describe, expect, it } from 'vitest';
import { loadProcess } from '../../src/cli/load.js';
import { downLatchRatio, sizeDownShifter } from '../../src/switches/down-shifter-sizing.js';
import { expectClose, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const level = (scale: number) => ({ scale, offset: 0 });
const shifter = { delay: 500e-12, transition: 250e-12, low: level(-1), high: level(0), invert: false };

describe('sizeDownShifter', () => {
  it('meets the declared delay on both edges and the declared transition by its own estimate (40 fF load, 200 ps input ramp)', () => {
    const size = sizeDownShifter(shifter, card, 40e-15, 200e-12);
    expectClose(size.estimate.rise, 500e-12, 1e-6);
    expectClose(size.estimate.fall, 500e-12, 1e-6);
    expectClose(size.estimate.transition, 250e-12, 1e-3);
    expect(size.latchCap).toBeGreaterThan(0);
    expect(size.bufferCap).toBeGreaterThan(0);
    expectClose(size.latchN / size.pullUp, downLatchRatio(card, shifter), 1e-12);
  });

  it("keeps the latch n devices below half the pull-ups' current: a narrower latch the deeper the low level", () => {
    expect(downLatchRatio(card, { low: level(-2), high: level(-1) })).toBeLessThan(downLatchRatio(card, shifter));
    expect(downLatchRatio(card, shifter)).toBeLessThanOrEqual(0.25);
  });

  it('widens the output inverter in proportion to a larger load, for the same transition', () => {
    const small = sizeDownShifter(shifter, card, 20e-15, 200e-12);
    const large = sizeDownShifter(shifter, card, 80e-15, 200e-12);
    expect(large.outputN / small.outputN).toBeGreaterThan(3);
    expectClose(large.outputP / large.outputN, small.outputP / small.outputN, 1e-12);
  });

  it('keeps a declared pull-up width and stops at 8 unit p widths when the declared delay is out of reach, saying so by its estimate', () => {
    expect(sizeDownShifter({ ...shifter, w: 3e-6 }, card, 40e-15, 200e-12).pullUp).toBe(3e-6);
    const fast = sizeDownShifter({ ...shifter, delay: 150e-12 }, card, 40e-15, 200e-12);
    expectClose(fast.pullUp, 8 * card.unit.wp, 1e-12);
    expect(fast.latchCap).toBe(0);
    expect(fast.estimate.rise).toBeGreaterThan(200e-12);
  });
});
