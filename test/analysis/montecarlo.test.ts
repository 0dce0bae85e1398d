import { describe, it, expect } from 'vitest';
import { quantileSorted } from 'simple-statistics';
import { quantileSorted as d3Quantile } from 'd3-array';
import { runMonteCarlo, runChunk, mergeChunks, chunkPlan, CHUNK_SIZE } from '../../src/analysis/montecarlo.js';
import { binWidth } from '../../src/variation/histogram.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { mcReport, QUANTILES } from '../../src/report/mc-report.js';
import { design, expectClose } from '../helpers.js';

// Three of the demo's 45 corners: Monte Carlo's bookkeeping is per corner, so three show it at a
// fifteenth of the cost.
const THREE_CORNERS = ['corners.process=[tt, ss, ff]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]'];

const doubler = () => {
  const { design: d, card } = loadDesign(design('doubler'), THREE_CORNERS);
  return resolveDesign(d, card);
};

describe('chunkPlan', () => {
  it('cuts dies into fixed chunks that cover every die once', () => {
    const plan = chunkPlan(2 * CHUNK_SIZE + 7);
    expect(plan.map((c) => c.count)).toEqual([CHUNK_SIZE, CHUNK_SIZE, 7]);
    expect(plan[2]!.start).toBe(2 * CHUNK_SIZE);
  });
});

describe('runMonteCarlo', () => {
  const resolved = doubler();
  const mc = runMonteCarlo(resolved, 400, 5);

  it('reports per corner yield, Wilson interval, dead-time statistics and the worst die', () => {
    expect(mc.corners.map((c) => c.name)).toEqual(['tt/1.8V/27C', 'ss/1.8V/27C', 'ff/1.8V/27C']);
    const c = mc.corners[0]!;
    expect(c.samples).toBe(400);
    expect(c.yieldInterval.low).toBeLessThanOrEqual(c.yield);
    const dead = c.quantities.find((q) => q.name === 'dead p1->p2')!;
    expect(dead.count).toBe(400);
    expect(dead.sigma).toBeGreaterThan(0);
    expect(dead.min).toBeLessThanOrEqual(dead.mean);
    expect(c.worstSample.index).toBeGreaterThanOrEqual(0);
    expect(c.worstSample.index).toBeLessThan(400);
  });

  it('reports the sigma margin of a check as its mean margin over its sigma', () => {
    const q = mc.corners[0]!.quantities.find((x) => x.kind === 'dead-time-min')!;
    expectClose(q.sigmaMargin!, q.mean / q.sigma, 1e-12);
  });

  it('computes dead-time quantiles within one histogram bin of simple-statistics on the same dies', () => {
    const report = mcReport('d', 'c', mc, undefined);
    const values = chunkPlan(400)
      .flatMap(({ start, count }) => Array.from(runChunk(resolved, 5, start, count, { circuit: true }).corners[1]!.dead0))
      .sort((a, b) => a - b);
    const width = binWidth(mc.deadTimes[1]![0]);
    // The histogram is fine: a bin is far narrower than the dies' spread.
    expect(width).toBeLessThan((values[values.length - 1]! - values[0]!) / 100);
    for (const q of QUANTILES) {
      // d3-array's quantileSorted on the whole list: the same R-7 convention, exact.
      expectClose(report.corners[1]!.deadTimeQuantiles[0]![`q${q}`]!, d3Quantile(values, q)!, width, 'abs');
    }
    // simple-statistics uses another convention; at n = 400 the two differ by at most one order statistic.
    const spacing = (values[values.length - 1]! - values[0]!) / 50;
    expectClose(report.corners[1]!.deadTimeQuantiles[0]!['q0.5']!, quantileSorted(values, 0.5), spacing, 'abs');
  });

  it('merges chunks arriving in any order into the same result as in order', () => {
    const chunks = chunkPlan(3 * CHUNK_SIZE + 11).map(({ start, count }) => runChunk(resolved, 2, start, count, { circuit: true }));
    const inOrder = mergeChunks(resolved, 2, 3 * CHUNK_SIZE + 11, chunks);
    const shuffled = mergeChunks(resolved, 2, 3 * CHUNK_SIZE + 11, [chunks[2]!, chunks[0]!, chunks[3]!, chunks[1]!]);
    expect(shuffled).toEqual(inOrder);
    expect(inOrder.deadTimes[0]![0].count).toBe(3 * CHUNK_SIZE + 11);
  });

  it('gives the same numbers for the same seed and different ones for another seed', () => {
    const again = runMonteCarlo(resolved, 400, 5);
    const other = runMonteCarlo(resolved, 400, 6);
    expect(again.corners[2]!.quantities).toEqual(mc.corners[2]!.quantities);
    expect(other.corners[2]!.quantities[0]!.mean).not.toBe(mc.corners[2]!.quantities[0]!.mean);
  });
});
