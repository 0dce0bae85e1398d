/**
 * The exact solution of one linear stretch: with dv/dt = A v + b (A = C^-1 G, b = C^-1 s),
 * v(h) = E v(0) + e and the integral of v over [0, h] is F v(0) + f, read off one exponential of
 * the augmented matrix [[A, b, 0], [0, 0, 0], [I, 0, 0]] h (C. F. Van Loan, Computing integrals
 * involving the matrix exponential, IEEE Trans. Automatic Control 23(3), 1978).
 */
import { branchesFor, stamp, type Branch } from './branches.js';
import { expm } from './expm.js';
import type { CircuitModel } from './model.js';

export interface SubstepMap {
  readonly h: number;
  readonly branches: readonly Branch[];
  /** n x n, row-major. */
  readonly E: Float64Array;
  readonly e: Float64Array;
  readonly F: Float64Array;
  readonly f: Float64Array;
}

/** Scratch for building maps of an n-node circuit: allocated once per model. */
export class SubstepBuilder {
  private readonly g: Float64Array;
  private readonly s: Float64Array;
  private readonly aug: Float64Array;
  private readonly exp: Float64Array;
  private readonly m: number;

  constructor(private readonly model: CircuitModel) {
    const n = model.nodes.length;
    this.m = 2 * n + 1;
    this.g = new Float64Array(n * n);
    this.s = new Float64Array(n);
    this.aug = new Float64Array(this.m * this.m);
    this.exp = new Float64Array(this.m * this.m);
  }

  /** `extra` branches join the interval's own (a switch's charge drawn at turn-on). */
  build(interval: number, segments: Uint8Array, h: number, extra: readonly Branch[] = []): SubstepMap {
    const model = this.model;
    const n = model.nodes.length;
    const m = this.m;
    const branches = branchesFor(model, interval, segments, extra);
    stamp(model, branches, this.g, this.s);
    const cinv = model.inverseCapacitance;
    const aug = this.aug.fill(0);
    for (let i = 0; i < n; i++) {
      let bi = 0;
      for (let k = 0; k < n; k++) bi += cinv[i * n + k]! * this.s[k]!;
      aug[i * m + n] = bi;
      for (let j = 0; j < n; j++) {
        let sum = 0;
        for (let k = 0; k < n; k++) sum += cinv[i * n + k]! * this.g[k * n + j]!;
        aug[i * m + j] = sum;
      }
      aug[(n + 1 + i) * m + i] = 1;
    }
    const x = expm(aug, m, h, this.exp);
    const E = new Float64Array(n * n);
    const F = new Float64Array(n * n);
    const e = new Float64Array(n);
    const f = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        E[i * n + j] = x[i * m + j]!;
        F[i * n + j] = x[(n + 1 + i) * m + j]!;
      }
      e[i] = x[i * m + n]!;
      f[i] = x[(n + 1 + i) * m + n]!;
    }
    return { h, branches, E, e, F, f };
  }
}
