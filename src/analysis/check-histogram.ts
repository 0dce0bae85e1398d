/**
 * The margin of one check at one corner for every Monte Carlo die, as a streaming histogram. The
 * dies are drawn and evaluated exactly as `runChunk` does (same chunks, a warm evaluator per
 * chunk), so the histogram matches the run's statistics for that check.
 */
import { CornerEvaluator, type DieChecks } from './evaluate.js';
import { chunkPlan } from './montecarlo.js';
import type { ResolvedDesign } from './resolve.js';
import { devicesAtCorner } from '../process/device.js';
import { addToHistogram, emptyHistogram, hasEdges, setEdges, type StreamingHistogram } from '../variation/histogram.js';
import { drawMismatch, mismatchBuffers, mismatchSigmas } from '../variation/mismatch.js';

/** Margins of `check` (s or V) at corner `cornerIndex` over dies 0..samples-1; an unmeasured die adds nothing. */
export function checkMarginHistogram(
  resolved: ResolvedDesign,
  seed: number,
  samples: number,
  cornerIndex: number,
  check: string,
  checks: DieChecks,
): StreamingHistogram {
  const { corner } = resolved.corners[cornerIndex]!;
  const devices = devicesAtCorner(resolved.card, corner);
  const sigmas = mismatchSigmas(resolved.netlist, resolved.card, resolved.switches);
  const h = emptyHistogram();
  for (const { start, count } of chunkPlan(samples)) {
    const evaluator = CornerEvaluator.forDies(resolved, checks);
    const margins = new Float64Array(count);
    for (let i = 0; i < count; i++) {
      const r = evaluator.evaluate(corner, drawMismatch(sigmas, seed, start + i, mismatchBuffers(sigmas)), devices);
      margins[i] = r.checks.find((c) => c.name === check)?.margin ?? NaN;
    }
    if (!hasEdges(h) && !setEdges(h, margins)) continue;
    for (let i = 0; i < count; i++) addToHistogram(h, margins[i]!);
  }
  return h;
}
