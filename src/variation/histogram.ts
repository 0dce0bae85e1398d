/**
 * A streaming histogram with fixed edges, for quantiles and histogram plots of Monte Carlo dead
 * times in memory that does not grow with the number of dies. The edges are set once, from the
 * first values seen (centre = their mean, half-span = the largest of 8 sigma, twice their range
 * and 2 % of the centre), into BINS equal bins with one underflow and one overflow bin; the exact
 * least and greatest values are kept too. Counts are integers, so the histogram does not depend
 * on the order values arrive in once its edges are set.
 *
 * Quantiles use the same convention as d3's quantileSorted (R-7: rank (n-1)p, linear between
 * neighbouring order statistics), with each order statistic placed evenly inside the bin that
 * holds it. Both the estimate and the exact value then lie in that bin, so the error is at most
 * the width of the bin(s) holding the quantile: `binWidth` inside the edges (the larger of 16
 * sigma and 4 ranges of the first values over 2048 bins: about a hundredth of a sigma for a
 * chunk of normal values), the distance from the extreme value to the edge outside them.
 */

export const BINS = 2048;

/** Plain data. `counts[0]` is the underflow bin, `counts[BINS + 1]` the overflow bin. */
export interface StreamingHistogram {
  /** Lower and upper edge of the regular bins, s (NaN until set). */
  lo: number;
  hi: number;
  readonly counts: Float64Array;
  /** Finite values added. */
  count: number;
  min: number;
  max: number;
}

export function emptyHistogram(): StreamingHistogram {
  return { lo: NaN, hi: NaN, counts: new Float64Array(BINS + 2), count: 0, min: Infinity, max: -Infinity };
}

export function hasEdges(h: StreamingHistogram): boolean {
  return !Number.isNaN(h.lo);
}

/** Sets the edges from the finite values among `values`; returns false (edges unset) if there are none. */
export function setEdges(h: StreamingHistogram, values: ArrayLike<number>): boolean {
  let n = 0;
  let mean = 0;
  let m2 = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const x = values[i]!;
    if (!Number.isFinite(x)) continue;
    n++;
    const delta = x - mean;
    mean += delta / n;
    m2 += delta * (x - mean);
    if (x < min) min = x;
    if (x > max) max = x;
  }
  if (n === 0) return false;
  const sigma = n > 1 ? Math.sqrt(m2 / (n - 1)) : 0;
  const half = Math.max(8 * sigma, 2 * (max - min), 0.02 * Math.abs(mean), 1e-15);
  h.lo = mean - half;
  h.hi = mean + half;
  return true;
}

/** Width of one regular bin, s. */
export function binWidth(h: StreamingHistogram): number {
  return (h.hi - h.lo) / BINS;
}

/** Adds one value; non-finite values (dies that did not settle) are left out. Edges must be set. */
export function addToHistogram(h: StreamingHistogram, x: number): void {
  if (!Number.isFinite(x)) return;
  const k = x < h.lo ? 0 : x >= h.hi ? BINS + 1 : 1 + Math.min(BINS - 1, Math.floor(((x - h.lo) / (h.hi - h.lo)) * BINS));
  h.counts[k]!++;
  h.count++;
  if (x < h.min) h.min = x;
  if (x > h.max) h.max = x;
}

/** Edges of bin k of `counts` (the underflow bin reaches down to the least value, the overflow bin up to the greatest). */
export function binEdges(h: StreamingHistogram, k: number): [number, number] {
  if (k === 0) return [h.min, h.lo];
  if (k === BINS + 1) return [h.hi, h.max];
  const w = binWidth(h);
  return [h.lo + (k - 1) * w, h.lo + k * w];
}

/** The r-th smallest value (0-based), placed evenly inside its bin; exact for the least and greatest. */
function orderStatistic(h: StreamingHistogram, r: number): number {
  if (r <= 0) return h.min;
  if (r >= h.count - 1) return h.max;
  let before = 0;
  for (let k = 0; k < h.counts.length; k++) {
    const c = h.counts[k]!;
    if (r < before + c) {
      const [a, b] = binEdges(h, k);
      return Math.min(h.max, Math.max(h.min, a + ((r - before + 0.5) / c) * (b - a)));
    }
    before += c;
  }
  return h.max;
}

/** The p-quantile of the values added, NaN when there are none. */
export function histogramQuantile(h: StreamingHistogram, p: number): number {
  if (h.count === 0) return NaN;
  const rank = (h.count - 1) * p;
  const below = Math.floor(rank);
  const lower = orderStatistic(h, below);
  const fraction = rank - below;
  return fraction === 0 ? lower : lower + fraction * (orderStatistic(h, below + 1) - lower);
}

/** A histogram of `values` with edges from the values themselves (for plots and tests of whole lists). */
export function histogramOf(values: ArrayLike<number>): StreamingHistogram {
  const h = emptyHistogram();
  if (!setEdges(h, values)) return h;
  for (let i = 0; i < values.length; i++) addToHistogram(h, values[i]!);
  return h;
}
