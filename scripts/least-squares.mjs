// Least squares for the fit scripts: the normal equations solved by Gauss-Jordan elimination with
// partial pivoting, and each run's relative error against the fit (worst and median).
function solve(a, b) {
  const n = b.length;
  const m = a.map((r, i) => [...r, b[i]]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) piv = r;
    [m[c], m[piv]] = [m[piv], m[c]];
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r][c] / m[c][c];
      for (let j = c; j <= n; j++) m[r][j] -= f * m[c][j];
    }
  }
  return m.map((r, i) => r[n] / r[i]);
}
/** With `absolute`, the errors are in the data's own units (for quantities that pass through 0). */
export function leastSquares(xs, ys, absolute = false) {
  const p = xs[0].length;
  const ata = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => xs.reduce((s, x) => s + x[i] * x[j], 0)));
  const atb = Array.from({ length: p }, (_, i) => xs.reduce((s, x, k) => s + x[i] * ys[k], 0));
  const coef = solve(ata, atb);
  const errors = xs.map((x, k) => Math.abs(x.reduce((s, v, i) => s + v * coef[i], 0) - ys[k]) / (absolute ? 1 : ys[k]));
  return { coef, worst: Math.max(...errors), median: errors.sort((a, b) => a - b)[Math.floor(errors.length / 2)] };
}
