/**
 * Random-number helpers of the Monte Carlo sizing: the seeded generator (SeededRandom, xoshiro128**
 * with polar normals) lives in numerics/random.ts and is re-exported here; this file keeps the
 * Cholesky factor used to draw correlated parameters.
 */
export { SeededRandom } from '../numerics/random.js';

/** The normal quantile of the estimation layer (tested against SciPy there), re-exported for sizing. */
export { normalQuantile } from '../estimation/distributions.js';

/**
 * Cholesky factor L (lower, row-major n x n) of a symmetric positive semi-definite matrix. Returns
 * null when a pivot is negative beyond round-off (not positive semi-definite); a zero pivot (a
 * parameter with zero variance) gives a zero column.
 */
export function cholesky(A: ArrayLike<number>, n: number): Float64Array | null {
  const L = new Float64Array(n * n);
  let maxDiag = 0;
  for (let i = 0; i < n; i++) maxDiag = Math.max(maxDiag, Math.abs(A[i * n + i]));
  for (let j = 0; j < n; j++) {
    let s = A[j * n + j];
    for (let k = 0; k < j; k++) s -= L[j * n + k] ** 2;
    if (s < -1e-12 * maxDiag) return null;
    const d = s > 0 ? Math.sqrt(s) : 0;
    L[j * n + j] = d;
    for (let i = j + 1; i < n; i++) {
      let t = A[i * n + j];
      for (let k = 0; k < j; k++) t -= L[i * n + k] * L[j * n + k];
      L[i * n + j] = d > 0 ? t / d : 0;
    }
  }
  return L;
}

/**
 * One correlated normal draw z = mean + L e with e standard normal from `rng` (n draws, in order),
 * L the Cholesky factor (lower, row-major n x n). `e` is scratch of length n; z is written to `out`.
 */
export function correlatedDraw(rng: { normal(): number }, mean: ArrayLike<number>, L: Float64Array, n: number, e: Float64Array, out: Float64Array, offset = 0): void {
  for (let i = 0; i < n; i++) e[i] = rng.normal();
  for (let i = 0; i < n; i++) {
    let v = mean[i];
    for (let k = 0; k <= i; k++) v += L[i * n + k] * e[k];
    out[offset + i] = v;
  }
}
