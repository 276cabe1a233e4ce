/**
 * Dense LU factorisation with partial (row) pivoting, PA = LU, on a row-major Float64Array,
 * in place (Golub & Van Loan, Matrix Computations, 4th ed., alg. 3.4.1), with forward/back
 * substitution and a reciprocal condition estimate in the 1-norm (Hager 1984, "Condition
 * estimates", SIAM J. Sci. Stat. Comput. 5; as refined by Higham 1988, ACM TOMS 14).
 *
 * The hot-path functions `luFactor` / `luSolve` allocate nothing and report singularity as a
 * return code; `luDecompose` / `solveLinear` are convenience wrappers with an Outcome-style status.
 */
import { outcome, type Outcome, type StatusTable } from '../core/outcome.js';

/** Status of a factorisation or solve. */
export type LuStatus = 'ok' | 'singular' | 'ill-conditioned' | 'non-finite';

export const LU_STATUS: StatusTable<LuStatus> = {
  ok: { success: true, message: 'LU factorisation succeeded' },
  singular: { success: false, message: 'the matrix is singular (a zero pivot was met)' },
  'ill-conditioned': {
    success: true,
    message: 'the matrix is nearly singular; the solution may be inaccurate',
  },
  'non-finite': { success: false, message: 'the matrix contains a non-finite entry' },
};

/**
 * Factor the n x n row-major matrix `a` in place into L (unit lower, below the diagonal) and U
 * (upper, on and above it); `piv[k]` is the row swapped with row k at step k.
 * Returns 0 on success, k+1 when the pivot of column k is exactly zero (the matrix is singular;
 * the factorisation is then incomplete), or -1 when a non-finite entry was found.
 * Allocation-free.
 */
export function luFactor(a: Float64Array, n: number, piv: Int32Array): number {
  for (let i = 0; i < n * n; i++) if (!Number.isFinite(a[i])) return -1;
  for (let k = 0; k < n; k++) {
    // choose the pivot row
    let p = k;
    let maxAbs = Math.abs(a[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * n + k]);
      if (v > maxAbs) {
        maxAbs = v;
        p = i;
      }
    }
    piv[k] = p;
    if (maxAbs === 0) return k + 1;
    if (p !== k) {
      const rk = k * n;
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const tmp = a[rk + j];
        a[rk + j] = a[rp + j];
        a[rp + j] = tmp;
      }
    }
    const pivot = a[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const m = a[ri + k] / pivot;
      a[ri + k] = m;
      if (m !== 0) {
        const rk = k * n;
        for (let j = k + 1; j < n; j++) a[ri + j] -= m * a[rk + j];
      }
    }
  }
  return 0;
}

/** Solve A x = b with the factors from `luFactor`; `b` is overwritten by x. Allocation-free. */
export function luSolve(lu: Float64Array, n: number, piv: Int32Array, b: Float64Array): void {
  for (let k = 0; k < n; k++) {
    const p = piv[k];
    if (p !== k) {
      const tmp = b[k];
      b[k] = b[p];
      b[p] = tmp;
    }
  }
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let j = 0; j < i; j++) s -= lu[ri + j] * b[j];
    b[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= lu[ri + j] * b[j];
    b[i] = s / lu[ri + i];
  }
}

/** Solve A^T x = b with the factors from `luFactor`; `b` is overwritten by x. Allocation-free. */
export function luSolveTranspose(lu: Float64Array, n: number, piv: Int32Array, b: Float64Array): void {
  // A = P^T L U  =>  A^T = U^T L^T P ; solve U^T z = b, L^T w = z, x = P^T w
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let j = 0; j < i; j++) s -= lu[j * n + i] * b[j];
    b[i] = s / lu[i * n + i];
  }
  for (let i = n - 2; i >= 0; i--) {
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= lu[j * n + i] * b[j];
    b[i] = s;
  }
  for (let k = n - 1; k >= 0; k--) {
    const p = piv[k];
    if (p !== k) {
      const tmp = b[k];
      b[k] = b[p];
      b[p] = tmp;
    }
  }
}

/** The 1-norm (maximum absolute column sum) of an n x n row-major matrix. */
export function norm1(a: ArrayLike<number>, n: number): number {
  let best = 0;
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Math.abs(a[i * n + j]);
    if (s > best) best = s;
  }
  return best;
}

/**
 * Estimate the reciprocal 1-norm condition number 1 / (||A||_1 ||A^-1||_1) from the LU factors
 * and ||A||_1 (Hager's estimator, at most 5 sweeps). Costs a few triangular solves; allocates two
 * work vectors, so call it outside hot loops. Returns 0 for a singular factorisation.
 */
