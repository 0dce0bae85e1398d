/**
 * The standard normal distribution: Φ(x) and its inverse, for turning a yield into a number of
 * sigmas. erf from its everywhere-convergent series of positive terms
 * erf(x) = 2/√π · e^(−x²) · Σ 2ⁿ x^(2n+1) / (1·3·…·(2n+1))  (Abramowitz & Stegun 7.1.6),
 * inverted by bisection: slow next to a rational approximation but exact to double precision.
 */

function erf(x: number): number {
  if (x < 0) return -erf(-x);
  let term = x;
  let sum = x;
  for (let n = 1; term > sum * 1e-17; n++) {
    term *= (2 * x * x) / (2 * n + 1);
    sum += term;
  }
  return (2 / Math.sqrt(Math.PI)) * Math.exp(-x * x) * sum;
}

/** Φ(x): probability that a standard normal value is below x. */
export function normalCdf(x: number): number {
  return 0.5 * (1 + erf(x / Math.SQRT2));
}

/** Largest |x| the quantile returns; Φ(8) rounds to 1 in double precision. */
const LIMIT = 8;

/** Φ⁻¹(p): the x with Φ(x) = p, clamped to ±8 at p = 0 and 1. */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`normalQuantile: ${p} is not a probability`);
  if (p === 0) return -LIMIT;
  if (p === 1) return LIMIT;
  let lo = -LIMIT;
  let hi = LIMIT;
  for (let i = 0; i < 80 && hi - lo > 1e-13; i++) {
    const mid = (lo + hi) / 2;
    if (normalCdf(mid) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
