/**
 * shapeLag, the level shifter output edge's fitted shape (src/switches/shifter-shape.ts), on the
 * floating shifter's rising-edge fit: the fitted levels read their own polynomial, the 50 % point
 * is the origin, levels between are read on a straight line, the ratio is held inside the range
 * the fit was made over, and levels outside 5..95 % have no shape. The fit against ngspice is
 * checked in shifter-edges.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { SHAPE_LEVELS, shapeLag } from '../../src/switches/shifter-shape.js';
import { shifterFits } from '../../src/switches/shifter-sizing.js';
import { expectClose } from '../helpers.js';

const fit = shifterFits(1.8).edges.riseShape;
const poly = (i: number, ratio: number) => {
  const [a, b, c] = fit.levels[i]!;
  const x = Math.log(ratio);
  return a + b * x + c * x * x;
};

describe('shapeLag', () => {
  it('reads each fitted level as its polynomial in ln r', () => {
    for (const [i, f] of SHAPE_LEVELS.entries()) expectClose(shapeLag(fit, 2, f)!, poly(i, 2), 1e-12, 'abs');
  });

  it('is 0 at the 50 % point and straight between the fitted levels and 50 %', () => {
    expect(shapeLag(fit, 2, 0.5)).toBe(0);
    expectClose(shapeLag(fit, 2, 0.45)!, poly(4, 2) / 2, 1e-12, 'abs');
    expectClose(shapeLag(fit, 2, 0.55)!, poly(5, 2) / 2, 1e-12, 'abs');
    expectClose(shapeLag(fit, 2, 0.85)!, (poly(7, 2) + poly(8, 2)) / 2, 1e-12, 'abs');
  });

  it('rises with the level and holds the ratio inside the fitted range', () => {
    let last = -Infinity;
    for (let f = 0.05; f <= 0.95; f += 0.01) {
      const t = shapeLag(fit, 1, f)!;
      expect(t).toBeGreaterThan(last);
      last = t;
    }
    expect(shapeLag(fit, 1e-6, 0.9)).toBe(shapeLag(fit, fit.ratio[0], 0.9));
    expect(shapeLag(fit, 1e6, 0.9)).toBe(shapeLag(fit, fit.ratio[1], 0.9));
  });

  it('gives no shape outside 5 to 95 % of the swing', () => {
    expect(shapeLag(fit, 2, 0.02)).toBeNull();
    expect(shapeLag(fit, 2, 0.98)).toBeNull();
    expect(shapeLag(fit, 2, Number.NaN)).toBeNull();
  });
});
