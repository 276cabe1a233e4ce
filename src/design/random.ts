/**
 * Random-number helpers of the Monte Carlo sizing: the seeded generator (SeededRandom, xoshiro128**
 * with polar normals) lives in numerics/random.ts and is re-exported here; this file keeps the
 * Cholesky factor used to draw correlated parameters.
 */
export { SeededRandom } from '../numerics/random';

/** The normal quantile of the estimation layer (tested against SciPy there), re-exported for sizing. */
export { normalQuantile } from '../estimation/distributions';

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
