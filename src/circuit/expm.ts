/**
 * Matrix exponential by scaling and squaring with a diagonal Pade approximant of degree 6
 * (G. H. Golub, C. F. Van Loan, Matrix Computations, 3rd ed., algorithm 11.3.1): the matrix is
 * scaled by 2^-j until its infinity norm is at most 1/2, the approximant solved as D^-1 N, then
 * squared j times. Everything runs on flat scratch arrays (products in the same summation order
 * as ml-matrix's `mmul`): a circuit solve takes thousands of small exponentials, and ml-matrix's
 * LU decomposition, which copies and re-wraps its matrices on every call, took 60 % of each one.
 * D^-1 N is Gaussian elimination with partial pivoting (Golub & Van Loan, algorithm 3.4.1) in
 * place: with the scaled norm at most 1/2, D is near the identity (its condition number stays
 * small, section 11.3.1), so the elimination is as accurate as the library's.
 */

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

/** out = a b for row-major m x m matrices (out must not alias a or b); col is scratch of length m. */
function multiply(a: Float64Array, b: Float64Array, m: number, out: Float64Array, col: Float64Array): void {
  for (let j = 0; j < m; j++) {
    for (let k = 0; k < m; k++) col[k] = b[k * m + j]!;
    for (let i = 0; i < m; i++) {
      let s = 0;
      for (let k = 0; k < m; k++) s += a[i * m + k]! * col[k]!;
      out[i * m + j] = s;
    }
  }
}

/**
 * Overwrites b (m x m) with a^-1 b and a with its eliminated form: Gaussian elimination with
 * partial pivoting, then back substitution, on row-major arrays.
 */
export function solveInPlace(a: Float64Array, b: Float64Array, m: number): void {
  for (let k = 0; k < m; k++) {
    let pivot = k;
    for (let i = k + 1; i < m; i++) if (Math.abs(a[i * m + k]!) > Math.abs(a[pivot * m + k]!)) pivot = i;
    if (pivot !== k) {
      for (let j = 0; j < m; j++) {
        const t = a[k * m + j]!;
        a[k * m + j] = a[pivot * m + j]!;
        a[pivot * m + j] = t;
        const u = b[k * m + j]!;
        b[k * m + j] = b[pivot * m + j]!;
        b[pivot * m + j] = u;
      }
    }
    const d = a[k * m + k]!;
    for (let i = k + 1; i < m; i++) {
      const f = a[i * m + k]! / d;
      if (f === 0) continue;
      for (let j = k + 1; j < m; j++) a[i * m + j] = a[i * m + j]! - f * a[k * m + j]!;
      for (let j = 0; j < m; j++) b[i * m + j] = b[i * m + j]! - f * b[k * m + j]!;
    }
  }
  for (let k = m - 1; k >= 0; k--) {
    const d = a[k * m + k]!;
    for (let j = 0; j < m; j++) {
      let sum = b[k * m + j]!;
      for (let l = k + 1; l < m; l++) sum -= a[k * m + l]! * b[l * m + j]!;
      b[k * m + j] = sum / d;
    }
  }
}

/** Scratch for exponentials of one size, reused across calls. */
class Scratch {
  readonly a: Float64Array;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly n: Float64Array;
  readonly d: Float64Array;
  readonly col: Float64Array;
  constructor(readonly m: number) {
    const size = m * m;
    this.a = new Float64Array(size);
    this.x = new Float64Array(size);
    this.y = new Float64Array(size);
    this.n = new Float64Array(size);
    this.d = new Float64Array(size);
    this.col = new Float64Array(m);
  }
}

const scratchBySize = new Map<number, Scratch>();

/** e^(a t) for a row-major m x m matrix `a`, written into `out` (row-major). */
export function expm(a: Float64Array, m: number, t: number, out: Float64Array): Float64Array {
  let s = scratchBySize.get(m);
  if (!s) {
    s = new Scratch(m);
    scratchBySize.set(m, s);
  }
  const size = m * m;
  const norm = infinityNorm(a, m) * t;
  const j = norm > 0.5 ? Math.max(0, Math.ceil(Math.log2(norm / 0.5))) : 0;
  const scale = t / 2 ** j;
  const A = s.a;
  for (let i = 0; i < size; i++) A[i] = a[i]! * scale;
  let c = 0.5;
  const N = s.n;
  const D = s.d;
  for (let i = 0; i < size; i++) {
    const eye = i % (m + 1) === 0 ? 1 : 0;
    N[i] = eye + A[i]! * c;
    D[i] = eye - A[i]! * c;
  }
  let X = s.x;
  let Y = s.y;
  X.set(A);
  let positive = true;
  for (let k = 2; k <= DEGREE; k++) {
    c = (c * (DEGREE - k + 1)) / (k * (2 * DEGREE - k + 1));
    multiply(A, X, m, Y, s.col);
    [X, Y] = [Y, X];
    for (let i = 0; i < size; i++) {
      const term = X[i]! * c;
      N[i] = N[i]! + term;
      D[i] = positive ? D[i]! + term : D[i]! - term;
    }
    positive = !positive;
  }
  solveInPlace(D, N, m);
  X.set(N);
  for (let k = 0; k < j; k++) {
    multiply(X, X, m, Y, s.col);
    [X, Y] = [Y, X];
  }
  out.set(X);
  return out;
}
