import { describe, expect, it } from 'vitest';
import { expm, solveInPlace } from '../../src/circuit/expm.js';
import { expectClose } from '../helpers.js';

describe('expm', () => {
  it('expm of an upper-triangular 2x2 matches the closed form [[e^a, (e^a - e^d) b/(a - d)], [0, e^d]]', () => {
    const out = expm(Float64Array.from([-1, 2, 0, -3]), 2, 1, new Float64Array(4));
    expectClose(out[0]!, Math.exp(-1), 1e-12);
    expectClose(out[1]!, Math.exp(-1) - Math.exp(-3), 1e-12);
    expect(out[2]).toBe(0);
    expectClose(out[3]!, Math.exp(-3), 1e-12);
  });

  it('expm of a stiff matrix (norm 1e5) stays accurate through the squarings', () => {
    const out = expm(Float64Array.from([-1e5, 0, 0, -1]), 2, 1e-5, new Float64Array(4));
    expectClose(out[0]!, Math.exp(-1), 1e-10);
    expectClose(out[3]!, Math.exp(-1e-5), 1e-12);
  });

  it('expm of a rotation generator gives cos and sin', () => {
    const out = expm(Float64Array.from([0, -1, 1, 0]), 2, Math.PI / 3, new Float64Array(4));
    expectClose(out[0]!, 0.5, 1e-12);
    expectClose(out[2]!, Math.sqrt(3) / 2, 1e-12);
  });

  it('solveInPlace needs a row exchange for a zero leading pivot and gives a^-1 b exactly', () => {
    // a = [[0, 2, 0], [1, 1, 0], [0, 0, 4]]: a^-1 = [[-1/2, 1, 0], [1/2, 0, 0], [0, 0, 1/4]] (by hand).
    const a = Float64Array.from([0, 2, 0, 1, 1, 0, 0, 0, 4]);
    const b = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);
    solveInPlace(a, b, 3);
    expect(Array.from(b)).toEqual([-0.5, 1, 0, 0.5, 0, 0, 0, 0, 0.25]);
  });
});