export function luRcond(lu: Float64Array, n: number, piv: Int32Array, anorm: number): number {
  if (n === 0) return 1;
  for (let i = 0; i < n; i++) if (lu[i * n + i] === 0) return 0;
  if (anorm === 0) return 0;
  const x = new Float64Array(n).fill(1 / n);
  const z = new Float64Array(n);
  let est = 0;
  let lastJ = -1;
  for (let iter = 0; iter < 5; iter++) {
    luSolve(lu, n, piv, x); // x = A^-1 x
    let s = 0;
    for (let i = 0; i < n; i++) s += Math.abs(x[i]);
    if (!Number.isFinite(s)) return 0;
    if (iter > 0 && s <= est) {
      est = Math.max(est, s);
      break;
    }
    est = s;
    for (let i = 0; i < n; i++) z[i] = x[i] >= 0 ? 1 : -1;
    luSolveTranspose(lu, n, piv, z); // z = A^-T sign(x)
    let j = 0;
    let zmax = -1;
    for (let i = 0; i < n; i++) {
      const v = Math.abs(z[i]);
      if (v > zmax) {
        zmax = v;
        j = i;
      }
    }
    if (j === lastJ) break;
    lastJ = j;
    x.fill(0);
    x[j] = 1;
  }
  // Higham's alternative lower bound guards against Hager's worst cases.
  for (let i = 0; i < n; i++) x[i] = (i % 2 === 0 ? 1 : -1) * (1 + i / Math.max(1, n - 1));
  luSolve(lu, n, piv, x);
  let alt = 0;
  for (let i = 0; i < n; i++) alt += Math.abs(x[i]);
  alt = (2 * alt) / (3 * n);
  if (Number.isFinite(alt) && alt > est) est = alt;
  if (!(est > 0) || !Number.isFinite(est)) return 0;
  return 1 / (anorm * est);
}

/** Result of `luDecompose`: the factors (a new array), pivots and a condition estimate. */
export interface LuDecomposition extends Outcome<LuStatus> {
  n: number;
  lu: Float64Array;
  piv: Int32Array;
  /** Reciprocal 1-norm condition estimate (0 when singular). */
  rcond: number;
}

/** Below this reciprocal condition estimate a factorisation is reported 'ill-conditioned'. */
export const ILL_CONDITIONED_RCOND = 1e-14;

/** Factor a copy of the n x n row-major matrix `a` (not mutated), with status and rcond. */
export function luDecompose(a: ArrayLike<number>, n: number): LuDecomposition {
  const lu = Float64Array.from(a as ArrayLike<number>);
  const piv = new Int32Array(n);
  const anorm = norm1(lu, n);
  const info = luFactor(lu, n, piv);
  if (info === -1) return { ...outcome(LU_STATUS, 'non-finite'), n, lu, piv, rcond: 0 };
  if (info > 0) {
    return { ...outcome(LU_STATUS, 'singular', [], `zero pivot in column ${info - 1}`), n, lu, piv, rcond: 0 };
  }
  const rcond = luRcond(lu, n, piv, anorm);
  if (rcond < ILL_CONDITIONED_RCOND) {
    return {
      ...outcome(LU_STATUS, 'ill-conditioned', [
        { code: 'ill-conditioned', message: `reciprocal condition estimate ${rcond.toExponential(2)}` },
      ]),
      n,
      lu,
      piv,
      rcond,
    };
  }
  return { ...outcome(LU_STATUS, 'ok'), n, lu, piv, rcond };
}

/** Result of `solveLinear`. `x` is all zeros unless `success`. */
export interface LinearSolveResult extends Outcome<LuStatus> {
  x: Float64Array;
  rcond: number;
}

/** Solve A x = b for an n x n row-major A (inputs are not mutated). */
export function solveLinear(a: ArrayLike<number>, b: ArrayLike<number>, n: number): LinearSolveResult {
  const dec = luDecompose(a, n);
  const x = new Float64Array(n);
  if (!dec.success) return { status: dec.status, success: false, message: dec.message, warnings: dec.warnings, x, rcond: 0 };
  for (let i = 0; i < n; i++) x[i] = b[i];
  luSolve(dec.lu, n, dec.piv, x);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i])) {
      return { ...outcome(LU_STATUS, 'non-finite', dec.warnings, 'the solution overflowed'), x: new Float64Array(n), rcond: dec.rcond };
    }
  }
  return { status: dec.status, success: dec.success, message: dec.message, warnings: dec.warnings, x, rcond: dec.rcond };
}
