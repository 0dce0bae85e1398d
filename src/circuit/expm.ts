/**
 * Matrix exponential by scaling and squaring with a diagonal Pade approximant of degree 6
 * (G. H. Golub, C. F. Van Loan, Matrix Computations, 3rd ed., algorithm 11.3.1): the matrix is
 * scaled by 2^-j until its infinity norm is at most 1/2, the approximant solved as D^-1 N with
 * ml-matrix's LU decomposition, then squared j times.
 */
import { LuDecomposition, Matrix } from 'ml-matrix';

const DEGREE = 6;

/** Infinity norm (largest absolute row sum) of a square matrix stored row-major. */
export function infinityNorm(a: Float64Array, m: number): number {
  let best = 0;
  for (let i = 0; i < m; i++) {
    let sum = 0;
    for (let j = 0; j < m; j++) sum += Math.abs(a[i * m + j]!);
    if (sum > best) best = sum;
  }
  return best;
}

/** e^(a t) for a row-major m x m matrix `a`, written into `out` (row-major). */
export function expm(a: Float64Array, m: number, t: number, out: Float64Array): Float64Array {
  const norm = infinityNorm(a, m) * t;
  const j = norm > 0.5 ? Math.max(0, Math.ceil(Math.log2(norm / 0.5))) : 0;
  const scale = t / 2 ** j;
  const A = new Matrix(m, m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) A.set(r, c, a[r * m + c]! * scale);
  let X = A;
  let c = 0.5;
  const N = Matrix.eye(m, m).add(Matrix.mul(A, c));
  const D = Matrix.eye(m, m).sub(Matrix.mul(A, c));
  let positive = true;
  for (let k = 2; k <= DEGREE; k++) {
    c = (c * (DEGREE - k + 1)) / (k * (2 * DEGREE - k + 1));
    X = A.mmul(X);
    N.add(Matrix.mul(X, c));
    if (positive) D.add(Matrix.mul(X, c));
    else D.sub(Matrix.mul(X, c));
    positive = !positive;
  }
  let F = new LuDecomposition(D).solve(N);
  for (let k = 0; k < j; k++) F = F.mmul(F);
  for (let r = 0; r < m; r++) for (let col = 0; col < m; col++) out[r * m + col] = F.get(r, col);
  return out;
}
