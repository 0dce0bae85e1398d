import { describe, it, expect } from 'vitest';
import { quantileSorted } from 'd3-array';
import { randomLcg, randomNormal } from 'd3-random';
import { BINS, addToHistogram, binWidth, emptyHistogram, histogramOf, histogramQuantile, setEdges } from '../../src/variation/histogram.js';
import { expectClose } from '../helpers.js';

const normal = (n: number, mean: number, sigma: number, seed: number) => {
  const draw = randomNormal.source(randomLcg(seed))(mean, sigma);
  return Float64Array.from({ length: n }, () => draw());
};

const sampleSigma = (v: Float64Array) => {
  const mean = v.reduce((a, b) => a + b, 0) / v.length;
  return Math.sqrt(v.reduce((a, b) => a + (b - mean) ** 2, 0) / (v.length - 1));
};

describe('histogramQuantile', () => {
  it.each([0.00135, 0.02, 0.5, 0.9, 0.99865])('lies within one bin of the exact quantile (d3 quantileSorted) at p = %s', (p) => {
    const values = normal(20000, 800e-12, 20e-12, 7);
    const h = histogramOf(values);
    const exact = quantileSorted(
      Array.from(values).sort((a, b) => a - b),
      p,
    )!;
    expectClose(histogramQuantile(h, p), exact, binWidth(h), 'abs');
  });

  it('gives the exact extremes and counts every finite value once, NaN left out', () => {
    const h = histogramOf([3, 1, NaN, 2, Infinity]);
    expect(h.count).toBe(3);
    expect(histogramQuantile(h, 0)).toBe(1);
    expect(histogramQuantile(h, 1)).toBe(3);
    expect(h.counts.reduce((a, b) => a + b, 0)).toBe(3);
  });

  it('keeps values outside the edges in the overflow bins, bounded by the extremes', () => {
    const h = emptyHistogram();
    setEdges(h, [1e-9, 1.01e-9]);
    for (const x of [0.5e-9, 1e-9, 1.005e-9, 1.01e-9, 4e-9]) addToHistogram(h, x);
    expect(h.counts[0]).toBe(1);
    expect(h.counts[BINS + 1]).toBe(1);
    expect(histogramQuantile(h, 0.5)).toBeCloseTo(1.005e-9, 13);
    expect(histogramQuantile(h, 1)).toBe(4e-9);
  });

  it('spans the larger of 16 sigma and 4 ranges of the first values: about a hundredth of a sigma per bin', () => {
    const values = normal(250, 1e-9, 10e-12, 3);
    const h = histogramOf(values);
    expectClose(binWidth(h), Math.max(16 * sampleSigma(values), 4 * (h.max - h.min)) / BINS, 1e-9);
    expect(binWidth(h)).toBeLessThan(10e-12 / 50);
  });

  it('is NaN with no values', () => {
    expect(histogramQuantile(emptyHistogram(), 0.5)).toBeNaN();
  });
});
