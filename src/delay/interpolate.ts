/**
 * Piecewise-linear interpolation on an ascending axis, and bilinear interpolation on a grid (the
 * usual non-linear delay model lookup). Outside the axis the end segment is extended linearly and
 * the caller is told, so it can warn.
 */

export interface Bracket {
  /** Lower index of the segment used. */
  readonly i: number;
  /** Position within the segment: 0 at axis[i], 1 at axis[i + 1]; < 0 or > 1 outside the axis. */
  readonly t: number;
  readonly outside: boolean;
}

export function bracket(axis: ArrayLike<number>, x: number): Bracket {
  const n = axis.length;
  let i = 0;
  if (x >= axis[n - 1]!) i = n - 2;
  else while (i < n - 2 && x >= axis[i + 1]!) i++;
  const a = axis[i]!;
  const b = axis[i + 1]!;
  const t = (x - a) / (b - a);
  return { i, t, outside: x < axis[0]! || x > axis[n - 1]! };
}

export function linear(values: ArrayLike<number>, at: Bracket): number {
  const a = values[at.i]!;
  return a + (values[at.i + 1]! - a) * at.t;
}

/** grid[row][column] at (row bracket, column bracket). */
export function bilinear(grid: ReadonlyArray<ArrayLike<number>>, row: Bracket, column: Bracket): number {
  const lo = linear(grid[row.i]!, column);
  const hi = linear(grid[row.i + 1]!, column);
  return lo + (hi - lo) * row.t;
}
