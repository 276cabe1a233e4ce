/**
 * Is a real square matrix A Hurwitz (every eigenvalue with a negative real part)?
 *
 * Method: Lyapunov's criterion (A. M. Lyapunov, 1892; see e.g. Horn and Johnson, Topics in Matrix
 * Analysis, 1991, Theorem 2.2.1): A is Hurwitz if and only if the Lyapunov equation
 * A^T P + P A = -I has a symmetric positive definite solution P. The equation is solved as the
 * n^2 x n^2 linear system (I kron A^T + A^T kron I) vec(P) = -vec(I) by LU (numerics/lu.ts), and P is
 * tested for definiteness by a Cholesky factorization. The system is singular when two eigenvalues
 * of A sum to zero (for example a zero eigenvalue): then the answer is 'undecided'. Meant for the
 * small matrices of a stirred tank's balances (n up to a few tens).
 */
import { luFactor, luSolve } from './lu.js';

export type HurwitzVerdict = 'stable' | 'unstable' | 'undecided';

/** Hurwitz test of A (n x n, row-major). */
export function hurwitz(A: ArrayLike<number>, n: number): HurwitzVerdict {
  const m = n * n;
  const K = new Float64Array(m * m);
  // Unknown P[i][j] at index i n + j; equation (i, j): sum_k A[k][i] P[k][j] + P[i][k] A[k][j] = -delta_ij.
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const row = (i * n + j) * m;
      for (let k = 0; k < n; k++) {
        K[row + k * n + j] += A[k * n + i];
        K[row + i * n + k] += A[k * n + j];
      }
    }
  }
  const b = new Float64Array(m);
  for (let i = 0; i < n; i++) b[i * n + i] = -1;
  const piv = new Int32Array(m);
  if (luFactor(K, m, piv) !== 0) return 'undecided';
  luSolve(K, m, piv, b);
  if (!b.every(Number.isFinite)) return 'undecided';
  return positiveDefinite(b, n) ? 'stable' : 'unstable';
}

/** Cholesky test of the symmetric part of P (n x n, row-major). */
function positiveDefinite(P: Float64Array, n: number): boolean {
  const L = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    let d = 0.5 * (P[j * n + j] + P[j * n + j]);
    for (let k = 0; k < j; k++) d -= L[j * n + k] ** 2;
    if (!(d > 0)) return false;
    const ljj = Math.sqrt(d);
    L[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = 0.5 * (P[i * n + j] + P[j * n + i]);
      for (let k = 0; k < j; k++) s -= L[i * n + k] * L[j * n + k];
      L[i * n + j] = s / ljj;
    }
  }
  return true;
}
