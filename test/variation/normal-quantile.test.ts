import { describe, it, expect } from 'vitest';
import { normalCdf, normalQuantile } from '../../src/variation/normal-quantile.js';
import { Z95 } from '../../src/variation/stats.js';
import { expectClose } from '../helpers.js';

// Standard normal table values (common practice; quoted from memory to the digits printed in
// statistics tables): Φ(1) = 0.841344746, Φ(3) = 0.998650102, Φ⁻¹(0.99) = 2.326347874.
describe('normalCdf', () => {
  it('gives the tabulated values and is symmetric about 0', () => {
    expect(normalCdf(0)).toBe(0.5);
    expectClose(normalCdf(1), 0.841344746, 1e-9, 'abs');
    expectClose(normalCdf(3), 0.998650102, 1e-9, 'abs');
    expectClose(normalCdf(-3), 1 - 0.998650102, 1e-9, 'abs');
    expectClose(normalCdf(Z95), 0.975, 1e-12, 'abs');
  });
});

describe('normalQuantile', () => {
  it('inverts the tabulated values', () => {
    expectClose(normalQuantile(0.5), 0, 1e-12, 'abs');
    expectClose(normalQuantile(0.975), Z95, 1e-9, 'abs');
    expectClose(normalQuantile(0.99), 2.326347874, 1e-8, 'abs');
    expectClose(normalQuantile(0.998650102), 3, 1e-7, 'abs');
    expectClose(normalQuantile(0.001349898), -3, 1e-6, 'abs');
  });

  it('clamps to ±8 at 0 and 1 and refuses what is not a probability', () => {
    expectClose(normalQuantile(1), 8, 1e-9, 'abs');
    expectClose(normalQuantile(0), -8, 1e-9, 'abs');
    expect(() => normalQuantile(1.5)).toThrow(RangeError);
    expect(() => normalQuantile(Number.NaN)).toThrow(RangeError);
  });
});
