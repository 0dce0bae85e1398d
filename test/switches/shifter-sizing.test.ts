import { describe, expect, it } from 'vitest';
import { loadProcess } from '../../src/cli/load.js';
import { sizeShifter } from '../../src/switches/shifter-sizing.js';
import { expectClose, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const vdd = { scale: 1, offset: 0 };
const twoVdd = { scale: 2, offset: 0 };
// 350 ps: with the card's 1.92 fF/um gates and 1.2 fF/um drains a 300 ps fall needs a latch node
// below its own devices' capacitance at the default 4 um pull-downs (the estimate stops at 307 ps).
const shifter = { delay: 350e-12, transition: 250e-12, low: vdd, high: twoVdd, invert: false };

describe('sizeShifter', () => {
  it('meets the declared delay on both edges and the declared transition by its own estimate (32 fF load, 300 ps input ramp)', () => {
    const size = sizeShifter(shifter, card, 32e-15, 300e-12);
    expectClose(size.estimate.rise, 350e-12, 1e-9);
    expectClose(size.estimate.fall, 350e-12, 1e-9);
    expectClose(size.estimate.transition, 250e-12, 1e-9);
    // The latch p devices a quarter of the pull-downs, the output stage's edges matched by drive.
    expectClose(size.latchP / size.pullDown, 0.25, 1e-12);
    expect(size.latchCap).toBeGreaterThanOrEqual(0);
    expect(size.bufferCap).toBeGreaterThan(0);
  });

  it('widens the output inverter in proportion to a larger load, for the same transition', () => {
    const small = sizeShifter(shifter, card, 32e-15, 300e-12);
    const large = sizeShifter(shifter, card, 64e-15, 300e-12);
    expectClose(large.outputN / small.outputN, 2, 1e-9);
    expectClose(large.outputP / large.outputN, small.outputP / small.outputN, 1e-12);
  });

  it('keeps a declared pull-down width and adds latch capacitance for a longer delay', () => {
    const fast = sizeShifter({ ...shifter, w: 3e-6 }, card, 32e-15, 200e-12);
    const slow = sizeShifter({ ...shifter, w: 3e-6, delay: 600e-12 }, card, 32e-15, 200e-12);
    expect(fast.pullDown).toBe(3e-6);
    expect(slow.pullDown).toBe(3e-6);
    expect(slow.latchCap).toBeGreaterThan(fast.latchCap);
    expectClose(slow.estimate.fall, 600e-12, 1e-9);
  });

  it('stops at 8 unit widths of pull-down when the declared delay is shorter than the shifter can reach, and says so by its estimate', () => {
    const size = sizeShifter({ ...shifter, delay: 100e-12 }, card, 64e-15, 300e-12);
    expectClose(size.pullDown, 8 * card.unit.wn, 1e-12);
    expect(size.latchCap).toBe(0);
    expect(size.estimate.fall).toBeGreaterThan(200e-12);
  });

  it('aims for a transition as long as the delay when none is declared', () => {
    const size = sizeShifter({ ...shifter, transition: undefined, delay: 400e-12 }, card, 32e-15, 300e-12);
    expectClose(size.estimate.transition, 400e-12, 1e-9);
  });
});
