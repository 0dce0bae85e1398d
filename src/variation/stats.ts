/** Streaming statistics: Welford's running mean and variance, mergeable in a fixed order. */

export interface StatsSummary {
  readonly count: number;
  readonly mean: number;
  /** Sample standard deviation (n - 1), 0 for fewer than two values. */
  readonly sigma: number;
  readonly min: number;
  readonly max: number;
}

/** Plain-data state, safe to post between threads. */
export interface RunningState {
  count: number;
  mean: number;
  m2: number;
  min: number;
  max: number;
}

export function emptyStats(): RunningState {
  return { count: 0, mean: 0, m2: 0, min: Infinity, max: -Infinity };
}

/** Adds one value (B. P. Welford, Technometrics 4(3), 1962: the numerically stable update). */
export function addValue(s: RunningState, x: number): void {
  s.count++;
  const delta = x - s.mean;
  s.mean += delta / s.count;
  s.m2 += delta * (x - s.mean);
  if (x < s.min) s.min = x;
  if (x > s.max) s.max = x;
}

/** Merges b into a (Chan, Golub & LeVeque's pairwise combination); the order of merges is the caller's. */
export function mergeStats(a: RunningState, b: RunningState): void {
  if (b.count === 0) return;
  if (a.count === 0) {
    Object.assign(a, b);
    return;
  }
  const count = a.count + b.count;
  const delta = b.mean - a.mean;
  a.mean += (delta * b.count) / count;
  a.m2 += b.m2 + (delta * delta * a.count * b.count) / count;
  a.count = count;
  a.min = Math.min(a.min, b.min);
  a.max = Math.max(a.max, b.max);
}

export function summarize(s: RunningState): StatsSummary {
  return {
    count: s.count,
    mean: s.count > 0 ? s.mean : NaN,
    sigma: s.count > 1 ? Math.sqrt(s.m2 / (s.count - 1)) : 0,
    min: s.count > 0 ? s.min : NaN,
    max: s.count > 0 ? s.max : NaN,
  };
}

/** Two-sided 95 % normal quantile. */
export const Z95 = 1.959963984540054;

/**
 * Wilson score interval for a binomial proportion (E. B. Wilson, J. Am. Stat. Assoc. 22(158),
 * 1927): centre (p + z²/2n)/(1 + z²/n), half-width z·sqrt(p(1-p)/n + z²/4n²)/(1 + z²/n).
 */
export function wilsonInterval(successes: number, n: number, z = Z95): { low: number; high: number } {
  if (n === 0) return { low: 0, high: 1 };
  const p = successes / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denominator;
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / denominator;
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}
