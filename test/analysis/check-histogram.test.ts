import { describe, it, expect } from 'vitest';
import { checkMarginHistogram } from '../../src/analysis/check-histogram.js';
import { runMonteCarlo } from '../../src/analysis/montecarlo.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { histogramMoments } from '../../src/render/svg/histogram.js';
import { binWidth } from '../../src/variation/histogram.js';
import { design, expectClose } from '../helpers.js';

describe('checkMarginHistogram', () => {
  const { design: d, card } = loadDesign(design('too-tight'));
  const resolved = resolveDesign(d, card);
  // 260 dies: two chunks, so the second chunk's dies land in the edges the first one set.
  const mc = runMonteCarlo(resolved, 260, 3);

  it("counts every die once and agrees with the run's own statistics of that check", () => {
    const corner = 4;
    const q = mc.corners[corner]!.quantities.find((x) => x.kind === 'break-before-make')!;
    const h = checkMarginHistogram(resolved, 3, 260, corner, q.name, { circuit: true });
    expect(h.count).toBe(260);
    expect(h.min).toBe(q.min);
    expect(h.max).toBe(q.max);
    const bins = h.counts.reduce((n, c) => n + c, 0);
    expect(bins).toBe(260);
    // The bin-centre estimates lie within half a bin (plus rounding) of the exact running statistics.
    const m = histogramMoments(h);
    expectClose(m.mean, q.mean, binWidth(h), 'abs');
    expectClose(m.sigma, q.sigma, binWidth(h), 'abs');
  });

  it('adds nothing for a check no die has', () => {
    expect(checkMarginHistogram(resolved, 3, 10, 0, 'no such check', { circuit: true }).count).toBe(0);
  });
});
