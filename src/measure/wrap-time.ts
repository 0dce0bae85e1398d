/** Positive remainder of x modulo m: a time folded into one period. */
export function wrapTime(x: number, m: number): number {
  const r = x % m;
  return r < 0 ? r + m : r;
}
