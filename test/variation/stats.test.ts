import { describe, it, expect } from 'vitest';
import { mean, sampleStandardDeviation } from 'simple-statistics';
import { randomLcg, randomNormal } from 'd3-random';
import { addValue, emptyStats, mergeStats, summarize, wilsonInterval } from '../../src/variation/stats.js';
import { expectClose } from '../helpers.js';

function values(n: number, seed: number): number[] {
  const normal = randomNormal.source(randomLcg(seed))(3, 2);
  return Array.from({ length: n }, () => normal());
}

describe('running statistics', () => {
  it('match simple-statistics mean and sample standard deviation (an independent library)', () => {
    const xs = values(5000, 0.25);
    const s = emptyStats();
    for (const x of xs) addValue(s, x);
    const sum = summarize(s);
    expectClose(sum.mean, mean(xs), 1e-12);
    expectClose(sum.sigma, sampleStandardDeviation(xs), 1e-10);
    expect(sum.min).toBe(Math.min(...xs));
    expect(sum.max).toBe(Math.max(...xs));
  });

  it('merge chunks to the same result as one pass', () => {
    const xs = values(1000, 0.5);
    const whole = emptyStats();
    for (const x of xs) addValue(whole, x);
    const merged = emptyStats();
    for (let start = 0; start < xs.length; start += 137) {
      const part = emptyStats();
      for (const x of xs.slice(start, start + 137)) addValue(part, x);
      mergeStats(merged, part);
    }
    expectClose(merged.mean, whole.mean, 1e-12);
    expectClose(Math.sqrt(merged.m2), Math.sqrt(whole.m2), 1e-10);
    expect(merged.count).toBe(1000);
  });

  it('give sigma 0 for a single value and NaN mean for none', () => {
    const one = emptyStats();
    addValue(one, 4);
    expect(summarize(one)).toMatchObject({ count: 1, mean: 4, sigma: 0 });
    expect(Number.isNaN(summarize(emptyStats()).mean)).toBe(true);
  });
});

describe('wilsonInterval', () => {
  // Worked examples of the score interval in R. G. Newcombe, "Two-sided confidence intervals for
  // the single proportion", Statistics in Medicine 17:857-872, 1998, Table I (values from memory,
  // to four decimals): 81/263 -> 0.2553..0.3662, 15/148 -> 0.0624..0.1605, 0/20 -> 0..0.1611,
  // 1/29 -> 0.0061..0.1718.
  it.each([
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('reproduces %i/%i -> %f .. %f', (k, n, low, high) => {
    const ci = wilsonInterval(k, n);
    expectClose(ci.low, low, 1e-4, 'abs');
    expectClose(ci.high, high, 1e-4, 'abs');
  });

  // Rule of three (J. A. Hanley, A. Lippman-Hand, JAMA 249(13), 1983, from memory): with no
  // failures in n trials the one-sided 95 % upper bound on the failure rate is about 3/n; the
  // exact binomial bound is 1 - 0.05^(1/n). The Wilson bound at one-sided z = 1.645 is z^2/(n + z^2).
  it.each([100, 1000, 10000])('puts the one-sided 95 percent bound for 0 failures in %i dies near 3/n', (n) => {
    const z = 1.6448536269514722;
    const failureBound = 1 - wilsonInterval(n, n, z).low;
    const exact = 1 - 0.05 ** (1 / n);
    expectClose(exact, 3 / n, 0.02);
    // Wilson's closed form for k = n, derived from the interval's formula: z^2 / (n + z^2) = 2.706/(n + 2.706).
    expectClose(failureBound, (z * z) / (n + z * z), 1e-9);
    expectClose(failureBound, 3 / n, 0.15);
  });

  it('stays inside [0, 1] and brackets the observed proportion', () => {
    for (const [k, n] of [
      [0, 5],
      [5, 5],
      [3, 7],
      [999, 1000],
    ] as const) {
      const ci = wilsonInterval(k, n);
      expect(ci.low).toBeGreaterThanOrEqual(0);
      expect(ci.high).toBeLessThanOrEqual(1);
      expect(ci.low).toBeLessThanOrEqual(k / n);
      expect(ci.high).toBeGreaterThanOrEqual(k / n);
    }
  });
});
