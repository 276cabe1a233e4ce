/**
 * Weighted linear least squares: minimise sum_i w_i (y_i - sum_k X_ik b_k)^2.
 *
 * Method: the rows are scaled by sqrt(w_i) and the columns by their Euclidean norms (equilibration,
 * van der Sluis 1969, "Condition numbers and equilibration of matrices", Numer. Math. 14, 14-23),
 * then solved through the thin SVD (src/numerics/svd.ts, one-sided Jacobi): b = V diag(1/s) U' y,
 * never forming X'X. The condition number reported is that of the column-scaled matrix, so it
 * measures collinearity, not units. Pure; small problems only (it copies the design).
 */
import { RateloomError } from '../core/errors.js';
import { conditionNumber, svd, svdRank } from '../numerics/svd.js';

export interface LinearFit {
  /** Coefficients, length p (NaN-free; 0 for a column dropped as rank-deficient). */
  coefficients: number[];
  /** Numerical rank of the column-scaled, weighted design. */
  rank: number;
  /** Condition number s_max / s_min of the column-scaled, weighted design (Infinity when rank-deficient). */
  conditionNumber: number;
  /** Weighted residual sum of squares. */
  ssr: number;
  /** Residuals y - X b, unweighted, length m. */
  residuals: number[];
}

/**
 * Weighted linear least squares of y on the columns of X.
 * @param X m x p design, row-major (rows are observations).
 * @param y m responses.
 * @param weights m positive weights; default all 1.
 * @throws RateloomError on mismatched sizes, non-finite input or non-positive weights (bad input).
 */
export function weightedLinearLeastSquares(X: ArrayLike<number>, m: number, p: number, y: ArrayLike<number>, weights?: ArrayLike<number>): LinearFit {
  if (X.length !== m * p || y.length !== m || (weights && weights.length !== m)) {
    throw new RateloomError('E_VALUE', `linear least squares: design ${X.length} values for ${m} x ${p}, ${y.length} responses${weights ? `, ${weights.length} weights` : ''}`, { path: [] });
  }
  const A = new Float64Array(m * p);
  const b = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const w = weights ? weights[i] : 1;
    if (!(w > 0) || !Number.isFinite(w)) throw new RateloomError('E_VALUE', `linear least squares: weight ${i} is ${w}; weights must be positive and finite`, { path: ['weights', i] });
    if (!Number.isFinite(y[i])) throw new RateloomError('E_VALUE', `linear least squares: response ${i} is not finite`, { path: ['y', i] });
    const sw = Math.sqrt(w);
    b[i] = sw * y[i];
    for (let k = 0; k < p; k++) {
      const v = X[i * p + k];
      if (!Number.isFinite(v)) throw new RateloomError('E_VALUE', `linear least squares: design value (${i}, ${k}) is not finite`, { path: ['X', i, k] });
      A[i * p + k] = sw * v;
    }
  }
  const scale = new Float64Array(p);
  for (let k = 0; k < p; k++) {
    let s = 0;
    for (let i = 0; i < m; i++) s += A[i * p + k] ** 2;
    scale[k] = s > 0 ? Math.sqrt(s) : 1;
    for (let i = 0; i < m; i++) A[i * p + k] /= scale[k];
  }
  const d = svd(A, m, p);
  const rank = svdRank(d, 1e-12);
  const coef = new Array<number>(p).fill(0);
  for (let k = 0; k < rank; k++) {
    let uty = 0;
    for (let i = 0; i < m; i++) uty += d.U[i * p + k] * b[i];
    const f = uty / d.s[k];
    for (let j = 0; j < p; j++) coef[j] += d.V[j * p + k] * f;
  }
  for (let k = 0; k < p; k++) coef[k] /= scale[k];
  const residuals: number[] = [];
  let ssr = 0;
  for (let i = 0; i < m; i++) {
    let fit = 0;
    for (let k = 0; k < p; k++) fit += X[i * p + k] * coef[k];
    const r = y[i] - fit;
    residuals.push(r);
    ssr += (weights ? weights[i] : 1) * r * r;
  }
  return { coefficients: coef, rank, conditionNumber: rank < p ? Infinity : conditionNumber(d), ssr, residuals };
}
