/** The nodal capacitance matrix of the circuit nodes and its inverse (ml-matrix). */
import { inverse, Matrix } from 'ml-matrix';

export interface Capacitor {
  /** Node indices (n and above are rails). */
  readonly a: number;
  readonly b: number;
  /** F. */
  readonly value: number;
}

/** Row-major n x n nodal capacitance matrix: C between two nodes, or from a node to a rail. */
export function capacitanceMatrix(n: number, capacitors: readonly Capacitor[]): Float64Array {
  const c = new Float64Array(n * n);
  for (const { a, b, value } of capacitors) {
    if (a < n) c[a * n + a]! += value;
    if (b < n) c[b * n + b]! += value;
    if (a < n && b < n) {
      c[a * n + b]! -= value;
      c[b * n + a]! -= value;
    }
  }
  return c;
}

/** Its inverse, row-major; null when singular (a group of nodes with no capacitance to any rail). */
export function invertCapacitance(c: Float64Array, n: number): Float64Array | null {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, c[i * n + j]!);
  const inv = inverse(m);
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i * n + j] = inv.get(i, j);
  return out.every(Number.isFinite) ? out : null;
}
